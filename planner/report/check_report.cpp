#include "planner/report/check_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/number_format.hpp"
#include "planner/scenario/spectrum_spec.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/study/body_model.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <nlohmann/json.hpp>

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
nlohmann::json totals_json(const DoseTotals& t, const std::string& organ) {
    nlohmann::json j{{"dose", t.mGyEq}};
    if (organ != "effective") {
        j["absorbed_mGy"] = t.absorbed_mGy;
        j["dose_equivalent_mSv"] = t.dose_equivalent_mSv;
    }
    return j;
}

nlohmann::json dose_json(const exposure::DoseQuantities& d) {
    return {{"absorbed_mGy", 1e3 * d.absorbed_Gy},
            {"dose_equivalent_mSv", 1e3 * d.dose_equivalent_Sv},
            {"mGyEq", 1e3 * d.rbe_weighted_GyEq}};
}

nlohmann::json window_json(const WindowMax& w) {
    return {{"dose", w.dose_mGyEq},
            {"window_start", w.dose_mGyEq > 0 ? format_time(w.window_start) : ""},
            {"window_end", w.dose_mGyEq > 0 ? format_time(w.window_end) : ""},
            {"top_contributor", w.top_contributor}};
}

// The answer first: one line per crew member with the limit that binds (the highest share of
// its limit), where the dose stands, and the budget left.
std::string verdict_block(const LedgerResult& ledger, double near_share, bool colour) {
    const char* red = colour ? "\033[31m" : "";
    const char* yellow = colour ? "\033[33m" : "";
    const char* green = colour ? "\033[32m" : "";
    const char* reset = colour ? "\033[0m" : "";
    // Crew members by name, or by id when a name would push the lines past 100 characters.
    bool by_name = true;
    std::size_t width = std::string("crew member").size();
    for (const auto& c : ledger.crew) {
        width = std::max(width, c.name.size());
    }
    if (width > 24) {
        by_name = false;
        width = std::string("crew member").size();
        for (const auto& c : ledger.crew) {
            width = std::max(width, c.crew.size());
        }
    }
    std::size_t exceeded = 0;
    std::size_t near = 0;
    std::string rows;
    std::string unevaluated;
    for (const auto& c : ledger.crew) {
        const LimitCheck* b = binding_check(c);
        const std::string who = by_name ? c.name : c.crew;
        if (!b) {
            rows += fmt::format("  {:<{}}  no limit evaluated\n", who, width);
            continue;
        }
        const LimitStatus st = status_of(*b, near_share);
        exceeded += st == LimitStatus::exceeded ? 1U : 0U;
        near += st == LimitStatus::near ? 1U : 0U;
        const char* on = st == LimitStatus::exceeded ? red
                         : st == LimitStatus::near   ? yellow
                                                     : green;
        const std::string budget = budget_left_text(c, st);
        const std::string word = st == LimitStatus::exceeded ? "EXCEEDED" : to_string(st);
        rows += fmt::format(
            "  {:<{}}  {:<16} {:>6} {:<6} / {:<5} {:>5}  {}{:<8}{} {}\n", who, width,
            organ_label(b->limit.organ) + " " + b->limit.window, significant(b->dose, 3),
            unit_of(b->limit.organ), significant(b->limit.value, 3),
            fmt::format("{:.0f} %", 100.0 * b->dose / b->limit.value), on, word, reset, budget);
        for (const std::string& note : check_verdict_notes(c)) {
            unevaluated += wrap("  " + note, 100, "    ");
        }
    }
    std::string out;
    if (exceeded > 0) {
        out = fmt::format("Verdict: {}A PLANNING LIMIT IS EXCEEDED{} for {} of {} crew member{}.\n",
                          red, reset, exceeded, ledger.crew.size(),
                          ledger.crew.size() == 1 ? "" : "s");
    } else if (near > 0) {
        out = fmt::format("Verdict: every evaluated planning limit is met; {}{} crew member{} near "
                          "a limit{}.\n",
                          yellow, near, near == 1 ? "" : "s", reset);
    } else {
        out = fmt::format("Verdict: {}every evaluated planning limit is met{}.\n", green, reset);
    }
    out += fmt::format("  {:<{}}  {:<16} {:>6} {:<14} {:>5}  {:<8} {}\n", "crew member", width,
                       "binding limit", "dose", "unit / limit", "used", "status", "budget left");
    out += rows + unevaluated;
    out += wrap(fmt::format("  binding: the limit with the highest share used; near: {:.0f} % of "
                            "its limit or more (--near); budget left (d: days): days more of this "
                            "timeline's activity mix at its GCR rate, no further events.",
                            100.0 * near_share),
                100, "    ");
    return out + "\n";
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

std::string format_check_report(const Study& study, const LedgerResult& ledger, OutputFormat format,
                                bool colour, double near_share) {
    const Scenario& sc = study.scenario();
    if (format == OutputFormat::json) {
        nlohmann::json j;
        j["mission"] = {{"name", sc.mission.name},
                        {"site", to_string(sc.mission.site)},
                        {"start", format_time(sc.mission.start)},
                        {"end", format_time(sc.mission.end)}};
        j["cautions"] = caution_text();
        j["model"] = model_text(study);
        j["uncertainty_factor"] = sc.limits.uncertainty_factor;
        j["directions"] = study.direction_count();
        j["phantom_directions"] = sc.mission.phantom_directions;
        j["body_models"] = nlohmann::json::object();
        for (const auto& loc : sc.locations) {
            j["body_models"][loc.id] = loc.body;
        }
        j["any_limit_exceeded"] = ledger.any_exceeded;
        j["near_share"] = near_share;
        j["headline"] = nlohmann::json::array();
        for (const auto& c : ledger.crew) {
            // What the text verdict says beside the row: the organs not evaluated and the
            // doses that are only an upper bound (their locations are under "crew").
            nlohmann::json not_evaluated = nlohmann::json::array();
            for (const auto& [organ, where] : c.not_evaluated) {
                not_evaluated.push_back(organ);
            }
            nlohmann::json bounded = nlohmann::json::array();
            for (const auto& [organ, where] : c.estimated) {
                bounded.push_back(organ);
            }
            const LimitCheck* b = binding_check(c);
            if (!b) {
                j["headline"].push_back({{"crew", c.crew},
                                         {"organ", nullptr},
                                         {"status", "no limit evaluated"},
                                         {"not_evaluated", not_evaluated},
                                         {"bounded", bounded}});
                continue;
            }
            j["headline"].push_back(
                {{"crew", c.crew},
                 {"organ", b->limit.organ},
                 {"window", b->limit.window},
                 {"dose", b->dose},
                 {"limit", b->limit.value},
                 {"unit", unit_of(b->limit.organ)},
                 {"share_of_limit", b->dose / b->limit.value},
                 {"status", to_string(status_of(*b, near_share))},
                 {"budget_days", c.budget.binds ? nlohmann::json(c.budget.days) : nullptr},
                 {"budget_binds", c.budget.binds ? c.budget.organ + " " + c.budget.window : ""},
                 {"not_evaluated", not_evaluated},
                 {"bounded", bounded}});
        }
        {
            nlohmann::json g{{"phi_MV", sc.mission.gcr_phi_MV},
                             {"phi_given", sc.mission.gcr_phi_given},
                             {"phi_series", sc.mission.gcr_phi_series},
                             {"composition", std::string(exposure::gcr_composition_source())},
                             {"transport",
                              "straight-ahead depth march of the whole field with nuclear "
                              "reactions (removal, projectile fragmentation with EPAX 3.1 "
                              "remnants, the secondaries of nucleon reactions: n, p, d, t, "
                              "He-3, alpha, target fragments deposited locally; recoil "
                              "protons of n-p elastic scattering) and without "
                              "any; limits use the higher of each quantity; not modelled: "
                              "pions and the electromagnetic cascade, target fragments of "
                              "nucleus-nucleus reactions, neutrons emitted backwards"},
                             {"directions", sc.mission.gcr_directions},
                             {"phases", nlohmann::json::array()},
                             {"daily_rates_at_start", nlohmann::json::object()}};
            for (const auto& phase : sc.mission.gcr_phases) {
                g["phases"].push_back(
                    {{"from", format_time(phase.from)}, {"phi_MV", phase.phi_MV}});
            }
            for (const auto& loc : sc.locations) {
                for (const auto& organ : study.body(loc.id).organs) {
                    const auto& d = study.gcr_daily_dose(loc.id, organ, sc.mission.gcr_phi_MV);
                    g["daily_rates_at_start"][loc.id][organ] = {
                        {"with_reactions", dose_json(d.with_removal)},
                        {"without_reactions", dose_json(d.without_removal)},
                        {"for_limits", dose_json(d.for_limits())}};
                }
            }
            j["gcr"] = g;
        }
        j["events"] = nlohmann::json::array();
        for (std::size_t k = 0; k < sc.events.size(); ++k) {
            const auto& e = sc.events[k];
            nlohmann::json ej{{"id", e.id},
                              {"flare_seen", format_time(e.flare_seen)},
                              {"arrival", format_time(e.arrival())},
                              {"spectrum", e.spectrum_text},
                              {"spectrum_at_AU", e.spectrum_at_AU.value_or(e.sun_distance_AU)},
                              {"fluence_exponent", sc.mission.sep_fluence_exponent}};
            ej["crew"] = nlohmann::json::array();
            for (const auto& c : ledger.crew) {
                if (k < c.event_distances.size()) {
                    const auto& d = c.event_distances[k];
                    ej["crew"].push_back({{"id", c.crew},
                                          {"sun_distance_AU", d.r_AU},
                                          {"basis", d.basis},
                                          {"fluence_scale", d.fluence_scale}});
                }
            }
            j["events"].push_back(ej);
        }
        j["crew"] = nlohmann::json::array();
        for (const auto& c : ledger.crew) {
            nlohmann::json cj{{"id", c.crew}, {"name", c.name}};
            cj["not_evaluated"] = nlohmann::json::object();
            for (const auto& [organ, where] : c.not_evaluated) {
                cj["not_evaluated"][organ] = where;
            }
            cj["bounded_from_above"] = nlohmann::json::object();
            for (const auto& [organ, where] : c.estimated) {
                cj["bounded_from_above"][organ] = where;
            }
            for (const auto& o : c.organs) {
                // Every dose of an organ is in its unit, said once: mGy-Eq, or mSv for the
                // effective dose (so no key names a unit that a row does not hold).
                nlohmann::json oj{{"unit", unit_of(o.organ)},
                                  {"max_30d", window_json(o.max_30d)},
                                  {"max_365d", window_json(o.max_365d)},
                                  {"career", o.career_mGyEq},
                                  {"mission", o.mission_mGyEq},
                                  {"mission_by_source",
                                   {{"gcr", totals_json(o.gcr, o.organ)},
                                    {"spe", totals_json(o.spe, o.organ)},
                                    {"recorded", totals_json(o.recorded, o.organ)}}}};
                if (o.organ != "effective") {
                    oj["mission_absorbed_mGy"] = o.mission_absorbed_mGy;
                    oj["mission_dose_equivalent_mSv"] = o.mission_dose_equivalent_mSv;
                }
                cj["organs"][o.organ] = std::move(oj);
            }
            cj["budget"] = {{"binds", c.budget.binds},
                            {"days_after_mission_end", c.budget.days},
                            {"organ", c.budget.organ},
                            {"window", c.budget.window},
                            {"gcr_rate_per_day", c.budget.rate_mGyEq_per_day},
                            {"unit", c.budget.binds ? unit_of(c.budget.organ) : ""}};
            for (const auto& chk : c.checks) {
                cj["limits"].push_back({{"organ", chk.limit.organ},
                                        {"unit", unit_of(chk.limit.organ)},
                                        {"window", chk.limit.window},
                                        {"limit", chk.limit.value},
                                        {"basis", chk.limit.basis},
                                        {"dose", chk.dose},
                                        {"margin", chk.margin},
                                        {"exceeded", chk.exceeded},
                                        {"where", chk.window_text},
                                        {"top_contributor", chk.top_contributor}});
            }
            j["crew"].push_back(cj);
        }
        j["gaps"] = nlohmann::json::array();
        for (const auto& g : ledger.gaps) {
            j["gaps"].push_back({{"crew", g.crew},
                                 {"start", format_time(g.start)},
                                 {"end", format_time(g.end)},
                                 {"charged_at", g.charged_at}});
        }
        return dump_checked(j);
    }
    if (format == OutputFormat::csv) {
        // The effective dose is in mSv, every organ dose in mGy-Eq: a unit column says which.
        // status: within, near (from near_share of the limit) or exceeded; binding: the crew
        // member's highest share of a limit.
        // evaluated: "computed", "upper bound at LOCATIONS" (the quick model's bound of the
        // effective dose) or, on a row of its own with no dose, "not evaluated at LOCATIONS".
        std::string out = "crew,organ,window,dose,limit,margin,unit,exceeded,status,binding,basis,"
                          "evaluated\n";
        const auto at = [](const std::vector<std::string>& where) {
            return fmt::format("{}", fmt::join(where, " "));
        };
        for (const auto& c : ledger.crew) {
            const LimitCheck* b = binding_check(c);
            for (const auto& chk : c.checks) {
                const auto bound = c.estimated.find(chk.limit.organ);
                out +=
                    fmt::format("{},{},{},{:.10g},{:.10g},{:.10g},{},{},{},{},\"{}\",{}\n", c.crew,
                                chk.limit.organ, chk.limit.window, chk.dose, chk.limit.value,
                                chk.margin, unit_of(chk.limit.organ), chk.exceeded ? "yes" : "no",
                                to_string(status_of(chk, near_share)), &chk == b ? "yes" : "no",
                                chk.limit.basis,
                                bound == c.estimated.end() ? std::string("computed")
                                                           : "upper bound at " + at(bound->second));
            }
            for (const auto& [organ, where] : c.not_evaluated) {
                out += fmt::format("{},{},,,,,{},,not evaluated,no,,not evaluated at {}\n", c.crew,
                                   organ, unit_of(organ), at(where));
            }
        }
        return out;
    }
    const char* red = colour ? "\033[31m" : "";
    const char* green = colour ? "\033[32m" : "";
    const char* reset = colour ? "\033[0m" : "";
    std::string out = wrap(fmt::format("crewdose check: {} ({}, {} to {})", sc.mission.name,
                                       to_string(sc.mission.site), format_time(sc.mission.start),
                                       format_time(sc.mission.end)),
                           100, "  ") +
                      fmt::format("scenario: {}\n\n", sc.file);
    out += verdict_block(ledger, near_share, colour);
    out += caution_text() + "\n";
    out += "Model: SPE and GCR doses through the shielding and the body, the higher of with and "
           "without\nnuclear reactions, uncertainty factor " +
           fmt::format("{:.2f}", sc.limits.uncertainty_factor) +
           " applied; the whole description is at the end.\n\n";
    out +=
        wrap(fmt::format("GCR dose rate at the mission start (phi {:.0f} MV{}), per day, with "
                         "nuclear reactions (removal and projectile fragments) / without any "
                         "(the higher is used for limits):",
                         sc.mission.gcr_phi_MV,
                         sc.mission.gcr_phi_series.empty() ? ""
                         : sc.mission.gcr_phases.empty()
                             ? "; from the recorded solar cycle, the same over the whole mission"
                             : "; later months from the recorded solar cycle, listed at the end"),
             96);
    out += fmt::format("  {:<20} {:<9} {:>22} {:>22}\n", "location", "organ", "mGy-Eq", "mSv");
    for (const auto& loc : sc.locations) {
        for (const auto& organ : study.body(loc.id).organs) {
            if (organ == "effective") {
                const auto& d = study.gcr_daily_dose(loc.id, organ, sc.mission.gcr_phi_MV);
                out += fmt::format("  {:<20} {:<9} {:>22} {:>22}\n", loc.id, organ, "-",
                                   significant(1e3 * d.with_removal.dose_equivalent_Sv, 3) + " / " +
                                       significant(1e3 * d.without_removal.dose_equivalent_Sv, 3));
                continue;
            }
            const auto& d = study.gcr_daily_dose(loc.id, organ, sc.mission.gcr_phi_MV);
            out += fmt::format("  {:<20} {:<9} {:>22} {:>22}\n", loc.id, organ_label(organ),
                               significant(1e3 * d.with_removal.rbe_weighted_GyEq, 3) + " / " +
                                   significant(1e3 * d.without_removal.rbe_weighted_GyEq, 3),
                               significant(1e3 * d.with_removal.dose_equivalent_Sv, 3) + " / " +
                                   significant(1e3 * d.without_removal.dose_equivalent_Sv, 3));
        }
    }
    out += "\n";
    out += "Events:\n";
    for (std::size_t k = 0; k < sc.events.size(); ++k) {
        const auto& e = sc.events[k];
        out += wrap(fmt::format("  {}: flare seen {}, arrival at the site {}; {}", e.id,
                                format_time(e.flare_seen), format_time(e.arrival()),
                                describe_spectrum(e.spectrum)),
                    100, "    ");
        out += wrap(fmt::format("    spectrum as written at {} AU from the Sun ({}); the fluence "
                                "scales as distance^-{}",
                                significant(e.spectrum_at_AU.value_or(e.sun_distance_AU), 3),
                                e.spectrum_at_AU ? "spectrum_at_AU" : "the site's distance",
                                significant(sc.mission.sep_fluence_exponent, 3)),
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
            out += wrap(fmt::format("    {}: {} AU ({}), fluence {} times the spectrum as written",
                                    who, significant(d->r_AU, 3), d->basis,
                                    significant(d->fluence_scale, 3)),
                        100, "      ");
        }
    }
    if (sc.events.empty()) {
        out += "  none\n";
    }
    out += "\n";
    for (const auto& c : ledger.crew) {
        out += fmt::format("{} ({})\n", c.name, c.crew);
        out += fmt::format("  {:<9} {:<8} {:>8} {:<6} {:>7} {:>8}  {}\n", "organ", "window", "dose",
                           "unit", "limit", "margin", "where the window lies");
        const LimitCheck* lowest = nullptr;
        for (const auto& chk : c.checks) {
            if (!lowest || chk.margin / chk.limit.value < lowest->margin / lowest->limit.value) {
                lowest = &chk;
            }
            out += fmt::format("  {:<9} {:<8} {:>8} {:<6} {:>7} {}{:>8}{}  {}\n",
                               organ_label(chk.limit.organ), chk.limit.window,
                               significant(chk.dose, 3), unit_of(chk.limit.organ),
                               significant(chk.limit.value, 3), chk.exceeded ? red : "",
                               significant(chk.margin, 3), chk.exceeded ? reset : "",
                               chk.window_text.empty() ? "-" : chk.window_text);
        }
        if (!c.not_evaluated.empty()) {
            std::vector<std::string> organs;
            std::set<std::string> where;
            for (const auto& [organ, locs] : c.not_evaluated) {
                organs.push_back(organ_label(organ));
                where.insert(locs.begin(), locs.end());
            }
            out += wrap(fmt::format("  not evaluated: {} (they need body = \"phantom\"; the quick "
                                    "model is used at {})",
                                    fmt::join(organs, ", "), fmt::join(where, ", ")),
                        100, "    ");
        }
        for (const auto& [organ, locs] : c.estimated) {
            out += wrap(
                fmt::format("  {}: bounded from above at {}, where the quick body model "
                            "stands: the effective dose, a weighted mean of organ dose equivalents "
                            "(ICRP 103), is bounded there by the skin at its weight 0.01 "
                            "and the higher of lens and BFO for the rest (conservative; "
                            "body = \"phantom\" computes it)",
                            organ, fmt::join(locs, ", ")),
                100, "    ");
        }
        if (lowest) {
            // An exceeded limit has a negative margin: say by how much it is over, not that a
            // negative share is left.
            const double share_left = 100.0 * lowest->margin / lowest->limit.value;
            out += wrap(
                fmt::format(
                    "  smallest margin: {} {} ({}){}", organ_label(lowest->limit.organ),
                    lowest->limit.window,
                    share_left >= 0.0
                        ? fmt::format("{:.0f} % of the limit left", share_left)
                        : fmt::format("EXCEEDED, {:.0f} % over the limit", -share_left),
                    lowest->top_contributor.empty() ? "" : "; mostly " + lowest->top_contributor),
                100, "    ");
        }
        if (c.budget.binds && c.budget.days > 0.0) {
            out += wrap(fmt::format("  budget left: {} {} binds first, after about {} more days "
                                    "of this timeline's activity mix ({} {}/day of GCR; no "
                                    "further events)",
                                    organ_label(c.budget.organ), c.budget.window,
                                    significant(c.budget.days, 3),
                                    significant(c.budget.rate_mGyEq_per_day, 3),
                                    unit_of(c.budget.organ)),
                        100, "    ");
        } else if (!c.budget.binds) {
            out += "  budget left: no limit binds from the GCR background of this timeline alone\n";
        }
        out += fmt::format("  mission dose by source (mGy-Eq; dose equivalent in mSv; effective "
                           "dose in mSv)\n");
        out += fmt::format("  {:<9} {:>16} {:>16} {:>16}\n", "organ", "GCR", "SPE", "recorded");
        for (const auto& o : c.organs) {
            const bool effective = o.organ == "effective";
            auto cell = [effective](const DoseTotals& t) {
                if (effective) {
                    return significant(t.dose_equivalent_mSv, 3);
                }
                return fmt::format("{} ({})", significant(t.mGyEq, 3),
                                   significant(t.dose_equivalent_mSv, 3));
            };
            out += fmt::format("  {:<9} {:>16} {:>16} {:>16}\n", organ_label(o.organ), cell(o.gcr),
                               cell(o.spe), cell(o.recorded));
        }
        out += "  largest BFO contributors:\n";
        for (std::size_t i = 0; i < std::min<std::size_t>(3, c.contributors.size()); ++i) {
            out +=
                wrap(fmt::format("    {:>10} mGy-Eq  {}", significant(c.contributors[i].second, 3),
                                 c.contributors[i].first),
                     100, "                       ");
        }
        if (c.contributors.empty()) {
            out += "    none (no modelled dose)\n";
        }
        out += "\n";
    }
    out += "Limits (planning values, not official; basis):\n";
    std::set<std::string> bases;
    for (const auto& l : sc.limits.limits) {
        out += wrap(fmt::format("  {} {}: {} {} ({})", organ_label(l.organ), l.window,
                                significant(l.value, 3), unit_of(l.organ), l.basis),
                    100, "    ");
    }
    for (const auto& g : ledger.gaps) {
        out += fmt::format("Gap filled: {} from {} to {}, charged at {}\n", g.crew,
                           format_time(g.start), format_time(g.end), g.charged_at);
    }
    out += "\n";
    if (ledger.any_exceeded) {
        for (const auto& c : ledger.crew) {
            for (const auto& chk : c.checks) {
                if (chk.exceeded) {
                    out +=
                        fmt::format("{}PLANNING LIMIT EXCEEDED{}: {} ({}), {} {} limit, {} of {} "
                                    "{}{}\n",
                                    red, reset, c.name, c.crew, organ_label(chk.limit.organ),
                                    chk.limit.window, significant(chk.dose, 3),
                                    significant(chk.limit.value, 3), unit_of(chk.limit.organ),
                                    chk.window_text.empty() ? "" : ", window " + chk.window_text);
                }
            }
        }
    } else {
        out += fmt::format("{}Every evaluated planning limit is met.{}\n", green, reset);
    }
    out += "\n" + wrap(model_text(study), 96);
    return out;
}

std::string format_series(const Study& study, const LedgerResult& ledger) {
    (void)study;
    // Units per row: mGy-Eq for the organs, mSv for the effective dose.
    std::string out = "crew,organ,unit,time,cumulative,rate_per_h\n";
    for (const auto& [key, pieces] : ledger.pieces) {
        std::set<Time> times;
        for (const auto& p : pieces) {
            times.insert(p.start);
            times.insert(p.end);
            if (p.event) {
                for (Time t = p.start; t < p.end; t += boost::posix_time::hours(1)) {
                    times.insert(t);
                }
            }
        }
        double previous = 0.0;
        Time previous_t;
        bool first = true;
        for (const auto& t : times) {
            double d = 0.0;
            for (const auto& p : pieces) {
                d += 1e3 * p.dose.rbe_weighted_GyEq * p.fraction_by(t);
            }
            const double rate =
                first || t == previous_t ? 0.0 : (d - previous) / hours(t - previous_t);
            out += fmt::format("{},{},{},{},{:.10g},{:.10g}\n", key.first, key.second,
                               unit_of(key.second), format_time(t), d, rate);
            previous = d;
            previous_t = t;
            first = false;
        }
    }
    return out;
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
