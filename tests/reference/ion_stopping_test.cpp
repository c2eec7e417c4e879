// Heavy-ion electronic stopping in liquid water above 10 MeV/u against published tables.
#include "exposure/material_library.hpp"
#include "exposure/stopping.hpp"

#include <catch2/catch.hpp>

#include <utility>
#include <vector>

using namespace crewdose::exposure;

namespace {

void check_ion(const char* name, const std::vector<std::pair<double, double>>& rows,
               double tolerance) {
    const Material& w = *find_builtin_material("water");
    const Particle ion = *particle_by_name(name);
    for (const auto& [E, s_ref] : rows) {
        const double s = electronic_stopping_MeV_cm2_g(w, ion, E);
        INFO(name << " at " << E << " MeV/u: crewdose " << s << ", reference " << s_ref);
        CHECK(s == Approx(s_ref).epsilon(tolerance));
    }
}

} // namespace

TEST_CASE("carbon ions in water match ICRU 73 above 10 MeV/u", "[ions]") {
    // Source: ICRU Report 73 (2005) carbon in liquid water, MeV cm2/g, in the revised form
    // computed after the report's 2009 errata (water I = 78 eV), as distributed in the libdedx
    // data file ICRU73_NEW. crewdose uses I = 75 eV (ICRU 49), which raises stopping by about
    // 0.6 %; tolerance 5 % (foundation issue).
    check_ion("carbon",
              {{10, 1630.2},
               {20, 926.30},
               {50, 443.28},
               {100, 260.28},
               {200, 160.83},
               {500, 98.575},
               {1000, 79.682}},
              5e-2);
}

TEST_CASE("carbon ions in water match MSTAR above 10 MeV/u", "[ions]") {
    // Source: H. Paul & A. Schinner, program MSTAR 3.12 with water I = 75 eV, MeV cm2/g.
    check_ion("carbon",
              {{10, 1639.72},
               {20, 938.005},
               {50, 448.228},
               {100, 262.61},
               {250, 141.078},
               {1000, 80.0059}},
              5e-2);
}

TEST_CASE("oxygen ions in water match ICRU 73 above 10 MeV/u", "[ions]") {
    // Source: ICRU Report 73 revised water tables (libdedx ICRU73_NEW), oxygen, MeV cm2/g.
    check_ion("oxygen", {{10, 2906.9}, {100, 462.78}, {1000, 141.94}}, 5e-2);
}

TEST_CASE("1 GeV/u iron in water has an LET near 150 keV/um", "[ions]") {
    // Common practice (from memory): the 1 GeV/u 56Fe beams used in space radiobiology are
    // quoted with an LET in water of about 150 keV/um (148 to 151 in most papers).
    const Material& w = *find_builtin_material("water");
    const double let = let_keV_um(w, *particle_by_name("iron"), 1000.0);
    CHECK(let == Approx(150.0).epsilon(5e-2));
}
