#pragma once
// The `shelter` command's report: the answer first (shelter_answer), then the cautions, the
// sizing rule and per material the answer's detail and the dose-thickness table.
#include "planner/analyses/shelter.hpp"
#include "planner/report/document.hpp"
#include "planner/report/output_format.hpp"
#include "planner/report/verdict_table.hpp"

#include <string>

namespace crewdose::planner {

/// The answer: a row per material with the least added areal density (and the added mass when
/// a wall layer gives one), the binding organ, its dose (the event in the shelter plus the
/// crew's other 30-day dose) against its target, and the status: met as built, needs X g/cm2,
/// NOT ACHIEVABLE within the areal density searched, or IMPOSSIBLE (the other dose alone
/// reaches a target). A dose that was not computed reads "not computed" and is never met.
[[nodiscard]] VerdictTable shelter_answer(const ShelterReport& report);

/// The report as a report model: JSON the request, the targets and per material the answer
/// and its curve; text the answer first (shelter_answer), the cautions, the sizing rule and per
/// material the answer's detail and dose-thickness table; CSV the table described below. A dose
/// the report needs that was not computed stops it (ResultFault), except the answer's own dose,
/// which reads "not computed" (JSON null).
[[nodiscard]] report::Document shelter_document(const Study& study, const ShelterReport& report);

/// Text, JSON or CSV: `report::write(shelter_document(...), format)`. The CSV has one header; each
/// material's answer comes first as a row whose `row` column is "answer" (areal_density_g_cm2: the
/// least added, empty when none is found; organ: the binding organ; event_mGyEq: its event dose
/// there; achievable: yes, no or impossible; added_mass_kg when a layer gives one), then the
/// dose-thickness points
/// ("curve", achievable and added_mass_kg empty).
[[nodiscard]] std::string format_shelter_report(const Study& study, const ShelterReport& report,
                                                OutputFormat format);

} // namespace crewdose::planner
