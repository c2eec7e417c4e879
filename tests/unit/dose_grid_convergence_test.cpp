#include "exposure/depth_dose.hpp"
#include "exposure/material_library.hpp"

#include <catch2/catch.hpp>

using namespace crewdose::exposure;

TEST_CASE("the default energy grid converges doses to 0.1 %", "[dose][slow]") {
    // Convergence (by construction): the demo Band event's BFO, lens and skin doses behind 0 to
    // 100 g/cm2 of aluminium change by less than 0.1 % when the grid is made 4 times denser.
    // Demo spectrum values are invented.
    const ProtonSpectrum band(BandRigidity{1e10, 1.1, 3.5, 0.25}, FitRange{10, 1000});
    TableLibrary coarse;
    EnergyGridSpec fine_spec;
    fine_spec.nodes_per_decade *= 4;
    TableLibrary fine(fine_spec);
    for (double tissue : {0.007, 0.3, 5.0}) {
        const DepthDoseSetup setup{find_builtin_material("aluminium"),
                                   find_builtin_material("soft-tissue"),
                                   find_builtin_material("water"), tissue, RbeModel{}};
        for (double t : {0.0, 1.0, 10.0, 100.0}) {
            const auto a = depth_dose(coarse, setup, band, t).for_limits();
            const auto b = depth_dose(fine, setup, band, t).for_limits();
            INFO("tissue " << tissue << " shield " << t);
            CHECK(a.absorbed_Gy == Approx(b.absorbed_Gy).epsilon(1e-3));
            CHECK(a.dose_equivalent_Sv == Approx(b.dose_equivalent_Sv).epsilon(1e-3));
        }
    }
}
