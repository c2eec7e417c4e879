#pragma once
// The `gcr` command's report.
#include "planner/analyses/gcr_curve.hpp"
#include "planner/report/document.hpp"
#include "planner/report/output_format.hpp"

#include "exposure/material.hpp"

#include <string>
#include <vector>

namespace crewdose::planner {

/// Days in the year of the rates per year (--per-year): the Julian year.
inline constexpr double kDaysPerYear = 365.25;

/// Where the shield stands, in words for reports and charts: "in deep space", or the surface
/// with what blocks the sky and, on Mars, the atmosphere's pressure and scale height.
[[nodiscard]] std::string site_text(const GcrSiteSpec& site);

/// The report as a report model; `per_year` scales the rates to 365.25 days.
[[nodiscard]] report::Document gcr_depth_document(double phi_MV, const exposure::Material& shield,
                                                  const TissueDepth& tissue,
                                                  const std::vector<GcrDepthRow>& rows,
                                                  bool per_year, const GcrSiteSpec& site,
                                                  const exposure::Material& detector);

/// The report in the chosen format; `per_year` scales the rates to 365.25 days.
[[nodiscard]] std::string
format_gcr_depth_report(double phi_MV, const exposure::Material& shield, const TissueDepth& tissue,
                        const std::vector<GcrDepthRow>& rows, OutputFormat format, bool per_year,
                        const GcrSiteSpec& site, const exposure::Material& detector);

} // namespace crewdose::planner
