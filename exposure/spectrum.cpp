#include "spectrum.hpp"

#include "parameter_error.hpp"
#include "particle.hpp"
#include "range_table.hpp"
#include "rigidity.hpp"
#include "units.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <string>

namespace crewdose::exposure {
namespace {

template <class... Ts> struct Overloaded : Ts... { using Ts::operator()...; };
template <class... Ts> Overloaded(Ts...) -> Overloaded<Ts...>;

// The energies a spectrum is evaluated at: the transport grid's (10 keV to 100 GeV).
constexpr EnergyGridSpec kSpectrumGrid{};
// Bounds of the plausible parameter ranges (see validate()).
constexpr double kMaxNormalisation = 1.0e20;
constexpr double kMaxSpectralIndex = 20.0;
constexpr double kMinRigidityScale_GV = 0.005;
constexpr double kMaxRigidityScale_GV = 10.0;

std::string number_text(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%g", v);
    return buf;
}

// A parameter in (lo, hi] (open_low) or [lo, hi]: finite by construction of the test.
void require_range(double value, double lo, double hi, const char* field, const char* unit,
                   bool open_low = true) {
    const bool ok = open_low ? (value > lo && value <= hi) : (value >= lo && value <= hi);
    if (!ok) {
        throw ParameterError(field, std::string("must be ") + (open_low ? "more than " : "from ") +
                                        number_text(lo) + (open_low ? " and at most " : " to ") +
                                        number_text(hi) + (*unit ? " " : "") + unit + ", got " +
                                        number_text(value));
    }
}

void require_positive(double value, const char* field) {
    require_range(value, 0.0, kMaxNormalisation, field, "");
}

// Plausible parameter ranges of the published forms (scenarios/README.md repeats them). Fitted
// SPE spectra lie well inside them (common practice); they keep every form finite on the
// transport grid, which check_values() then verifies.
void validate(const SpectrumForm& form) {
    std::visit(
        Overloaded{
            [](const BandRigidity& b) {
                require_positive(b.J0_per_cm2, "J0");
                require_range(b.R0_GV, kMinRigidityScale_GV, kMaxRigidityScale_GV, "R0_GV", "GV",
                              false);
                // gamma_a < 0 makes J(>R) rise with R at low rigidity: a negative
                // differential fluence.
                require_range(b.gamma_a, 0.0, kMaxSpectralIndex, "gamma_a", "", false);
                if (!(b.gamma_b > b.gamma_a && b.gamma_b <= kMaxSpectralIndex)) {
                    throw ParameterError("gamma_b", "must be greater than gamma_a and at "
                                                    "most " +
                                                        number_text(kMaxSpectralIndex) + ", got " +
                                                        number_text(b.gamma_b));
                }
            },
            [](const BandDifferentialRigidity& b) {
                require_positive(b.C_per_cm2_GV, "C");
                require_range(b.R0_GV, kMinRigidityScale_GV, kMaxRigidityScale_GV, "R0_GV", "GV",
                              false);
                require_range(b.gamma_a, 0.0, kMaxSpectralIndex, "gamma_a", "", false);
                // gamma_b <= 1 leaves J(>R) infinite: the high-rigidity tail never ends.
                if (!(b.gamma_b > b.gamma_a && b.gamma_b > 1.0 && b.gamma_b <= kMaxSpectralIndex)) {
                    throw ParameterError("gamma_b", "must be greater than gamma_a and than 1 "
                                                    "(a finite integral fluence) and at "
                                                    "most " +
                                                        number_text(kMaxSpectralIndex) + ", got " +
                                                        number_text(b.gamma_b));
                }
            },
            [](const WeibullEnergy& w) {
                require_positive(w.J0_per_cm2, "J0");
                require_range(w.k, 0.0, 100.0, "k", "MeV^-alpha");
                require_range(w.alpha, 0.0, 5.0, "alpha", "");
            },
            [](const ExponentialRigidity& e) {
                require_positive(e.J0_per_cm2, "J0");
                require_range(e.R0_GV, kMinRigidityScale_GV, kMaxRigidityScale_GV, "R0_GV", "GV",
                              false);
            },
            [](const ExponentialEnergy& e) {
                require_positive(e.J0_per_cm2, "J0");
                require_range(e.E0_MeV, 0.1, 1.0e4, "E0_MeV", "MeV", false);
            },
            [](const PowerLawEnergy& p) {
                require_positive(p.J0_per_cm2, "J0");
                require_range(p.gamma, 0.0, kMaxSpectralIndex, "gamma", "");
                require_range(p.E_ref_MeV, kSpectrumGrid.min_MeV_per_n, kSpectrumGrid.max_MeV_per_n,
                              "E_ref_MeV", "MeV", false);
            },
            [](const TabulatedIntegral& t) {
                if (t.energy_MeV.size() < 2 || t.energy_MeV.size() != t.J_per_cm2.size()) {
                    throw ParameterError("table", "needs at least two (energy, J) rows "
                                                  "of equal length");
                }
                for (std::size_t i = 0; i < t.energy_MeV.size(); ++i) {
                    require_range(t.energy_MeV[i], kSpectrumGrid.min_MeV_per_n,
                                  kSpectrumGrid.max_MeV_per_n, "energy_MeV", "MeV", false);
                    require_positive(t.J_per_cm2[i], "J");
                    if (i > 0 && !(t.energy_MeV[i] > t.energy_MeV[i - 1])) {
                        throw ParameterError("energy_MeV", "must increase strictly "
                                                           "down the table");
                    }
                    if (i > 0 && !(t.J_per_cm2[i] < t.J_per_cm2[i - 1])) {
                        throw ParameterError("J", "an integral fluence J(>E) must "
                                                  "decrease strictly with energy");
                    }
                    if (i > 0) {
                        // Each segment is a power law, extended beyond the table: its
                        // index obeys the power form's bound.
                        const double index = -std::log(t.J_per_cm2[i] / t.J_per_cm2[i - 1]) /
                                             std::log(t.energy_MeV[i] / t.energy_MeV[i - 1]);
                        if (!(index <= kMaxSpectralIndex)) {
                            throw ParameterError(
                                "J", "falls faster than E^-" + number_text(kMaxSpectralIndex) +
                                         " between " + number_text(t.energy_MeV[i - 1]) + " and " +
                                         number_text(t.energy_MeV[i]) + " MeV (index " +
                                         number_text(index) + "); no SPE spectrum is that steep");
                        }
                    }
                }
            },
        },
        form);
}

// J(>R) of the Band form and -dJ/dR.
struct IntegralAndSlope {
    double J;
    double minus_dJ;
};

IntegralAndSlope band(const BandRigidity& b, double R) {
    const double R_break = (b.gamma_b - b.gamma_a) * b.R0_GV;
    if (R <= R_break) {
        const double J = b.J0_per_cm2 * std::pow(R, -b.gamma_a) * std::exp(-R / b.R0_GV);
        return {J, J * (b.gamma_a / R + 1.0 / b.R0_GV)};
    }
    const double J = b.J0_per_cm2 * std::pow(R, -b.gamma_b) *
                     std::pow(R_break, b.gamma_b - b.gamma_a) * std::exp(b.gamma_a - b.gamma_b);
    return {J, J * b.gamma_b / R};
}

// The 8-point Gauss-Legendre rule on [-1, 1]: nodes by Newton's method on P_n (no tabulated
// constants), weights 2 / ((1 - x^2) P_n'(x)^2).
struct GaussLegendre8 {
    static constexpr std::size_t kN = 8;
    std::array<double, kN> x{};
    std::array<double, kN> w{};
    GaussLegendre8() {
        const double n = static_cast<double>(kN);
        for (std::size_t i = 0; i < kN; ++i) {
            double z = std::cos(kPi * (static_cast<double>(i) + 0.75) / (n + 0.5));
            double dp = 0.0;
            for (int it = 0; it < 100; ++it) {
                double p0 = 1.0;
                double p1 = z;
                for (std::size_t k = 2; k <= kN; ++k) {
                    const double kd = static_cast<double>(k);
                    const double p2 = ((2.0 * kd - 1.0) * z * p1 - (kd - 1.0) * p0) / kd;
                    p0 = p1;
                    p1 = p2;
                }
                dp = n * (z * p1 - p0) / (z * z - 1.0);
                const double step = p1 / dp;
                z -= step;
                if (std::abs(step) < 1e-15) {
                    break;
                }
            }
            x[i] = z;
            w[i] = 2.0 / ((1.0 - z * z) * dp * dp);
        }
    }
};

// dJ/dR of the differential Band form at R (GV).
double band_differential_dJdR(const BandDifferentialRigidity& b, double R) {
    const double R_break = (b.gamma_b - b.gamma_a) * b.R0_GV;
    if (R <= R_break) {
        return b.C_per_cm2_GV * std::pow(R, -b.gamma_a) * std::exp(-R / b.R0_GV);
    }
    return b.C_per_cm2_GV * std::pow(R, -b.gamma_b) * std::pow(R_break, b.gamma_b - b.gamma_a) *
           std::exp(b.gamma_a - b.gamma_b);
}

// J(>R) of the differential Band form: the power-law tail in closed form, the part below the
// break by composite Gauss-Legendre in u = ln R (integrand R dJ/dR, smooth), panels at most
// 0.125 wide (the integrand changes by at most a factor e^2.5 across one for gamma_a <= 20).
double band_differential_J(const BandDifferentialRigidity& b, double R) {
    const double R_break = (b.gamma_b - b.gamma_a) * b.R0_GV;
    const double tail_from = std::max(R, R_break);
    const double tail = band_differential_dJdR(b, tail_from) * tail_from / (b.gamma_b - 1.0);
    if (R >= R_break) {
        return tail;
    }
    static const GaussLegendre8 rule;
    const double u0 = std::log(R);
    const double u1 = std::log(R_break);
    const int panels = std::max(1, static_cast<int>(std::ceil((u1 - u0) / 0.125)));
    const double h = (u1 - u0) / panels;
    double sum = 0.0;
    for (int p = 0; p < panels; ++p) {
        const double mid = u0 + (static_cast<double>(p) + 0.5) * h;
        for (std::size_t i = 0; i < GaussLegendre8::kN; ++i) {
            const double r = std::exp(mid + 0.5 * h * rule.x[i]);
            sum += 0.5 * h * rule.w[i] * r * band_differential_dJdR(b, r);
        }
    }
    return sum + tail;
}

// J(>E) and -dJ/dE of any form at energy E (MeV), before scaling; `with_integral` false skips
// J where it is costly (the differential Band form), returning J = 0.
IntegralAndSlope evaluate(const SpectrumForm& form, double E, bool with_integral = true) {
    const Particle& p = proton();
    return std::visit(
        Overloaded{
            [&](const BandRigidity& b) {
                const auto r = band(b, rigidity_GV(p, E));
                return IntegralAndSlope{r.J, r.minus_dJ * rigidity_per_energy_GV_per_MeV_n(p, E)};
            },
            [&](const BandDifferentialRigidity& b) {
                const double R = rigidity_GV(p, E);
                return IntegralAndSlope{with_integral ? band_differential_J(b, R) : 0.0,
                                        band_differential_dJdR(b, R) *
                                            rigidity_per_energy_GV_per_MeV_n(p, E)};
            },
            [&](const WeibullEnergy& w) {
                const double J = w.J0_per_cm2 * std::exp(-w.k * std::pow(E, w.alpha));
                return IntegralAndSlope{J, J * w.k * w.alpha * std::pow(E, w.alpha - 1.0)};
            },
            [&](const ExponentialRigidity& e) {
                const double J = e.J0_per_cm2 * std::exp(-rigidity_GV(p, E) / e.R0_GV);
                return IntegralAndSlope{J, J / e.R0_GV * rigidity_per_energy_GV_per_MeV_n(p, E)};
            },
            [&](const ExponentialEnergy& e) {
                const double J = e.J0_per_cm2 * std::exp(-E / e.E0_MeV);
                return IntegralAndSlope{J, J / e.E0_MeV};
            },
            [&](const PowerLawEnergy& pl) {
                const double J = pl.J0_per_cm2 * std::pow(E / pl.E_ref_MeV, -pl.gamma);
                return IntegralAndSlope{J, J * pl.gamma / E};
            },
            [&](const TabulatedIntegral& t) {
                // Log-log linear inside the table, the end segments' power laws outside.
                const auto& x = t.energy_MeV;
                const auto& y = t.J_per_cm2;
                std::size_t i = 0;
                while (i + 2 < x.size() && E > x[i + 1]) {
                    ++i;
                }
                const double slope = std::log(y[i + 1] / y[i]) / std::log(x[i + 1] / x[i]);
                const double J = y[i] * std::pow(E / x[i], slope);
                return IntegralAndSlope{J, -slope * J / E};
            },
        },
        form);
}

} // namespace

ProtonSpectrum::ProtonSpectrum(SpectrumForm form, FitRange fit_range)
    : form_(std::move(form)), fit_range_(fit_range) {
    validate(form_);
    if (!(fit_range_.min_MeV >= kSpectrumGrid.min_MeV_per_n) ||
        !(fit_range_.max_MeV > fit_range_.min_MeV) ||
        !(fit_range_.max_MeV <= kSpectrumGrid.max_MeV_per_n)) {
        throw ParameterError("fit_range", "needs " + number_text(kSpectrumGrid.min_MeV_per_n) +
                                              " <= fit_min_MeV < fit_max_MeV <= " +
                                              number_text(kSpectrumGrid.max_MeV_per_n) + " MeV");
    }
    check_values();
}

void ProtonSpectrum::check_values() const {
    // Every energy the transport grid can ask for, 8 per decade, and the fit range's ends.
    const double decades = std::log10(kSpectrumGrid.max_MeV_per_n / kSpectrumGrid.min_MeV_per_n);
    const int n = static_cast<int>(std::lround(8.0 * decades));
    for (int i = 0; i <= n + 2; ++i) {
        const double E = i == n + 1 ? fit_range_.min_MeV
                         : i == n + 2
                             ? fit_range_.max_MeV
                             : kSpectrumGrid.min_MeV_per_n * std::pow(10.0, decades * i / n);
        const auto v = evaluate(form_, E);
        const double J = scale_ * v.J;
        const double dJ = scale_ * v.minus_dJ;
        if (!std::isfinite(J) || !std::isfinite(dJ) || J < 0.0 || dJ < 0.0) {
            throw ParameterError("spectrum", "does not give a finite, non-negative fluence at " +
                                                 number_text(E) + " MeV (J(>E) = " +
                                                 number_text(J) + ", -dJ/dE = " + number_text(dJ) +
                                                 "); the parameters are outside what the form can "
                                                 "represent on 0.01 MeV to 100 GeV");
        }
    }
    const double in_fit =
        integral_fluence_per_cm2(fit_range_.min_MeV) - integral_fluence_per_cm2(fit_range_.max_MeV);
    if (!(in_fit > 0.0)) {
        throw ParameterError("spectrum", "has no fluence inside its fit range (" +
                                             number_text(fit_range_.min_MeV) + " to " +
                                             number_text(fit_range_.max_MeV) + " MeV)");
    }
    const double above_10 = integral_fluence_per_cm2(10.0);
    if (!(above_10 <= kMaxFluenceAbove10MeV_per_cm2)) {
        throw ParameterError(
            "spectrum", "gives J(>10 MeV) = " + number_text(above_10) + " protons/cm2, above " +
                            number_text(kMaxFluenceAbove10MeV_per_cm2) +
                            ", about a thousand times the largest events on record; "
                            "check the units of J0 and of scale_to");
    }
}

double ProtonSpectrum::integral_fluence_per_cm2(double energy_MeV) const {
    return scale_ * evaluate(form_, energy_MeV).J;
}

double ProtonSpectrum::differential_fluence_per_cm2_MeV(double energy_MeV) const {
    return scale_ * evaluate(form_, energy_MeV, false).minus_dJ;
}

ProtonSpectrum ProtonSpectrum::scaled_to(double fluence_per_cm2, double energy_MeV) const {
    require_range(fluence_per_cm2, 0.0, kMaxFluenceAbove10MeV_per_cm2, "scale_to fluence",
                  "protons/cm2");
    require_range(energy_MeV, kSpectrumGrid.min_MeV_per_n, kSpectrumGrid.max_MeV_per_n,
                  "scale_to energy", "MeV", false);
    const double J = evaluate(form_, energy_MeV).J;
    if (!(J > 0.0) || !std::isfinite(J)) {
        throw ParameterError("scale_to", "the spectrum's J(>" + number_text(energy_MeV) +
                                             " MeV) is " + number_text(J) +
                                             ": it cannot be scaled there");
    }
    ProtonSpectrum copy = *this;
    copy.scale_ = fluence_per_cm2 / J;
    copy.check_values();
    return copy;
}

double omnidirectional_from_per_sr(double fluence_per_cm2_sr) {
    return 4.0 * kPi * fluence_per_cm2_sr;
}

} // namespace crewdose::exposure
