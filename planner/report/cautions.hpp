#pragma once
#include <string>

namespace crewdose::planner {

/// The cautions every dose report carries, one per line.
[[nodiscard]] std::string caution_text();

} // namespace crewdose::planner
