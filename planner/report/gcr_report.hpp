#pragma once
// The `gcr` command's report.
#include "planner/analyses/gcr_curve.hpp"
#include "planner/report/output_format.hpp"

#include "exposure/material.hpp"

#include <string>
#include <vector>

namespace crewdose::planner {

/// The report in the chosen format; `per_year` scales the rates to 365.25 days.
[[nodiscard]] std::string
format_gcr_depth_report(double phi_MV, const exposure::Material& shield, const TissueDepth& tissue,
                        const std::vector<GcrDepthRow>& rows, OutputFormat format, bool per_year,
                        const GcrSiteSpec& site, const exposure::Material& detector);

} // namespace crewdose::planner
