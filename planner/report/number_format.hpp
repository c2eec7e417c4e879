#pragma once
#include <string>

namespace crewdose::planner {

/// `value` to `digits` significant figures for text reports: fixed notation from 0.001 to
/// 999999 (trailing zeros kept, so every figure shown is significant), scientific outside.
[[nodiscard]] std::string significant(double value, int digits);

/// `value` rounded to a whole number with its sign, for a change ("+3", "-12"): "0" when it
/// rounds to zero from either side, never "-0" or "+0".
[[nodiscard]] std::string signed_whole(double value);

/// `text` wrapped at `width` columns, its leading spaces kept on the first line, continuation
/// lines starting with `indent`; ends with a newline.
[[nodiscard]] std::string wrap(const std::string& text, std::size_t width,
                               const std::string& indent = "");

} // namespace crewdose::planner
