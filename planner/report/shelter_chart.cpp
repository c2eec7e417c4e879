#include "planner/report/shelter_chart.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/number_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

namespace crewdose::planner {
namespace {

// A number for a chart's text: a value that was not computed says so, never a number.
std::string shown(double value) {
    return std::isfinite(value) ? significant(value, 3) : std::string("not computed");
}

// The value of `key` in `m`, or NaN (not computed) when it is missing.
double at_or_nan(const std::map<std::string, double>& m, const std::string& key) {
    const auto it = m.find(key);
    return it == m.end() ? std::numeric_limits<double>::quiet_NaN() : it->second;
}

// The organs to draw: those whose target sets some material's answer, in target order; when
// none does, the organ with the highest share of its target at the thinnest point drawn.
std::vector<std::string> organs_to_draw(const ShelterReport& rep) {
    std::vector<std::string> organs;
    for (const auto& [organ, target] : rep.target_mGyEq) {
        for (const auto& a : rep.answers) {
            if (a.binding_organ == organ) {
                organs.push_back(organ);
                break;
            }
        }
    }
    if (!organs.empty() || rep.target_mGyEq.empty()) {
        return organs;
    }
    std::string best = rep.target_mGyEq.begin()->first;
    double best_share = -std::numeric_limits<double>::infinity();
    for (const auto& [organ, target] : rep.target_mGyEq) {
        for (const auto& a : rep.answers) {
            if (a.curve.empty()) {
                continue;
            }
            const double share = (at_or_nan(a.curve.front().event_mGyEq, organ) +
                                  at_or_nan(rep.other_30d_mGyEq, organ)) /
                                 target;
            const double rank = std::isnan(share) ? std::numeric_limits<double>::infinity() : share;
            if (rank > best_share) {
                best = organ;
                best_share = rank;
            }
        }
    }
    return {best};
}

svg::Chart organ_chart(const ShelterReport& rep, const std::string& organ) {
    svg::Chart c;
    const double target = at_or_nan(rep.target_mGyEq, organ);
    const double other = at_or_nan(rep.other_30d_mGyEq, organ);
    c.title = fmt::format("{}: the event in the shelter plus the crew's highest other 30-day dose",
                          organ_label(organ));
    c.x.title = "added areal density (g/cm2)";
    c.x.from_zero = true;
    c.y.title = "30-day dose (mGy-Eq)";
    c.y.from_zero = true;
    for (const auto& a : rep.answers) {
        svg::Series s;
        s.label = a.material;
        s.show_points = true;
        for (const auto& p : a.curve) {
            s.x.push_back(p.areal_density_g_cm2);
            s.y.push_back(at_or_nan(p.event_mGyEq, organ) + other);
        }
        if (!s.x.empty()) {
            c.series.push_back(std::move(s));
        }
        if (a.achievable && !a.none_needed && a.binding_organ == organ) {
            c.markers.push_back({a.areal_density_g_cm2, fmt::format("{}: {} g/cm2", a.material,
                                                                    shown(a.areal_density_g_cm2))});
        }
        if (a.none_needed) {
            c.notes.push_back(fmt::format("{}: no added material needed.", a.material));
        } else if (!rep.other_alone_exceeds.empty()) {
            c.notes.push_back(fmt::format("{}: NOT ACHIEVABLE: the crew's other 30-day dose "
                                          "alone reaches or exceeds a target, so no shelter can "
                                          "meet it (see the report).",
                                          a.material));
        } else if (!a.achievable) {
            c.notes.push_back(fmt::format("{}: NOT ACHIEVABLE up to {} g/cm2 (see the report).",
                                          a.material, shown(a.searched_to_g_cm2)));
        } else if (a.binding_organ == organ) {
            c.notes.push_back(fmt::format("{}: at least {} g/cm2 ({} cm); the marker is there.",
                                          a.material, shown(a.areal_density_g_cm2),
                                          shown(a.thickness_cm)));
        }
    }
    c.levels.push_back({target, fmt::format("target {} mGy-Eq", shown(target))});
    c.levels.push_back(
        {other, fmt::format("crew's other 30-day dose {} mGy-Eq (in every point)", shown(other))});
    c.notes.push_back(fmt::format("Each point: the design event received whole in the shelter "
                                  "plus {} mGy-Eq, the highest 30-day dose any crew member has "
                                  "from everything else. The answer is where a curve meets the "
                                  "target.",
                                  shown(other)));
    return c;
}

} // namespace

svg::Figure shelter_figure(const Study& study, const ShelterReport& rep) {
    const Scenario& sc = study.scenario();
    const auto& r = rep.request;
    svg::Figure f;
    f.id = "crewdose-shelter";
    f.title = fmt::format("crewdose shelter: event {} at location {}", r.event_id, r.location_id);
    f.subtitle.push_back(fmt::format("scenario {}; {}", sc.file,
                                     r.solid_id ? fmt::format("a layer added inside layer {} of "
                                                              "solid '{}'",
                                                              r.layer_index + 1, *r.solid_id)
                                                : std::string("a uniform shell around the dose "
                                                              "point, every direction")));
    f.subtitle.push_back(fmt::format(
        "{} body model; the higher of the doses with and without nuclear reactions; uncertainty "
        "factor {:.2f} applied. Targets: the 30-day planning limits unless --target sets one.",
        study.location(r.location_id).body, sc.limits.uncertainty_factor));
    f.boxed_note = chart_caution_note();
    svg::Panel p;
    p.heading = fmt::format("Dose at location '{}' against added material", r.location_id);
    for (const auto& organ : organs_to_draw(rep)) {
        p.charts.push_back(organ_chart(rep, organ));
    }
    f.panels.push_back(std::move(p));
    return f;
}

std::string format_shelter_chart(const Study& study, const ShelterReport& report) {
    return svg::render_svg(shelter_figure(study, report));
}

} // namespace crewdose::planner
