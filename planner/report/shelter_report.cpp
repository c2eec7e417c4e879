#include "planner/report/shelter_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/number_format.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>

namespace crewdose::planner {

std::string format_shelter_report(const Study& study, const ShelterReport& rep,
                                  OutputFormat format) {
    const Scenario& sc = study.scenario();
    const auto& r = rep.request;
    const std::string where =
        r.solid_id ? fmt::format("a layer added inside layer {} of solid '{}'", r.layer_index + 1,
                                 *r.solid_id)
                   : std::string("a uniform shell around the dose point, every direction");
    if (format == OutputFormat::json) {
        nlohmann::json j;
        j["cautions"] = caution_text();
        j["event"] = r.event_id;
        j["location"] = r.location_id;
        j["added_as"] = where;
        j["body_model"] = to_string(study.location(r.location_id).body);
        j["uncertainty_factor"] = sc.limits.uncertainty_factor;
        j["max_g_cm2"] = r.max_g_cm2;
        j["targets_mGyEq"] = rep.target_mGyEq;
        j["other_30d_mGyEq"] = rep.other_30d_mGyEq;
        j["sun_distance_AU"] = rep.sun_distance_AU;
        j["fluence_scale"] = rep.fluence_scale;
        j["other_alone_exceeds_target"] = rep.other_alone_exceeds;
        j["answers"] = nlohmann::json::array();
        for (const auto& a : rep.answers) {
            nlohmann::json aj{{"material", a.material},
                              {"density_g_cm3", a.density_g_cm3},
                              {"achievable", a.achievable},
                              {"none_needed", a.none_needed},
                              {"binding_organ", a.binding_organ},
                              {"searched_to_g_cm2", a.searched_to_g_cm2},
                              {"limited_by_room", a.limited_by_room},
                              {"evaluations", a.evaluations}};
            if (a.achievable) {
                aj["areal_density_g_cm2"] = a.areal_density_g_cm2;
                aj["thickness_cm"] = a.thickness_cm;
                aj["mass_per_area_kg_m2"] = a.mass_per_area_kg_m2;
                if (a.added_mass_kg) {
                    aj["added_mass_kg"] = *a.added_mass_kg;
                }
            }
            for (const auto& p : a.curve) {
                aj["curve"].push_back({{"areal_density_g_cm2", p.areal_density_g_cm2},
                                       {"event_mGyEq", p.event_mGyEq}});
            }
            j["answers"].push_back(aj);
        }
        return dump_checked(j);
    }
    if (format == OutputFormat::csv) {
        std::string out = "material,areal_density_g_cm2,organ,event_mGyEq,other_30d_mGyEq,"
                          "target_mGyEq\n";
        for (const auto& a : rep.answers) {
            for (const auto& p : a.curve) {
                for (const auto& [organ, d] : p.event_mGyEq) {
                    if (!rep.target_mGyEq.count(organ)) {
                        continue;
                    }
                    out += fmt::format("{},{:.10g},{},{:.10g},{:.10g},{:.10g}\n", a.material,
                                       p.areal_density_g_cm2, organ, d,
                                       rep.other_30d_mGyEq.at(organ), rep.target_mGyEq.at(organ));
                }
            }
        }
        return out;
    }
    std::string out = wrap(fmt::format("crewdose shelter: event {} at location {}, {}", r.event_id,
                                       r.location_id, where),
                           100, "  ") +
                      fmt::format("scenario: {}\n\n", sc.file);
    out += caution_text() + "\n";
    out += wrap(fmt::format(
                    "Sizing rule: the crew receive the whole event in the shelter; its dose ({} "
                    "body model at the shelter; the higher "
                    "of with and without nuclear reactions; uncertainty factor {:.2f}) plus the "
                    "highest 30-day dose any crew member has from everything else must stay "
                    "within each target. Searched from 0 to {} g/cm2; the answer's dose is at or "
                    "below its target and within 0.5 % of it. The event is taken at {} AU from "
                    "the Sun ({}), its fluence {} times the spectrum as written.",
                    to_string(study.location(r.location_id).body), sc.limits.uncertainty_factor,
                    significant(r.max_g_cm2, 3), significant(rep.sun_distance_AU, 3),
                    rep.sun_distance_AU == sc.mission.sun_distance_AU
                        ? "the site's distance"
                        : "the nearest to the Sun a crew member comes: a shelter in space",
                    significant(rep.fluence_scale, 3)),
                96) +
           "\n";
    out += fmt::format("  {:<6} {:>12} {:>16}\n", "organ", "target", "other 30-day");
    for (const auto& [organ, target] : rep.target_mGyEq) {
        out += fmt::format("  {:<6} {:>12} {:>16}   mGy-Eq\n", organ_label(organ),
                           significant(target, 3), significant(rep.other_30d_mGyEq.at(organ), 3));
    }
    out += "\n";
    for (const auto& a : rep.answers) {
        out += fmt::format("{} ({} g/cm3):\n", a.material, significant(a.density_g_cm3, 3));
        if (a.none_needed) {
            out += fmt::format("  no added material needed: every target is met as built "
                               "(closest: {})\n",
                               organ_label(a.binding_organ));
        } else if (!rep.other_alone_exceeds.empty()) {
            // Nothing was searched: the crew's other dose alone is already beyond a target.
            std::string doses;
            bool all_above = true;
            for (std::size_t k = 0; k < rep.other_alone_exceeds.size(); ++k) {
                const std::string& organ = rep.other_alone_exceeds[k];
                const double other = rep.other_30d_mGyEq.at(organ);
                const double target = rep.target_mGyEq.at(organ);
                all_above = all_above && other > target;
                doses += fmt::format(
                    "{}{} {} mGy-Eq, target {}",
                    k == 0 ? "" : (k + 1 == rep.other_alone_exceeds.size() ? " and " : ", "),
                    organ_label(organ), significant(other, 3), significant(target, 3));
            }
            out += wrap(fmt::format("  NOT ACHIEVABLE: the crew's other 30-day dose alone ({}) "
                                    "{} its target, so no shelter can meet it",
                                    doses, all_above ? "exceeds" : "reaches or exceeds"),
                        100, "    ");
        } else if (!a.achievable) {
            out += wrap(fmt::format("  NOT ACHIEVABLE: {} g/cm2{} does not bring {} within its "
                                    "target",
                                    significant(a.searched_to_g_cm2, 3),
                                    a.limited_by_room ? " (as much as the geometry takes: more "
                                                        "would reach the dose point or another "
                                                        "solid)"
                                                      : "",
                                    organ_label(a.binding_organ)),
                        100, "    ");
        } else {
            out += fmt::format(
                "  minimum {} g/cm2 = {} cm, {} kg/m2", significant(a.areal_density_g_cm2, 3),
                significant(a.thickness_cm, 3), significant(a.mass_per_area_kg_m2, 3));
            if (a.added_mass_kg) {
                out += fmt::format(", added mass {} kg", significant(*a.added_mass_kg, 3));
            }
            out += fmt::format("; set by {}\n", organ_label(a.binding_organ));
        }
        out += fmt::format("  {:>12}", "g/cm2");
        for (const auto& [organ, target] : rep.target_mGyEq) {
            out += fmt::format(" {:>14}", organ_label(organ) + " event");
        }
        out += "   (mGy-Eq)\n";
        for (const auto& p : a.curve) {
            out += fmt::format("  {:>12}", significant(p.areal_density_g_cm2, 3));
            for (const auto& [organ, target] : rep.target_mGyEq) {
                out += fmt::format(" {:>14}", significant(p.event_mGyEq.at(organ), 3));
            }
            out += "\n";
        }
        out += "\n";
    }
    return out;
}

} // namespace crewdose::planner
