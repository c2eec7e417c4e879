#pragma once
#include <string>

namespace crewdose::planner {

/// The cautions every dose report carries, one per line.
[[nodiscard]] std::string caution_text();

/// The cautions on one line, then what a chart does with a dose it has no value for: the note
/// boxed on every SVG chart.
[[nodiscard]] std::string chart_caution_note();

} // namespace crewdose::planner
