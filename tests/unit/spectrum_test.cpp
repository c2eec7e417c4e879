#include "exposure/parameter_error.hpp"
#include "exposure/particle.hpp"
#include "exposure/rigidity.hpp"
#include "exposure/spectrum.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <string>

using namespace crewdose::exposure;

namespace {

// Demo parameters (invented, not a real event).
const BandRigidity kDemoBand{1.0e10, 1.1, 3.5, 0.25};
const FitRange kWide{10.0, 1000.0};

// Integral of phi dE from a to b by Simpson's rule in ln E (2000 intervals).
double integrate_phi(const ProtonSpectrum& s, double a, double b) {
    const int n = 2000;
    const double h = std::log(b / a) / n;
    double sum = 0.0;
    for (int i = 0; i <= n; ++i) {
        const double E = a * std::exp(i * h);
        const double w = (i == 0 || i == n) ? 1.0 : (i % 2 == 1 ? 4.0 : 2.0);
        sum += w * E * s.differential_fluence_per_cm2_MeV(E);
    }
    return sum * h / 3.0;
}

std::string error_field(const SpectrumForm& f) {
    try {
        const ProtonSpectrum s(f, kWide);
    } catch (const ParameterError& e) {
        return e.field();
    }
    return "no error";
}

} // namespace

TEST_CASE("rigidity and energy convert both ways", "[spectrum]") {
    // Analytic: a 1 GeV proton has p c = sqrt(T (T + 2 m)) = 1696.0 MeV, so R = 1.696 GV.
    CHECK(rigidity_GV(proton(), 1000.0) == Approx(1.69604).epsilon(1e-5));
    for (double E : {0.01, 1.0, 100.0, 1.0e4, 1.0e5}) {
        for (const Particle& p : {proton(), alpha(), *particle_by_name("iron")}) {
            CHECK(energy_MeV_per_n_from_rigidity(p, rigidity_GV(p, E)) == Approx(E).epsilon(1e-12));
            // The Jacobian against a central difference (by construction).
            const double h = E * 1e-5;
            const double fd = (rigidity_GV(p, E + h) - rigidity_GV(p, E - h)) / (2.0 * h);
            CHECK(rigidity_per_energy_GV_per_MeV_n(p, E) == Approx(fd).epsilon(1e-7));
        }
    }
    // A / Z = 2 doubles the rigidity at equal velocity (common practice; exact here because
    // alpha and proton at the same energy per nucleon differ only by mass per nucleon).
    const double ratio = rigidity_GV(alpha(), 100.0) / rigidity_GV(proton(), 100.0);
    CHECK(ratio == Approx(2.0).epsilon(1e-2));
}

TEST_CASE("the Band differential fluence integrates back to J(>E)", "[spectrum]") {
    // By construction: integral_E^Emax phi dE = J(>E) - J(>Emax). A wrong differential form
    // (a missing Jacobian, the wrong branch slope) fails this.
    const ProtonSpectrum s(kDemoBand, kWide);
    for (double E : {1.0, 10.0, 30.0, 100.0, 500.0}) {
        const double expected = s.integral_fluence_per_cm2(E) - s.integral_fluence_per_cm2(1.0e5);
        CHECK(integrate_phi(s, E, 1.0e5) == Approx(expected).epsilon(1e-6));
    }
}

TEST_CASE("the differential Band form: its J(>E) and its dJ/dR agree", "[spectrum]") {
    // Demo parameters (invented). J(>E) is the form's own numerical integral below the break;
    // phi is dJ/dR dR/dE in closed form. Both ways round, to the quadrature's accuracy:
    const BandDifferentialRigidity d{1.0e11, 0.6, 5.0, 0.07};
    const ProtonSpectrum s(d, kWide);
    // 1. phi integrated over E (Simpson in ln E, independent of the form's Gauss-Legendre)
    //    gives back J(>E) - J(>Emax), below and above the break (0.31 GV, 50 MeV).
    for (double E : {0.1, 1.0, 10.0, 30.0, 49.0, 52.0, 100.0, 500.0}) {
        INFO(E);
        const double expected = s.integral_fluence_per_cm2(E) - s.integral_fluence_per_cm2(1.0e5);
        CHECK(integrate_phi(s, E, 1.0e5) == Approx(expected).epsilon(1e-6));
    }
    // 2. -dJ/dE of the integral (central difference) is phi.
    for (double E : {0.05, 12.0, 50.0, 200.0, 5000.0}) {
        const double h = E * 1e-5;
        const double fd =
            -(s.integral_fluence_per_cm2(E + h) - s.integral_fluence_per_cm2(E - h)) / (2 * h);
        CHECK(s.differential_fluence_per_cm2_MeV(E) == Approx(fd).epsilon(1e-6));
    }
    // 3. Analytic: above the break J(>R) = C [(gb-ga) R0]^(gb-ga) e^(ga-gb) R^(1-gb) / (gb-1),
    //    and dJ/dR is C R^-ga e^(-R/R0) below it.
    const double R = 1.0;
    const double E = energy_MeV_per_n_from_rigidity(proton(), R);
    const double K = std::pow((d.gamma_b - d.gamma_a) * d.R0_GV, d.gamma_b - d.gamma_a) *
                     std::exp(d.gamma_a - d.gamma_b);
    CHECK(s.integral_fluence_per_cm2(E) ==
          Approx(d.C_per_cm2_GV * K * std::pow(R, 1.0 - d.gamma_b) / (d.gamma_b - 1.0))
              .epsilon(1e-12));
    const double R_low = 0.1;
    const double E_low = energy_MeV_per_n_from_rigidity(proton(), R_low);
    CHECK(s.differential_fluence_per_cm2_MeV(E_low) ==
          Approx(d.C_per_cm2_GV * std::pow(R_low, -d.gamma_a) * std::exp(-R_low / d.R0_GV) *
                 rigidity_per_energy_GV_per_MeV_n(proton(), E_low))
              .epsilon(1e-12));
    // 4. A steep low-rigidity index (gamma_a 19) still integrates back.
    const ProtonSpectrum steep(BandDifferentialRigidity{1.0e-6, 19.0, 20.0, 0.5}, kWide);
    for (double E2 : {10.0, 100.0}) {
        const double expected =
            steep.integral_fluence_per_cm2(E2) - steep.integral_fluence_per_cm2(1.0e5);
        CHECK(integrate_phi(steep, E2, 1.0e5) == Approx(expected).epsilon(1e-6));
    }
}

TEST_CASE("the Band function and its slope are continuous at the break", "[spectrum]") {
    // Analytic: the two branches meet with equal value and slope at R = (gb - ga) R0.
    const ProtonSpectrum s(kDemoBand, kWide);
    const double R_break = (kDemoBand.gamma_b - kDemoBand.gamma_a) * kDemoBand.R0_GV;
    const double E_break = energy_MeV_per_n_from_rigidity(proton(), R_break);
    const double below = E_break * (1.0 - 1e-9);
    const double above = E_break * (1.0 + 1e-9);
    CHECK(s.integral_fluence_per_cm2(above) ==
          Approx(s.integral_fluence_per_cm2(below)).epsilon(1e-7));
    CHECK(s.differential_fluence_per_cm2_MeV(above) ==
          Approx(s.differential_fluence_per_cm2_MeV(below)).epsilon(1e-7));
}

TEST_CASE("closed-form spectra have their closed-form differentials", "[spectrum]") {
    // Analytic: phi = -dJ/dE for each form, checked against a central difference.
    const std::vector<SpectrumForm> forms{WeibullEnergy{1e9, 0.8, 0.45},
                                          ExponentialRigidity{1e9, 0.1},
                                          ExponentialEnergy{1e9, 30.0},
                                          PowerLawEnergy{1e8, 2.5, 10.0},
                                          TabulatedIntegral{{10.0, 30.0, 100.0}, {1e9, 2e8, 1e7}},
                                          kDemoBand};
    for (const auto& f : forms) {
        const ProtonSpectrum s(f, kWide);
        for (double E : {12.0, 50.0, 200.0}) {
            const double h = E * 1e-6;
            const double fd =
                -(s.integral_fluence_per_cm2(E + h) - s.integral_fluence_per_cm2(E - h)) / (2 * h);
            CHECK(s.differential_fluence_per_cm2_MeV(E) == Approx(fd).epsilon(1e-6));
        }
    }
    // Analytic values: exponential in energy J(>E0) = J0 / e; power law J(>E_ref) = J0.
    CHECK(ProtonSpectrum(ExponentialEnergy{1e9, 30.0}, kWide).integral_fluence_per_cm2(30.0) ==
          Approx(1e9 / std::exp(1.0)).epsilon(1e-12));
    CHECK(ProtonSpectrum(PowerLawEnergy{1e8, 2.5, 10.0}, kWide).integral_fluence_per_cm2(10.0) ==
          Approx(1e8).epsilon(1e-12));
    // Tabulated: exact at the nodes, log-log between them.
    const ProtonSpectrum t(TabulatedIntegral{{10.0, 100.0}, {1e9, 1e7}}, kWide);
    CHECK(t.integral_fluence_per_cm2(std::sqrt(1000.0)) == Approx(1e8).epsilon(1e-12));
}

TEST_CASE("scaling keeps the shape and sets the fluence above an energy", "[spectrum]") {
    const ProtonSpectrum s(kDemoBand, kWide);
    const ProtonSpectrum big = s.scaled_to(1.0e10, 30.0);
    CHECK(big.integral_fluence_per_cm2(30.0) == Approx(1.0e10).epsilon(1e-12));
    const double k = big.integral_fluence_per_cm2(100.0) / s.integral_fluence_per_cm2(100.0);
    CHECK(big.differential_fluence_per_cm2_MeV(5.0) / s.differential_fluence_per_cm2_MeV(5.0) ==
          Approx(k).epsilon(1e-12));
    // By definition of an isotropic field: omnidirectional = 4 pi per steradian.
    CHECK(omnidirectional_from_per_sr(1.0) == Approx(12.566370614).epsilon(1e-10));
}

TEST_CASE("bad spectrum parameters name the parameter", "[spectrum]") {
    CHECK(error_field(BandRigidity{1e10, 3.5, 1.1, 0.25}) == "gamma_b");
    CHECK(error_field(BandRigidity{-1.0, 1.1, 3.5, 0.25}) == "J0");
    CHECK(error_field(BandRigidity{1e10, 1.1, 3.5, 0.0}) == "R0_GV");
    CHECK(error_field(BandDifferentialRigidity{1e10, 0.5, 0.9, 0.07}) == "gamma_b"); // J infinite
    CHECK(error_field(BandDifferentialRigidity{1e10, 3.0, 2.0, 0.07}) == "gamma_b");
    CHECK(error_field(BandDifferentialRigidity{0.0, 0.5, 5.7, 0.07}) == "C");
    CHECK(error_field(BandDifferentialRigidity{1e10, -0.1, 5.7, 0.07}) == "gamma_a");
    CHECK(error_field(BandDifferentialRigidity{1e10, 0.5, 5.7, 0.001}) == "R0_GV");
    CHECK(error_field(BandDifferentialRigidity{1e10, 0.5, 5.7, std::nan("")}) == "R0_GV");
    CHECK(error_field(WeibullEnergy{1e9, 0.0, 0.5}) == "k");
    CHECK(error_field(WeibullEnergy{1e9, 1.0, -0.5}) == "alpha");
    CHECK(error_field(ExponentialEnergy{1e9, std::nan("")}) == "E0_MeV");
    CHECK(error_field(PowerLawEnergy{1e9, 2.0, 0.0}) == "E_ref_MeV");
    CHECK(error_field(TabulatedIntegral{{10.0, 30.0}, {1e8, 2e8}}) == "J");
    CHECK(error_field(TabulatedIntegral{{30.0, 10.0}, {1e9, 1e8}}) == "energy_MeV");
    CHECK(error_field(TabulatedIntegral{{10.0}, {1e9}}) == "table");
    CHECK_THROWS_AS(ProtonSpectrum(kDemoBand, FitRange{100.0, 10.0}), ParameterError);
}
