#pragma once
// The check as one self-contained HTML file (--html): the verdict as a table, the cautions, the
// chart inline, the full text report, and where the report came from. No script, no style
// sheet, font or image from elsewhere: it opens without a network and prints as it shows.
#include "planner/study/ledger.hpp"

#include <string>
#include <utility>
#include <vector>

namespace crewdose::planner {

/// The HTML page. `about` lists what the caller knows of the run (tool version, scenario
/// digest, run time), shown at the foot as label and value. The markup is also well-formed XML
/// (every element closed, attributes quoted), which the tests read back.
[[nodiscard]] std::string
format_check_html(const Study& study, const LedgerResult& ledger, double near_share,
                  const std::vector<std::pair<std::string, std::string>>& about);

} // namespace crewdose::planner
