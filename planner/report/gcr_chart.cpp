#include "planner/report/gcr_chart.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/gcr_report.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <functional>
#include <numeric>

namespace crewdose::planner {
namespace {

// The rows' indices in order of areal density: the report keeps the order asked for, a curve
// runs from left to right (equal thicknesses keep their order).
std::vector<std::size_t> by_shield(const std::vector<GcrDepthRow>& rows) {
    std::vector<std::size_t> order(rows.size());
    std::iota(order.begin(), order.end(), std::size_t{0});
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
        return rows[a].shield_g_cm2 < rows[b].shield_g_cm2;
    });
    return order;
}

// A curve of one quantity of the rows, in Sv or Gy per day, drawn in milli-units per day or
// per year: `scale` is the report's (1 or kDaysPerYear) and the product is the report's too.
svg::Series curve(const std::vector<GcrDepthRow>& rows, const std::vector<std::size_t>& order,
                  const std::string& label, double scale,
                  const std::function<double(const GcrDepthRow&)>& per_day) {
    svg::Series s;
    s.label = label;
    s.show_points = true;
    for (const std::size_t i : order) {
        s.x.push_back(rows[i].shield_g_cm2);
        s.y.push_back(1e3 * scale * per_day(rows[i]));
    }
    return s;
}

} // namespace

svg::Figure gcr_figure(double phi_MV, const exposure::Material& shield, const TissueDepth& tissue,
                       const std::vector<GcrDepthRow>& rows, bool per_year, const GcrSiteSpec& site,
                       const exposure::Material& detector) {
    const double scale = per_year ? kDaysPerYear : 1.0;
    const char* per = per_year ? "yr" : "d";
    const auto order = by_shield(rows);

    svg::Figure f;
    f.id = "crewdose-gcr";
    f.title =
        fmt::format("crewdose gcr: GCR dose rate against the areal density of {}", shield.id());
    f.subtitle.push_back(fmt::format(
        "phi = {:g} MV (Burger et al. 2000 interstellar spectrum); shield {} ({}); dose at {}, "
        "scored in {}; {}.",
        phi_MV, shield.id(), shield.name(), tissue.label, detector.id(), site_text(site)));
    f.subtitle.push_back(fmt::format(
        "Shell-equivalent geometry: every open direction sees the same shield thickness, then the "
        "tissue. Rates per {}. Each point is a row of the text report, the same numbers; the "
        "lines between points only join them.",
        per_year ? fmt::format("year of {:g} days", kDaysPerYear) : std::string("day")));
    std::string cautions = caution_text();
    std::replace(cautions.begin(), cautions.end(), '\n', ' ');
    f.boxed_note = cautions +
                   "A dose that was not computed is never drawn as a value: its line breaks "
                   "and the stretch is marked \"not computed\".";

    const std::string x_title = fmt::format("shield areal density (g/cm2 of {})", shield.id());

    svg::Chart equivalent;
    equivalent.title = "Dose equivalent rate: the whole field and the two diagnostics";
    equivalent.x.title = x_title;
    equivalent.x.from_zero = true;
    equivalent.y.title = fmt::format("dose equivalent (mSv/{})", per);
    equivalent.y.from_zero = true;
    equivalent.series.push_back(curve(rows, order, "whole field", scale, [](const GcrDepthRow& r) {
        return r.per_day.dose_equivalent_Sv;
    }));
    equivalent.series.push_back(
        curve(rows, order, "no nuclear reaction", scale,
              [](const GcrDepthRow& r) { return r.per_day_without_reactions.dose_equivalent_Sv; }));
    equivalent.series.push_back(
        curve(rows, order, "primaries + fragments", scale,
              [](const GcrDepthRow& r) { return r.per_day_primaries.dose_equivalent_Sv; }));
    equivalent.notes.push_back(
        "whole field: the nuclei with removal and fragmentation and the secondaries of nucleon "
        "reactions (the report's 'dose equiv.', ICRP 60 Q(L)).");
    equivalent.notes.push_back(
        "no nuclear reaction: every nucleus keeps its charge (the report's 'no react.'); "
        "crewdose check takes, quantity by quantity, the higher of this and the whole field "
        "while the model is not validated.");
    equivalent.notes.push_back("primaries + fragments: without the secondaries of nucleon "
                               "reactions (the report's 'prim.'), a diagnostic only.");

    svg::Chart absorbed;
    absorbed.title = "Absorbed and RBE-weighted dose rate of the whole field";
    absorbed.x.title = x_title;
    absorbed.x.from_zero = true;
    absorbed.y.title = fmt::format("dose (mGy/{0} or mGy-Eq/{0})", per);
    absorbed.y.from_zero = true;
    absorbed.series.push_back(curve(rows, order, fmt::format("absorbed (mGy/{})", per), scale,
                                    [](const GcrDepthRow& r) { return r.per_day.absorbed_Gy; }));
    absorbed.series.push_back(
        curve(rows, order, fmt::format("RBE-weighted (mGy-Eq/{})", per), scale,
              [](const GcrDepthRow& r) { return r.per_day.rbe_weighted_GyEq; }));
    absorbed.notes.push_back("The report's 'absorbed' and 'RBE-weighted' columns (RBE values of "
                             "NCRP 132); the share of each charge and source is in the report.");

    svg::Panel p;
    p.heading = fmt::format("Design curve behind {}, at {}", shield.id(), tissue.label);
    p.charts.push_back(std::move(equivalent));
    p.charts.push_back(std::move(absorbed));
    f.panels.push_back(std::move(p));
    return f;
}

std::string format_gcr_chart(double phi_MV, const exposure::Material& shield,
                             const TissueDepth& tissue, const std::vector<GcrDepthRow>& rows,
                             bool per_year, const GcrSiteSpec& site,
                             const exposure::Material& detector) {
    return svg::render_svg(gcr_figure(phi_MV, shield, tissue, rows, per_year, site, detector));
}

} // namespace crewdose::planner
