#pragma once
// The shelter sizing as one self-contained HTML file (shelter --html): the answer as a table,
// the cautions, the dose-thickness chart inline (shelter_chart), the whole text report and
// where it came from (html_page.hpp's frame).
#include "planner/analyses/shelter.hpp"
#include "planner/report/html_page.hpp"

#include <string>

namespace crewdose::planner {

[[nodiscard]] std::string format_shelter_html(const Study& study, const ShelterReport& report,
                                              const HtmlAbout& about);

} // namespace crewdose::planner
