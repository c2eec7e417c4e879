#include "planner/scenario/number_parse.hpp"

#include <charconv>
#include <cmath>
#include <utility>

namespace crewdose::planner {

std::optional<double> parse_finite(std::string_view text) {
    double v = 0.0;
    const auto [ptr, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
    if (text.empty() || ec != std::errc() || ptr != text.data() + text.size() ||
        !std::isfinite(v)) {
        return std::nullopt;
    }
    return v;
}

std::optional<std::int64_t> parse_duration_s(std::string_view text) {
    static constexpr std::pair<std::string_view, double> kUnits[] = {
        {"min", 60.0}, {"s", 1.0}, {"h", 3600.0}, {"d", 86400.0}};
    // 1000 years: far beyond any mission, and exact in a double and in microseconds.
    constexpr double kMax_s = 1000.0 * 366.0 * 86400.0;
    for (const auto& [unit, seconds] : kUnits) {
        if (text.size() <= unit.size() || !text.ends_with(unit)) {
            continue;
        }
        const auto v = parse_finite(text.substr(0, text.size() - unit.size()));
        if (!v || !(*v >= 0.0) || !(*v * seconds <= kMax_s)) {
            return std::nullopt;
        }
        const double s = *v * seconds;
        // A whole number of seconds (to rounding: "0.1h" is 360 s).
        const double whole = std::round(s);
        if (std::abs(s - whole) > 1e-6) {
            return std::nullopt;
        }
        return static_cast<std::int64_t>(whole);
    }
    return std::nullopt;
}

std::vector<std::string_view> split_commas(std::string_view text) {
    std::vector<std::string_view> out;
    std::size_t start = 0;
    while (true) {
        const auto comma = text.find(',', start);
        if (comma == std::string_view::npos) {
            out.push_back(text.substr(start));
            return out;
        }
        out.push_back(text.substr(start, comma - start));
        start = comma + 1;
    }
}

} // namespace crewdose::planner
