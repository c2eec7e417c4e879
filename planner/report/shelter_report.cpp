#include "planner/report/shelter_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/document_writer.hpp"
#include "planner/report/number_format.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>

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

// Where the material goes, in words.
std::string where_text(const ShelterRequest& r) {
    return r.solid_id ? fmt::format("a layer added inside layer {} of solid '{}'",
                                    r.layer_index + 1, *r.solid_id)
                      : std::string("a uniform shell around the dose point, every direction");
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

report::Document shelter_document(const Study& study, const ShelterReport& rep) {
    using report::Field;
    using report::Value;
    const Scenario& sc = study.scenario();
    const auto& r = rep.request;
    const auto sig3 = [](std::string key, double v) {
        return Field{std::move(key), v, 3, report::Rounding::significant};
    };
    // The targets' doses, text and CSV: each computed (a finite dose >= 0), or the report stops
    // (exit 3) before anything is printed.
    std::map<std::string, double> target;
    std::map<std::string, double> other;
    for (const auto& [organ, t] : rep.target_mGyEq) {
        target[organ] = require_dose(t, "a shelter target");
        other[organ] =
            require_dose(value_or_nan(rep.other_30d_mGyEq, organ), "a shelter's other 30-day dose");
    }
    const auto curve_dose = [](const ShelterPoint& p, const std::string& organ) {
        return require_dose(p.event_mGyEq.at(organ), "a shelter curve's dose");
    };
    const VerdictTable answer = shelter_answer(rep);
    report::Document doc;

    // JSON: the request and its context, the answer sentence (the table's headline, so that
    // JSON, text and HTML cannot disagree).
    const auto by_organ_numbers = [](const std::map<std::string, double>& m) {
        report::Object o;
        for (const auto& [organ, v] : m) {
            o.fields.push_back({organ, v});
        }
        return o;
    };
    report::Object not_targets;
    for (const auto& [organ, why] : rep.not_targets) {
        not_targets.fields.push_back({organ, why});
    }
    doc.group({"",
               {{"event", r.event_id},
                {"location", r.location_id},
                {"added_as", where_text(r)},
                {"body_model", study.location(r.location_id).body},
                {"uncertainty_factor", sc.limits.uncertainty_factor},
                {"max_g_cm2", r.max_g_cm2},
                {"targets_mGyEq", by_organ_numbers(rep.target_mGyEq)},
                {"other_30d_mGyEq", by_organ_numbers(rep.other_30d_mGyEq)},
                {"sun_distance_AU", rep.sun_distance_AU},
                {"fluence_scale", rep.fluence_scale},
                {"other_alone_exceeds_target", report::List{rep.other_alone_exceeds}},
                {"not_targets", not_targets},
                {"answer", answer.headline}}});

    // JSON: per material the answer's status (the word and class of the same table), its dose
    // (null when not computed) and the search's figures; the curve as records.
    report::Table answers;
    answers.key = "answers";
    answers.in_text = false;
    const auto json_column = [](std::string key, bool omit_absent = false) {
        auto c = report::text_column(std::move(key)).shown_in(false, true, false);
        c.omit_absent_in_json = omit_absent;
        return c;
    };
    for (const char* key : {"material", "status", "status_text", "dose_mGyEq", "target_mGyEq",
                            "density_g_cm3", "achievable", "none_needed", "binding_organ",
                            "searched_to_g_cm2", "limited_by_room", "evaluations"}) {
        answers.columns.push_back(json_column(key));
    }
    for (const char* key :
         {"areal_density_g_cm2", "thickness_cm", "mass_per_area_kg_m2", "added_mass_kg", "curve"}) {
        answers.columns.push_back(json_column(key, true));
    }
    // A dose that was not computed is nothing (JSON null), never a number.
    const auto dose_value = [](double v) -> Value {
        return std::isfinite(v) && v >= 0.0 ? Value(v) : Value();
    };
    for (std::size_t i = 0; i < rep.answers.size(); ++i) {
        const ShelterAnswer& a = rep.answers[i];
        report::Records curve;
        for (const auto& p : a.curve) {
            report::Object event;
            for (const auto& [organ, d] : p.event_mGyEq) {
                event.fields.push_back({organ, target.count(organ) ? curve_dose(p, organ) : d});
            }
            curve.items.push_back(
                {{"areal_density_g_cm2", p.areal_density_g_cm2}, {"event_mGyEq", event}});
        }
        const auto if_achievable = [&](double v) {
            return a.achievable ? Value(v) : Value();
        };
        answers.rows.push_back(
            {a.material, answer.rows[i].back().status, answer.rows[i].back().text,
             dose_value(answer_dose(rep, a)),
             dose_value(value_or_nan(rep.target_mGyEq, a.binding_organ)), a.density_g_cm3,
             a.achievable, a.none_needed, a.binding_organ, a.searched_to_g_cm2, a.limited_by_room,
             static_cast<std::int64_t>(a.evaluations), if_achievable(a.areal_density_g_cm2),
             if_achievable(a.thickness_cm), if_achievable(a.mass_per_area_kg_m2),
             a.achievable && a.added_mass_kg ? Value(*a.added_mass_kg) : Value(),
             a.curve.empty() ? Value() : Value(std::move(curve))});
    }
    doc.table(std::move(answers));

    // CSV: one header; each material's answer first ("answer" rows), then the curves ("curve"
    // rows, the targets' organs only).
    report::Table csv;
    csv.key = "rows";
    csv.in_text = false;
    csv.in_json = false;
    csv.is_csv = true;
    const auto csv_text = [](std::string key) {
        return report::text_column(std::move(key));
    };
    const auto csv_number = [](std::string key) {
        return report::number_column(std::move(key), {});
    };
    csv.columns = {csv_text("material"),
                   csv_number("areal_density_g_cm2"),
                   csv_text("organ"),
                   csv_number("event_mGyEq"),
                   csv_number("other_30d_mGyEq"),
                   csv_number("target_mGyEq"),
                   csv_text("row"),
                   csv_text("achievable"),
                   csv_number("added_mass_kg")};
    for (const auto& a : rep.answers) {
        const Outcome k = outcome_of(rep, a);
        const bool found = k == Outcome::as_built || k == Outcome::needs;
        const std::string& organ = a.binding_organ;
        // The event dose at the answer: a value the curve does not have is a NaN, which the
        // writer refuses (exit 3), never prints.
        csv.rows.push_back(
            {a.material, found ? Value(answer_depth(k, a)) : Value(), organ,
             found ? Value(event_at(a, answer_depth(k, a), organ)) : Value(),
             require_dose(value_or_nan(rep.other_30d_mGyEq, organ),
                          "a shelter answer's other dose"),
             require_dose(value_or_nan(rep.target_mGyEq, organ), "a shelter target"),
             std::string("answer"),
             std::string(k == Outcome::impossible ? "impossible" : (found ? "yes" : "no")),
             found && a.added_mass_kg ? Value(*a.added_mass_kg) : Value()});
    }
    for (const auto& a : rep.answers) {
        for (const auto& p : a.curve) {
            for (const auto& [organ, d] : p.event_mGyEq) {
                if (!target.count(organ)) {
                    continue;
                }
                csv.rows.push_back({a.material, p.areal_density_g_cm2, organ, curve_dose(p, organ),
                                    other.at(organ), target.at(organ), std::string("curve"),
                                    Value(), Value()});
            }
        }
    }
    doc.table(std::move(csv));

    // Text: the answer first, the cautions, the sizing rule, the targets, per material the
    // answer's detail and its dose-thickness table.
    doc.text("crewdose shelter: event {} at location {}, {}",
             {Field{"event", r.event_id}, Field{"location", r.location_id},
              Field{"added_as", where_text(r)}},
             100, "  ");
    doc.text("scenario: {}", {Field{"scenario", sc.file}});
    doc.blank();
    append_verdict(doc, answer);
    doc.keyed_text("cautions", caution_text());
    doc.blank();

    // Where the layer's room stopped the search short of --max-g-cm2: " (the room in the layer
    // allows no more than 61.1 g/cm2 of polyethylene)", or nothing.
    std::string room;
    std::vector<Field> room_args;
    for (const auto& a : rep.answers) {
        if (a.limited_by_room) {
            room += room.empty() ? " (the room in the layer allows no more than " : ", ";
            room += "{} g/cm2 of {}";
            room_args.push_back(sig3("searched_to_g_cm2", a.searched_to_g_cm2));
            room_args.push_back({"material", a.material});
        }
    }
    if (!room.empty()) {
        room += ")";
    }
    std::vector<Field> rule_args{
        {"body_model", study.location(r.location_id).body},
        {"uncertainty_factor", sc.limits.uncertainty_factor, 2, report::Rounding::fixed},
        sig3("max_g_cm2", r.max_g_cm2)};
    rule_args.insert(rule_args.end(), room_args.begin(), room_args.end());
    rule_args.push_back(sig3("sun_distance_AU", rep.sun_distance_AU));
    rule_args.push_back({"where", std::string(rep.sun_distance_AU == sc.mission.sun_distance_AU
                                                  ? "the site's distance"
                                                  : "the nearest to the Sun a crew member "
                                                    "comes: a shelter in space")});
    rule_args.push_back(sig3("fluence_scale", rep.fluence_scale));
    doc.text(
        "Sizing rule: the crew receive the whole event in the shelter; its dose ({} body "
        "model at the shelter; the higher of with and without nuclear reactions; "
        "uncertainty factor {}) plus the highest 30-day dose any crew member has from "
        "everything else must stay within each target. Searched from 0 to {} g/cm2" +
            room +
            "; the answer's dose is at or below its target, the event's within half a per cent of "
            "what the other dose leaves. The "
            "event is taken at {} AU from the Sun ({}), its fluence {} times the spectrum "
            "as written.",
        rule_args, 96);
    doc.blank();

    report::Table targets;
    targets.key = "targets";
    targets.in_json = false;
    auto organ_col = report::text_column("organ", "organ");
    organ_col.min_width = 6;
    auto target_col = report::number_column("target_mGyEq", "target", {}, 12, 1.0, 3);
    target_col.gap = 1;
    auto other_col = report::number_column("other_30d_mGyEq", "other 30-day", {}, 16, 1.0, 3);
    other_col.gap = 1;
    auto unit_col = report::text_column("unit");
    unit_col.gap = 3;
    targets.columns = {organ_col, target_col, other_col, unit_col};
    for (const auto& [organ, t] : target) {
        targets.rows.push_back({organ_label(organ), t, other.at(organ), std::string("mGy-Eq")});
    }
    doc.table(std::move(targets));
    for (const auto& [organ, why] : rep.not_targets) {
        doc.text("  {}: not a target: the crew's 30-day {} dose is not evaluated for {} (the "
                 "quick body model; body = \"phantom\" there makes it one)",
                 {Field{"organ", organ_label(organ)}, Field{"organ", organ_label(organ)},
                  Field{"why", why}},
                 100, "    ");
    }
    doc.blank();

    for (const auto& a : rep.answers) {
        doc.text("{} ({} g/cm3):",
                 {Field{"material", a.material}, sig3("density", a.density_g_cm3)});
        if (a.none_needed) {
            doc.text("  no added material needed: every target is met as built (closest: {})",
                     {Field{"organ", organ_label(a.binding_organ)}});
        } else if (!rep.other_alone_exceeds.empty()) {
            // Nothing was searched: the crew's other dose alone is already beyond a target.
            std::string doses;
            std::vector<Field> args;
            bool all_above = true;
            for (std::size_t k = 0; k < rep.other_alone_exceeds.size(); ++k) {
                const std::string& organ = rep.other_alone_exceeds[k];
                all_above = all_above && other.at(organ) > target.at(organ);
                doses += k == 0 ? "" : (k + 1 == rep.other_alone_exceeds.size() ? " and " : ", ");
                doses += "{} {} mGy-Eq, target {}";
                args.push_back({"organ", organ_label(organ)});
                args.push_back(sig3("other_30d_mGyEq", other.at(organ)));
                args.push_back(sig3("target_mGyEq", target.at(organ)));
            }
            args.push_back({"verb", std::string(all_above ? "exceeds" : "reaches or exceeds")});
            doc.text("  NOT ACHIEVABLE: the crew's other 30-day dose alone (" + doses +
                         ") {} its target, so no shelter can meet it",
                     args, 100, "    ");
        } else if (!a.achievable) {
            doc.text("  NOT ACHIEVABLE: {} g/cm2{} does not bring {} within its target",
                     {sig3("searched_to_g_cm2", a.searched_to_g_cm2),
                      Field{"room",
                            std::string(a.limited_by_room ? " (as much as the geometry takes: more "
                                                            "would reach the dose point or another "
                                                            "solid)"
                                                          : "")},
                      Field{"organ", organ_label(a.binding_organ)}},
                     100, "    ");
        } else {
            std::vector<Field> args{sig3("areal_density_g_cm2", a.areal_density_g_cm2),
                                    sig3("thickness_cm", a.thickness_cm),
                                    sig3("mass_per_area_kg_m2", a.mass_per_area_kg_m2)};
            std::string pattern = "  minimum {} g/cm2 = {} cm, {} kg/m2";
            if (a.added_mass_kg) {
                pattern += ", added mass {} kg";
                args.push_back(sig3("added_mass_kg", *a.added_mass_kg));
            }
            args.push_back({"organ", organ_label(a.binding_organ)});
            doc.text(pattern + "; set by {}", args);
        }
        report::Table t;
        t.key = "curve";
        t.in_json = false;
        t.columns.push_back(report::number_column("areal_density_g_cm2", "g/cm2", {}, 12, 1.0, 3));
        for (const auto& [organ, tg] : target) {
            auto c = report::number_column(organ, organ_label(organ) + " event", {}, 14, 1.0, 3);
            c.gap = 1;
            t.columns.push_back(std::move(c));
        }
        auto unit = report::text_column("unit", "(mGy-Eq)");
        unit.gap = 3;
        t.columns.push_back(std::move(unit));
        for (const auto& p : a.curve) {
            std::vector<Value> row{p.areal_density_g_cm2};
            for (const auto& [organ, tg] : target) {
                row.emplace_back(curve_dose(p, organ));
            }
            row.emplace_back(std::string());
            t.rows.push_back(std::move(row));
        }
        doc.table(std::move(t));
        doc.blank();
    }
    return doc;
}

std::string format_shelter_report(const Study& study, const ShelterReport& rep,
                                  OutputFormat format) {
    return report::write(shelter_document(study, rep), format);
}

} // namespace crewdose::planner
