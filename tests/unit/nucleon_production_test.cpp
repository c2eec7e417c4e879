// Light-particle production by nucleons: conservation, continuity, charge symmetry, and the
// neutron yields against measured (p,xn) spectra (EXFOR, tests/data/exfor).
#include "exposure/element.hpp"
#include "exposure/nuclear.hpp"
#include "exposure/nucleon_production.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

using namespace crewdose::exposure;

namespace {

double neutrons_between(const ReactionYield& y, double lo, double hi) {
    const auto e = yield_edges_MeV();
    const auto n = static_cast<std::size_t>(LightParticle::neutron);
    double s = 0.0;
    for (std::size_t i = 0; i + 1 < e.size(); ++i) {
        const double a = std::max(lo, e[i]);
        const double b = std::min(hi, e[i + 1]);
        if (b > a) {
            s += (y.forward[n][i] + y.backward[n][i]) * (b - a) / (e[i + 1] - e[i]);
        }
    }
    return s;
}

struct Measured {
    std::vector<double> E;
    std::vector<double> dsdE; // mb/MeV, mean of the two angular integrations
};

Measured read_exfor(const std::string& name) {
    std::ifstream in(std::string(CREWDOSE_SOURCE_DIR) + "/tests/data/exfor/" + name);
    REQUIRE(in);
    Measured m;
    std::string line;
    bool header = true;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') {
            continue;
        }
        if (header) {
            header = false; // E_MeV,dsig_dE_lin,dsig_dE_exp,...
            continue;
        }
        std::stringstream s(line);
        std::string a, b, c;
        std::getline(s, a, ',');
        std::getline(s, b, ',');
        std::getline(s, c, ',');
        m.E.push_back(std::stod(a));
        m.dsdE.push_back(0.5 * (std::stod(b) + std::stod(c)));
    }
    return m;
}

} // namespace

TEST_CASE("nucleon reactions conserve energy and charge, per reaction", "[production]") {
    // By construction (nucleon_production.hpp: the closure), to 1e-6.
    for (const int Z : {2, 3, 6, 7, 8, 11, 13, 14, 20, 22, 26, 29, 74, 82}) {
        for (const bool neutron : {false, true}) {
            for (const double E : {2.0, 10.0, 25.0, 60.0, 149.0, 150.0, 151.0, 200.0, 249.9, 250.0,
                                   1000.0, 1e4, 1e5}) {
                const ReactionYield y = nucleon_reaction_yield(Z, neutron, E);
                INFO("Z " << Z << (neutron ? " n " : " p ") << E << " MeV");
                const double sum = y.light_MeV() + y.recoil_MeV + y.other_MeV;
                CHECK(std::abs(sum - y.available_MeV) <= 1e-6 * std::max(1.0, y.available_MeV));
                CHECK(y.available_MeV == Approx(std::max(0.0, E + y.q_MeV)).margin(1e-12));
                CHECK(std::abs(y.light_charge() + y.residual_charge - y.charge_in) <= 1e-9);
                CHECK(y.residual_charge >= 0.0);
                CHECK(y.recoil_MeV >= 0.0);
                CHECK(y.other_MeV >= 0.0);
                for (std::size_t j = 0; j < kLightParticles; ++j) {
                    for (std::size_t i = 0; i < y.forward[j].size(); ++i) {
                        REQUIRE(std::isfinite(y.forward[j][i]));
                        REQUIRE(y.forward[j][i] >= 0.0);
                        REQUIRE(y.backward[j][i] >= 0.0);
                    }
                }
            }
        }
    }
}

TEST_CASE("the evaluated range, the blend and the fit join without a step", "[production]") {
    // By construction: the blend is linear between the table's top and the fit at 250 MeV.
    for (const int Z : {8, 13, 26}) {
        const auto a = nucleon_reaction_yield(Z, false, 150.0);
        const auto b = nucleon_reaction_yield(Z, false, 150.0 + 1e-6);
        CHECK(neutrons_between(b, 0, 1e6) == Approx(neutrons_between(a, 0, 1e6)).epsilon(1e-5));
        const auto c = nucleon_reaction_yield(Z, false, 250.0 - 1e-6);
        const auto d = nucleon_reaction_yield(Z, false, 250.0);
        CHECK(neutrons_between(c, 0, 1e6) == Approx(neutrons_between(d, 0, 1e6)).epsilon(1e-5));
    }
}

TEST_CASE("charge symmetry: a neutron on oxygen emits what a proton does, n and p exchanged",
          "[production]") {
    // By construction: ENDF/B-VIII.1 has no usable n + O-16 file here, so the mirror is used.
    const auto p = nucleon_reaction_yield(8, false, 60.0);
    const auto n = nucleon_reaction_yield(8, true, 60.0);
    const auto N = static_cast<std::size_t>(LightParticle::neutron);
    const auto P = static_cast<std::size_t>(LightParticle::proton);
    for (std::size_t i = 0; i < p.forward[N].size(); ++i) {
        CHECK(n.forward[N][i] == Approx(p.forward[P][i]).margin(1e-15));
        CHECK(n.forward[P][i] == Approx(p.forward[N][i]).margin(1e-15));
    }
    CHECK(n.charge_in == 8.0);
    CHECK(p.charge_in == 9.0);
}

TEST_CASE("neutron production against measured (p,xn) spectra, within 30 %", "[production]") {
    // Source: EXFOR double-differential (p,xn) data, angle-integrated by
    // scripts/data/exfor/angle_integrate.py (tests/data/exfor; each file names its entry):
    // Meier et al. (113 and 256 MeV; C0171003/5, C0168005-7), Amian et al. (597 and 800 MeV;
    // C0169007, C0170004/7/8/11), Leray et al. (1.2 GeV; O0977006), Ishibashi et al. (3 GeV;
    // E1762050-055, E1762086-091). The 113 MeV sets test the evaluated tables (ENDF/B-VIII.1),
    // the rest the fit; Amian 597 MeV and Leray 1.2 GeV were held out of the fit.
    struct Set {
        const char* file;
        int Z;
        double E;
    };
    for (const Set& s : {Set{"p-C000-Meier-C0171003-E0113.csv", 6, 113.0},
                         Set{"p-Al027-Meier-C0171005-E0113.csv", 13, 113.0},
                         Set{"p-Al027-Meier-C0168005-E0256.csv", 13, 256.0},
                         Set{"p-Fe000-Meier-C0168006-E0256.csv", 26, 256.0},
                         Set{"p-Pb000-Meier-C0168007-E0256.csv", 82, 256.0},
                         Set{"p-Al027-Amian-C0169007-E0597.csv", 13, 597.0},
                         Set{"p-C000-Amian-C0170004-E0800.csv", 6, 800.0},
                         Set{"p-Al027-Amian-C0170007-E0800.csv", 13, 800.0},
                         Set{"p-Fe000-Amian-C0170008-E0800.csv", 26, 800.0},
                         Set{"p-Pb000-Amian-C0170011-E0800.csv", 82, 800.0},
                         Set{"p-Fe000-Leray-O0977006-E1200.csv", 26, 1200.0},
                         Set{"p-Fe000-Ishibashi-E1762050-055-E3000.csv", 26, 3000.0},
                         Set{"p-Pb000-Ishibashi-E1762086-091-E3000.csv", 82, 3000.0}}) {
        const Measured m = read_exfor(s.file);
        const double A = element_by_Z(s.Z)->atomic_mass_g_mol;
        const double sigma = proton_reaction_cross_section_mb(s.Z, A, s.E);
        const auto y = nucleon_reaction_yield(s.Z, false, s.E);
        for (const double lo : {m.E.front(), 20.0}) {
            // The evaluated p + Al file gives 0.62 of Meier's neutrons above 20 MeV at 113 MeV
            // (its total above 0.68 MeV is 0.88 of theirs); crewdose keeps the evaluation below
            // 150 MeV and this check records the difference instead of hiding it.
            const bool al_113_fast = s.Z == 13 && s.E < 150.0 && lo == 20.0;
            const double hi = std::min(m.E.back(), 0.95 * s.E);
            double measured = 0.0;
            for (std::size_t i = 0; i + 1 < m.E.size(); ++i) {
                if (m.E[i] >= lo && m.E[i + 1] <= hi) {
                    measured += 0.5 * (m.dsdE[i] + m.dsdE[i + 1]) * (m.E[i + 1] - m.E[i]);
                }
            }
            const double model = sigma * neutrons_between(y, lo, hi);
            INFO(s.file << " above " << lo << " MeV: model " << model << " mb, measured "
                        << measured << " mb");
            if (al_113_fast) {
                CHECK(model / measured > 0.5);
                CHECK(model / measured < 0.75);
            } else {
                CHECK(model == Approx(measured).epsilon(0.30));
            }
        }
    }
}

TEST_CASE("forward shares and the fit's neutron spectrum are sane", "[production]") {
    // Cascade neutrons above 100 MeV go mostly forward, evaporation ones about evenly
    // (common practice; the fit's table comes from the EXFOR sets).
    const auto y = nucleon_reaction_yield(26, false, 1000.0);
    const auto e = yield_edges_MeV();
    const auto N = static_cast<std::size_t>(LightParticle::neutron);
    for (std::size_t i = 0; i + 1 < e.size(); ++i) {
        const double all = y.forward[N][i] + y.backward[N][i];
        if (all <= 0.0) {
            continue;
        }
        const double f = y.forward[N][i] / all;
        CHECK(f >= 0.0);
        CHECK(f <= 1.0);
        if (e[i] > 200.0 && e[i + 1] < 1000.0) {
            CHECK(f > 0.85);
        }
    }
    CHECK(fitted_neutron_spectrum_per_MeV(56.0, 1000.0, 2000.0) <
          1e-3 * fitted_neutron_spectrum_per_MeV(56.0, 1000.0, 3.0));
}
