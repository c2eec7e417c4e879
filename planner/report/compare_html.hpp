#pragma once
// Two plans side by side as one self-contained HTML file (compare --html): both verdicts and
// every compared limit as a table, the cautions, the whole text report and where it came from
// (html_page.hpp's frame). The comparison has no chart.
#include "planner/analyses/compare.hpp"
#include "planner/report/html_page.hpp"
#include "planner/scenario/scenario.hpp"

#include <string>

namespace crewdose::planner {

[[nodiscard]] std::string format_comparison_html(const PlanComparison& comparison,
                                                 const Scenario& a, const Scenario& b,
                                                 const HtmlAbout& about);

} // namespace crewdose::planner
