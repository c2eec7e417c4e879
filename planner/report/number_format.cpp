#include "planner/report/number_format.hpp"

#include "planner/study/result_guard.hpp"

#include <fmt/format.h>

#include <cmath>

namespace crewdose::planner {

std::string significant(double value, int digits) {
    // Nothing that was not computed reaches a report (result_guard.hpp).
    require_finite(value, "a number to print");
    if (value == 0.0) {
        return "0";
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

std::string signed_whole(double value) {
    require_finite(value, "a number to print");
    const double rounded = std::round(value);
    // -0.4 rounds to -0.0, which fmt prints as "-0".
    return rounded == 0.0 ? "0" : fmt::format("{:+.0f}", rounded);
}

std::string wrap(const std::string& text, std::size_t width, const std::string& indent) {
    const std::size_t lead = text.find_first_not_of(' ');
    if (lead == std::string::npos) {
        return text + "\n";
    }
    std::string out;
    std::string line = text.substr(0, lead);
    bool line_has_word = false;
    std::size_t start = lead;
    while (start < text.size()) {
        auto space = text.find(' ', start);
        if (space == std::string::npos) {
            space = text.size();
        }
        const std::string word = text.substr(start, space - start);
        start = space + 1;
        if (word.empty()) {
            continue;
        }
        if (line_has_word && line.size() + 1 + word.size() > width) {
            out += line + "\n";
            line = indent;
            line_has_word = false;
        }
        line += (line_has_word ? " " : "") + word;
        line_has_word = true;
    }
    return out + line + "\n";
}

} // namespace crewdose::planner
