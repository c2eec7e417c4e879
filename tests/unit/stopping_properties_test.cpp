#include "exposure/bethe.hpp"
#include "exposure/material_library.hpp"
#include "exposure/stopping.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace crewdose::exposure;

TEST_CASE("stopping power is continuous across the low-energy join", "[stopping]") {
    // Property: no step above 0.5 % anywhere, and in particular at both ends of the join
    // window, for protons and alphas in every built-in material.
    for (const auto& m : builtin_materials()) {
        for (const Particle& p : {proton(), alpha()}) {
            INFO(m.id() << " " << p.name);
            const JoinWindow w = join_window(m, p);
            for (double E : {w.low_MeV_per_n, w.high_MeV_per_n}) {
                const double below = electronic_stopping_MeV_cm2_g(m, p, E * (1.0 - 1e-9));
                const double above = electronic_stopping_MeV_cm2_g(m, p, E * (1.0 + 1e-9));
                CHECK(std::abs(above / below - 1.0) < 1e-6);
            }
            // A fine scan through the window: neighbouring points 0.1 % apart in energy differ
            // by far less than 0.5 %.
            double prev = electronic_stopping_MeV_cm2_g(m, p, w.low_MeV_per_n * 0.9);
            for (double E = w.low_MeV_per_n * 0.9; E < w.high_MeV_per_n * 1.1; E *= 1.001) {
                const double s = electronic_stopping_MeV_cm2_g(m, p, E);
                CHECK(std::abs(s / prev - 1.0) < 5e-3);
                prev = s;
            }
        }
    }
}

TEST_CASE("stopping power is finite and positive from 10 keV/n to 100 GeV/n", "[stopping]") {
    for (const auto& m : builtin_materials()) {
        for (const auto& p : particles()) {
            for (double E = 0.01; E <= 1.0e5; E *= 1.5) {
                const double s = electronic_stopping_MeV_cm2_g(m, p, E);
                INFO(m.id() << " " << p.name << " " << E);
                REQUIRE(std::isfinite(s));
                REQUIRE(s > 0.0);
            }
        }
    }
}

TEST_CASE("Bragg additivity: a mixture stops like the mass-weighted sum of its parts",
          "[stopping]") {
    // By construction, when every part uses Bragg-additive I and no density effect applies
    // (below ~200 MeV for these solids), the mixture's stopping power equals the mass-weighted
    // sum of its parts' in both the fit region and the Bethe region.
    auto make = [](std::string id, std::vector<ElementShare> comp) {
        MaterialSpec s;
        s.id = std::move(id);
        s.name = s.id;
        s.density_g_cm3 = 2.5;
        s.composition = std::move(comp);
        return Material(s);
    };
    const Material al = make("al", {{13, 1.0}});
    const Material si = make("si", {{14, 1.0}});
    const Material mix = make("mix", {{13, 0.3}, {14, 0.7}});
    for (double E : {0.05, 0.1, 3.0, 10.0, 100.0}) {
        INFO(E);
        const double sum = 0.3 * electronic_stopping_MeV_cm2_g(al, proton(), E) +
                           0.7 * electronic_stopping_MeV_cm2_g(si, proton(), E);
        // In the Bethe region ln I of the mix is the electron-weighted mean, so L is not
        // exactly the weighted L of the parts; the difference is second order (< 0.05 %).
        CHECK(electronic_stopping_MeV_cm2_g(mix, proton(), E) == Approx(sum).epsilon(5e-4));
    }
}

TEST_CASE("fast ions scale with z squared at equal velocity", "[stopping]") {
    // Analytic limit of the Bethe formula: at 1 GeV/n the effective-charge deficit vanishes and
    // S_ion / S_proton -> z^2, less the Bloch term -1.202 y^2 / L (y = z alpha / beta: 0.2 %
    // of L for carbon, 0.7 % for iron) and the small difference in mass per nucleon.
    const Material& w = *find_builtin_material("water");
    for (int Z : {2, 6, 26}) {
        const Particle ion = *particle_by_Z(Z);
        const double ratio = electronic_stopping_MeV_cm2_g(w, ion, 1000.0) /
                             electronic_stopping_MeV_cm2_g(w, proton(), 1000.0);
        CHECK(ratio / (Z * Z) == Approx(1.0).epsilon(Z < 10 ? 4e-3 : 1e-2));
    }
}

TEST_CASE("Bethe corrections behave as the theory says", "[stopping]") {
    // Analytic: the Bloch term tends to -zeta(3) y^2 = -1.2020569 y^2 for small y.
    CHECK(bloch_term(0.01) == Approx(-1.2020569 * 1e-4).epsilon(1e-4));
    // Analytic: for large y, -y^2 sum 1/(n(n^2+y^2)) -> -(gamma_E + ln y) (digamma asymptote).
    CHECK(bloch_term(50.0) == Approx(-(0.5772157 + std::log(50.0))).epsilon(1e-3));
    // The effective charge of a fast ion is its bare charge (Barkas 1963 form, analytic limit).
    const Particle fe = *particle_by_name("iron");
    CHECK(effective_charge(fe, 10000.0) == Approx(26.0).epsilon(1e-6));
    CHECK(effective_charge(fe, 1.0) < 20.0);
    CHECK(effective_charge(proton(), 0.01) == 1.0);
}
