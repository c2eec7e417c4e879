#pragma once
// The `shelter` command's report.
#include "planner/analyses/shelter.hpp"
#include "planner/report/output_format.hpp"

#include <string>

namespace crewdose::planner {

[[nodiscard]] std::string format_shelter_report(const Study& study, const ShelterReport& report,
                                                OutputFormat format);

} // namespace crewdose::planner
