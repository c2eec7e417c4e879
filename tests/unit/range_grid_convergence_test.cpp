#include "exposure/material_library.hpp"
#include "exposure/range_table.hpp"

#include <catch2/catch.hpp>

using namespace crewdose::exposure;

TEST_CASE("the default range grid is converged", "[range][slow]") {
    // Convergence (by construction): quadrupling the node density changes no range by more
    // than 1e-4 relative, anywhere from 10 keV to 100 GeV per nucleon.
    for (const char* id : {"water", "aluminium", "polyethylene", "lead"}) {
        const Material& m = *find_builtin_material(id);
        for (const Particle& p : {proton(), alpha()}) {
            const RangeTable coarse(m, p);
            EnergyGridSpec fine_spec;
            fine_spec.nodes_per_decade *= 4;
            const RangeTable fine(m, p, fine_spec);
            INFO(id << " " << p.name);
            for (double E = 0.0107; E < 9.9e4; E *= 1.29) {
                CHECK(coarse.range_g_cm2(E) == Approx(fine.range_g_cm2(E)).epsilon(1e-4));
            }
        }
    }
}
