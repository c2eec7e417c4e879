#include "density_effect.hpp"

#include <cmath>

namespace crewdose::exposure {

namespace {
constexpr double kTwoLn10 = 4.605170185988091;
}

double SternheimerParameters::delta(double x) const noexcept {
    if (x >= x1) {
        return kTwoLn10 * x - c_bar;
    }
    if (x >= x0) {
        return kTwoLn10 * x - c_bar + a * std::pow(x1 - x, m);
    }
    return delta0 > 0.0 ? delta0 * std::pow(10.0, 2.0 * (x - x0)) : 0.0;
}

SternheimerParameters sternheimer_peierls(double mean_excitation_eV, double plasma_energy_eV,
                                          bool gas) {
    // Sternheimer & Peierls 1971: C = 2 ln(I / h-bar omega_p) + 1, then (X0, X1) from the
    // table of C ranges (solids/liquids split at I = 100 eV; gases by C), m = 3.
    const double c_bar = 2.0 * std::log(mean_excitation_eV / plasma_energy_eV) + 1.0;
    double x0 = 0.0;
    double x1 = 0.0;
    if (!gas) {
        if (mean_excitation_eV < 100.0) {
            x1 = 2.0;
            x0 = c_bar < 3.681 ? 0.2 : 0.326 * c_bar - 1.0;
        } else {
            x1 = 3.0;
            x0 = c_bar < 5.215 ? 0.2 : 0.326 * c_bar - 1.5;
        }
    } else {
        x1 = 4.0;
        if (c_bar < 10.0) {
            x0 = 1.6;
        } else if (c_bar < 10.5) {
            x0 = 1.7;
        } else if (c_bar < 11.0) {
            x0 = 1.8;
        } else if (c_bar < 11.5) {
            x0 = 1.9;
        } else if (c_bar < 12.25) {
            x0 = 2.0;
        } else if (c_bar < 13.804) {
            x0 = 2.0;
            x1 = 5.0;
        } else {
            x0 = 0.326 * c_bar - 2.5;
            x1 = 5.0;
        }
    }
    constexpr double m = 3.0;
    const double a = (c_bar - kTwoLn10 * x0) / std::pow(x1 - x0, m);
    return SternheimerParameters{c_bar, x0, x1, a, m, 0.0};
}

} // namespace crewdose::exposure
