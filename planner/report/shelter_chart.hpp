#pragma once
// The shelter's chart (--chart): the design event's dose in the shelter against the added areal
// density, per material, with the target line, read from the sizing's dose-thickness table.
#include "planner/analyses/shelter.hpp"
#include "planner/report/svg_plot.hpp"

#include <string>

namespace crewdose::planner {

/// The figure of `shelter`: a chart per organ whose target sets an answer (or, when none does,
/// the organ closest to its target at the thinnest point), a curve per material through its
/// dose-thickness table (ShelterAnswer::curve): the event's dose in the shelter plus the
/// crew's highest other 30-day dose (mGy-Eq), against the added areal density (g/cm2), with
/// the target line and a marker at each material's answer.
[[nodiscard]] svg::Figure shelter_figure(const Study& study, const ShelterReport& report);

/// shelter_figure() drawn: one SVG document.
[[nodiscard]] std::string format_shelter_chart(const Study& study, const ShelterReport& report);

} // namespace crewdose::planner
