#pragma once
// The `shielding` command: what a location's shielding looks like, for shield engineers.
#include "planner/analyses/shielding_summary.hpp"
#include "planner/report/document.hpp"
#include "planner/report/output_format.hpp"
#include "planner/study/study.hpp"

#include <optional>
#include <string>

namespace crewdose::planner {

/// The summary as a report model.
[[nodiscard]] report::Document shielding_document(const ShieldingSummary& summary);

/// Areal-density distribution over the location's directions (external shielding, and per
/// organ with the body's tissue added), the share of the sky blocked by the ground, and with
/// an event id the organ doses of that event there. InputError for an unknown location or
/// event id (field "--location" / "--event").
[[nodiscard]] std::string format_shielding_report(const Study& study, const std::string& location,
                                                  const std::optional<std::string>& event,
                                                  OutputFormat format);

} // namespace crewdose::planner
