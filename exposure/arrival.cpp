#include "arrival.hpp"

#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {

double parker_spiral_length_AU(double r, double wind_km_s) {
    if (!(r > 0.0) || !(wind_km_s > 0.0)) {
        throw std::logic_error("parker_spiral_length_AU: need r > 0 and a wind speed > 0");
    }
    constexpr double kPi = 3.14159265358979323846;
    constexpr double kKm_per_AU = 149597870.7;
    const double omega_per_s = 2.0 * kPi / (25.38 * 86400.0); // sidereal rotation (Carrington)
    const double a = wind_km_s / omega_per_s / kKm_per_AU;    // AU
    const double theta = r / a;
    return 0.5 * a * (theta * std::sqrt(1.0 + theta * theta) + std::asinh(theta));
}

double scatter_free_delay_h(double E, double path_AU, double r_AU, double m) {
    if (!(E > 0.0) || !(path_AU >= r_AU) || !(r_AU > 0.0)) {
        throw std::logic_error("scatter_free_delay_h: need E > 0 and path >= distance > 0");
    }
    const double gamma = 1.0 + E / m;
    const double beta = std::sqrt(1.0 - 1.0 / (gamma * gamma));
    return (path_AU / beta - r_AU) * kLightSeconds_per_AU / 3600.0;
}

} // namespace crewdose::exposure
