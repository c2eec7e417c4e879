#pragma once
// The depth design curve's chart (depth --chart): an SPE's dose behind a uniform shield against
// the shield's areal density, drawn from the same rows the report prints.
#include "planner/analyses/depth_curve.hpp"
#include "planner/report/svg_plot.hpp"

#include "exposure/material.hpp"
#include "exposure/spectrum.hpp"

#include <string>
#include <vector>

namespace crewdose::planner {

/// The figure of a depth run: one panel of two charts against the shield's areal density
/// (g/cm2 of `shield`), a point per row in order of areal density. The first chart: the
/// absorbed dose (mGy) that limits are checked against (BracketedDose::for_limits), the whole
/// field's with reactions and the primaries' alone with reactions (the report's first, fifth
/// and sixth columns); the second: the dose equivalent (mSv) and the RBE-weighted dose
/// (mGy-Eq) that limits are checked against. The spectrum, shield, tissue depth and detector in
/// the subtitle, the cautions boxed under it. Every value is the row's own in the report's
/// unit; one that is not a finite dose >= 0 is drawn as a gap labelled "not computed". The y
/// axis is linear: the doses behind the thickest shields lie near zero, and a note says so.
[[nodiscard]] svg::Figure depth_figure(const exposure::ProtonSpectrum& spectrum,
                                       const exposure::Material& shield, const TissueDepth& tissue,
                                       const std::vector<DepthRow>& rows,
                                       const exposure::Material& detector);

/// depth_figure() drawn: one SVG document.
[[nodiscard]] std::string format_depth_chart(const exposure::ProtonSpectrum& spectrum,
                                             const exposure::Material& shield,
                                             const TissueDepth& tissue,
                                             const std::vector<DepthRow>& rows,
                                             const exposure::Material& detector);

} // namespace crewdose::planner
