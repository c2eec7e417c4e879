// Convergence of the phantom body model's numerical choices (slow: skipped by the sanitizer
// pass): points per direction, directions, the SPE energy grid, the GCR march step and grid.
#include "phantom_helpers.hpp"

#include <catch2/catch.hpp>

using namespace crewdose;
using namespace crewdose::phantom_test;

TEST_CASE("phantom: SPE organ doses converge in points, directions and energy grid",
          "[phantom][slow]") {
    // Convergence (by construction), demo Band event and a harder one:
    // - 32 of each region's 512 points per direction (the skin: 128) against all 512 (128
    //   directions, behind the suit): largest difference seen 1.6 % (effective dose: breasts
    //   and testes lie near the skin; the skin 0.6 %, and 4.2 % with 32 of its points); gate
    //   3 %;
    // - 256 directions against 1024 (10 g/cm2 aluminium): gate 1 %;
    // - 32 energy nodes per decade against 64 (suit, 10 g/cm2 aluminium, 60 g/cm2 regolith):
    //   largest seen 0.1 %; gate 0.2 %.
    const auto grid = planner::phantom_depth_grid();
    {
        const auto a =
            phantom_responses(suited(), 128, 32, planner::kPhantomPointsPerDirection, grid);
        const auto b = phantom_responses(suited(), 128, 32, 0, grid);
        for (std::size_t o = 0; o < a.size(); ++o) {
            INFO(a[o].organ);
            CHECK(dose_equivalent(a[o], kBand) ==
                  Approx(dose_equivalent(b[o], kBand)).epsilon(0.03));
        }
    }
    {
        const auto al = shelled("aluminium", 10.0);
        const auto a = phantom_responses(al, planner::kDefaultPhantomDirections, 32,
                                         planner::kPhantomPointsPerDirection, grid);
        const auto b = phantom_responses(al, 1024, 32, planner::kPhantomPointsPerDirection, grid);
        for (std::size_t o = 0; o < a.size(); ++o) {
            INFO(a[o].organ);
            CHECK(dose_equivalent(a[o], kBand) ==
                  Approx(dose_equivalent(b[o], kBand)).epsilon(0.01));
        }
    }
    for (const auto& where :
         {suited(), shelled("aluminium", 10.0), shelled("highland-regolith", 60.0)}) {
        const auto a = phantom_responses(where, 64, planner::kPhantomSpeNodesPerDecade,
                                         planner::kPhantomPointsPerDirection, grid);
        const auto b = phantom_responses(where, 64, 64, planner::kPhantomPointsPerDirection, grid);
        for (std::size_t o = 0; o < a.size(); ++o) {
            for (const auto* s : {&kBand, &kHard}) {
                INFO(a[o].organ);
                CHECK(dose_equivalent(a[o], *s) == Approx(dose_equivalent(b[o], *s)).epsilon(2e-3));
            }
        }
    }
}

TEST_CASE("phantom: GCR organ doses converge in march step and tissue grid", "[phantom][slow]") {
    // Convergence (by construction), phi = 650 MV, dose equivalent and absorbed dose, both
    // marches: the check's march step (8 g/cm2) against 2 g/cm2; with the secondaries the
    // largest seen is 1.1 % (behind 150 g/cm2 of regolith: the secondaries' source is taken
    // linear over each step), gate 1.5 % (without them it was 0.21 %);
    // the GCR tissue grid (12 nodes to 46 g/cm2) against the SPE grid (25 nodes to 160 g/cm2):
    // the coarser grid is higher (linear interpolation of a convex fall), largest seen 0.8 %,
    // gate 1.2 %.
    const auto dirs = habitats::fibonacci_directions(32);
    const std::vector<double> phis{650.0};
    for (const auto& where :
         {suited(), shelled("aluminium", 20.0), shelled("highland-regolith", 150.0)}) {
        exposure::TableLibrary tables(planner::gcr_grid());
        exposure::MarchOptions fine_step = planner::gcr_march_options();
        fine_step.max_step_g_cm2 = 2.0;
        exposure::FragmentTransport check_march(tables, planner::gcr_march_options());
        exposure::FragmentTransport fine_march(tables, fine_step);
        exposure::MarchOptions none;
        none.removal = false;
        exposure::FragmentTransport without(tables, none);
        const auto gcr_body =
            planner::phantom_body_depths(planner::shared_phantom(), habitats::Posture::standing,
                                         0.0, dirs, planner::phantom_gcr_depth_grid());
        const auto spe_body =
            planner::phantom_body_depths(planner::shared_phantom(), habitats::Posture::standing,
                                         0.0, dirs, planner::phantom_depth_grid());
        const auto a =
            planner::gcr_body_doses({check_march, without}, builtin, where, dirs, gcr_body, phis);
        const auto b =
            planner::gcr_body_doses({fine_march, without}, builtin, where, dirs, gcr_body, phis);
        const auto c =
            planner::gcr_body_doses({check_march, without}, builtin, where, dirs, spe_body, phis);
        for (const auto& [key, d] : a) {
            INFO(key.first);
            CHECK(d.with_removal.dose_equivalent_Sv ==
                  Approx(b.at(key).with_removal.dose_equivalent_Sv).epsilon(1.5e-2));
            CHECK(d.with_removal.absorbed_Gy ==
                  Approx(b.at(key).with_removal.absorbed_Gy).epsilon(1.5e-2));
            for (const bool with : {true, false}) {
                const auto& x = with ? d.with_removal : d.without_removal;
                const auto& y = with ? c.at(key).with_removal : c.at(key).without_removal;
                CHECK(x.dose_equivalent_Sv >= y.dose_equivalent_Sv * (1.0 - 1e-3));
                CHECK(x.dose_equivalent_Sv == Approx(y.dose_equivalent_Sv).epsilon(0.012));
            }
        }
    }
}
