// Heavy-ion electronic stopping in liquid water above 10 MeV/u against published tables.
#include "exposure/material_library.hpp"
#include "exposure/stopping.hpp"

#include <catch2/catch.hpp>

#include <fstream>
#include <sstream>
#include <string>
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

TEST_CASE("carbon and oxygen in water below 10 MeV/u: the record against ICRU 73", "[ions]") {
    // Source: ICRU Report 73 (2005) liquid water, revised after its errata, carbon and oxygen,
    // as distributed in libdEdx (github.com/APTG/libdedx, commit f3cf313, data/raw/
    // ICRU73_NEW.dat; tests/data/icru73 gives the provenance). Below about 10 MeV/u crewdose's
    // heavy ions (effective charge after Barkas, times the ICRU 49 proton stopping at the same
    // velocity, joined to Bethe) are low: carbon -2 % at 10 MeV/u, -12 % at 1, -29 % at 0.1;
    // oxygen -5 %, -14 %, -29 %. A Ziegler-Biersack-Littmark 1985 effective charge gives the
    // same within 1 %. This records the gap (it matters for target fragments and the ends of
    // heavy-ion tracks) so that a fix shows.
    const Material& w = *find_builtin_material("water");
    for (const auto& [name, file] : {std::pair{"carbon", "icru73_water_carbon_Z6.csv"},
                                     std::pair{"oxygen", "icru73_water_oxygen_Z8.csv"}}) {
        std::ifstream in(std::string(CREWDOSE_SOURCE_DIR) + "/tests/data/icru73/" + file);
        REQUIRE(in);
        const Particle ion = *particle_by_name(name);
        std::string line;
        bool header = true;
        int rows = 0;
        while (std::getline(in, line)) {
            if (line.empty() || line[0] == '#') {
                continue;
            }
            if (header) {
                header = false;
                continue;
            }
            std::stringstream ss(line);
            std::string E_text, S_text;
            std::getline(ss, E_text, ',');
            std::getline(ss, S_text, ',');
            const double E = std::stod(E_text);
            const double S_ref = std::stod(S_text);
            if (E < 0.1 || E > 1000.0) {
                continue;
            }
            const double ratio = electronic_stopping_MeV_cm2_g(w, ion, E) / S_ref;
            INFO(name << " at " << E << " MeV/u: crewdose / ICRU 73 = " << ratio);
            if (E >= 20.0) {
                CHECK(ratio == Approx(1.0).epsilon(0.015));
            } else if (E >= 1.0) {
                CHECK(ratio > 0.84);
                CHECK(ratio < 1.0);
            } else {
                CHECK(ratio > 0.68);
                CHECK(ratio < 1.0);
            }
            ++rows;
        }
        CHECK(rows > 20);
    }
}
