#pragma once
// The `range` and `materials` reports: look-up tables of the stopping and range physics for
// engineers who want to see the numbers behind a shielding result.
#include "planner/analyses/physics_lookup.hpp"
#include "planner/report/document.hpp"
#include "planner/report/output_format.hpp"

#include "exposure/material.hpp"
#include "exposure/particle.hpp"

#include <string>
#include <vector>

namespace crewdose::planner {

/// The range report as a report model: the material and particle as fields, one row per energy.
[[nodiscard]] report::Document range_document(const exposure::Material& material,
                                              const exposure::Particle& particle,
                                              const std::vector<RangeRow>& rows);

/// The built-in materials as a report model.
[[nodiscard]] report::Document materials_document();

/// The range report in the chosen format (text: 4 significant figures; json: full precision).
[[nodiscard]] std::string format_range_report(const exposure::Material& material,
                                              const exposure::Particle& particle,
                                              const std::vector<RangeRow>& rows,
                                              OutputFormat format);

/// The list of built-in materials in the chosen format.
[[nodiscard]] std::string format_materials_report(OutputFormat format);

} // namespace crewdose::planner
