#include "planner/report/check_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/document_writer.hpp"
#include "planner/report/number_format.hpp"
#include "planner/scenario/spectrum_spec.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/study/body_model.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <set>

namespace crewdose::planner {
namespace {

// The unit of an organ's ledger: the effective dose is in mSv, every organ dose in mGy-Eq.
const char* unit_of(const std::string& organ) {
    return organ == "effective" ? "mSv" : "mGy-Eq";
}

std::string body_text(const Study& study) {
    const Scenario& sc = study.scenario();
    std::string t;
    for (const BodyModel* model : body_models()) {
        std::vector<std::string> at;
        for (const auto& loc : sc.locations) {
            if (loc.body == model->id()) {
                at.push_back(loc.id);
            }
        }
        if (!at.empty()) {
            t += fmt::format("{}{} at {}", t.empty() ? "" : "; ", model->report_text(sc.mission),
                             fmt::join(at, ", "));
        }
    }
    return t;
}

std::string phi_text(const Mission& m) {
    std::string t = fmt::format("phi = {:.0f} MV from the mission start", m.gcr_phi_MV);
    for (const auto& phase : m.gcr_phases) {
        t += fmt::format(", {:.0f} MV from {}", phase.phi_MV, format_time(phase.from));
    }
    if (!m.gcr_phi_series.empty()) {
        t += fmt::format(" ({}by month from the recorded solar cycle: Usoskin et al. 2017, "
                         "2014-2025; a later or earlier month takes the lowest value within a "
                         "year of its phase, 11 years apart; rounded down to {:.0f} MV; a "
                         "planning estimate, not a forecast)",
                         m.gcr_phi_given ? "" : "no value given: ", kRecordedPhiStep_MV);
    }
    return t;
}

std::string model_text(const Study& study) {
    const Scenario& sc = study.scenario();
    return fmt::format(
        "Model: body: {}; {} directions per quick-model location for SPEs, {} for GCR; "
        "SPE primary protons by straight-ahead CSDA transport; GCR nuclei Z = 1-28 from the "
        "Burger et al. 2000 local interstellar spectrum (protons, helium) and ISO 15390 spectral "
        "shapes scaled to HEAO-3 abundances (heavier nuclei), force-field modulated with {}, "
        "marched straight ahead through the same range tables with nucleus-nucleus removal "
        "(Sihver et al. 1993), projectile fragmentation (EPAX 3.1 remnants; the charge they "
        "lack leaves as protons, the nucleons left as neutrons, at the same velocity) and the "
        "secondaries of nucleon reactions (neutrons, protons, deuterons, tritons, helions and "
        "alphas from ENDF/B-VIII.1 to 150 MeV and a fit to measured neutron spectra above; "
        "target fragments and slow light ions deposited where they are made; recoil protons "
        "of neutron scattering on hydrogen), and again "
        "without any nuclear reaction; as for the SPE protons, every dose is the higher of the "
        "two, quantity by quantity. Against published in-situ measurements the GCR model is "
        "still low (see the README). Not modelled: pions and the electromagnetic cascade, the "
        "target fragments of nucleus-nucleus reactions, neutrons emitted backwards. "
        "RBE-weighted dose with NCRP 132 values; "
        "uncertainty factor {:.2f} applied to every dose. Window maxima are exact at "
        "activity and event boundaries and sampled every 10 minutes inside event profiles.",
        body_text(study), study.direction_count(), sc.mission.gcr_directions, phi_text(sc.mission),
        sc.limits.uncertainty_factor);
}

// A limit quantity's totals: "dose" in the organ's unit (mGy-Eq, or mSv for the effective
// dose); for an organ also its absorbed dose and dose equivalent (the effective dose is itself
// a dose equivalent, so it has no other quantity).
// What the GCR march includes, for the JSON.
constexpr const char* kGcrTransport =
    "straight-ahead depth march of the whole field with nuclear reactions (removal, projectile "
    "fragmentation with EPAX 3.1 remnants, the secondaries of nucleon reactions: n, p, d, t, "
    "He-3, alpha, target fragments deposited locally; recoil protons of n-p elastic "
    "scattering) and without any; limits use the higher of each quantity; not modelled: pions "
    "and the electromagnetic cascade, target fragments of nucleus-nucleus reactions, neutrons "
    "emitted backwards";

using report::Field;
using report::List;
using report::Object;
using report::Records;
using report::Value;

Field field(std::string key, Value value, double scale = 1.0) {
    Field f{std::move(key), std::move(value)};
    f.scale = scale;
    return f;
}

// A number for a sentence: `digits` significant figures, or `digits` decimals when `fixed`.
Field figure(double value, int digits = 3, bool fixed = false, double scale = 1.0) {
    Field f{"value", value, digits,
            fixed ? report::Rounding::fixed : report::Rounding::significant};
    f.scale = scale;
    return f;
}

Field word(std::string text, report::Tone tone = report::Tone::plain) {
    Field f{"text", std::move(text)};
    f.tone = tone;
    return f;
}

Value time_or_empty(bool set, const Time& t) {
    return set ? format_time(t) : std::string();
}

List list_of(const std::vector<std::string>& items, std::string separator = ", ") {
    return List{items, std::move(separator)};
}

// A limit quantity's totals: "dose" in the organ's unit (mGy-Eq, or mSv for the effective
// dose); for an organ also its absorbed dose and dose equivalent (the effective dose is itself
// a dose equivalent, so it has no other quantity).
Object totals_object(const DoseTotals& t, const std::string& organ) {
    Object o{{field("dose", t.mGyEq)}};
    if (organ != "effective") {
        o.fields.push_back(field("absorbed_mGy", t.absorbed_mGy));
        o.fields.push_back(field("dose_equivalent_mSv", t.dose_equivalent_mSv));
    }
    return o;
}

// Dose quantities stored in Gy and Sv, shown in mGy, mSv and mGy-Eq.
Object dose_object(const exposure::DoseQuantities& d) {
    return Object{{field("absorbed_mGy", d.absorbed_Gy, 1e3),
                   field("dose_equivalent_mSv", d.dose_equivalent_Sv, 1e3),
                   field("mGyEq", d.rbe_weighted_GyEq, 1e3)}};
}

Object window_object(const WindowMax& w) {
    return Object{{field("dose", w.dose_mGyEq),
                   field("window_start", time_or_empty(w.dose_mGyEq > 0, w.window_start)),
                   field("window_end", time_or_empty(w.dose_mGyEq > 0, w.window_end)),
                   field("top_contributor", w.top_contributor)}};
}

std::vector<std::string> keys_of(const std::map<std::string, std::vector<std::string>>& m) {
    std::vector<std::string> keys;
    for (const auto& [k, v] : m) {
        keys.push_back(k);
    }
    return keys;
}

Object lists_by_key(const std::map<std::string, std::vector<std::string>>& m) {
    Object o;
    for (const auto& [k, v] : m) {
        o.fields.push_back(field(k, list_of(v)));
    }
    return o;
}

// The JSON of the check: the same keys and numbers whatever the text shows.
void add_json(report::Document& doc, const Study& study, const LedgerResult& ledger,
              double near_share) {
    const Scenario& sc = study.scenario();
    Object body_models;
    for (const auto& loc : sc.locations) {
        body_models.fields.push_back(field(loc.id, loc.body));
    }
    Records headline;
    for (const auto& c : ledger.crew) {
        // What the text verdict says beside the row: the organs not evaluated and the doses
        // that are only an upper bound (their locations are under "crew").
        const List not_evaluated = list_of(keys_of(c.not_evaluated));
        const List bounded = list_of(keys_of(c.estimated));
        const LimitCheck* b = binding_check(c);
        if (!b) {
            headline.items.push_back({field("crew", c.crew), field("organ", {}),
                                      field("status", std::string("no limit evaluated")),
                                      field("not_evaluated", not_evaluated),
                                      field("bounded", bounded)});
            continue;
        }
        headline.items.push_back(
            {field("crew", c.crew), field("organ", b->limit.organ),
             field("window", b->limit.window), field("dose", b->dose),
             field("limit", b->limit.value), field("unit", std::string(unit_of(b->limit.organ))),
             field("share_of_limit", b->dose / b->limit.value),
             field("status", to_string(status_of(*b, near_share))),
             field("budget_days", c.budget.binds ? Value(c.budget.days) : Value()),
             field("budget_binds",
                   c.budget.binds ? c.budget.organ + " " + c.budget.window : std::string()),
             field("not_evaluated", not_evaluated), field("bounded", bounded)});
    }
    Records phases;
    for (const auto& phase : sc.mission.gcr_phases) {
        phases.items.push_back(
            {field("from", format_time(phase.from)), field("phi_MV", phase.phi_MV)});
    }
    Object rates;
    for (const auto& loc : sc.locations) {
        Object by_organ;
        for (const auto& organ : study.body(loc.id).organs) {
            const auto& d = study.gcr_daily_dose(loc.id, organ, sc.mission.gcr_phi_MV);
            by_organ.fields.push_back(
                field(organ, Object{{field("with_reactions", dose_object(d.with_removal)),
                                     field("without_reactions", dose_object(d.without_removal)),
                                     field("for_limits", dose_object(d.for_limits()))}}));
        }
        rates.fields.push_back(field(loc.id, std::move(by_organ)));
    }
    Records events;
    for (std::size_t k = 0; k < sc.events.size(); ++k) {
        const auto& e = sc.events[k];
        Records crew;
        for (const auto& c : ledger.crew) {
            if (k < c.event_distances.size()) {
                const auto& d = c.event_distances[k];
                crew.items.push_back({field("id", c.crew), field("sun_distance_AU", d.r_AU),
                                      field("basis", d.basis),
                                      field("fluence_scale", d.fluence_scale)});
            }
        }
        events.items.push_back(
            {field("id", e.id), field("flare_seen", format_time(e.flare_seen)),
             field("arrival", format_time(e.arrival())), field("spectrum", e.spectrum_text),
             field("spectrum_at_AU", e.spectrum_at_AU.value_or(e.sun_distance_AU)),
             field("fluence_exponent", sc.mission.sep_fluence_exponent),
             field("crew", std::move(crew))});
    }
    Records crew;
    for (const auto& c : ledger.crew) {
        std::vector<Field> cf{field("id", c.crew), field("name", c.name),
                              field("not_evaluated", lists_by_key(c.not_evaluated)),
                              field("bounded_from_above", lists_by_key(c.estimated))};
        Object organs;
        for (const auto& o : c.organs) {
            // Every dose of an organ is in its unit, said once: mGy-Eq, or mSv for the
            // effective dose (so no key names a unit that a row does not hold).
            Object of{{field("unit", std::string(unit_of(o.organ))),
                       field("max_30d", window_object(o.max_30d)),
                       field("max_365d", window_object(o.max_365d)),
                       field("career", o.career_mGyEq), field("mission", o.mission_mGyEq),
                       field("mission_by_source",
                             Object{{field("gcr", totals_object(o.gcr, o.organ)),
                                     field("spe", totals_object(o.spe, o.organ)),
                                     field("recorded", totals_object(o.recorded, o.organ))}})}};
            if (o.organ != "effective") {
                of.fields.push_back(field("mission_absorbed_mGy", o.mission_absorbed_mGy));
                of.fields.push_back(
                    field("mission_dose_equivalent_mSv", o.mission_dose_equivalent_mSv));
            }
            organs.fields.push_back(field(o.organ, std::move(of)));
        }
        if (!organs.fields.empty()) {
            cf.push_back(field("organs", std::move(organs)));
        }
        cf.push_back(field(
            "budget",
            Object{{field("binds", c.budget.binds), field("days_after_mission_end", c.budget.days),
                    field("organ", c.budget.organ), field("window", c.budget.window),
                    field("gcr_rate_per_day", c.budget.rate_mGyEq_per_day),
                    field("unit", std::string(c.budget.binds ? unit_of(c.budget.organ) : ""))}}));
        Records limits;
        for (const auto& chk : c.checks) {
            limits.items.push_back(
                {field("organ", chk.limit.organ),
                 field("unit", std::string(unit_of(chk.limit.organ))),
                 field("window", chk.limit.window), field("limit", chk.limit.value),
                 field("basis", chk.limit.basis), field("dose", chk.dose),
                 field("margin", chk.margin), field("exceeded", chk.exceeded),
                 field("where", chk.window_text), field("top_contributor", chk.top_contributor)});
        }
        if (!limits.items.empty()) {
            cf.push_back(field("limits", std::move(limits)));
        }
        crew.items.push_back(std::move(cf));
    }
    Records gaps;
    for (const auto& g : ledger.gaps) {
        gaps.items.push_back({field("crew", g.crew), field("start", format_time(g.start)),
                              field("end", format_time(g.end)), field("charged_at", g.charged_at)});
    }
    doc.group(report::Group{
        "",
        {field("mission",
               Object{{field("name", sc.mission.name), field("site", to_string(sc.mission.site)),
                       field("start", format_time(sc.mission.start)),
                       field("end", format_time(sc.mission.end))}}),
         field("cautions", caution_text()), field("model", model_text(study)),
         field("uncertainty_factor", sc.limits.uncertainty_factor),
         field("directions", static_cast<std::int64_t>(study.direction_count())),
         field("phantom_directions", static_cast<std::int64_t>(sc.mission.phantom_directions)),
         field("body_models", std::move(body_models)),
         field("any_limit_exceeded", ledger.any_exceeded), field("near_share", near_share),
         field("headline", std::move(headline)),
         field("gcr",
               Object{{field("phi_MV", sc.mission.gcr_phi_MV),
                       field("phi_given", sc.mission.gcr_phi_given),
                       field("phi_series", sc.mission.gcr_phi_series),
                       field("composition", std::string(exposure::gcr_composition_source())),
                       field("transport", std::string(kGcrTransport)),
                       field("directions", static_cast<std::int64_t>(sc.mission.gcr_directions)),
                       field("phases", std::move(phases)),
                       field("daily_rates_at_start", std::move(rates))}}),
         field("events", std::move(events)), field("crew", std::move(crew)),
         field("gaps", std::move(gaps))}});
}

// The CSV: a row per crew member and limit. The effective dose is in mSv, every organ dose in
// mGy-Eq: a unit column says which. status: within, near (from near_share of the limit) or
// exceeded; binding: the crew member's highest share of a limit. evaluated: "computed", "upper
// bound at LOCATIONS" (the quick model's bound of the effective dose) or, on a row of its own
// with no dose, "not evaluated at LOCATIONS".
report::Table limits_csv_table(const LedgerResult& ledger, double near_share) {
    report::Table t = report::csv_only_table("limits");
    for (const char* key : {"crew", "organ", "window", "dose", "limit", "margin", "unit",
                            "exceeded", "status", "binding", "basis", "evaluated"}) {
        t.columns.push_back(report::text_column(key));
    }
    const auto yes_no = [](bool b) {
        return std::string(b ? "yes" : "no");
    };
    for (const auto& c : ledger.crew) {
        const LimitCheck* b = binding_check(c);
        for (const auto& chk : c.checks) {
            const auto bound = c.estimated.find(chk.limit.organ);
            t.rows.push_back(
                {c.crew, chk.limit.organ, chk.limit.window, chk.dose, chk.limit.value, chk.margin,
                 std::string(unit_of(chk.limit.organ)), yes_no(chk.exceeded),
                 to_string(status_of(chk, near_share)), yes_no(&chk == b), chk.limit.basis,
                 bound == c.estimated.end()
                     ? std::string("computed")
                     : fmt::format("upper bound at {}", fmt::join(bound->second, " "))});
        }
        for (const auto& [organ, where] : c.not_evaluated) {
            t.rows.push_back({c.crew,
                              organ,
                              std::string(),
                              {},
                              {},
                              {},
                              std::string(unit_of(organ)),
                              std::string(),
                              std::string("not evaluated"),
                              std::string("no"),
                              std::string(),
                              fmt::format("not evaluated at {}", fmt::join(where, " "))});
        }
    }
    return t;
}

// The GCR daily rates at the mission start, with and without nuclear reactions, in the
// organ's unit: text only (JSON: gcr.daily_rates_at_start).
report::Table gcr_rate_table(const Study& study) {
    const Scenario& sc = study.scenario();
    report::Table t;
    t.key = "gcr_daily_rates";
    t.in_json = false;
    t.columns = {report::text_column("location", "location"),
                 report::text_column("organ", "organ"),
                 report::number_column("with_mGyEq", "with", "mGy-Eq/d", 6, 1e3, 3),
                 report::number_column("without_mGyEq", "without", "mGy-Eq/d", 6, 1e3, 3),
                 report::number_column("with_mSv", "with", "mSv/d", 6, 1e3, 3),
                 report::number_column("without_mSv", "without", "mSv/d", 6, 1e3, 3)};
    t.columns[2].absent = "-";
    t.columns[3].absent = "-";
    t.columns[2].gap = 4;
    t.columns[4].gap = 4;
    for (const auto& loc : sc.locations) {
        for (const auto& organ : study.body(loc.id).organs) {
            const auto& d = study.gcr_daily_dose(loc.id, organ, sc.mission.gcr_phi_MV);
            const bool effective = organ == "effective";
            t.rows.push_back({loc.id, effective ? organ : organ_label(organ),
                              effective ? Value() : Value(d.with_removal.rbe_weighted_GyEq),
                              effective ? Value() : Value(d.without_removal.rbe_weighted_GyEq),
                              d.with_removal.dose_equivalent_Sv,
                              d.without_removal.dose_equivalent_Sv});
        }
    }
    return t;
}

// One crew member's limits: dose, limit and margin per organ and window, where the window lies.
report::Table limit_table(const CrewResult& c) {
    report::Table t;
    t.key = "limits_" + c.crew;
    t.in_json = false;
    t.columns = {report::text_column("organ", "organ"),
                 report::text_column("window", "window"),
                 report::number_column("dose", "dose", {}, 8, 1.0, 3),
                 report::text_column("unit", "unit"),
                 report::number_column("limit", "limit", {}, 7, 1.0, 3),
                 report::number_column("margin", "margin", {}, 8, 1.0, 3),
                 report::text_column("where", "where the window lies")};
    t.columns[0].min_width = 9;
    t.columns[1].min_width = 8;
    t.columns[3].min_width = 6;
    for (std::size_t k = 1; k + 1 < t.columns.size(); ++k) {
        t.columns[k].gap = 1;
    }
    t.columns.back().absent = "-";
    for (const auto& chk : c.checks) {
        t.rows.push_back({organ_label(chk.limit.organ), chk.limit.window, chk.dose,
                          std::string(unit_of(chk.limit.organ)), chk.limit.value, chk.margin,
                          chk.window_text.empty() ? Value() : Value(chk.window_text)});
        std::vector<report::Tone> tones(t.columns.size(), report::Tone::plain);
        tones[5] = chk.exceeded ? report::Tone::alarm : report::Tone::plain;
        t.tones.push_back(std::move(tones));
    }
    return t;
}

// One crew member's mission dose by source: mGy-Eq per organ (the effective dose has none) and
// the dose equivalent in mSv.
report::Table source_table(const CrewResult& c) {
    report::Table t;
    t.key = "sources_" + c.crew;
    t.in_json = false;
    t.title = "  mission dose by source";
    t.columns = {report::text_column("organ", "organ"),
                 report::number_column("gcr_mGyEq", "GCR", "mGy-Eq", 6, 1.0, 3),
                 report::number_column("spe_mGyEq", "SPE", "mGy-Eq", 6, 1.0, 3),
                 report::number_column("recorded_mGyEq", "recorded", "mGy-Eq", 6, 1.0, 3),
                 report::number_column("gcr_mSv", "GCR", "mSv", 6, 1.0, 3),
                 report::number_column("spe_mSv", "SPE", "mSv", 6, 1.0, 3),
                 report::number_column("recorded_mSv", "recorded", "mSv", 6, 1.0, 3)};
    t.columns[0].min_width = 9;
    t.columns[4].gap = 4;
    for (std::size_t k = 1; k <= 3; ++k) {
        t.columns[k].absent = "-";
    }
    for (const auto& o : c.organs) {
        const bool effective = o.organ == "effective";
        const auto gy = [effective](const DoseTotals& d) {
            return effective ? Value() : Value(d.mGyEq);
        };
        t.rows.push_back({organ_label(o.organ), gy(o.gcr), gy(o.spe), gy(o.recorded),
                          o.gcr.dose_equivalent_mSv, o.spe.dose_equivalent_mSv,
                          o.recorded.dose_equivalent_mSv});
    }
    return t;
}

// What the text shows of one crew member after the verdict.
void add_crew_text(report::Document& doc, const CrewResult& c) {
    doc.text("{0} ({1})", {word(c.name), word(c.crew)});
    doc.table(limit_table(c));
    const LimitCheck* lowest = nullptr;
    for (const auto& chk : c.checks) {
        if (!lowest || chk.margin / chk.limit.value < lowest->margin / lowest->limit.value) {
            lowest = &chk;
        }
    }
    if (!c.not_evaluated.empty()) {
        std::vector<std::string> organs;
        std::set<std::string> where;
        for (const auto& [organ, locs] : c.not_evaluated) {
            organs.push_back(organ_label(organ));
            where.insert(locs.begin(), locs.end());
        }
        doc.text("  not evaluated: {0} (they need body = \"phantom\"; the quick model is used at "
                 "{1})",
                 {word(fmt::format("{}", fmt::join(organs, ", "))),
                  word(fmt::format("{}", fmt::join(where, ", ")))},
                 100, "    ");
    }
    for (const auto& [organ, locs] : c.estimated) {
        doc.text("  {0}: bounded from above at {1}, where the quick body model stands: the "
                 "effective dose, a weighted mean of organ dose equivalents (ICRP 103), is bounded "
                 "there by the skin at its weight 0.01 and the higher of lens and BFO for the rest "
                 "(conservative; body = \"phantom\" computes it)",
                 {word(organ), word(fmt::format("{}", fmt::join(locs, ", ")))}, 100, "    ");
    }
    if (lowest) {
        // An exceeded limit has a negative margin: say by how much it is over, not that a
        // negative share is left.
        const double share_left = lowest->margin / lowest->limit.value;
        const std::string mostly =
            lowest->top_contributor.empty() ? "" : "; mostly " + lowest->top_contributor;
        if (share_left >= 0.0) {
            doc.text("  smallest margin: {0} {1} ({2} % of the limit left){3}",
                     {word(organ_label(lowest->limit.organ)), word(lowest->limit.window),
                      figure(share_left, 0, true, 100.0), word(mostly)},
                     100, "    ");
        } else {
            doc.text("  smallest margin: {0} {1} ({2}, {3} % over the limit){4}",
                     {word(organ_label(lowest->limit.organ)), word(lowest->limit.window),
                      word("EXCEEDED", report::Tone::alarm), figure(-share_left, 0, true, 100.0),
                      word(mostly)},
                     100, "    ");
        }
    }
    if (c.budget.binds && c.budget.days > 0.0) {
        doc.text("  budget left: {0} {1} binds first, after about {2} more days of this "
                 "timeline's activity mix ({3} {4}/day of GCR; no further events)",
                 {word(organ_label(c.budget.organ)), word(c.budget.window), figure(c.budget.days),
                  figure(c.budget.rate_mGyEq_per_day), word(unit_of(c.budget.organ))},
                 100, "    ");
    } else if (!c.budget.binds) {
        doc.text("  budget left: no limit binds from the GCR background of this timeline alone");
    }
    doc.table(source_table(c));
    report::Table top = report::text_list("contributors_" + c.crew,
                                          "  largest BFO contributors:", "{0} mGy-Eq  {1}", "    ",
                                          std::string(23, ' '));
    top.columns = {report::number_column("dose_mGyEq", "dose", "mGy-Eq", 10, 1.0, 3),
                   report::text_column("what", "what")};
    for (std::size_t i = 0; i < std::min<std::size_t>(3, c.contributors.size()); ++i) {
        top.rows.push_back({c.contributors[i].second, c.contributors[i].first});
    }
    doc.table(std::move(top));
    if (c.contributors.empty()) {
        doc.text("    none (no modelled dose)");
    }
    doc.blank();
}

void add_text(report::Document& doc, const Study& study, const LedgerResult& ledger,
              double near_share) {
    const Scenario& sc = study.scenario();
    doc.text("crewdose check: {0} ({1}, {2} to {3})",
             {word(sc.mission.name), word(to_string(sc.mission.site)),
              word(format_time(sc.mission.start)), word(format_time(sc.mission.end))},
             100, "  ");
    doc.text("scenario: {0}", {word(sc.file)});
    doc.blank();
    append_verdict(doc, check_verdict(ledger, near_share));
    doc.text(caution_text());
    doc.blank();
    doc.text("Model: SPE and GCR doses through the shielding and the body, the higher of with and "
             "without nuclear reactions, uncertainty factor {0} applied; events charged on the "
             "timeline as planned, with no storm response (crewdose storm applies the "
             "scenario's response policy); the whole description is at the end.",
             {figure(sc.limits.uncertainty_factor, 2, true)}, 96);
    doc.blank();
    doc.text("GCR dose rate at the mission start (phi {0} MV{1}), per day, with nuclear reactions "
             "(removal and projectile fragments) and without any (the higher is used for "
             "limits):",
             {figure(sc.mission.gcr_phi_MV, 0, true),
              word(sc.mission.gcr_phi_series.empty() ? ""
                   : sc.mission.gcr_phases.empty()
                       ? "; from the recorded solar cycle, the same over the whole mission"
                       : "; later months from the recorded solar cycle, listed at the end")},
             96);
    doc.table(gcr_rate_table(study));
    doc.blank();
    doc.text("Events:");
    for (std::size_t k = 0; k < sc.events.size(); ++k) {
        const auto& e = sc.events[k];
        doc.text("  {0}: flare seen {1}, arrival at the site {2}; {3}",
                 {word(e.id), word(format_time(e.flare_seen)), word(format_time(e.arrival())),
                  word(describe_spectrum(e.spectrum))},
                 100, "    ");
        doc.text("    spectrum as written at {0} AU from the Sun ({1}); the fluence scales as "
                 "distance^-{2}",
                 {figure(e.spectrum_at_AU.value_or(e.sun_distance_AU)),
                  word(e.spectrum_at_AU ? "spectrum_at_AU" : "the site's distance"),
                  figure(sc.mission.sep_fluence_exponent)},
                 100, "      ");
        // The crew grouped by where they meet the event.
        std::vector<std::pair<const CrewResult::EventDistance*, std::string>> groups;
        for (const auto& c : ledger.crew) {
            if (k >= c.event_distances.size()) {
                continue;
            }
            const auto& d = c.event_distances[k];
            const auto g = std::find_if(groups.begin(), groups.end(), [&](const auto& x) {
                return x.first->r_AU == d.r_AU && x.first->basis == d.basis;
            });
            if (g == groups.end()) {
                groups.emplace_back(&d, c.crew);
            } else {
                g->second += ", " + c.crew;
            }
        }
        for (const auto& [d, who] : groups) {
            doc.text("    {0}: {1} AU ({2}), fluence {3} times the spectrum as written",
                     {word(who), figure(d->r_AU), word(d->basis), figure(d->fluence_scale)}, 100,
                     "      ");
        }
    }
    if (sc.events.empty()) {
        doc.text("  none");
    }
    doc.blank();
    for (const auto& c : ledger.crew) {
        add_crew_text(doc, c);
    }
    doc.text("Limits (planning values, not official; basis):");
    for (const auto& l : sc.limits.limits) {
        doc.text("  {0} {1}: {2} {3} ({4})",
                 {word(organ_label(l.organ)), word(l.window), figure(l.value),
                  word(unit_of(l.organ)), word(l.basis)},
                 100, "    ");
    }
    for (const auto& g : ledger.gaps) {
        doc.text("Gap filled: {0} from {1} to {2}, charged at {3}",
                 {word(g.crew), word(format_time(g.start)), word(format_time(g.end)),
                  word(g.charged_at)});
    }
    doc.blank();
    if (ledger.any_exceeded) {
        for (const auto& c : ledger.crew) {
            for (const auto& chk : c.checks) {
                if (chk.exceeded) {
                    doc.text("{0}: {1} ({2}), {3} {4} limit, {5} of {6} {7}{8}",
                             {word("PLANNING LIMIT EXCEEDED", report::Tone::alarm), word(c.name),
                              word(c.crew), word(organ_label(chk.limit.organ)),
                              word(chk.limit.window), figure(chk.dose), figure(chk.limit.value),
                              word(unit_of(chk.limit.organ)),
                              word(chk.window_text.empty() ? "" : ", window " + chk.window_text)},
                             100, "  ");
                }
            }
        }
    } else {
        doc.text("{0}", {word("Every evaluated planning limit is met.", report::Tone::good)});
    }
    doc.blank();
    doc.text(model_text(study), {}, 96);
}

} // namespace

std::vector<std::string> check_verdict_notes(const CrewResult& c) {
    std::vector<std::string> notes;
    if (!c.not_evaluated.empty()) {
        std::vector<std::string> organs;
        for (const auto& [organ, locs] : c.not_evaluated) {
            organs.push_back(organ_label(organ));
        }
        notes.push_back(fmt::format("not evaluated for {}: {} (the quick body model; see below)",
                                    c.crew, fmt::join(organs, ", ")));
    }
    for (const auto& [organ, locs] : c.estimated) {
        notes.push_back(fmt::format("{} dose of {}: an upper bound where the quick body model "
                                    "stands ({}; see below)",
                                    organ, c.crew, fmt::join(locs, ", ")));
    }
    return notes;
}

std::string budget_left_text(const CrewResult& c, LimitStatus status) {
    if (status == LimitStatus::exceeded) {
        return "none";
    }
    if (!c.budget.binds) {
        return "not bound by GCR alone";
    }
    if (c.budget.days > 0.0) {
        return fmt::format("{} d ({} {})", significant(c.budget.days, 3),
                           organ_label(c.budget.organ), c.budget.window);
    }
    return "none";
}

report::Document check_document(const Study& study, const LedgerResult& ledger, double near_share) {
    report::Document doc;
    add_text(doc, study, ledger, near_share);
    add_json(doc, study, ledger, near_share);
    doc.table(limits_csv_table(ledger, near_share));
    return doc;
}

VerdictTable check_verdict(const LedgerResult& ledger, double near_share) {
    VerdictTable t;
    t.columns = {"crew member", "binding limit", "dose",       "planning limit",
                 "used",        "status",        "budget left"};
    // Crew members by name, or by id when a name is long enough to crowd the table.
    const bool by_name = std::all_of(ledger.crew.begin(), ledger.crew.end(),
                                     [](const CrewResult& c) { return c.name.size() <= 24; });
    std::size_t exceeded = 0;
    std::size_t near = 0;
    for (const auto& c : ledger.crew) {
        for (const std::string& note : check_verdict_notes(c)) {
            t.notes.push_back(note);
        }
        const LimitCheck* b = binding_check(c);
        const std::string& who = by_name ? c.name : c.crew;
        if (!b) {
            t.rows.push_back({{who}, {"no limit evaluated"}, {"-"}, {"-"}, {"-"}, {"-"}, {"-"}});
            continue;
        }
        const LimitStatus st = status_of(*b, near_share);
        exceeded += st == LimitStatus::exceeded ? 1U : 0U;
        near += st == LimitStatus::near ? 1U : 0U;
        const std::string word = st == LimitStatus::exceeded ? "EXCEEDED" : to_string(st);
        const char* unit = b->limit.organ == "effective" ? "mSv" : "mGy-Eq";
        // A dose that was not computed reads so (status_of has made it EXCEEDED).
        const bool computed = std::isfinite(b->dose) && b->dose >= 0.0;
        const std::string dose =
            computed ? fmt::format("{} {}", significant(b->dose, 3), unit) : "not computed";
        const std::string used =
            computed ? fmt::format("{:.0f} %", 100.0 * b->dose / b->limit.value) : "-";
        t.rows.push_back({{who},
                          {organ_label(b->limit.organ) + " " + b->limit.window},
                          {dose, true},
                          {fmt::format("{} {}", significant(b->limit.value, 3), unit), true},
                          {used, true},
                          {word, false, st == LimitStatus::exceeded ? "exceeded" : to_string(st)},
                          {budget_left_text(c, st)}});
    }
    if (exceeded > 0) {
        t.headline_words = "A PLANNING LIMIT IS EXCEEDED";
        t.headline_status = "exceeded";
        t.headline = fmt::format("Verdict: {} for {} of {} crew member{}.", t.headline_words,
                                 exceeded, ledger.crew.size(), ledger.crew.size() == 1 ? "" : "s");
    } else if (near > 0) {
        t.headline_words = fmt::format("{} crew member{} near a limit", near, near == 1 ? "" : "s");
        t.headline_status = "near";
        t.headline = "Verdict: every evaluated planning limit is met; " + t.headline_words + ".";
    } else {
        t.headline_words = "every evaluated planning limit is met";
        t.headline_status = "within";
        t.headline = "Verdict: " + t.headline_words + ".";
    }
    t.note = fmt::format(
        "Binding: the limit with the highest share used. Near: {:.0f} % of its "
        "limit or more (--near). Budget left: days more of this timeline's activity mix "
        "at its GCR rate, with no further events.",
        100.0 * near_share);
    return t;
}

std::string format_check_report(const Study& study, const LedgerResult& ledger, OutputFormat format,
                                bool colour, double near_share) {
    return report::write(check_document(study, ledger, near_share), format, colour);
}

std::string format_series(const Study& study, const LedgerResult& ledger) {
    (void)study;
    // Units per row: mGy-Eq for the organs, mSv for the effective dose.
    report::Table t;
    t.key = "series";
    t.is_csv = true;
    t.columns = {report::text_column("crew"),
                 report::text_column("organ"),
                 report::text_column("unit"),
                 report::text_column("time"),
                 report::number_column("cumulative", {}),
                 report::number_column("rate_per_h", {})};
    for (const auto& [key, pieces] : ledger.pieces) {
        std::set<Time> times;
        for (const auto& p : pieces) {
            times.insert(p.start);
            times.insert(p.end);
            if (p.event) {
                for (Time t_h = p.start; t_h < p.end; t_h += boost::posix_time::hours(1)) {
                    times.insert(t_h);
                }
            }
        }
        double previous = 0.0;
        Time previous_t;
        bool first = true;
        for (const auto& time : times) {
            double d = 0.0;
            for (const auto& p : pieces) {
                d += 1e3 * p.dose.rbe_weighted_GyEq * p.fraction_by(time);
            }
            const double rate =
                first || time == previous_t ? 0.0 : (d - previous) / hours(time - previous_t);
            t.rows.push_back({key.first, key.second, std::string(unit_of(key.second)),
                              format_time(time), d, rate});
            previous = d;
            previous_t = time;
            first = false;
        }
    }
    report::Document doc;
    doc.table(std::move(t));
    return report::write_csv(doc);
}

std::string format_validation(const Scenario& sc) {
    std::string out = fmt::format("{}: valid\n", sc.file);
    out +=
        fmt::format("  mission: {} ({}, {} to {})\n", sc.mission.name, to_string(sc.mission.site),
                    format_time(sc.mission.start), format_time(sc.mission.end));
    const auto count = [](std::size_t n, const char* one, const char* many) {
        return fmt::format("{} {}", n, n == 1 ? one : many);
    };
    out += fmt::format("  {}, {}, {}, {}, {} crew, {}, {}\n",
                       count(sc.materials.size(), "user material", "user materials"),
                       count(sc.solids.size(), "solid", "solids"),
                       count(sc.locations.size(), "location", "locations"),
                       count(sc.events.size(), "event", "events"), sc.crew.size(),
                       count(sc.activities.size(), "activity", "activities"),
                       count(sc.recorded.size(), "recorded dose", "recorded doses"));
    for (const auto& l : sc.locations) {
        out += fmt::format(
            "  location {}: {}; body {}\n", l.id,
            l.shielding_table_file ? "imported table " + *l.shielding_table_file
                                   : count(l.solids.size(), "solid", "solids"),
            body_model(l.body).has_posture()
                ? fmt::format("{} ({})", l.body,
                              l.posture == habitats::Posture::lying ? "lying" : "standing")
                : l.body);
    }
    for (const auto& c : sc.crew) {
        out += fmt::format("  crew {}: {}\n", c.id, c.name);
    }
    for (const auto& g : timeline_gaps(sc)) {
        out += fmt::format("  gap: crew {} has no activity from {} to {} (after the activity at "
                           "line {}); check --allow-gaps charges it at that activity's location\n",
                           g.crew, format_time(g.from), format_time(g.to), g.where.line);
    }
    return out;
}

} // namespace crewdose::planner
