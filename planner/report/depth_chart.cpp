#include "planner/report/depth_chart.hpp"

#include "planner/report/cautions.hpp"
#include "planner/scenario/spectrum_spec.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <functional>
#include <numeric>

namespace crewdose::planner {
namespace {

// The rows' indices in order of areal density: the report keeps the order asked for, a curve
// runs from left to right (equal thicknesses keep their order).
std::vector<std::size_t> by_shield(const std::vector<DepthRow>& rows) {
    std::vector<std::size_t> order(rows.size());
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        return rows[a].shield_g_cm2 < rows[b].shield_g_cm2;
    });
    return order;
}

// A curve of one quantity of the rows, in Gy (Sv, Gy-Eq), drawn in milli-units as the report
// prints it.
svg::Series curve(const std::vector<DepthRow>& rows, const std::vector<std::size_t>& order,
                  const std::string& label, const std::function<double(const DepthRow&)>& dose) {
    svg::Series s;
    s.label = label;
    s.show_points = true;
    for (const std::size_t i : order) {
        s.x.push_back(rows[i].shield_g_cm2);
        s.y.push_back(1e3 * dose(rows[i]));
    }
    return s;
}

} // namespace

svg::Figure depth_figure(const exposure::ProtonSpectrum& spectrum, const exposure::Material& shield,
                         const TissueDepth& tissue, const std::vector<DepthRow>& rows,
                         const exposure::Material& detector) {
    const auto order = by_shield(rows);

    svg::Figure f;
    f.id = "crewdose-depth";
    f.title = fmt::format("crewdose depth: SPE dose against the areal density of {}", shield.id());
    f.subtitle.push_back("spectrum: " + describe_spectrum(spectrum));
    f.subtitle.push_back(fmt::format(
        "shield {} ({}); dose at {}, scored in {}. Shell-equivalent geometry: the event's whole "
        "omnidirectional fluence through the same thickness in every direction. Each point is a "
        "row of the text report, the same numbers; the lines between points only join them.",
        shield.id(), shield.name(), tissue.label, detector.id()));
    std::string cautions = caution_text();
    std::replace(cautions.begin(), cautions.end(), '\n', ' ');
    f.boxed_note = cautions +
                   "A dose that was not computed is never drawn as a value: its line breaks "
                   "and the stretch is marked \"not computed\".";

    const std::string x_title = fmt::format("shield areal density (g/cm2 of {})", shield.id());
    const std::string linear = "Linear scale: the doses behind the thickest shields lie close to "
                               "zero here; read them in the text report.";

    svg::Chart absorbed;
    absorbed.title = "Absorbed dose: the value for limits and the two parts of its bracket";
    absorbed.x.title = x_title;
    absorbed.x.from_zero = true;
    absorbed.y.title = "absorbed dose (mGy)";
    absorbed.y.from_zero = true;
    absorbed.series.push_back(curve(rows, order, "for limits", [](const DepthRow& r) {
        return r.dose.for_limits().absorbed_Gy;
    }));
    absorbed.series.push_back(curve(rows, order, "whole field", [](const DepthRow& r) {
        return r.dose.with_removal.absorbed_Gy;
    }));
    absorbed.series.push_back(curve(rows, order, "primaries only",
                                    [](const DepthRow& r) { return r.primaries.absorbed_Gy; }));
    absorbed.notes.push_back(
        "for limits: the higher of the whole field and the primaries without any nuclear "
        "reaction (the report's 'absorbed'; what limits are checked against while the model is "
        "not validated).");
    absorbed.notes.push_back("whole field: the protons with nuclear removal and the secondaries "
                             "of their reactions (the report's 'absorbed with reactions').");
    absorbed.notes.push_back("primaries only: the protons with removal, without their "
                             "secondaries (the report's 'absorbed, primaries'), a diagnostic.");
    absorbed.notes.push_back(linear);

    svg::Chart weighted;
    weighted.title = "Dose equivalent and RBE-weighted dose, the values for limits";
    weighted.x.title = x_title;
    weighted.x.from_zero = true;
    weighted.y.title = "dose (mSv or mGy-Eq)";
    weighted.y.from_zero = true;
    weighted.series.push_back(curve(rows, order, "dose equivalent (mSv)", [](const DepthRow& r) {
        return r.dose.for_limits().dose_equivalent_Sv;
    }));
    weighted.series.push_back(curve(rows, order, "RBE-weighted (mGy-Eq)", [](const DepthRow& r) {
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
