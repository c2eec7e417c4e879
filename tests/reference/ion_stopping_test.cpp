// Heavy-ion electronic stopping against published tables: water, aluminium, silicon and
// polyethylene, ions Z = 3-18 from 0.1 MeV/u.
#include "exposure/material_library.hpp"
#include "exposure/stopping.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>
#include <tuple>
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

namespace {

struct Row {
    double E;
    int Z;
    double S;
};

// tests/data/icru73/icru73_ions_<target>.csv (scripts/data/icru73_tables.py): T, Z, S.
std::vector<Row> icru73_rows(const std::string& target) {
    std::ifstream in(std::string(CREWDOSE_SOURCE_DIR) + "/tests/data/icru73/icru73_ions_" + target +
                     ".csv");
    REQUIRE(in);
    std::vector<Row> rows;
    std::string line;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#' || line[0] == 'T') {
            continue;
        }
        std::stringstream ss(line);
        std::string e, z, v;
        std::getline(ss, e, ',');
        std::getline(ss, z, ',');
        std::getline(ss, v, ',');
        rows.push_back({std::stod(e), std::stoi(z), std::stod(v)});
    }
    return rows;
}

const Particle& ion_of(int Z) {
    for (const auto& p : particles()) {
        if (p.Z == Z) {
            return p;
        }
    }
    FAIL("no particle with Z = " << Z);
    throw std::logic_error("unreachable");
}

// Root mean square of ln(crewdose / ICRU 73) over the rows with lo <= E < hi, and the largest
// |ln| among them.
std::pair<double, double> log_error(const std::string& target, double lo, double hi) {
    const Material& m = *find_builtin_material(target);
    double sum = 0.0;
    double worst = 0.0;
    int n = 0;
    for (const Row& r : icru73_rows(target)) {
        if (r.E < lo || r.E >= hi) {
            continue;
        }
        const double l = std::log(electronic_stopping_MeV_cm2_g(m, ion_of(r.Z), r.E) / r.S);
        INFO(target << " Z = " << r.Z << " at " << r.E << " MeV/u: ln(crewdose / ICRU 73) " << l);
        CHECK(std::isfinite(l));
        sum += l * l;
        worst = std::max(worst, std::fabs(l));
        ++n;
    }
    REQUIRE(n > 0);
    return {std::sqrt(sum / n), worst};
}

} // namespace

TEST_CASE("ions Z = 3-18 in water against ICRU 73 from 0.1 MeV/u", "[ions]") {
    // Source: ICRU Report 73 (2005), revised water table (libdEdx ICRU73_NEW; provenance in
    // tests/data/icru73/icru73_ions_water.csv), 16 ions x 45 energies from 0.1 to 1000 MeV/u.
    // The effective charge is fitted to this table (stopping.hpp), so this checks the fit and
    // the model around it. With Barkas's effective charge the errors were: rms 10.6 %, worst
    // 33 % (carbon -29 % at 0.1 MeV/u, -12 % at 1; argon -12 % at 10). Measured now: rms 4.7 %
    // below 0.3 MeV/u (worst 12.8 %), 2.8 % from 0.3 to 10 (worst 7.3 %), 3.5 % from 10 to 20
    // (worst 6.4 %), 1.1 % from 20 (worst 4.5 %, argon and chlorine at 20 MeV/u).
    for (const auto& [lo, hi, rms_gate, worst_gate] :
         {std::tuple{0.1, 0.3, 0.06, 0.14}, std::tuple{0.3, 10.0, 0.035, 0.08},
          std::tuple{10.0, 20.0, 0.045, 0.075}, std::tuple{20.0, 1000.1, 0.015, 0.05}}) {
        const auto [rms, worst] = log_error("water", lo, hi);
        INFO(lo << "-" << hi << " MeV/u: rms " << rms << ", worst " << worst);
        CHECK(rms < rms_gate);
        CHECK(worst < worst_gate);
    }
}

TEST_CASE("ions Z = 3-18 in aluminium, silicon and polyethylene against ICRU 73, not fitted",
          "[ions]") {
    // Source: ICRU Report 73 (2005) as first printed (libdEdx ICRU73; provenance in
    // tests/data/icru73/), 16 ions x 45 energies from 0.1 to 1000 MeV/u; targets the
    // effective charge was not fitted to. With Barkas's effective charge the rms errors were
    // 9.6 % (aluminium), 9.5 % (silicon), 10.2 % (polyethylene); measured now 5.8 %, 5.3 %,
    // 3.2 %; the worst |ln| 0.193 (aluminium: oxygen at 0.1 MeV/u 18 % low, argon at 0.6 MeV/u
    // 18 % high: the proton scaling differs by target), 0.155 (silicon: argon at 0.7 MeV/u)
    // and 0.089 (polyethylene).
    for (const auto& [target, rms_gate, worst_gate] :
         {std::tuple{"aluminium", 0.07, 0.22}, std::tuple{"silicon", 0.065, 0.18},
          std::tuple{"polyethylene", 0.04, 0.11}}) {
        const auto [rms, worst] = log_error(target, 0.1, 1000.1);
        INFO(target << ": rms " << rms << ", worst " << worst);
        CHECK(rms < rms_gate);
        CHECK(worst < worst_gate);
    }
}
