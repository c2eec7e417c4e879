#include "planner/report/depth_chart.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/gcr_chart.hpp"
#include "planner/scenario/spectrum_spec.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <utility>

namespace crewdose::planner {

svg::Figure depth_figure(const exposure::ProtonSpectrum& spectrum, const exposure::Material& shield,
                         const TissueDepth& tissue, const std::vector<DepthRow>& rows,
                         const exposure::Material& detector) {
    svg::Figure f;
    f.id = "crewdose-depth";
    f.title = fmt::format("crewdose depth: SPE dose against the areal density of {}", shield.id());
    f.subtitle.push_back("spectrum: " + describe_spectrum(spectrum));
    f.subtitle.push_back(fmt::format(
        "shield {} ({}); dose at {}, scored in {}. Shell-equivalent geometry: the event's whole "
        "omnidirectional fluence through the same thickness in every direction. Each point is a "
        "row of the text report, the same numbers; the lines between points only join them.",
        shield.id(), shield.name(), tissue.label, detector.id()));
    f.boxed_note = chart_caution_note();

    // Both charts: x the shield's areal density from zero, y a dose from zero.
    const auto chart = [&](std::string title, std::string y_title) {
        return areal_density_chart(std::move(title), std::move(y_title), shield.id());
    };
    // A curve of one quantity of the rows (Gy, Sv or Gy-Eq) in milli-units as the report prints
    // it; a point per row in order of thickness.
    const auto curve = [&](std::string label, auto dose) {
        return svg::series_by_x(
            std::move(label), rows, [](const DepthRow& r) { return r.shield_g_cm2; },
            [&](const DepthRow& r) { return 1e3 * dose(r); }, true);
    };
    const std::string linear = "Linear scale: the doses behind the thickest shields lie close to "
                               "zero here; read them in the text report.";

    svg::Chart absorbed = chart("Absorbed dose: the value for limits and the two parts of its "
                                "bracket",
                                "absorbed dose (mGy)");
    absorbed.series.push_back(
        curve("for limits", [](const DepthRow& r) { return r.dose.for_limits().absorbed_Gy; }));
    absorbed.series.push_back(
        curve("whole field", [](const DepthRow& r) { return r.dose.with_removal.absorbed_Gy; }));
    absorbed.series.push_back(
        curve("primaries only", [](const DepthRow& r) { return r.primaries.absorbed_Gy; }));
    absorbed.notes.push_back(
        "for limits: the higher of the whole field and the primaries without any nuclear "
        "reaction (the report's 'absorbed'; what limits are checked against while the model is "
        "not validated).");
    absorbed.notes.push_back("whole field: the protons with nuclear removal and the secondaries "
                             "of their reactions (the report's 'absorbed with reactions').");
    absorbed.notes.push_back("primaries only: the protons with removal, without their "
                             "secondaries (the report's 'absorbed, primaries'), a diagnostic.");
    absorbed.notes.push_back(linear);

    svg::Chart weighted = chart("Dose equivalent and RBE-weighted dose, the values for limits",
                                "dose (mSv or mGy-Eq)");
    weighted.series.push_back(curve("dose equivalent (mSv)", [](const DepthRow& r) {
        return r.dose.for_limits().dose_equivalent_Sv;
    }));
    weighted.series.push_back(curve("RBE-weighted (mGy-Eq)", [](const DepthRow& r) {
        return r.dose.for_limits().rbe_weighted_GyEq;
    }));
    weighted.notes.push_back(
        "The report's 'dose equiv.' (ICRP 60 Q(L)) and 'RBE-weighted' (NCRP 132) columns: each "
        "the higher of the whole field and the primaries without any reaction. The share of the "
        "dose from energies outside the spectrum's fit range is in the report.");
    weighted.notes.push_back(linear);

    svg::Panel p;
    p.heading = fmt::format("Design curve behind {}, at {}", shield.id(), tissue.label);
    p.charts.push_back(std::move(absorbed));
    p.charts.push_back(std::move(weighted));
    f.panels.push_back(std::move(p));
    return f;
}

std::string format_depth_chart(const exposure::ProtonSpectrum& spectrum,
                               const exposure::Material& shield, const TissueDepth& tissue,
                               const std::vector<DepthRow>& rows,
                               const exposure::Material& detector) {
    return svg::render_svg(depth_figure(spectrum, shield, tissue, rows, detector));
}

} // namespace crewdose::planner
