#pragma once
// The `storm` command's reports: one what-if, and a sweep of onsets.
#include "planner/analyses/storm.hpp"
#include "planner/report/output_format.hpp"

#include <string>

namespace crewdose::planner {

[[nodiscard]] std::string format_storm_whatif(const StormContext& context, const StormWhatIf& w,
                                              OutputFormat format);
[[nodiscard]] std::string format_storm_sweep(const StormContext& context, const StormSweep& s,
                                             OutputFormat format);

} // namespace crewdose::planner
