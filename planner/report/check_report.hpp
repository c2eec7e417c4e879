#pragma once
// The reports of `check` and `validate`, and the --series output.
#include "planner/report/output_format.hpp"
#include "planner/study/ledger.hpp"

#include <string>

namespace crewdose::planner {

/// The check report. `colour` adds ANSI colour to the verdict lines (terminals only).
[[nodiscard]] std::string format_check_report(const Study& study, const LedgerResult& ledger,
                                              OutputFormat format, bool colour);

/// Cumulative dose and dose rate against time per crew member and organ, CSV.
[[nodiscard]] std::string format_series(const Study& study, const LedgerResult& ledger);

/// What a scenario defines, for `validate`.
[[nodiscard]] std::string format_validation(const Scenario& scenario);

} // namespace crewdose::planner
