#include "direction_set.hpp"

#include <cmath>
#include <stdexcept>

namespace crewdose::habitats {

std::vector<Vector3> fibonacci_directions(std::size_t count) {
    if (count == 0) {
        throw std::logic_error("fibonacci_directions: need at least one direction");
    }
    constexpr double kPi = 3.14159265358979323846;
    const double golden = 0.5 * (1.0 + std::sqrt(5.0));
    const double n = static_cast<double>(count);
    std::vector<Vector3> out;
    out.reserve(count);
    for (std::size_t i = 0; i < count; ++i) {
        const double di = static_cast<double>(i);
        const double z = 1.0 - (2.0 * di + 1.0) / n;
        const double r = std::sqrt(std::max(0.0, 1.0 - z * z));
        // Fractional part keeps the angle small, so large i loses no precision.
        const double turns = di / golden - std::floor(di / golden);
        const double phi = 2.0 * kPi * turns;
        out.push_back({r * std::cos(phi), r * std::sin(phi), z});
    }
    return out;
}

} // namespace crewdose::habitats
