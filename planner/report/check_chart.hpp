#pragma once
// The check's chart (--chart): per crew member, the rolling 30-day dose and the career dose
// along the timeline against their planning limits, read from the ledger.
#include "planner/report/svg_plot.hpp"
#include "planner/study/ledger.hpp"

#include <string>

namespace crewdose::planner {

/// The figure of the check: a panel per crew member (ledger order) with two charts, each of the
/// organ whose limit of that window has the highest share used (a dose that is not a number
/// counts as the highest): the dose in the 30 days up to each time (mGy-Eq, or mSv for the
/// effective dose) and the career dose (prior plus the mission so far), each with its limit
/// line; the crew member's EVAs, rover drives and shelter stays shaded and the events marked
/// where their flare is seen. x: days from the mission start. Every value is the ledger's
/// cumulative dose (cumulative_at) at a time of the timeline: piece boundaries, the same 30
/// days later, hourly inside event pieces, and the end of the highest 30-day window.
[[nodiscard]] svg::Figure check_figure(const Study& study, const LedgerResult& ledger,
                                       double near_share = kDefaultNearShare);

/// check_figure() drawn: one SVG document.
[[nodiscard]] std::string format_check_chart(const Study& study, const LedgerResult& ledger,
                                             double near_share = kDefaultNearShare);

} // namespace crewdose::planner
