#include "planner/scenario/number_parse.hpp"

#include <charconv>
#include <cmath>

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
