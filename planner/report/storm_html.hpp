#pragma once
// The storm what-if and sweep as one self-contained HTML file (storm --html): the verdict as a
// table, the cautions, the sweep's chart inline (storm_chart), the whole text report and where
// it came from (html_page.hpp's frame).
#include "planner/analyses/storm.hpp"
#include "planner/report/html_page.hpp"

#include <string>

namespace crewdose::planner {

/// One what-if's page: the verdict (storm_whatif_verdict) and the text report; no chart.
[[nodiscard]] std::string format_storm_whatif_html(const StormContext& context,
                                                   const StormWhatIf& w, double near_share,
                                                   const HtmlAbout& about);
/// A sweep's page: the verdict (storm_sweep_verdict), the chart of --chart and the text report.
[[nodiscard]] std::string format_storm_sweep_html(const StormContext& context, const StormSweep& s,
                                                  double near_share, const HtmlAbout& about);

} // namespace crewdose::planner
