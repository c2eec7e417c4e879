#include "planner/report/storm_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/document_writer.hpp"
#include "planner/report/number_format.hpp"
#include "planner/scenario/time_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>
#include <optional>

namespace crewdose::planner {

namespace {

using report::Field;
using report::Rounding;

// A number in a sentence: `digits` significant figures of value * scale.
Field number(std::string key, double value, int digits = 3, double scale = 1.0) {
    return Field{std::move(key), value, digits, Rounding::significant, scale};
}

// A share (1 = the whole limit) in a sentence, as a whole percentage.
Field percent(std::string key, double share) {
    return Field{std::move(key), share, 0, Rounding::fixed, 100.0};
}

// Words in a sentence (never a pattern: braces in them stay as they are).
Field words(std::string key, std::string text) {
    return Field{std::move(key), std::move(text)};
}

Field whole(std::string key, std::int64_t n) {
    return Field{std::move(key), n};
}

// Every part of the 30-day dose was computed (finite, >= 0) and the limit is a positive number.
bool computed(const StormOrgan& o, double event_mGyEq) {
    return std::isfinite(event_mGyEq) && event_mGyEq >= 0.0 && std::isfinite(o.other_30d_mGyEq) &&
           o.other_30d_mGyEq >= 0.0 && std::isfinite(o.limit_30d_mGyEq) && o.limit_30d_mGyEq > 0.0;
}

// The organ with the highest share of its 30-day limit; one whose dose was not computed first
// of all (it must show).
const StormOrgan* binding_organ(const StormCrew& c) {
    const StormOrgan* b = nullptr;
    double highest = 0.0;
    for (const auto& o : c.organs) {
        const double share = computed(o, o.with_response_mGyEq)
                                 ? o.ratio()
                                 : std::numeric_limits<double>::infinity();
        if (!b || share > highest) {
            b = &o;
            highest = share;
        }
    }
    return b;
}

// One crew member's verdict: the binding organ, its 30-day dose with the response (the event
// plus the highest other 30-day dose) and the status. Text, HTML and JSON all read these, so
// they cannot disagree. A dose that was not computed is never within: !(dose <= limit).
struct StormVerdictRow {
    const StormCrew* crew = nullptr;
    const Time* onset = nullptr;       ///< the worst onset, in a sweep
    const StormOrgan* organ = nullptr; ///< null: no organ checked
    double dose = 0.0;
    bool known = false;
    bool over = false;
    bool near = false;
};

std::vector<StormVerdictRow>
storm_verdict_rows(const std::vector<std::pair<const StormCrew*, const Time*>>& crew,
                   double near_share) {
    std::vector<StormVerdictRow> rows;
    for (const auto& [c, onset] : crew) {
        StormVerdictRow r;
        r.crew = c;
        r.onset = onset;
        r.organ = binding_organ(*c);
        if (r.organ) {
            r.dose = r.organ->with_response_mGyEq + r.organ->other_30d_mGyEq;
            r.known = computed(*r.organ, r.organ->with_response_mGyEq);
            r.over = !r.known || !(r.dose <= r.organ->limit_30d_mGyEq);
            r.near = !r.over && r.dose >= near_share * r.organ->limit_30d_mGyEq;
        }
        rows.push_back(r);
    }
    return rows;
}

// The crew of a what-if, or each crew member's worst onset of a sweep.
std::vector<std::pair<const StormCrew*, const Time*>> verdict_crew(const StormWhatIf& w) {
    std::vector<std::pair<const StormCrew*, const Time*>> crew;
    for (const auto& c : w.crew) {
        crew.emplace_back(&c, nullptr);
    }
    return crew;
}

std::vector<std::pair<const StormCrew*, const Time*>> verdict_crew(const StormSweep& s) {
    std::vector<std::pair<const StormCrew*, const Time*>> crew;
    for (const auto& [onset, c] : s.worst) {
        crew.emplace_back(&c, &onset);
    }
    return crew;
}

// The verdict table of `rows` (with each one's onset in a sweep); counts the exceeded and near.
VerdictTable storm_verdict(const StormContext& ctx, const std::vector<StormVerdictRow>& rows,
                           double near_share, std::size_t& exceeded, std::size_t& near) {
    const bool responds = ctx.responds();
    const bool sweep = !rows.empty() && rows.front().onset != nullptr;
    // Crew members by name, or by id when a name would push the lines past 100 columns.
    bool by_name = true;
    for (const StormVerdictRow& v : rows) {
        by_name = by_name && v.crew->name.size() <= 16;
    }
    VerdictTable t;
    t.columns = {"crew member", "binding", "30-day dose / limit", "used", "status"};
    if (sweep) {
        t.columns.emplace_back("worst t0");
    }
    if (responds) {
        t.columns.emplace_back("without response");
    }
    exceeded = 0;
    near = 0;
    for (const StormVerdictRow& v : rows) {
        const StormCrew* c = v.crew;
        std::vector<VerdictCell> row{{by_name ? c->name : c->crew}};
        const StormOrgan* o = v.organ;
        if (!o) {
            row.push_back({"no organ checked"});
            t.rows.push_back(std::move(row));
            continue;
        }
        exceeded += v.over ? 1U : 0U;
        near += v.near ? 1U : 0U;
        row.push_back({organ_label(o->organ)});
        row.push_back(
            {fmt::format("{} / {} mGy-Eq", v.known ? significant(v.dose, 3) : "not computed",
                         verdict_dose_text(o->limit_30d_mGyEq)),
             true});
        row.push_back(
            {v.known ? fmt::format("{:.0f} %", 100.0 * v.dose / o->limit_30d_mGyEq) : "-", true});
        row.push_back({v.over ? "EXCEEDED" : (v.near ? "near" : "within"), false,
                       v.over ? "exceeded" : (v.near ? "near" : "within")});
        if (sweep) {
            // To the microsecond when the onset has a fraction of a second (a policy
            // breakpoint): --onset then reads back the very onset.
            row.push_back({format_time_exact(*v.onset)});
        }
        if (responds) {
            const double without = o->without_response_mGyEq + o->other_30d_mGyEq;
            row.push_back({computed(*o, o->without_response_mGyEq)
                               ? fmt::format("{} mGy-Eq, {:.0f} %", significant(without, 3),
                                             100.0 * without / o->limit_30d_mGyEq)
                               : "not computed",
                           true});
        }
        t.rows.push_back(std::move(row));
    }
    t.note = fmt::format(
        "binding: the organ with the highest share of its 30-day limit; 30-day dose: the event "
        "{}plus the crew member's highest other 30-day dose (mGy-Eq); near: {:.0f} % of the "
        "limit or more (--near){}{}.",
        responds ? "with the response " : "on the planned timeline ", 100.0 * near_share,
        sweep ? "; worst t0: the onset that uses the most of a limit (give it to --onset for "
                "its what-if)"
              : "",
        responds ? "; without response: the same organ if the crew kept to the planned timeline"
                 : "");
    // Organs the body model does not give are said under the table, not only in the model
    // paragraph: "met" covers only what was evaluated.
    if (!ctx.unchecked_note().empty()) {
        t.notes.push_back("not evaluated: " + ctx.unchecked_note());
    }
    return t;
}

std::string crew_count(std::size_t n, std::size_t of) {
    return fmt::format("{} of {} crew member{}", n, of, of == 1 ? "" : "s");
}

// The words of a storm headline that carry its status, for colour on a terminal.
void set_headline_words(VerdictTable& t, std::size_t exceeded, std::size_t near, std::size_t of) {
    if (exceeded > 0) {
        t.headline_words = "A 30-DAY PLANNING LIMIT IS EXCEEDED";
        t.headline_status = "exceeded";
    } else if (near > 0) {
        t.headline_words = crew_count(near, of) + " near a limit";
        t.headline_status = "near";
    } else {
        t.headline_words = "every evaluated 30-day planning limit is met";
        t.headline_status = "within";
    }
}

// The what-if's verdict from its rows (storm_verdict_rows of verdict_crew(w)).
VerdictTable whatif_verdict(const StormContext& ctx, const StormWhatIf& w,
                            const std::vector<StormVerdictRow>& rows, double near_share) {
    std::size_t exceeded = 0;
    std::size_t near = 0;
    VerdictTable t = storm_verdict(ctx, rows, near_share, exceeded, near);
    const std::string how = w.respond ? "with the planned response"
                                      : "no response: the crew keep to the planned timeline";
    if (exceeded > 0) {
        t.headline = fmt::format("Verdict: A 30-DAY PLANNING LIMIT IS EXCEEDED for {} in this "
                                 "what-if ({}).",
                                 crew_count(exceeded, rows.size()), how);
    } else if (near > 0) {
        t.headline =
            fmt::format("Verdict: every evaluated 30-day planning limit is met in this what-if "
                        "({}); {} near a limit.",
                        how, crew_count(near, rows.size()));
    } else {
        t.headline = fmt::format(
            "Verdict: every evaluated 30-day planning limit is met in this what-if ({}).", how);
    }
    set_headline_words(t, exceeded, near, rows.size());
    return t;
}

// The sweep's verdict from its rows (storm_verdict_rows of verdict_crew(s)).
VerdictTable sweep_verdict(const StormContext& ctx, const StormSweep& s,
                           const std::vector<StormVerdictRow>& rows, double near_share) {
    std::size_t exceeded = 0;
    std::size_t near = 0;
    VerdictTable t = storm_verdict(ctx, rows, near_share, exceeded, near);
    std::size_t no_go = 0;
    std::size_t not_swept = 0;
    for (const auto& e : s.evas) {
        not_swept += e.swept() ? 0U : 1U;
        no_go += e.swept() && !e.go() ? 1U : 0U;
    }
    std::string evas;
    if (!s.evas.empty()) {
        evas = no_go > 0
                   ? fmt::format("; {} of {} EVAs and rover drives NO-GO", no_go, s.evas.size())
                   : fmt::format("; every EVA and rover drive is go for an onset during it");
        if (not_swept > 0) {
            evas += fmt::format(" ({} not swept)", not_swept);
        }
    }
    const std::string how =
        ctx.responds() ? "with the planned response" : "no response: the planned timeline";
    if (exceeded > 0) {
        t.headline = fmt::format("Verdict: A 30-DAY PLANNING LIMIT IS EXCEEDED at the worst onset "
                                 "for {} ({}){}.",
                                 crew_count(exceeded, rows.size()), how, evas);
    } else if (near > 0) {
        t.headline =
            fmt::format("Verdict: every evaluated 30-day planning limit is met at every onset "
                        "tried ({}); {} near a limit at the worst onset{}.",
                        how, crew_count(near, rows.size()), evas);
    } else {
        t.headline =
            fmt::format("Verdict: every evaluated 30-day planning limit is met at every onset "
                        "tried ({}){}.",
                        how, evas);
    }
    set_headline_words(t, exceeded, near, rows.size());
    return t;
}

// The organs in words: "BFO, lens and skin".
std::string organ_list(const std::vector<std::string>& organs) {
    std::string out;
    for (std::size_t k = 0; k < organs.size(); ++k) {
        out += (k == 0 ? "" : (k + 1 == organs.size() ? " and " : ", ")) + organ_label(organs[k]);
    }
    return out;
}

// What the numbers mean: the arrival, the 30-day dose; JSON carries it as "model".
report::Text model_text(const StormContext& ctx) {
    const Scenario& sc = ctx.study().scenario();
    const EventSpec& ev = ctx.event();
    report::Text t;
    t.wrap_width = 96;
    t.json_key = "model";
    t.pattern = "t0 is when the flare is seen at the site; ";
    if (ev.fixed_arrival) {
        t.pattern += "every energy arrives {} h after t0 (fixed arrival_delay_h)";
        t.args.push_back(number("arrival_delay_h", ev.arrival_delay_h));
    } else {
        t.pattern += "scatter-free arrival, the earliest possible: 10, 100 and 1000 MeV protons "
                     "{}, {} and {} min after t0 (field line {} AU, site {} AU from the Sun)";
        t.args.push_back(number("arrival_10MeV_min", ev.delay_h(10), 3, 60.0));
        t.args.push_back(number("arrival_100MeV_min", ev.delay_h(100), 3, 60.0));
        t.args.push_back(number("arrival_1000MeV_min", ev.delay_h(1000), 3, 60.0));
        t.args.push_back(number("path_length_AU", ev.path_length_AU));
        t.args.push_back(number("sun_distance_AU", ev.sun_distance_AU));
    }
    bool elsewhere = false;
    for (const auto& track : sc.sun_tracks) {
        elsewhere = elsewhere || track.lowest_AU() != ev.sun_distance_AU ||
                    track.highest_AU() != ev.sun_distance_AU;
    }
    if (elsewhere) {
        t.pattern += "; crew away from the site (transits) meet the event at their own distance "
                     "from the Sun, its fluence scaled as distance^-{} from where its spectrum is "
                     "given and arriving along the field line there (arrival on a 0.01 AU grid)";
        t.args.push_back(number("sep_fluence_exponent", sc.mission.sep_fluence_exponent));
    }
    t.pattern += ". 30-day dose = the event (uncertainty factor {}, the higher of with and without "
                 "nuclear reactions, each location's body model; {}) plus the crew member's "
                 "highest 30-day dose from everything else, wherever it lies (conservative: as "
                 "if both fell in one window).{}";
    t.args.push_back({"uncertainty_factor", sc.limits.uncertainty_factor, 2, Rounding::fixed});
    t.args.push_back(words("organs", organ_list(ctx.organs())));
    t.args.push_back(words("unchecked", ctx.unchecked_note().empty()
                                            ? std::string()
                                            : " Not checked: " + ctx.unchecked_note() + "."));
    return t;
}

// The response policy, in a sentence.
report::Text policy_text(const StormPolicy& p) {
    report::Text t;
    t.wrap_width = 96;
    t.pattern = "Response: warning {} min after t0; crew inside reach {} within {} min; crew on "
                "EVA or driving return in their activity's return_min (default {} min) to its "
                "refuge (default the shelter); no EVA starts before the all-clear, ";
    t.args = {number("warning_delay_min", p.warning_delay_min), words("shelter", p.shelter),
              number("move_to_shelter_min", p.move_to_shelter_min),
              number("eva_return_min", p.eva_return_min)};
    if (p.all_clear_above_MeV) {
        t.pattern += "which comes when the flux above {} MeV falls below {} /(cm2 s sr)";
        t.args.push_back(number("all_clear_above_MeV", *p.all_clear_above_MeV));
        t.args.push_back(number("all_clear_flux", p.all_clear_flux_per_cm2_s_sr));
    } else {
        t.pattern += "which comes {} h after t0";
        t.args.push_back(number("all_clear_h", p.all_clear_h));
    }
    t.pattern += "; the rest of the timeline is unchanged.";
    return t;
}

// One crew member for JSON: who, where from the Sun, per organ the event with and without the
// response against the 30-day limit, and the spans that meet the event.
std::vector<Field> crew_fields(const StormCrew& c) {
    std::vector<Field> f{words("id", c.crew),
                         words("name", c.name),
                         {"worst_ratio", c.worst_ratio()},
                         {"sun_distance_AU", c.sun_distance_AU},
                         words("distance_basis", c.distance_basis),
                         {"fluence_scale", c.fluence_scale}};
    report::Object organs;
    for (const auto& o : c.organs) {
        organs.fields.push_back(
            {o.organ,
             report::Object{{{"without_response_mGyEq", o.without_response_mGyEq},
                             {"with_response_mGyEq", o.with_response_mGyEq},
                             {"saved_mGyEq", o.without_response_mGyEq - o.with_response_mGyEq},
                             {"other_30d_mGyEq", o.other_30d_mGyEq},
                             {"limit_30d_mGyEq", o.limit_30d_mGyEq},
                             {"margin_30d_mGyEq", o.margin()},
                             {"exceeded", o.exceeded()}}}});
    }
    if (!organs.fields.empty()) {
        f.push_back({"organs", std::move(organs)});
    }
    report::Records timeline;
    for (const auto& s : c.responded) {
        timeline.items.push_back({words("start", format_time(s.start)),
                                  words("end", format_time(s.end)), words("location", s.location),
                                  words("what", s.label)});
    }
    if (!timeline.items.empty()) {
        f.push_back({"timeline", std::move(timeline)});
    }
    return f;
}

// The verdict for JSON: a row per crew member, the same numbers the text table rounds. A dose
// that was not computed is null with status "exceeded".
report::Records verdict_records(const std::vector<StormVerdictRow>& rows) {
    report::Records out;
    for (const StormVerdictRow& v : rows) {
        std::vector<Field> row{words("crew", v.crew->crew)};
        if (!v.organ) {
            row.push_back({"organ", std::monostate{}});
            row.push_back(words("status", "no organ checked"));
        } else {
            const double limit = v.organ->limit_30d_mGyEq;
            row.push_back(words("organ", v.organ->organ));
            row.push_back(words("window", "30-day"));
            row.push_back({"dose", v.known ? report::Value(v.dose) : report::Value()});
            row.push_back({"limit", limit});
            row.push_back(words("unit", "mGy-Eq"));
            row.push_back(
                {"share_of_limit", v.known ? report::Value(v.dose / limit) : report::Value()});
            row.push_back(words("status", v.over ? "exceeded" : (v.near ? "near" : "within")));
        }
        if (v.onset) {
            row.push_back(words("worst_onset", format_time_exact(*v.onset)));
        }
        out.items.push_back(std::move(row));
    }
    return out;
}

// The verdict's sentence and rows in JSON, the near share they were judged with.
report::Group verdict_group(const VerdictTable& table, const std::vector<StormVerdictRow>& rows,
                            double near_share) {
    return {"",
            {words("verdict", table.headline),
             {"near_share", near_share},
             {"headline", verdict_records(rows)}}};
}

// The cautions (also in JSON), then a blank line.
void add_cautions(report::Document& doc) {
    doc.keyed_text("cautions", caution_text());
    doc.blank();
}

// A crew member's organs in text: the event without and with the response, what it saves, the
// other 30-day dose, the limit and the margin left.
report::Table organ_table(const StormCrew& c) {
    report::Table t;
    t.key = "organs";
    t.in_json = false; // JSON: the crew member's "organs" object
    auto col = [](std::string key, std::string header, int width) {
        report::Column k =
            report::number_column(std::move(key), std::move(header), "mGy-Eq", width, 1.0, 3);
        k.gap = 1;
        return k;
    };
    report::Column organ = report::text_column("organ", "organ");
    organ.min_width = 6;
    report::Column exceeded = report::text_column("exceeded");
    exceeded.suffix_when_true = "EXCEEDED";
    t.columns = {organ,
                 col("without_response_mGyEq", "no response", 12),
                 col("with_response_mGyEq", "response", 12),
                 col("saved_mGyEq", "saved", 10),
                 col("other_30d_mGyEq", "other 30d", 12),
                 col("limit_30d_mGyEq", "limit", 8),
                 col("margin_30d_mGyEq", "margin", 10),
                 exceeded};
    for (const auto& o : c.organs) {
        t.rows.push_back({organ_label(o.organ), o.without_response_mGyEq, o.with_response_mGyEq,
                          o.without_response_mGyEq - o.with_response_mGyEq, o.other_30d_mGyEq,
                          o.limit_30d_mGyEq, o.margin(), o.exceeded()});
    }
    return t;
}

// Where a crew member is from t0 on (text; JSON has the spans in "timeline").
report::Table where_table(const StormCrew& c, Time onset) {
    report::Table t =
        report::text_list("timeline", "  where (from t0):", "{0} to {1} {2}", "    ", "      ");
    t.columns = {report::text_column("start"), report::text_column("end"),
                 report::text_column("what")};
    for (const auto& s : c.responded) {
        t.rows.push_back({format_time(std::max(s.start, onset)), format_time(s.end), s.label});
    }
    return t;
}

// The what-if's CSV: a line per crew member and organ.
report::Table whatif_csv_table(const StormWhatIf& w) {
    report::Table t = report::csv_only_table("organs");
    auto col = [](std::string key) {
        return report::number_column(std::move(key), {});
    };
    t.columns = {
        report::text_column("crew"), report::text_column("organ"), col("without_response_mGyEq"),
        col("with_response_mGyEq"),  col("saved_mGyEq"),           col("other_30d_mGyEq"),
        col("limit_30d_mGyEq"),      col("margin_30d_mGyEq"),      report::text_column("exceeded")};
    for (const auto& c : w.crew) {
        for (const auto& o : c.organs) {
            t.rows.push_back({c.crew, o.organ, o.without_response_mGyEq, o.with_response_mGyEq,
                              o.without_response_mGyEq - o.with_response_mGyEq, o.other_30d_mGyEq,
                              o.limit_30d_mGyEq, o.margin(),
                              std::string(o.exceeded() ? "yes" : "no")});
        }
    }
    return t;
}

// The sweep's CSV: a line per EVA and rover drive.
report::Table sweep_csv_table(const StormSweep& s) {
    report::Table t = report::csv_only_table("evas");
    t.columns = {report::text_column("activity"),
                 report::text_column("start"),
                 report::text_column("end"),
                 report::text_column("worst_onset"),
                 report::text_column("crew"),
                 report::text_column("organ"),
                 report::number_column("ratio_to_30d_limit", {}),
                 report::text_column("go")};
    for (const auto& e : s.evas) {
        t.rows.push_back({e.label, format_time(e.start), format_time(e.end),
                          e.swept() ? format_time_exact(e.worst_onset) : std::string(), e.crew,
                          e.organ, e.swept() ? report::Value(e.ratio) : report::Value(),
                          std::string(!e.swept() ? "not swept" : (e.go() ? "go" : "no-go"))});
    }
    return t;
}

} // namespace

VerdictTable storm_whatif_verdict(const StormContext& ctx, const StormWhatIf& w,
                                  double near_share) {
    return whatif_verdict(ctx, w, storm_verdict_rows(verdict_crew(w), near_share), near_share);
}

VerdictTable storm_sweep_verdict(const StormContext& ctx, const StormSweep& s, double near_share) {
    return sweep_verdict(ctx, s, storm_verdict_rows(verdict_crew(s), near_share), near_share);
}

report::Document storm_whatif_document(const StormContext& ctx, const StormWhatIf& w,
                                       double near_share) {
    const Scenario& sc = ctx.study().scenario();
    // One set of rows for the text's verdict and JSON's: they cannot disagree.
    const auto rows = storm_verdict_rows(verdict_crew(w), near_share);
    const VerdictTable verdict = whatif_verdict(ctx, w, rows, near_share);
    report::Document doc;
    report::Records crew;
    for (const auto& c : w.crew) {
        crew.items.push_back(crew_fields(c));
    }
    report::Group top{"",
                      {words("event", w.event_id),
                       words("onset", format_time(w.times.onset)),
                       words("warning", format_time(w.times.warning)),
                       words("all_clear", format_time(w.times.all_clear)),
                       {"respond", w.respond},
                       {"any_limit_exceeded", w.any_exceeded()}}};
    if (!crew.items.empty()) {
        top.fields.push_back({"crew", std::move(crew)});
    }
    doc.group(std::move(top));
    doc.group(verdict_group(verdict, rows, near_share));

    doc.text("crewdose storm: event {} with t0 at {}",
             {words("event", w.event_id), words("onset", format_time(w.times.onset))});
    doc.text("scenario: {}", {words("scenario", sc.file)});
    doc.blank();
    append_verdict(doc, verdict);
    add_cautions(doc);
    doc.blocks.emplace_back(model_text(ctx));
    if (w.respond) {
        doc.blocks.emplace_back(policy_text(sc.storm));
        doc.text("Warning {}, all-clear {}.", {words("warning", format_time(w.times.warning)),
                                               words("all_clear", format_time(w.times.all_clear))});
    } else {
        doc.text("No response: the crew keep to the planned timeline.");
    }
    doc.blank();
    for (const auto& c : w.crew) {
        doc.text("{} ({})", {words("name", c.name), words("id", c.crew)});
        if (c.sun_distance_AU != ctx.event().sun_distance_AU || c.fluence_scale != 1.0) {
            doc.text("  at {} AU from the Sun ({}): the event's fluence is {} times its spectrum "
                     "as written",
                     {number("sun_distance_AU", c.sun_distance_AU),
                      words("distance_basis", c.distance_basis),
                      number("fluence_scale", c.fluence_scale)},
                     100, "    ");
        }
        doc.table(organ_table(c));
        // A response that adds dose (the crew wait out the event somewhere less shielded than
        // where the plan had them) is said so: "saved" below zero is easy to miss.
        std::vector<std::string> worse;
        for (const auto& o : c.organs) {
            if (w.respond && o.with_response_mGyEq > o.without_response_mGyEq) {
                worse.push_back(organ_label(o.organ));
            }
        }
        if (!worse.empty()) {
            doc.text("  NOTE: the response adds dose here ({}): the crew wait the event out "
                     "somewhere less shielded than the plan had them (an EVA's refuge, or the "
                     "place they are held until the all-clear); check [storm_response] and the "
                     "refuges",
                     {{"organs", report::List{worse}}}, 100, "    ");
        }
        doc.table(where_table(c, w.times.onset));
        doc.blank();
    }
    doc.text(w.any_exceeded() ? "A 30-DAY PLANNING LIMIT IS EXCEEDED in this what-if."
                              : "Every 30-day planning limit is met in this what-if.");
    doc.table(whatif_csv_table(w));
    return doc;
}

report::Document storm_sweep_document(const StormContext& ctx, const StormSweep& s,
                                      double near_share) {
    const Scenario& sc = ctx.study().scenario();
    const bool responds = ctx.responds();
    // One set of rows for the text's verdict and JSON's: they cannot disagree.
    const auto rows = storm_verdict_rows(verdict_crew(s), near_share);
    const VerdictTable verdict = sweep_verdict(ctx, s, rows, near_share);
    report::Document doc;
    report::Group top{"",
                      {words("event", s.event_id),
                       words("from", format_time(s.from)),
                       words("to", format_time(s.to)),
                       whole("step_s", s.step.total_seconds()),
                       whole("onsets", static_cast<std::int64_t>(s.onsets)),
                       {"any_limit_exceeded", s.any_exceeded()},
                       {"response", responds},
                       whole("profile_bin_h", s.profile_bin_h)}};
    report::Records worst;
    for (const auto& [onset, c] : s.worst) {
        auto fields = crew_fields(c);
        fields.push_back(words("worst_onset", format_time_exact(onset)));
        worst.items.push_back(std::move(fields));
    }
    if (!worst.items.empty()) {
        top.fields.push_back({"worst", std::move(worst)});
    }
    report::Records evas;
    for (const auto& e : s.evas) {
        evas.items.push_back(
            {words("activity", e.label), words("start", format_time(e.start)),
             words("end", format_time(e.end)),
             words("worst_onset", e.swept() ? format_time_exact(e.worst_onset) : std::string()),
             words("crew", e.crew), words("organ", e.organ),
             Field{"ratio_to_30d_limit", e.swept() ? report::Value(e.ratio) : report::Value()},
             Field{"swept", e.swept()}, Field{"go", e.go()}});
    }
    if (!evas.items.empty()) {
        top.fields.push_back({"evas", std::move(evas)});
    }
    report::Records profile;
    for (const auto& [t, r] : s.profile) {
        profile.items.push_back({words("bin_start", format_time(t)), Field{"worst_ratio", r}});
    }
    if (!profile.items.empty()) {
        top.fields.push_back({"profile", std::move(profile)});
    }
    doc.group(std::move(top));
    doc.group(verdict_group(verdict, rows, near_share));

    // The onsets beyond the regular steps are the policy's (or timeline's) breakpoints.
    const std::int64_t regular = (s.to - s.from).total_seconds() / s.step.total_seconds() + 1;
    doc.text("crewdose storm sweep: event {} with t0 from {} to {}, every {} plus {} {}breakpoints",
             {words("event", s.event_id), words("from", format_time(s.from)),
              words("to", format_time(s.to)), words("step", format_duration(s.step)),
              whole("breakpoints", static_cast<std::int64_t>(s.onsets) - regular),
              words("kind", responds ? "policy " : "timeline ")},
             100, "  ");
    doc.text("scenario: {}", {words("scenario", sc.file)});
    doc.blank();
    append_verdict(doc, verdict);
    add_cautions(doc);
    doc.blocks.emplace_back(model_text(ctx));
    if (responds) {
        doc.blocks.emplace_back(policy_text(sc.storm));
    } else {
        doc.text("No response (--no-response): the crew keep to the planned timeline.");
    }
    doc.blank();
    // The worst onset itself is the verdict's "worst t0": said once.
    doc.text("At each crew member's worst onset (the verdict's worst t0; 30-day dose {}, "
             "mGy-Eq):",
             {words("how", responds ? "with the response" : "without a response")});
    // Where the response gives an organ more of the event than the planned timeline would.
    std::string adds;
    std::vector<Field> adds_args;
    const StormOrgan* most_saved = nullptr;
    const StormCrew* most_saved_by = nullptr;
    for (const auto& [onset, c] : s.worst) {
        const StormOrgan* worst_organ = nullptr;
        std::string more;
        std::vector<Field> more_args;
        for (const auto& o : c.organs) {
            if (!worst_organ || o.ratio() > worst_organ->ratio()) {
                worst_organ = &o;
            }
            const double saved = o.without_response_mGyEq - o.with_response_mGyEq;
            if (saved < 0.0) {
                more += std::string(more.empty() ? "" : ", ") + "{} +{} mGy-Eq";
                more_args.push_back(words("organ", organ_label(o.organ)));
                more_args.push_back(number("added_mGyEq", -saved));
            } else if (!most_saved || saved > most_saved->without_response_mGyEq -
                                                  most_saved->with_response_mGyEq) {
                most_saved = &o;
                most_saved_by = &c;
            }
        }
        if (!more.empty()) {
            adds += std::string(adds.empty() ? "" : "; ") + "{} (" + more + ")";
            adds_args.push_back(words("name", c.name));
            adds_args.insert(adds_args.end(), more_args.begin(), more_args.end());
        }
        if (!worst_organ) {
            continue;
        }
        const StormOrgan& o = *worst_organ;
        doc.text("  {} ({}): {} {} = {} event + {} other of {} ({} %){}",
                 {words("name", c.name), words("id", c.crew), words("organ", organ_label(o.organ)),
                  number("dose_30d_mGyEq", o.with_response_mGyEq + o.other_30d_mGyEq),
                  number("event_mGyEq", o.with_response_mGyEq),
                  number("other_30d_mGyEq", o.other_30d_mGyEq),
                  number("limit_30d_mGyEq", o.limit_30d_mGyEq), percent("used", o.ratio()),
                  words("status", o.exceeded() ? "  EXCEEDED" : "")},
                 100, "      ");
    }
    // Whether the response helps there, from these numbers (the sweep computes the planned
    // timeline's dose beside the response's only at the worst onsets).
    if (responds && !adds.empty()) {
        doc.text("  NOTE: the response adds dose at the worst onset for " + adds +
                     " (with the response, more than on the planned timeline): the crew wait "
                     "the event out somewhere less shielded than the plan had them (an EVA's "
                     "refuge, or the place they are held until the all-clear); check "
                     "[storm_response] and the refuges",
                 adds_args, 100, "    ");
    } else if (responds && most_saved &&
               most_saved->without_response_mGyEq == most_saved->with_response_mGyEq) {
        doc.text("  At every crew member's worst onset the response leaves the event's dose as "
                 "planned.");
    } else if (responds && most_saved) {
        doc.text("  At every crew member's worst onset the response lowers the event's dose or "
                 "leaves it as planned, organ by organ; it saves most for {}: {} {} mGy-Eq of {} "
                 "on the planned timeline.",
                 {words("name", most_saved_by->name),
                  words("organ", organ_label(most_saved->organ)),
                  number("saved_mGyEq",
                         most_saved->without_response_mGyEq - most_saved->with_response_mGyEq),
                  number("without_response_mGyEq", most_saved->without_response_mGyEq)},
                 100, "    ");
    }
    doc.blank();
    doc.text("Go/no-go per EVA and rover drive (the design event starting at the worst moment of "
             "it, {}):",
             {words("how", responds ? "with the planned response"
                                    : "the crew keeping to the planned timeline")},
             100);
    for (const auto& e : s.evas) {
        if (!e.swept()) {
            doc.text("  NOT SWEPT {} to {}, {}: no onset of the sweep falls inside it (widen "
                     "--from/--to)",
                     {words("start", format_time(e.start)), words("end", format_time(e.end)),
                      words("activity", e.label)},
                     100, "        ");
            continue;
        }
        // The onset exact to the fraction of a second of a policy breakpoint, as in the
        // verdict: --onset reads it back to the very onset.
        doc.text("  {} {} to {}, {}: worst t0 {}, {} {} at {} % of its 30-day limit",
                 {words("go", e.go() ? "GO" : "NO-GO"), words("start", format_time(e.start)),
                  words("end", format_time(e.end)), words("activity", e.label),
                  words("worst_onset", format_time_exact(e.worst_onset)), words("crew", e.crew),
                  words("organ", organ_label(e.organ)), percent("ratio", e.ratio)},
                 100, "        ");
    }
    doc.blank();
    doc.text("Profile: the highest share of a 30-day limit over the crew, per {} of onset\n"
             "  (each # is 5 %; a bar that ends in > goes beyond 200 %):",
             {words("bin", profile_bin_text(s.profile_bin_h))});
    const boost::posix_time::time_duration bin = boost::posix_time::hours(s.profile_bin_h);
    std::optional<Time> last;
    for (const auto& [t, r] : s.profile) {
        // A bin no onset fell in (a step longer than the bin) is said so, never left out.
        for (Time gap = last ? *last + bin : t; gap < t; gap += bin) {
            doc.text(
                "  {}    - no onset in this bin (--step {} is longer)",
                {words("bin_start", format_time(gap)), words("step", format_duration(s.step))});
        }
        last = t;
        // The bar: a # per 5 %, up to 200 %.
        const int n = static_cast<int>(std::lround(std::min(r, 2.0) * 20.0));
        doc.text("  {} {:>4} % {}{}",
                 {words("bin_start", format_time(t)), percent("worst_ratio", r),
                  words("bar", std::string(static_cast<std::size_t>(n), '#')),
                  words("beyond", r > 2.0 ? ">" : "")});
    }
    doc.blank();
    doc.text(s.any_exceeded() ? "A 30-DAY PLANNING LIMIT IS EXCEEDED at some onset."
                              : "Every 30-day planning limit is met at every onset tried.");
    doc.table(sweep_csv_table(s));
    return doc;
}

std::string format_storm_whatif(const StormContext& ctx, const StormWhatIf& w, OutputFormat format,
                                double near_share, bool colour) {
    return report::write(storm_whatif_document(ctx, w, near_share), format, colour);
}

std::string format_storm_sweep(const StormContext& ctx, const StormSweep& s, OutputFormat format,
                               double near_share, bool colour) {
    return report::write(storm_sweep_document(ctx, s, near_share), format, colour);
}

} // namespace crewdose::planner
