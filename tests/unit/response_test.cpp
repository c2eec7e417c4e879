// Responses per incident-energy node, dose quantities and depth-dose tables.
#include "exposure/depth_dose.hpp"
#include "exposure/material_library.hpp"
#include "exposure/nuclear.hpp"
#include "exposure/response.hpp"
#include "exposure/table_library.hpp"
#include "exposure/units.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <vector>

using namespace crewdose::exposure;

namespace {

// Demo spectra (invented parameters, not real events).
const std::vector<ProtonSpectrum>& demo_spectra() {
    static const std::vector<ProtonSpectrum> s{
        ProtonSpectrum(BandRigidity{1.0e10, 1.1, 3.5, 0.25}, FitRange{10, 1000}),
        ProtonSpectrum(WeibullEnergy{5.0e9, 0.9, 0.4}, FitRange{10, 1000}),
        ProtonSpectrum(PowerLawEnergy{1.0e9, 2.5, 30.0}, FitRange{10, 1000}),
        ProtonSpectrum(ExponentialRigidity{3.0e9, 0.12}, FitRange{10, 1000})};
    return s;
}

struct Fixture {
    TableLibrary tables;
    const Material& al = *find_builtin_material("aluminium");
    const Material& water = *find_builtin_material("water");
    const RangeTable& tal = tables.table(al, proton());
    const RangeTable& tw = tables.table(water, proton());
    DoseMedium medium{&tw, &tw};
    RbeModel rbe{};
};

} // namespace

TEST_CASE("dose of a monoenergetic beam follows the hand formula", "[dose]") {
    // Source: D = 1.602e-10 Phi S (Gy, Phi in cm^-2, S in MeV cm2/g) by definition of absorbed
    // dose; Q = 1 at LET < 10 keV/um (ICRP 60); RBE 1.5 for protons above 2 MeV (NCRP 132).
    Fixture f;
    const double phi = 1.0e8;
    const DoseQuantities d = dose_per_fluence(f.medium, proton(), 100.0, f.rbe).scaled(phi);
    const double S = f.tw.stopping_MeV_cm2_g(100.0);
    CHECK(d.absorbed_Gy == Approx(1.602176634e-10 * phi * S).epsilon(1e-12));
    CHECK(d.dose_equivalent_Sv == Approx(d.absorbed_Gy).epsilon(1e-12));
    CHECK(d.rbe_weighted_GyEq == Approx(1.5 * d.absorbed_Gy).epsilon(1e-12));
    // Behind 10 g/cm2 of aluminium the beam arrives slower and fewer (removal): by hand from the
    // forward transport.
    const LayerPath path{{&f.tal, 10.0}};
    const ForwardResult fr = transport_forward(path, 100.0, Removal::with);
    const double expected =
        kGy_per_MeV_per_g * phi * fr.survival * f.tw.stopping_MeV_cm2_g(fr.exit_energy_MeV_per_n);
    CHECK(dose_per_fluence(f.medium, proton(), fr.exit_energy_MeV_per_n, f.rbe)
              .scaled(phi * fr.survival)
              .absorbed_Gy == Approx(expected).epsilon(1e-12));
}

TEST_CASE("response sums equal exact spectrum transport within 0.2 %", "[dose]") {
    // By construction: the exact reference integrates the backward-transported spectrum over
    // exit energies; the response folds node weights with the spectrum's node values.
    Fixture f;
    for (const auto& spectrum : demo_spectra()) {
        for (double t : {0.0, 1.0, 10.0, 50.0}) {
            const LayerPath path{{&f.tal, t}, {&f.tw, 5.0}};
            const PathResponse r = path_response(path, f.medium, proton(), f.rbe);
            const BracketedDose folded =
                fold(r, node_fluences(spectrum, r.node_energies_MeV_per_n));
            const BracketedDose exact = exact_spectrum_dose(
                path, f.medium, proton(),
                [&](double E) { return spectrum.differential_fluence_per_cm2_MeV(E); },
                spectrum.fit_range(), f.rbe);
            INFO("t = " << t);
            CHECK(folded.with_removal.absorbed_Gy ==
                  Approx(exact.with_removal.absorbed_Gy).epsilon(2e-3));
            CHECK(folded.without_removal.absorbed_Gy ==
                  Approx(exact.without_removal.absorbed_Gy).epsilon(2e-3));
            CHECK(folded.without_removal.dose_equivalent_Sv ==
                  Approx(exact.without_removal.dose_equivalent_Sv).epsilon(2e-3));
            CHECK(folded.without_removal.rbe_weighted_GyEq ==
                  Approx(exact.without_removal.rbe_weighted_GyEq).epsilon(2e-3));
        }
    }
}

TEST_CASE("the removal bracket and its limit-check value", "[dose]") {
    Fixture f;
    const auto& band = demo_spectra()[0];
    const LayerPath path{{&f.tal, 20.0}, {&f.tw, 5.0}};
    const PathResponse r = path_response(path, f.medium, proton(), f.rbe);
    const BracketedDose d = fold(r, node_fluences(band, r.node_energies_MeV_per_n));
    // By construction: removal only takes particles away, so it lowers every quantity, and the
    // limit check uses the higher value.
    CHECK(d.with_removal.absorbed_Gy < d.without_removal.absorbed_Gy);
    CHECK(d.with_removal.absorbed_Gy > 0.7 * d.without_removal.absorbed_Gy);
    CHECK(d.for_limits().absorbed_Gy == d.without_removal.absorbed_Gy);
    CHECK(d.for_limits().dose_equivalent_Sv == d.without_removal.dose_equivalent_Sv);
    // Linearity: twice the spectrum, twice the dose (by construction).
    const BracketedDose d2 =
        fold(r, node_fluences(band.scaled_to(2.0 * band.integral_fluence_per_cm2(30.0), 30.0),
                              r.node_energies_MeV_per_n));
    CHECK(d2.without_removal.absorbed_Gy ==
          Approx(2.0 * d.without_removal.absorbed_Gy).epsilon(1e-12));
    // Common practice: the mean quality factor of an SPE proton spectrum behind shielding is
    // between 1 and 2.
    const double q = d.without_removal.dose_equivalent_Sv / d.without_removal.absorbed_Gy;
    CHECK(q > 1.0);
    CHECK(q < 2.0);
}

TEST_CASE("BFO dose of the demo Band event falls as aluminium is added", "[dose]") {
    // Property (transport issue): from 0.1 to 100 g/cm2 of aluminium, 5 cm of tissue.
    TableLibrary tables;
    DepthDoseSetup setup{find_builtin_material("aluminium"), find_builtin_material("soft-tissue"),
                         find_builtin_material("water"), 5.0, RbeModel{}};
    const auto& band = demo_spectra()[0];
    double previous = depth_dose(tables, setup, band, 0.1).for_limits().absorbed_Gy;
    for (double t = 0.2; t <= 100.0; t *= 1.6) {
        const double d = depth_dose(tables, setup, band, t).for_limits().absorbed_Gy;
        INFO("t = " << t);
        CHECK(d < previous);
        previous = d;
    }
}

TEST_CASE("depth-dose table interpolates within 0.5 % of the exact dose", "[dose]") {
    // By construction: the table's nodes are exact; between nodes (at the geometric midpoints)
    // the log-log interpolation stays within 0.5 % of the exact dose.
    TableLibrary tables;
    DepthDoseSetup setup{find_builtin_material("aluminium"), find_builtin_material("water"),
                         find_builtin_material("water"), 5.0, RbeModel{}};
    const auto& band = demo_spectra()[0];
    const DepthDoseTable table(tables, setup, band);
    const auto& nodes = table.nodes_g_cm2();
    for (std::size_t i = 1; i + 1 < nodes.size(); i += 3) {
        const double mid = std::sqrt(nodes[i] * nodes[i + 1]);
        const DoseQuantities exact = depth_dose(tables, setup, band, mid).for_limits();
        const DoseQuantities interp = table.at(mid);
        INFO("t = " << mid);
        CHECK(interp.absorbed_Gy == Approx(exact.absorbed_Gy).epsilon(5e-3));
        CHECK(interp.dose_equivalent_Sv == Approx(exact.dose_equivalent_Sv).epsilon(5e-3));
    }
    CHECK(table.at(0.0).absorbed_Gy ==
          Approx(depth_dose(tables, setup, band, 0.0).for_limits().absorbed_Gy).epsilon(1e-12));
}

TEST_CASE("the LET spectrum accounts for the dose at the point", "[dose]") {
    // By construction: the LET bins partition the transmitted spectrum, so their doses add up
    // to the exact absorbed dose (without removal), and protons never exceed ~100 keV/um.
    Fixture f;
    const auto& band = demo_spectra()[0];
    const LayerPath path{{&f.tal, 10.0}, {&f.tw, 5.0}};
    auto phi = [&](double E) {
        return band.differential_fluence_per_cm2_MeV(E);
    };
    const LetSpectrum s = let_spectrum(path, f.medium, proton(), phi);
    double total = 0.0;
    double above_200 = 0.0;
    for (std::size_t i = 0; i < s.absorbed_Gy.size(); ++i) {
        total += s.absorbed_Gy[i];
        if (s.let_edges_keV_um[i] >= 200.0) {
            above_200 += s.absorbed_Gy[i];
        }
    }
    const BracketedDose exact =
        exact_spectrum_dose(path, f.medium, proton(), phi, band.fit_range(), f.rbe);
    // The exact sum also counts exit energies below the grid (< 1e-4 of the dose).
    CHECK(total == Approx(exact.without_removal.absorbed_Gy).epsilon(1e-3));
    CHECK(above_200 == 0.0);
}

TEST_CASE("alphas and ions use the same transport code", "[dose]") {
    // By construction: the forward step through one layer is R(E_out) = R(E_in) - t on the
    // particle's own table, whatever the particle.
    TableLibrary tables;
    const Material& al = *find_builtin_material("aluminium");
    for (const Particle& p : {alpha(), *particle_by_name("carbon"), *particle_by_name("iron")}) {
        const RangeTable& t = tables.table(al, p);
        const double E0 = 400.0;
        const ForwardResult fr = transport_forward(LayerPath{{&t, 3.0}}, E0, Removal::with);
        REQUIRE_FALSE(fr.stopped);
        CHECK(fr.exit_energy_MeV_per_n ==
              Approx(t.energy_MeV_per_n(t.range_g_cm2(E0) - 3.0)).epsilon(1e-12));
        // Removal by the energy-independent nucleus-nucleus cross section on aluminium:
        // survival exp(-Sigma t) over the 3 g/cm2 crossed (by construction).
        CHECK(fr.survival == Approx(std::exp(-removal_cm2_g(al, p, E0) * 3.0)).epsilon(1e-5));
        CHECK(fr.survival < 1.0);
        const BackwardResult b =
            transport_backward(LayerPath{{&t, 3.0}}, fr.exit_energy_MeV_per_n, Removal::with);
        CHECK(b.incident_MeV_per_n == Approx(E0).epsilon(1e-9));
    }
}

TEST_CASE("shared node doses and the depth curve equal the one-off calls", "[dose]") {
    // By construction: the same arithmetic with the path-independent parts computed once.
    Fixture f;
    const LayerPath path{{&f.tal, 4.0}, {&f.tw, 5.0}};
    const PathResponse one = path_response(path, f.medium, proton(), f.rbe);
    const PathResponse shared = path_response(path, node_doses(f.medium, proton(), f.rbe));
    REQUIRE(shared.with_removal.size() == one.with_removal.size());
    for (std::size_t j = 0; j < one.with_removal.size(); ++j) {
        CHECK(shared.with_removal[j].absorbed_Gy == one.with_removal[j].absorbed_Gy);
        CHECK(shared.without_removal[j].dose_equivalent_Sv ==
              one.without_removal[j].dose_equivalent_Sv);
    }
    const DepthDoseSetup setup{&f.al, find_builtin_material("soft-tissue"), &f.water, 5.0, f.rbe};
    const std::vector<double> depths{0.0, 0.5, 20.0, 300.0};
    for (const auto& s : demo_spectra()) {
        const auto curve = depth_dose_curve(f.tables, setup, s, depths);
        REQUIRE(curve.size() == depths.size());
        for (std::size_t i = 0; i < depths.size(); ++i) {
            const BracketedDose single = depth_dose(f.tables, setup, s, depths[i]);
            CHECK(curve[i].with_removal.absorbed_Gy == single.with_removal.absorbed_Gy);
            CHECK(curve[i].without_removal.rbe_weighted_GyEq ==
                  single.without_removal.rbe_weighted_GyEq);
        }
        CHECK(curve[1].for_limits().absorbed_Gy > curve[2].for_limits().absorbed_Gy);
    }
}

TEST_CASE("depth responses (fast path) equal one path response per depth", "[dose]") {
    // Reference: path_response() of external + tissue(t), the exact path; the fast path
    // interpolates the external layers' backward map between grid nodes (by construction).
    // Criterion: every demo spectrum's folded dose within 0.05 % (largest seen: 0.017 %).
    TableLibrary tables;
    const Material& tissue = *find_builtin_material("soft-tissue");
    const Material& water = *find_builtin_material("water");
    const RangeTable& tt = tables.table(tissue, proton());
    const DoseMedium medium{&tt, &tables.table(water, proton())};
    const NodeDoses doses = node_doses(medium, proton(), RbeModel{});
    const std::vector<double> depths{0.007, 0.3, 1.0, 5.0, 12.8, 32.0, 96.0, 160.0};
    const std::vector<std::vector<std::pair<std::string, double>>> externals{
        {},
        {{"aluminium", 0.3}},
        {{"highland-regolith", 40.0}, {"aluminium", 1.2}, {"polyethylene", 5.0}},
        {{"water", 20.0}, {"aluminium", 2.0}}};
    for (const auto& ext : externals) {
        LayerPath path;
        for (const auto& [id, t] : ext) {
            path.push_back({&tables.table(*find_builtin_material(id), proton()), t});
        }
        const std::vector<PathResponse> fast = depth_responses(path, tt, depths, doses);
        REQUIRE(fast.size() == depths.size());
        for (std::size_t g = 0; g < depths.size(); ++g) {
            LayerPath full = path;
            full.push_back({&tt, depths[g]});
            const PathResponse exact = path_response(full, doses);
            for (const auto& s : demo_spectra()) {
                const auto f = node_fluences(s, exact.node_energies_MeV_per_n);
                const BracketedDose a = fold(fast[g], f);
                const BracketedDose b = fold(exact, f);
                INFO("layers " << ext.size() << " depth " << depths[g]);
                CHECK(a.with_removal.absorbed_Gy ==
                      Approx(b.with_removal.absorbed_Gy).epsilon(5e-4));
                CHECK(a.without_removal.dose_equivalent_Sv ==
                      Approx(b.without_removal.dose_equivalent_Sv).epsilon(5e-4));
                CHECK(a.with_removal.rbe_weighted_GyEq ==
                      Approx(b.with_removal.rbe_weighted_GyEq).epsilon(5e-4));
            }
        }
    }
}
