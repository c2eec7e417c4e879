#include "number_format.hpp"

#include <fmt/format.h>

#include <cmath>

namespace crewdose::planner {

std::string significant(double value, int digits) {
    if (value == 0.0 || !std::isfinite(value)) {
        return fmt::format("{}", value);
    }
    // Round first, so that 999.96 at 4 figures becomes 1000 (exponent 3), not 999.96.
    const std::string sci = fmt::format("{:.{}e}", value, digits - 1);
    const double rounded = std::stod(sci);
    const int exponent = static_cast<int>(std::floor(std::log10(std::abs(rounded))));
    if (exponent < -3 || exponent > 5) {
        return sci;
    }
    const int decimals = std::max(0, digits - 1 - exponent);
    return fmt::format("{:.{}f}", rounded, decimals);
}

} // namespace crewdose::planner
