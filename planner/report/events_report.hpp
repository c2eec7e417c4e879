#pragma once
// The `events` report: the library of reference solar particle events, each with its integral
// fluences and its source.
#include "planner/report/document.hpp"
#include "planner/report/output_format.hpp"

#include <string>

namespace crewdose::planner {

/// The event library as a report model.
[[nodiscard]] report::Document events_document();

/// The event library in the chosen format.
[[nodiscard]] std::string format_events_report(OutputFormat format);

} // namespace crewdose::planner
