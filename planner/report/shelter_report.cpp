#include "planner/report/shelter_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/number_format.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>

namespace crewdose::planner {

namespace {

enum class Outcome { as_built, needs, not_achievable, impossible };

Outcome outcome_of(const ShelterReport& rep, const ShelterAnswer& a) {
    if (!rep.other_alone_exceeds.empty()) {
        return Outcome::impossible;
    }
    if (a.none_needed) {
        return Outcome::as_built;
    }
    return a.achievable ? Outcome::needs : Outcome::not_achievable;
}

// The event's dose of `organ` at `areal_density_g_cm2` of the answer's curve (which holds the
// answer, 0 when met as built and the areal density searched to when none is found); NaN when
// the curve does not have it.
double event_at(const ShelterAnswer& a, double areal_density_g_cm2, const std::string& organ) {
    for (const auto& p : a.curve) {
        if (p.areal_density_g_cm2 == areal_density_g_cm2) {
            const auto it = p.event_mGyEq.find(organ);
            if (it != p.event_mGyEq.end()) {
                return it->second;
            }
        }
    }
    return std::numeric_limits<double>::quiet_NaN();
}

double value_or_nan(const std::map<std::string, double>& m, const std::string& key) {
    const auto it = m.find(key);
    return it == m.end() ? std::numeric_limits<double>::quiet_NaN() : it->second;
}

// The areal density whose dose the answer row shows.
double answer_depth(Outcome k, const ShelterAnswer& a) {
    switch (k) {
    case Outcome::as_built:
        return 0.0;
    case Outcome::needs:
        return a.areal_density_g_cm2;
    case Outcome::not_achievable:
        return a.searched_to_g_cm2;
    case Outcome::impossible:
        break;
    }
    return std::numeric_limits<double>::quiet_NaN();
}

// The binding organ's dose at the answer: the event there plus the other 30-day dose (the
// other dose alone when no shelter can meet the target).
double answer_dose(const ShelterReport& rep, const ShelterAnswer& a) {
    const Outcome k = outcome_of(rep, a);
    const double other = value_or_nan(rep.other_30d_mGyEq, a.binding_organ);
    return k == Outcome::impossible ? other
                                    : event_at(a, answer_depth(k, a), a.binding_organ) + other;
}

// Where the layer's room stopped the search short of --max-g-cm2: "; the room allows no more
// than 61.1 g/cm2 of polyethylene", or nothing.
std::string room_note(const ShelterReport& rep) {
    std::vector<std::string> parts;
    for (const auto& a : rep.answers) {
        if (a.limited_by_room) {
            parts.push_back(
                fmt::format("{} g/cm2 of {}", significant(a.searched_to_g_cm2, 3), a.material));
        }
    }
    if (parts.empty()) {
        return "";
    }
    return fmt::format(" (the room in the layer allows no more than {})", fmt::join(parts, ", "));
}

} // namespace

VerdictTable shelter_answer(const ShelterReport& rep) {
    VerdictTable t;
    bool masses = false;
    for (const auto& a : rep.answers) {
        masses = masses || a.added_mass_kg.has_value();
    }
    t.columns = {"material", "least added"};
    if (masses) {
        t.columns.emplace_back("added mass");
    }
    t.columns.insert(t.columns.end(), {"binding", "dose / target", "status"});
    std::vector<std::string> needs;
    std::vector<std::string> not_achievable;
    for (const auto& a : rep.answers) {
        const Outcome k = outcome_of(rep, a);
        const double target = value_or_nan(rep.target_mGyEq, a.binding_organ);
        const double dose = answer_dose(rep, a);
        // Every organ's dose at the answer must have been computed, not only the binding one's.
        bool known = std::isfinite(dose) && dose >= 0.0;
        if (k != Outcome::impossible) {
            for (const auto& [organ, target_of] : rep.target_mGyEq) {
                const double e = event_at(a, answer_depth(k, a), organ);
                known = known && std::isfinite(e) && e >= 0.0;
            }
        }
        // Met only when the dose was computed and is at or below the target.
        const bool met = dose_within(dose, target);
        std::vector<VerdictCell> row{{a.material}};
        row.push_back({k == Outcome::as_built ? "0 g/cm2"
                       : k == Outcome::needs  ? significant(a.areal_density_g_cm2, 3) + " g/cm2"
                                              : "-",
                       true});
        if (masses) {
            row.push_back({k == Outcome::needs && a.added_mass_kg
                               ? significant(*a.added_mass_kg, 3) + " kg"
                               : (k == Outcome::as_built ? "0 kg" : "-"),
                           true});
        }
        row.push_back({organ_label(a.binding_organ)});
        row.push_back(
            {fmt::format("{} / {} mGy-Eq", verdict_dose_text(dose), verdict_dose_text(target)),
             true});
        std::string word;
        std::string status = "exceeded";
        if (!known) {
            word = "not computed";
        } else if (k == Outcome::impossible) {
            word = "IMPOSSIBLE: other dose alone";
        } else if (k == Outcome::not_achievable) {
            word =
                fmt::format("NOT ACHIEVABLE within {} g/cm2{}", significant(a.searched_to_g_cm2, 3),
                            a.limited_by_room ? " (all the room there is)" : "");
            not_achievable.push_back(a.material);
        } else if (!met) {
            word = "EXCEEDED";
        } else {
            status = "within";
            if (k == Outcome::as_built) {
                word = "met as built";
            } else {
                word = fmt::format("needs {} g/cm2", significant(a.areal_density_g_cm2, 3));
                needs.push_back(fmt::format("{} g/cm2 of {}", significant(a.areal_density_g_cm2, 3),
                                            a.material));
            }
        }
        row.push_back({word, false, status});
        t.rows.push_back(std::move(row));
    }
    const auto join = [](const std::vector<std::string>& parts, const char* last) {
        std::string out;
        for (std::size_t i = 0; i < parts.size(); ++i) {
            out += (i == 0 ? "" : (i + 1 == parts.size() ? last : ", ")) + parts[i];
        }
        return out;
    };
    bool all_met = !rep.answers.empty();
    bool any_unknown = false;
    for (const auto& row : t.rows) {
        all_met = all_met && row.back().text == "met as built";
        any_unknown = any_unknown || row.back().text == "not computed";
    }
    if (!rep.other_alone_exceeds.empty()) {
        std::vector<std::string> organs;
        for (const auto& o : rep.other_alone_exceeds) {
            organs.push_back(organ_label(o));
        }
        t.headline = fmt::format("Answer: NO SHELTER CAN MEET THE {} TARGET{}: the crew's other "
                                 "30-day dose alone reaches {}.",
                                 join(organs, " and "), organs.size() == 1 ? "" : "S",
                                 organs.size() == 1 ? "it" : "them");
    } else if (any_unknown) {
        t.headline = "Answer: NOT FOUND: a dose the answer needs was not computed.";
    } else if (all_met) {
        t.headline = "Answer: the shelter meets every target as built; nothing needs adding.";
    } else if (needs.empty()) {
        t.headline = fmt::format("Answer: NOT ACHIEVABLE with {} within the areal density "
                                 "searched.",
                                 join(not_achievable, " or "));
    } else {
        t.headline =
            fmt::format("Answer: add at least {}{}.", join(needs, " or "),
                        not_achievable.empty() ? ""
                                               : fmt::format("; NOT ACHIEVABLE with {}",
                                                             join(not_achievable, " or ")));
    }
    t.note = fmt::format("least added: the least areal density of the material that keeps every "
                         "organ within its target{}; binding: the organ whose target sets it; "
                         "dose: the event in the shelter there plus the crew's highest other "
                         "30-day dose{}.",
                         masses ? "; added mass: the layer's, for the solid's real geometry" : "",
                         rep.other_alone_exceeds.empty()
                             ? ""
                             : " (IMPOSSIBLE: that other dose alone, which already reaches the "
                               "target, so no shelter can meet it)");
    return t;
}

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
        j["body_model"] = study.location(r.location_id).body;
        j["uncertainty_factor"] = sc.limits.uncertainty_factor;
        j["max_g_cm2"] = r.max_g_cm2;
        j["targets_mGyEq"] = rep.target_mGyEq;
        j["other_30d_mGyEq"] = rep.other_30d_mGyEq;
        j["sun_distance_AU"] = rep.sun_distance_AU;
        j["fluence_scale"] = rep.fluence_scale;
        j["other_alone_exceeds_target"] = rep.other_alone_exceeds;
        j["not_targets"] = rep.not_targets;
        // The answer the text and HTML open with: its sentence, and per material the status
        // word and class of the same table (so JSON, text and HTML cannot disagree).
        const VerdictTable answer = shelter_answer(rep);
        j["answer"] = answer.headline;
        j["answers"] = nlohmann::json::array();
        for (std::size_t i = 0; i < rep.answers.size(); ++i) {
            const ShelterAnswer& a = rep.answers[i];
            // A dose that was not computed is null, never a number.
            const auto dose_json = [](double v) {
                return std::isfinite(v) && v >= 0.0 ? nlohmann::json(v) : nlohmann::json(nullptr);
            };
            nlohmann::json aj{
                {"material", a.material},
                {"status", answer.rows[i].back().status},
                {"status_text", answer.rows[i].back().text},
                {"dose_mGyEq", dose_json(answer_dose(rep, a))},
                {"target_mGyEq", dose_json(value_or_nan(rep.target_mGyEq, a.binding_organ))},
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
        // One header. The answers first ("answer" rows), then the curves ("curve" rows).
        std::string out = "material,areal_density_g_cm2,organ,event_mGyEq,other_30d_mGyEq,"
                          "target_mGyEq,row,achievable,added_mass_kg\n";
        for (const auto& a : rep.answers) {
            const Outcome k = outcome_of(rep, a);
            const bool found = k == Outcome::as_built || k == Outcome::needs;
            const std::string& organ = a.binding_organ;
            // The numbers go through require_dose: a value that was not computed stops the
            // report (exit 3), never prints.
            const std::string depth =
                found ? fmt::format("{:.10g}", require_dose(answer_depth(k, a), "a shelter answer"))
                      : "";
            const std::string event =
                found ? fmt::format("{:.10g}", require_dose(event_at(a, answer_depth(k, a), organ),
                                                            "a shelter answer's dose"))
                      : "";
            out += fmt::format(
                "{},{},{},{},{:.10g},{:.10g},answer,{},{}\n", a.material, depth, organ, event,
                require_dose(value_or_nan(rep.other_30d_mGyEq, organ),
                             "a shelter answer's other dose"),
                require_dose(value_or_nan(rep.target_mGyEq, organ), "a shelter target"),
                k == Outcome::impossible ? "impossible" : (found ? "yes" : "no"),
                found && a.added_mass_kg ? fmt::format("{:.10g}", *a.added_mass_kg) : "");
        }
        for (const auto& a : rep.answers) {
            for (const auto& p : a.curve) {
                for (const auto& [organ, d] : p.event_mGyEq) {
                    if (!rep.target_mGyEq.count(organ)) {
                        continue;
                    }
                    out += fmt::format("{},{:.10g},{},{:.10g},{:.10g},{:.10g},curve,,\n",
                                       a.material, p.areal_density_g_cm2, organ,
                                       require_dose(d, "a shelter curve's dose"),
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
    out += format_verdict_text(shelter_answer(rep));
    out += caution_text() + "\n";
    out +=
        wrap(fmt::format(
                 "Sizing rule: the crew receive the whole event in the shelter; its dose ({} "
                 "body model at the shelter; the higher "
                 "of with and without nuclear reactions; uncertainty factor {:.2f}) plus the "
                 "highest 30-day dose any crew member has from everything else must stay "
                 "within each target. Searched from 0 to {} g/cm2{}; the answer's dose is at or "
                 "below its target and within 0.5 % of it. The event is taken at {} AU from "
                 "the Sun ({}), its fluence {} times the spectrum as written.",
                 study.location(r.location_id).body, sc.limits.uncertainty_factor,
                 significant(r.max_g_cm2, 3), room_note(rep), significant(rep.sun_distance_AU, 3),
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
    for (const auto& [organ, why] : rep.not_targets) {
        out += wrap(fmt::format("  {}: not a target: the crew's 30-day {} dose is not evaluated "
                                "for {} (the quick body model; body = \"phantom\" there "
                                "makes it one)",
                                organ_label(organ), organ_label(organ), why),
                    100, "    ");
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
