#pragma once
// The report of `compare`: two plans' planning limits side by side.
#include "planner/analyses/compare.hpp"
#include "planner/report/document.hpp"
#include "planner/report/output_format.hpp"
#include "planner/report/verdict_table.hpp"
#include "planner/scenario/scenario.hpp"

#include <string>

namespace crewdose::planner {

/// Both verdicts and a row per crew member and limit (both doses, the change, both statuses):
/// what compare --html shows as its table. A dose that was not computed reads so.
[[nodiscard]] VerdictTable comparison_verdict(const PlanComparison& comparison);

/// The report as a report model. Text: the two verdicts, the cautions, then a row per crew
/// member and limit (both doses, the change, the statuses; a row whose status changes is
/// marked), then what only one plan checks. JSON and CSV: the same rows at full precision. A
/// dose that was not computed is never printed as a number (the JSON and CSV writers refuse it;
/// the text says "not computed").
[[nodiscard]] report::Document comparison_document(const PlanComparison& comparison,
                                                   const Scenario& a, const Scenario& b);

/// `report::write(comparison_document(...), format)`.
[[nodiscard]] std::string format_comparison(const PlanComparison& comparison, const Scenario& a,
                                            const Scenario& b, OutputFormat format);

} // namespace crewdose::planner
