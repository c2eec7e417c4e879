#pragma once
// The gcr design curve's chart (gcr --chart): the GCR dose rate behind a uniform shield against
// the shield's areal density, drawn from the same rows the report prints.
#include "planner/analyses/gcr_curve.hpp"
#include "planner/report/svg_plot.hpp"

#include "exposure/material.hpp"

#include <string>
#include <vector>

namespace crewdose::planner {

/// A design-curve chart (gcr and depth --chart): x the shield's areal density in g/cm2 of the
/// material, y a dose from zero, both titled.
[[nodiscard]] svg::Chart areal_density_chart(std::string title, std::string y_title,
                                             const std::string& material_id);

/// The figure of a gcr run: one panel of two charts against the shield's areal density (g/cm2
/// of `shield`), a point per row in order of areal density. The first chart: the dose
/// equivalent rate (mSv per day, or per year of kDaysPerYear days when `per_year`) of the
/// whole field, without any nuclear reaction, and of the primaries and their fragments alone
/// (the report's columns "dose equiv.", "no react." and "prim."); the second: the whole field's
/// absorbed dose rate (mGy) and RBE-weighted dose rate (mGy-Eq). The run's conditions (phi,
/// shield, tissue depth, detector, site) in the subtitle, the cautions boxed under it. Every
/// value is the row's own, scaled to the report's unit exactly as the report scales it; one
/// that is not a finite dose >= 0 is drawn as a gap labelled "not computed".
[[nodiscard]] svg::Figure gcr_figure(double phi_MV, const exposure::Material& shield,
                                     const TissueDepth& tissue,
                                     const std::vector<GcrDepthRow>& rows, bool per_year,
                                     const GcrSiteSpec& site, const exposure::Material& detector);

/// gcr_figure() drawn: one SVG document.
[[nodiscard]] std::string format_gcr_chart(double phi_MV, const exposure::Material& shield,
                                           const TissueDepth& tissue,
                                           const std::vector<GcrDepthRow>& rows, bool per_year,
                                           const GcrSiteSpec& site,
                                           const exposure::Material& detector);

} // namespace crewdose::planner
