#pragma once
// The `storm` command's reports: one what-if, and a sweep of onsets. The text opens with the
// verdict (storm_whatif_verdict, storm_sweep_verdict), then the cautions, the model and the
// detail.
#include "planner/analyses/storm.hpp"
#include "planner/report/document.hpp"
#include "planner/report/output_format.hpp"
#include "planner/report/verdict_table.hpp"

#include <string>

namespace crewdose::planner {

/// The verdict of one what-if: a row per crew member with the binding organ (the highest share
/// of its 30-day limit), its 30-day dose (the event with the response, if any, plus the other
/// 30-day dose) against the limit, the share used, within / near (from `near_share` of the
/// limit) / EXCEEDED, and, with the response, the same organ's dose without it. A dose that
/// was not computed reads "not computed" and counts as exceeded.
[[nodiscard]] VerdictTable storm_whatif_verdict(const StormContext& context, const StormWhatIf& w,
                                                double near_share = kDefaultNearShare);
/// The verdict of a sweep: the same per crew member at their worst onset, with that onset
/// (RFC 3339, as --onset reads it), and the EVAs' go/no-go count in the headline.
[[nodiscard]] VerdictTable storm_sweep_verdict(const StormContext& context, const StormSweep& s,
                                               double near_share = kDefaultNearShare);

/// One what-if as a report Document: the verdict, the cautions, the model and the response,
/// then per crew member the organs and where they are from t0. JSON carries the crew's numbers
/// and the verdict's rows; CSV a line per crew member and organ.
[[nodiscard]] report::Document storm_whatif_document(const StormContext& context,
                                                     const StormWhatIf& w,
                                                     double near_share = kDefaultNearShare);
/// A sweep as a report Document: the verdict, the cautions and the model, each crew member's
/// worst onset, go/no-go per EVA and rover drive, and the profile of onsets. CSV: a line per
/// EVA and rover drive.
[[nodiscard]] report::Document storm_sweep_document(const StormContext& context,
                                                    const StormSweep& s,
                                                    double near_share = kDefaultNearShare);

/// The what-if and the sweep in `format`: report::write of their Documents; `colour` adds
/// terminal colour to the verdict's status words (text only).
[[nodiscard]] std::string format_storm_whatif(const StormContext& context, const StormWhatIf& w,
                                              OutputFormat format,
                                              double near_share = kDefaultNearShare,
                                              bool colour = false);
[[nodiscard]] std::string format_storm_sweep(const StormContext& context, const StormSweep& s,
                                             OutputFormat format,
                                             double near_share = kDefaultNearShare,
                                             bool colour = false);

} // namespace crewdose::planner
