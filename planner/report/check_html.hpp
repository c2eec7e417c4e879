#pragma once
// The check as one self-contained HTML file (--html): the verdict as a table, the cautions, the
// chart inline, the full text report, and where the report came from. No script, no style
// sheet, font or image from elsewhere: it opens without a network and prints as it shows.
#include "planner/report/html_page.hpp"
#include "planner/study/ledger.hpp"

#include <string>

namespace crewdose::planner {

/// The HTML page (html_page.hpp's frame). `about` lists what the caller knows of the run (tool
/// version, scenario digest, run time), shown at the foot.
[[nodiscard]] std::string format_check_html(const Study& study, const LedgerResult& ledger,
                                            double near_share, const HtmlAbout& about);

} // namespace crewdose::planner
