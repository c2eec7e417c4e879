#pragma once
// The reports of `check` and `validate`, and the --series output.
#include "planner/report/output_format.hpp"
#include "planner/report/verdict_table.hpp"
#include "planner/study/ledger.hpp"

#include <string>
#include <vector>

namespace crewdose::planner {

/// The check report: the verdict first (a headline per crew member: the binding limit, the dose,
/// the share of the limit used, within / near / exceeded with "near" from `near_share` of the
/// limit, and the budget left), then the detail, the limits and the model. `colour` adds ANSI
/// colour to the verdict words (terminals only; the words carry the meaning).
[[nodiscard]] std::string format_check_report(const Study& study, const LedgerResult& ledger,
                                              OutputFormat format, bool colour,
                                              double near_share = kDefaultNearShare);

/// The verdict as a table, the same in text and HTML: a row per crew member (by name, or by id
/// when a name is longer than 24 characters) with the binding limit, the dose, the planning
/// limit, the share used, the status and the budget left; the notes of check_verdict_notes.
[[nodiscard]] VerdictTable check_verdict(const LedgerResult& ledger, double near_share);

/// The verdict's "budget left" of a crew member whose binding limit stands at `status`: days
/// more of the timeline's activity mix at its GCR rate until a limit binds, "none" (exceeded, or
/// no day left) or "not bound by GCR alone".
[[nodiscard]] std::string budget_left_text(const CrewResult& crew, LimitStatus status);

/// What the verdict says beside a crew member's row, the same in text and HTML: the organs not
/// evaluated for them ("not evaluated for b: heart, brain (...)") and the doses that are an
/// upper bound ("effective dose of b: an upper bound where the quick body model stands
/// (...)"); empty when every dose was computed.
[[nodiscard]] std::vector<std::string> check_verdict_notes(const CrewResult& crew);

/// Cumulative dose and dose rate against time per crew member and organ, CSV.
[[nodiscard]] std::string format_series(const Study& study, const LedgerResult& ledger);

/// What a scenario defines, for `validate`.
[[nodiscard]] std::string format_validation(const Scenario& scenario);

} // namespace crewdose::planner
