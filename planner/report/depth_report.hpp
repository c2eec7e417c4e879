#pragma once
// The `depth` command's report: SPE dose at a tissue depth behind a uniform shield.
#include "planner/analyses/depth_curve.hpp"
#include "planner/report/document.hpp"
#include "planner/report/output_format.hpp"

#include "exposure/dosimetry.hpp"
#include "exposure/spectrum.hpp"

#include <nlohmann/json.hpp>

#include <string>
#include <vector>

namespace crewdose::planner {

/// Dose quantities in SI units for JSON reports: absorbed_Gy, dose_equivalent_Sv,
/// rbe_weighted_GyEq (full precision).
[[nodiscard]] nlohmann::json dose_si_json(const exposure::DoseQuantities& d);

/// The three dose quantities in SI units as a report-model object (same keys).
[[nodiscard]] report::Object dose_si_object(const exposure::DoseQuantities& d);

/// The report as a report model.
[[nodiscard]] report::Document depth_document(const exposure::ProtonSpectrum& spectrum,
                                              const exposure::Material& shield,
                                              const TissueDepth& tissue,
                                              const std::vector<DepthRow>& rows,
                                              const exposure::Material& detector);

/// The report in the chosen format.
[[nodiscard]] std::string
format_depth_report(const exposure::ProtonSpectrum& spectrum, const exposure::Material& shield,
                    const TissueDepth& tissue, const std::vector<DepthRow>& rows,
                    OutputFormat format, const exposure::Material& detector);

} // namespace crewdose::planner
