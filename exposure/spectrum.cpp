#include "spectrum.hpp"

#include "parameter_error.hpp"
#include "particle.hpp"
#include "rigidity.hpp"
#include "units.hpp"

#include <cmath>
#include <string>

namespace crewdose::exposure {
namespace {

template <class... Ts> struct Overloaded : Ts... { using Ts::operator()...; };
template <class... Ts> Overloaded(Ts...) -> Overloaded<Ts...>;

void require_positive(double value, const char* field) {
    if (!(value > 0.0) || !std::isfinite(value)) {
        throw ParameterError(field, "must be a finite number > 0, got " + std::to_string(value));
    }
}

void validate(const SpectrumForm& form) {
    std::visit(Overloaded{
                   [](const BandRigidity& b) {
                       require_positive(b.J0_per_cm2, "J0");
                       require_positive(b.R0_GV, "R0_GV");
                       if (!std::isfinite(b.gamma_a)) {
                           throw ParameterError("gamma_a", "must be a finite number");
                       }
                       if (!(b.gamma_b > b.gamma_a) || !std::isfinite(b.gamma_b)) {
                           throw ParameterError("gamma_b", "must be finite and greater than "
                                                           "gamma_a");
                       }
                   },
                   [](const WeibullEnergy& w) {
                       require_positive(w.J0_per_cm2, "J0");
                       require_positive(w.k, "k");
                       require_positive(w.alpha, "alpha");
                   },
                   [](const ExponentialRigidity& e) {
                       require_positive(e.J0_per_cm2, "J0");
                       require_positive(e.R0_GV, "R0_GV");
                   },
                   [](const ExponentialEnergy& e) {
                       require_positive(e.J0_per_cm2, "J0");
                       require_positive(e.E0_MeV, "E0_MeV");
                   },
                   [](const PowerLawEnergy& p) {
                       require_positive(p.J0_per_cm2, "J0");
                       require_positive(p.gamma, "gamma");
                       require_positive(p.E_ref_MeV, "E_ref_MeV");
                   },
                   [](const TabulatedIntegral& t) {
                       if (t.energy_MeV.size() < 2 || t.energy_MeV.size() != t.J_per_cm2.size()) {
                           throw ParameterError("table", "needs at least two (energy, J) rows "
                                                         "of equal length");
                       }
                       for (std::size_t i = 0; i < t.energy_MeV.size(); ++i) {
                           require_positive(t.energy_MeV[i], "energy_MeV");
                           require_positive(t.J_per_cm2[i], "J");
                           if (i > 0 && !(t.energy_MeV[i] > t.energy_MeV[i - 1])) {
                               throw ParameterError("energy_MeV", "must increase strictly "
                                                                  "down the table");
                           }
                           if (i > 0 && !(t.J_per_cm2[i] < t.J_per_cm2[i - 1])) {
                               throw ParameterError("J", "an integral fluence J(>E) must "
                                                         "decrease strictly with energy");
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

// J(>E) and -dJ/dE of any form at energy E (MeV), before scaling.
IntegralAndSlope evaluate(const SpectrumForm& form, double E) {
    const Particle& p = proton();
    return std::visit(
        Overloaded{
            [&](const BandRigidity& b) {
                const auto r = band(b, rigidity_GV(p, E));
                return IntegralAndSlope{r.J, r.minus_dJ * rigidity_per_energy_GV_per_MeV_n(p, E)};
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
    if (!(fit_range_.min_MeV > 0.0) || !(fit_range_.max_MeV > fit_range_.min_MeV)) {
        throw ParameterError("fit_range", "needs 0 < min_MeV < max_MeV");
    }
}

double ProtonSpectrum::integral_fluence_per_cm2(double energy_MeV) const {
    return scale_ * evaluate(form_, energy_MeV).J;
}

double ProtonSpectrum::differential_fluence_per_cm2_MeV(double energy_MeV) const {
    return scale_ * evaluate(form_, energy_MeV).minus_dJ;
}

ProtonSpectrum ProtonSpectrum::scaled_to(double fluence_per_cm2, double energy_MeV) const {
    require_positive(fluence_per_cm2, "fluence");
    require_positive(energy_MeV, "energy_MeV");
    ProtonSpectrum copy = *this;
    copy.scale_ = fluence_per_cm2 / evaluate(form_, energy_MeV).J;
    return copy;
}

double omnidirectional_from_per_sr(double fluence_per_cm2_sr) {
    return 4.0 * kPi * fluence_per_cm2_sr;
}

} // namespace crewdose::exposure
