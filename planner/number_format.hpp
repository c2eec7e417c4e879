#pragma once
#include <string>

namespace crewdose::planner {

/// `value` to `digits` significant figures for text reports: fixed notation from 0.001 to
/// 999999 (trailing zeros kept, so every figure shown is significant), scientific outside.
[[nodiscard]] std::string significant(double value, int digits);

} // namespace crewdose::planner
