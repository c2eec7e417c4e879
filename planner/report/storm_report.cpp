#include "planner/report/storm_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/number_format.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>

namespace crewdose::planner {

namespace {

nlohmann::json crew_json(const StormCrew& c) {
    nlohmann::json j{{"id", c.crew},
                     {"name", c.name},
                     {"worst_ratio", c.worst_ratio()},
                     {"sun_distance_AU", c.sun_distance_AU},
                     {"distance_basis", c.distance_basis},
                     {"fluence_scale", c.fluence_scale}};
    for (const auto& o : c.organs) {
        j["organs"][o.organ] = {{"without_response_mGyEq", o.without_response_mGyEq},
                                {"with_response_mGyEq", o.with_response_mGyEq},
                                {"saved_mGyEq", o.without_response_mGyEq - o.with_response_mGyEq},
                                {"other_30d_mGyEq", o.other_30d_mGyEq},
                                {"limit_30d_mGyEq", o.limit_30d_mGyEq},
                                {"margin_30d_mGyEq", o.margin()},
                                {"exceeded", o.exceeded()}};
    }
    for (const auto& s : c.responded) {
        j["timeline"].push_back({{"start", format_time(s.start)},
                                 {"end", format_time(s.end)},
                                 {"location", s.location},
                                 {"what", s.label}});
    }
    return j;
}

std::string model_note(const StormContext& ctx) {
    const Scenario& sc = ctx.study().scenario();
    const EventSpec& ev = ctx.event();
    std::string arrival =
        ev.fixed_arrival
            ? fmt::format("every energy arrives {} h after t0 (fixed arrival_delay_h)",
                          significant(ev.arrival_delay_h, 3))
            : fmt::format("scatter-free arrival, the earliest possible: 10, 100 and 1000 MeV "
                          "protons {}, {} and {} min after t0 (field line {} AU, site {} AU from "
                          "the Sun)",
                          significant(60 * ev.delay_h(10), 3), significant(60 * ev.delay_h(100), 3),
                          significant(60 * ev.delay_h(1000), 3), significant(ev.path_length_AU, 3),
                          significant(ev.sun_distance_AU, 3));
    std::string organs;
    for (std::size_t k = 0; k < ctx.organs().size(); ++k) {
        organs += fmt::format("{}{}", k == 0 ? "" : (k + 1 == ctx.organs().size() ? " and " : ", "),
                              organ_label(ctx.organs()[k]));
    }
    bool elsewhere = false;
    for (const auto& track : sc.sun_tracks) {
        elsewhere = elsewhere || track.lowest_AU() != ev.sun_distance_AU ||
                    track.highest_AU() != ev.sun_distance_AU;
    }
    if (elsewhere) {
        arrival += fmt::format("; crew away from the site (transits) meet the event at their own "
                               "distance from the Sun, its fluence scaled as distance^-{} from "
                               "where its spectrum is given and arriving along the field line "
                               "there (arrival on a 0.01 AU grid)",
                               significant(sc.mission.sep_fluence_exponent, 3));
    }
    std::string unchecked;
    if (!ctx.unchecked_note().empty()) {
        unchecked = fmt::format(" Not checked: {}.", ctx.unchecked_note());
    }
    return fmt::format(
        "t0 is when the flare is seen at the site; {}. 30-day dose = the event (uncertainty "
        "factor {:.2f}, the higher of with and without nuclear reactions, each location's body "
        "model; {}) plus the crew member's highest 30-day dose from everything else, wherever "
        "it lies (conservative: as if both fell in one window).{}",
        arrival, sc.limits.uncertainty_factor, organs, unchecked);
}

std::string policy_text(const StormPolicy& p) {
    return fmt::format(
        "Response: warning {} min after t0; crew inside reach {} within {} min; crew on EVA or "
        "driving return in their activity's return_min (default {} min) to its refuge (default "
        "the shelter); no EVA starts before the all-clear, {}; the rest of the timeline is "
        "unchanged.",
        significant(p.warning_delay_min, 3), p.shelter, significant(p.move_to_shelter_min, 3),
        significant(p.eva_return_min, 3),
        p.all_clear_above_MeV
            ? fmt::format("which comes when the flux above {} MeV falls below {} /(cm2 s sr)",
                          significant(*p.all_clear_above_MeV, 3),
                          significant(p.all_clear_flux_per_cm2_s_sr, 3))
            : fmt::format("which comes {} h after t0", significant(p.all_clear_h, 3)));
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
    return t;
}

// The verdict for JSON: the sentence, the near share and a row per crew member, the same
// numbers the text table rounds. A dose that was not computed is null with status "exceeded".
void add_verdict_json(nlohmann::json& j, const VerdictTable& table,
                      const std::vector<StormVerdictRow>& rows, double near_share) {
    j["verdict"] = table.headline;
    j["near_share"] = near_share;
    j["headline"] = nlohmann::json::array();
    for (const StormVerdictRow& v : rows) {
        nlohmann::json row{{"crew", v.crew->crew}};
        if (!v.organ) {
            row["organ"] = nullptr;
            row["status"] = "no organ checked";
        } else {
            row["organ"] = v.organ->organ;
            row["window"] = "30-day";
            row["dose"] = v.known ? nlohmann::json(v.dose) : nlohmann::json(nullptr);
            row["limit"] = v.organ->limit_30d_mGyEq;
            row["unit"] = "mGy-Eq";
            row["share_of_limit"] =
                v.known ? nlohmann::json(v.dose / v.organ->limit_30d_mGyEq) : nullptr;
            row["status"] = v.over ? "exceeded" : (v.near ? "near" : "within");
        }
        if (v.onset) {
            row["worst_onset"] = format_time_exact(*v.onset);
        }
        j["headline"].push_back(std::move(row));
    }
}

std::string crew_count(std::size_t n, std::size_t of) {
    return fmt::format("{} of {} crew member{}", n, of, of == 1 ? "" : "s");
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
        t.headline = fmt::format("Verdict: every 30-day planning limit is met in this what-if "
                                 "({}); {} near a limit.",
                                 how, crew_count(near, rows.size()));
    } else {
        t.headline =
            fmt::format("Verdict: every 30-day planning limit is met in this what-if ({}).", how);
    }
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
                   : fmt::format("; every EVA and rover drive swept is go");
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
        t.headline = fmt::format("Verdict: every 30-day planning limit is met at every onset "
                                 "tried ({}); {} near a limit at the worst onset{}.",
                                 how, crew_count(near, rows.size()), evas);
    } else {
        t.headline = fmt::format("Verdict: every 30-day planning limit is met at every onset "
                                 "tried ({}){}.",
                                 how, evas);
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

std::string format_storm_whatif(const StormContext& ctx, const StormWhatIf& w, OutputFormat format,
                                double near_share) {
    const Scenario& sc = ctx.study().scenario();
    if (format == OutputFormat::json) {
        nlohmann::json j{{"cautions", caution_text()},
                         {"event", w.event_id},
                         {"onset", format_time(w.times.onset)},
                         {"warning", format_time(w.times.warning)},
                         {"all_clear", format_time(w.times.all_clear)},
                         {"respond", w.respond},
                         {"model", model_note(ctx)},
                         {"any_limit_exceeded", w.any_exceeded()}};
        for (const auto& c : w.crew) {
            j["crew"].push_back(crew_json(c));
        }
        // One set of rows for the sentence and the headline: they cannot disagree.
        const auto rows = storm_verdict_rows(verdict_crew(w), near_share);
        add_verdict_json(j, whatif_verdict(ctx, w, rows, near_share), rows, near_share);
        return dump_checked(j);
    }
    if (format == OutputFormat::csv) {
        std::string out = "crew,organ,without_response_mGyEq,with_response_mGyEq,saved_mGyEq,"
                          "other_30d_mGyEq,limit_30d_mGyEq,margin_30d_mGyEq,exceeded\n";
        for (const auto& c : w.crew) {
            for (const auto& o : c.organs) {
                out +=
                    fmt::format("{},{},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{}\n",
                                c.crew, o.organ, o.without_response_mGyEq, o.with_response_mGyEq,
                                o.without_response_mGyEq - o.with_response_mGyEq, o.other_30d_mGyEq,
                                o.limit_30d_mGyEq, o.margin(), o.exceeded() ? "yes" : "no");
            }
        }
        return out;
    }
    std::string out = fmt::format("crewdose storm: event {} with t0 at {}\nscenario: {}\n\n",
                                  w.event_id, format_time(w.times.onset), sc.file);
    out += format_verdict_text(storm_whatif_verdict(ctx, w, near_share));
    out += caution_text() + "\n";
    out += wrap(model_note(ctx), 96);
    if (w.respond) {
        out += wrap(policy_text(sc.storm), 96);
        out += fmt::format("Warning {}, all-clear {}.\n", format_time(w.times.warning),
                           format_time(w.times.all_clear));
    } else {
        out += "No response: the crew keep to the planned timeline.\n";
    }
    out += "\n";
    for (const auto& c : w.crew) {
        out += fmt::format("{} ({})\n", c.name, c.crew);
        if (c.sun_distance_AU != ctx.event().sun_distance_AU || c.fluence_scale != 1.0) {
            out += wrap(fmt::format("  at {} AU from the Sun ({}): the event's fluence is {} times "
                                    "its spectrum as written",
                                    significant(c.sun_distance_AU, 3), c.distance_basis,
                                    significant(c.fluence_scale, 3)),
                        100, "    ");
        }
        out += fmt::format("  {:<6} {:>12} {:>12} {:>10} {:>12} {:>8} {:>10}\n", "organ",
                           "no response", "response", "saved", "other 30d", "limit", "margin");
        for (const auto& o : c.organs) {
            out += fmt::format("  {:<6} {:>12} {:>12} {:>10} {:>12} {:>8} {:>10}{}\n",
                               organ_label(o.organ), significant(o.without_response_mGyEq, 3),
                               significant(o.with_response_mGyEq, 3),
                               significant(o.without_response_mGyEq - o.with_response_mGyEq, 3),
                               significant(o.other_30d_mGyEq, 3), significant(o.limit_30d_mGyEq, 3),
                               significant(o.margin(), 3), o.exceeded() ? "  EXCEEDED" : "");
        }
        // A response that adds dose (the crew wait out the event somewhere less shielded than
        // where the plan had them) is said so: "saved" below zero is easy to miss.
        std::vector<std::string> worse;
        for (const auto& o : c.organs) {
            if (w.respond && o.with_response_mGyEq > o.without_response_mGyEq) {
                worse.push_back(organ_label(o.organ));
            }
        }
        if (!worse.empty()) {
            out += wrap(fmt::format("  NOTE: the response adds dose here ({}): the crew wait the "
                                    "event out somewhere less shielded than the plan had them "
                                    "(an EVA's refuge, or the place they are held until the "
                                    "all-clear); check [storm_response] and the refuges",
                                    fmt::format("{}", fmt::join(worse, ", "))),
                        100, "    ");
        }
        out += "  where (from t0):\n";
        for (const auto& s : c.responded) {
            out +=
                wrap(fmt::format("    {} to {}  {}", format_time(std::max(s.start, w.times.onset)),
                                 format_time(s.end), s.label),
                     100, "      ");
        }
        out += "\n";
    }
    out += w.any_exceeded() ? "A 30-DAY PLANNING LIMIT IS EXCEEDED in this what-if.\n"
                            : "Every 30-day planning limit is met in this what-if.\n";
    return out;
}

std::string format_storm_sweep(const StormContext& ctx, const StormSweep& s, OutputFormat format,
                               double near_share) {
    const Scenario& sc = ctx.study().scenario();
    if (format == OutputFormat::json) {
        nlohmann::json j{
            {"cautions", caution_text()},       {"event", s.event_id},
            {"from", format_time(s.from)},      {"to", format_time(s.to)},
            {"step_s", s.step.total_seconds()}, {"onsets", s.onsets},
            {"model", model_note(ctx)},         {"any_limit_exceeded", s.any_exceeded()},
            {"response", ctx.responds()}};
        for (const auto& [onset, c] : s.worst) {
            auto cj = crew_json(c);
            cj["worst_onset"] = format_time_exact(onset);
            j["worst"].push_back(cj);
        }
        // One set of rows for the sentence and the headline: they cannot disagree.
        const auto rows = storm_verdict_rows(verdict_crew(s), near_share);
        add_verdict_json(j, sweep_verdict(ctx, s, rows, near_share), rows, near_share);
        for (const auto& e : s.evas) {
            j["evas"].push_back(
                {{"activity", e.label},
                 {"start", format_time(e.start)},
                 {"end", format_time(e.end)},
                 {"worst_onset", e.ratio >= 0 ? format_time_exact(e.worst_onset) : ""},
                 {"crew", e.crew},
                 {"organ", e.organ},
                 {"ratio_to_30d_limit", e.ratio},
                 {"swept", e.swept()},
                 {"go", e.go()}});
        }
        for (const auto& [t, r] : s.profile) {
            j["profile"].push_back({{"bin_start", format_time(t)}, {"worst_ratio", r}});
        }
        j["profile_bin_h"] = s.profile_bin_h;
        return dump_checked(j);
    }
    if (format == OutputFormat::csv) {
        std::string out = "activity,start,end,worst_onset,crew,organ,ratio_to_30d_limit,go\n";
        for (const auto& e : s.evas) {
            out += fmt::format(
                "\"{}\",{},{},{},{},{},{:.10g},{}\n", e.label, format_time(e.start),
                format_time(e.end), e.ratio >= 0 ? format_time_exact(e.worst_onset) : "", e.crew,
                e.organ, e.ratio, !e.swept() ? "not swept" : (e.go() ? "go" : "no-go"));
        }
        return out;
    }
    const bool responds = ctx.responds();
    std::string out =
        wrap(fmt::format("crewdose storm sweep: event {} with t0 from {} to {}, every {} plus {} {}"
                         "breakpoints",
                         s.event_id, format_time(s.from), format_time(s.to),
                         format_duration(s.step),
                         s.onsets -
                             static_cast<std::size_t>((s.to - s.from).total_seconds() /
                                                      s.step.total_seconds()) -
                             1,
                         responds ? "policy " : "timeline "),
             100, "  ") +
        fmt::format("scenario: {}\n\n", sc.file);
    out += format_verdict_text(storm_sweep_verdict(ctx, s, near_share));
    out += caution_text() + "\n";
    out += wrap(model_note(ctx), 96);
    out += responds ? wrap(policy_text(sc.storm), 96) + "\n"
                    : "No response (--no-response): the crew keep to the planned timeline.\n\n";
    // The worst onset itself is the verdict's "worst t0": said once.
    out += fmt::format("At each crew member's worst onset (the verdict's worst t0; 30-day dose {}, "
                       "mGy-Eq):\n",
                       responds ? "with the response" : "without a response");
    // Where the response gives an organ more of the event than the planned timeline would.
    std::vector<std::string> adds;
    const StormOrgan* most_saved = nullptr;
    const StormCrew* most_saved_by = nullptr;
    for (const auto& [onset, c] : s.worst) {
        const StormOrgan* worst = nullptr;
        std::vector<std::string> more;
        for (const auto& o : c.organs) {
            if (!worst || o.ratio() > worst->ratio()) {
                worst = &o;
            }
            const double saved = o.without_response_mGyEq - o.with_response_mGyEq;
            if (saved < 0.0) {
                more.push_back(
                    fmt::format("{} +{} mGy-Eq", organ_label(o.organ), significant(-saved, 3)));
            } else if (!most_saved || saved > most_saved->without_response_mGyEq -
                                                  most_saved->with_response_mGyEq) {
                most_saved = &o;
                most_saved_by = &c;
            }
        }
        if (!more.empty()) {
            adds.push_back(fmt::format("{} ({})", c.name, fmt::join(more, ", ")));
        }
        if (!worst) {
            continue;
        }
        out += wrap(fmt::format("  {} ({}): {} {} = {} event + {} other of {} ({:.0f} %){}", c.name,
                                c.crew, organ_label(worst->organ),
                                significant(worst->with_response_mGyEq + worst->other_30d_mGyEq, 3),
                                significant(worst->with_response_mGyEq, 3),
                                significant(worst->other_30d_mGyEq, 3),
                                significant(worst->limit_30d_mGyEq, 3), 100.0 * worst->ratio(),
                                worst->exceeded() ? "  EXCEEDED" : ""),
                    100, "      ");
    }
    // Whether the response helps there, from these numbers (the sweep computes the planned
    // timeline's dose beside the response's only at the worst onsets).
    if (responds && !adds.empty()) {
        out += wrap(fmt::format("  NOTE: the response adds dose at the worst onset for {} "
                                "(with the response, more than on the planned timeline): the "
                                "crew wait the event out somewhere less shielded than the plan "
                                "had them (an EVA's refuge, or the place they are held until the "
                                "all-clear); check [storm_response] and the refuges",
                                fmt::format("{}", fmt::join(adds, "; "))),
                    100, "    ");
    } else if (responds && most_saved &&
               most_saved->without_response_mGyEq == most_saved->with_response_mGyEq) {
        out += "  At every crew member's worst onset the response leaves the event's dose as "
               "planned.\n";
    } else if (responds && most_saved) {
        out += wrap(fmt::format("  At every crew member's worst onset the response lowers the "
                                "event's dose or leaves it as planned, organ by organ; it saves "
                                "most for {}: {} {} mGy-Eq of {} on the planned timeline.",
                                most_saved_by->name, organ_label(most_saved->organ),
                                significant(most_saved->without_response_mGyEq -
                                                most_saved->with_response_mGyEq,
                                            3),
                                significant(most_saved->without_response_mGyEq, 3)),
                    100, "    ");
    }
    out += "\n" + wrap(fmt::format("Go/no-go per EVA and rover drive (the design event starting at "
                                   "the worst moment of it, {}):",
                                   responds ? "with the planned response"
                                            : "the crew keeping to the planned timeline"),
                       100);
    for (const auto& e : s.evas) {
        if (!e.swept()) {
            out += wrap(fmt::format("  NOT SWEPT {} to {}, {}: no onset of the sweep falls inside "
                                    "it (widen --from/--to)",
                                    format_time(e.start), format_time(e.end), e.label),
                        100, "        ");
            continue;
        }
        // The onset exact to the fraction of a second of a policy breakpoint, as in the
        // verdict: --onset reads it back to the very onset.
        out += wrap(fmt::format("  {:<5} {} to {}, {}: worst t0 {}, {} {} at {:.0f} % of its "
                                "30-day limit",
                                e.go() ? "GO" : "NO-GO", format_time(e.start), format_time(e.end),
                                e.label, format_time_exact(e.worst_onset), e.crew,
                                organ_label(e.organ), 100.0 * e.ratio),
                    100, "        ");
    }
    out += fmt::format("\nProfile: the highest share of a 30-day limit over the crew, per {} of "
                       "onset\n  (each # is 5 %; a bar that ends in > goes beyond 200 %):\n",
                       profile_bin_text(s.profile_bin_h));
    const boost::posix_time::time_duration bin = boost::posix_time::hours(s.profile_bin_h);
    std::optional<Time> last;
    for (const auto& [t, r] : s.profile) {
        // A bin no onset fell in (a step longer than the bin) is said so, never left out.
        for (Time gap = last ? *last + bin : t; gap < t; gap += bin) {
            out += fmt::format("  {}    - no onset in this bin (--step {} is longer)\n",
                               format_time(gap), format_duration(s.step));
        }
        last = t;
        const int n = static_cast<int>(std::lround(std::min(r, 2.0) * 20.0));
        out += fmt::format("  {} {:>4.0f} % {}{}\n", format_time(t), 100.0 * r,
                           std::string(static_cast<std::size_t>(n), '#'), r > 2.0 ? ">" : "");
    }
    out += "\n";
    out += s.any_exceeded() ? "A 30-DAY PLANNING LIMIT IS EXCEEDED at some onset.\n"
                            : "Every 30-day planning limit is met at every onset tried.\n";
    return out;
}

} // namespace crewdose::planner
