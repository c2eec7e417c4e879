#include "planner/report/gcr_chart.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/gcr_report.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <utility>

namespace crewdose::planner {

svg::Chart areal_density_chart(std::string title, std::string y_title,
                               const std::string& material_id) {
    svg::Chart c;
    c.title = std::move(title);
    c.x.title = fmt::format("shield areal density (g/cm2 of {})", material_id);
    c.x.from_zero = true;
    c.y.title = std::move(y_title);
    c.y.from_zero = true;
    return c;
}

svg::Figure gcr_figure(double phi_MV, const exposure::Material& shield, const TissueDepth& tissue,
                       const std::vector<GcrDepthRow>& rows, bool per_year, const GcrSiteSpec& site,
                       const exposure::Material& detector) {
    const double scale = per_year ? kDaysPerYear : 1.0;
    const char* per = per_year ? "yr" : "d";

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
    f.boxed_note = chart_caution_note();

    // Both charts: x the shield's areal density from zero, y a dose rate from zero.
    const auto chart = [&](std::string title, std::string y_title) {
        return areal_density_chart(std::move(title), std::move(y_title), shield.id());
    };
    // A curve of one quantity of the rows (Sv or Gy per day) in milli-units per day or per year,
    // the report's product 1e3 * scale * value; a point per row in order of thickness.
    const auto curve = [&](std::string label, auto per_day) {
        return svg::series_by_x(
            std::move(label), rows, [](const GcrDepthRow& r) { return r.shield_g_cm2; },
            [&](const GcrDepthRow& r) { return 1e3 * scale * per_day(r); }, true);
    };

    svg::Chart equivalent = chart("Dose equivalent rate: the whole field and the two diagnostics",
                                  fmt::format("dose equivalent (mSv/{})", per));
    equivalent.series.push_back(
        curve("whole field", [](const GcrDepthRow& r) { return r.per_day.dose_equivalent_Sv; }));
    equivalent.series.push_back(curve("no nuclear reaction", [](const GcrDepthRow& r) {
        return r.per_day_without_reactions.dose_equivalent_Sv;
    }));
    equivalent.series.push_back(curve("primaries + fragments", [](const GcrDepthRow& r) {
        return r.per_day_primaries.dose_equivalent_Sv;
    }));
    equivalent.notes.push_back(
        "whole field: the nuclei with removal and fragmentation and the secondaries of nucleon "
        "reactions (the report's 'dose equiv.', ICRP 60 Q(L)).");
    equivalent.notes.push_back(
        "no nuclear reaction: every nucleus keeps its charge (the report's 'no react.'); "
        "crewdose check takes, quantity by quantity, the higher of this and the whole field "
        "while the model is not validated.");
    equivalent.notes.push_back("primaries + fragments: without the secondaries of nucleon "
                               "reactions (the report's 'prim.'), a diagnostic only.");

    svg::Chart absorbed = chart("Absorbed and RBE-weighted dose rate of the whole field",
                                fmt::format("dose (mGy/{0} or mGy-Eq/{0})", per));
    absorbed.series.push_back(curve(fmt::format("absorbed (mGy/{})", per),
                                    [](const GcrDepthRow& r) { return r.per_day.absorbed_Gy; }));
    absorbed.series.push_back(
        curve(fmt::format("RBE-weighted (mGy-Eq/{})", per),
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
