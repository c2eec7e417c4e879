#include "planner/study/ledger.hpp"

#include "planner/scenario/time_format.hpp"
#include "planner/study/result_guard.hpp"

#include "exposure/effective_dose.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <set>
#include <stdexcept>

namespace crewdose::planner {
namespace {

using boost::posix_time::time_duration;

double cumulative(const std::vector<DosePiece>& pieces, const Time& t) {
    double sum = 0.0;
    for (const auto& p : pieces) {
        sum += 1e3 * p.dose.rbe_weighted_GyEq * p.fraction_by(t);
    }
    return sum;
}

} // namespace

exposure::DoseQuantities
effective_upper_bound(const std::function<exposure::DoseQuantities(const std::string&)>& dose,
                      std::string* deeper) {
    const auto bound =
        exposure::effective_dose_upper_bound(dose("skin"), dose("lens"), dose("bfo"));
    if (deeper) {
        *deeper = bound.deeper == exposure::DeeperOrgan::lens ? "lens" : "bfo";
    }
    return bound.dose;
}

double DosePiece::fraction_by(const Time& t) const {
    if (t < start) {
        return 0.0;
    }
    if (t >= end) {
        return 1.0;
    }
    if (event && timing) {
        const double a = hours(start - event->flare_seen);
        const double whole =
            timing->fraction_between(a, hours(end - event->flare_seen), event->profile);
        return whole > 0.0
                   ? timing->fraction_between(a, hours(t - event->flare_seen), event->profile) /
                         whole
                   : 1.0;
    }
    return hours(t - start) / hours(end - start);
}

std::vector<double> cumulative_at(const std::vector<DosePiece>& pieces,
                                  const std::vector<Time>& times) {
    // A sweep in time: pieces that have ended count whole, those under way by their fraction.
    // On a crew member's timeline pieces hardly overlap (one activity at a time), so the set
    // under way stays small and the sweep is linear after the sorts.
    std::vector<std::size_t> by_start(pieces.size());
    for (std::size_t i = 0; i < pieces.size(); ++i) {
        by_start[i] = i;
    }
    std::vector<std::size_t> by_end = by_start;
    std::sort(by_start.begin(), by_start.end(),
              [&](std::size_t a, std::size_t b) { return pieces[a].start < pieces[b].start; });
    std::sort(by_end.begin(), by_end.end(),
              [&](std::size_t a, std::size_t b) { return pieces[a].end < pieces[b].end; });
    std::vector<double> out(times.size());
    std::vector<std::size_t> under_way;
    double done = 0.0;
    std::size_t next_start = 0;
    std::size_t next_end = 0;
    for (std::size_t q = 0; q < times.size(); ++q) {
        const Time& t = times[q];
        if (q > 0 && t < times[q - 1]) {
            throw std::logic_error("cumulative_at: times must be sorted");
        }
        while (next_start < by_start.size() && !(t < pieces[by_start[next_start]].start)) {
            under_way.push_back(by_start[next_start++]);
        }
        while (next_end < by_end.size() && !(t < pieces[by_end[next_end]].end)) {
            done += 1e3 * pieces[by_end[next_end++]].dose.rbe_weighted_GyEq;
        }
        double partial = 0.0;
        std::size_t kept = 0;
        for (const std::size_t i : under_way) {
            if (t < pieces[i].end) {
                partial += 1e3 * pieces[i].dose.rbe_weighted_GyEq * pieces[i].fraction_by(t);
                under_way[kept++] = i;
            }
        }
        under_way.resize(kept);
        out[q] = done + partial;
    }
    return out;
}

WindowMax window_maximum(const std::vector<DosePiece>& pieces, time_duration length,
                         time_duration step) {
    WindowMax best;
    if (pieces.empty()) {
        return best;
    }
    // Candidate window ends: every piece boundary and the same plus the window length (the
    // maxima of a piecewise-smooth running window lie there), and steps inside event pieces.
    std::set<Time> ends;
    for (const auto& p : pieces) {
        for (const Time& t : {p.start, p.end}) {
            ends.insert(t);
            ends.insert(t + length);
        }
        if (p.event) {
            for (Time t = p.start; t < p.end; t += step) {
                ends.insert(t);
                ends.insert(t + length);
            }
        }
    }
    // The cumulative dose at every window end and start, in one sweep.
    std::vector<Time> times;
    times.reserve(2 * ends.size());
    for (const Time& e : ends) {
        times.push_back(e);
        times.push_back(e - length);
    }
    std::sort(times.begin(), times.end());
    times.erase(std::unique(times.begin(), times.end()), times.end());
    const std::vector<double> C = cumulative_at(pieces, times);
    auto at = [&](const Time& t) {
        return C[static_cast<std::size_t>(std::lower_bound(times.begin(), times.end(), t) -
                                          times.begin())];
    };
    // A window is closed, [e - length, e]: a dose given at an instant (prior totals at the
    // mission start) counts in the window that starts there. With a half-open window the
    // highest dose was approached, never reached, by the candidates, and the result fell to the
    // nearest activity boundary before (a prior total and 30 days of GCR could read as the
    // prior and 10 days).
    std::map<Time, double> instant;
    for (const auto& p : pieces) {
        if (p.end == p.start) {
            instant[p.start] += 1e3 * p.dose.rbe_weighted_GyEq;
        }
    }
    auto before = [&](const Time& t) {
        const auto it = instant.find(t);
        return at(t) - (it == instant.end() ? 0.0 : it->second);
    };
    for (const Time& e : ends) {
        const double d = require_finite(at(e) - before(e - length), "a rolling-window dose");
        if (d > best.dose_mGyEq) {
            best.dose_mGyEq = d;
            best.window_end = e;
            best.window_start = e - length;
        }
    }
    if (best.dose_mGyEq > 0.0) {
        double top = 0.0;
        for (const auto& p : pieces) {
            // An instant's dose is in the closed window when it lies inside it, its start too.
            const bool instant_inside =
                p.end == p.start && !(p.start < best.window_start) && !(best.window_end < p.start);
            const double part = 1e3 * p.dose.rbe_weighted_GyEq *
                                (instant_inside ? 1.0
                                                : p.fraction_by(best.window_end) -
                                                      p.fraction_by(best.window_start));
            if (part > top) {
                top = part;
                best.top_contributor = p.source + " during " + p.activity;
            }
        }
    }
    return best;
}

std::vector<TimelineSpan> crew_timeline(const Scenario& sc, const CrewSpec& crew, bool allow_gaps,
                                        std::vector<Gap>& gaps) {
    std::vector<TimelineSpan> spans;
    for (const ActivitySpec* a : activities_of(sc, crew.id)) {
        spans.push_back(
            {a->start, a->end, a->location,
             fmt::format("{} at {} ({})", to_string(a->kind), a->location, activity_origin(*a)),
             a});
    }
    if (spans.empty()) {
        throw InputError(crew.where, "crew",
                         fmt::format("crew member '{}' has no activities; "
                                     "the timeline must cover the mission",
                                     crew.id));
    }
    std::vector<TimelineSpan> filled;
    Time cursor = sc.mission.start;
    for (std::size_t i = 0; i <= spans.size(); ++i) {
        const Time next = i < spans.size() ? spans[i].start : sc.mission.end;
        if (next > cursor) {
            if (!allow_gaps) {
                // One message for gaps, the scenario stage's (it names the activity before
                // the gap); it finds this gap, or an earlier one of the crew before.
                refuse_timeline_gaps(sc);
                throw std::logic_error("crew_timeline: a gap the scenario's check missed");
            }
            const std::string at = i > 0 ? spans[i - 1].location : spans[0].location;
            gaps.push_back({crew.id, cursor, next, at});
            filled.push_back({cursor, next, at, fmt::format("gap charged at {}", at), nullptr});
        }
        if (i < spans.size()) {
            filled.push_back(spans[i]);
            cursor = std::max(cursor, spans[i].end);
        }
    }
    return filled;
}

double highest_30d_without(const LedgerResult& ledger, const std::string& crew,
                           const std::string& organ, const EventSpec* excluded) {
    const auto it = ledger.pieces.find({crew, organ});
    if (it == ledger.pieces.end()) {
        return 0.0;
    }
    std::vector<DosePiece> others;
    for (const auto& p : it->second) {
        if (!excluded || p.event == nullptr || p.event->id != excluded->id) {
            others.push_back(p);
        }
    }
    return window_maximum(others, boost::posix_time::hours(24 * 30), LedgerOptions{}.profile_step)
        .dose_mGyEq;
}

Budget remaining_budget(const std::vector<LimitCheck>& checks,
                        const std::vector<OrganResult>& organs, double mission_days) {
    Budget best;
    for (const auto& c : checks) {
        const auto organ = std::find_if(organs.begin(), organs.end(), [&](const OrganResult& o) {
            return o.organ == c.limit.organ;
        });
        if (organ == organs.end() || !(mission_days > 0.0)) {
            continue;
        }
        const double rate = organ->gcr.mGyEq / mission_days;
        double days = 0.0;
        if (!c.exceeded) {
            if (!(rate > 0.0)) {
                continue;
            }
            days = c.margin / rate;
            const double window_days =
                c.limit.window == "30-day" ? 30.0 : (c.limit.window == "annual" ? 365.0 : 0.0);
            if (window_days > 0.0 && days > window_days) {
                continue; // the background alone never fills this window
            }
        }
        if (!best.binds || days < best.days) {
            best = {true, days, c.limit.organ, c.limit.window, rate};
        }
    }
    return best;
}

namespace {

// A dose given in the scenario for an organ (mGy-Eq) or, for "effective", in mSv.
std::optional<double> stated_dose(const OrganDoses& d, const std::string& organ) {
    if (organ == "effective") {
        return d.effective_mSv;
    }
    if (const auto it = d.mGyEq.find(organ); it != d.mGyEq.end()) {
        return it->second;
    }
    return std::nullopt;
}

} // namespace

namespace {

// Every number of a crew member's result is one that was computed (result_guard.hpp).
void verify(const CrewResult& c) {
    const std::string who = "crew member '" + c.crew + "': ";
    for (const auto& o : c.organs) {
        const std::string what = who + o.organ;
        for (const DoseTotals* t : {&o.gcr, &o.spe, &o.recorded}) {
            require_dose(t->mGyEq, what + " mission dose");
            require_dose(t->absorbed_mGy, what + " absorbed dose");
            require_dose(t->dose_equivalent_mSv, what + " dose equivalent");
        }
        require_dose(o.max_30d.dose_mGyEq, what + " highest 30-day dose");
        require_dose(o.max_365d.dose_mGyEq, what + " highest 365-day dose");
        require_dose(o.career_mGyEq, what + " career dose");
        require_dose(o.mission_mGyEq, what + " mission dose");
        require_dose(o.mission_absorbed_mGy, what + " mission absorbed dose");
        require_dose(o.mission_dose_equivalent_mSv, what + " mission dose equivalent");
    }
    for (const auto& chk : c.checks) {
        require_dose(chk.dose, who + chk.limit.organ + " " + chk.limit.window + " dose");
        require_finite(chk.margin, who + chk.limit.organ + " " + chk.limit.window + " margin");
    }
    require_finite(c.budget.days, who + "budget left");
    require_dose(c.budget.rate_mGyEq_per_day, who + "GCR rate");
    for (const auto& [name, dose] : c.contributors) {
        require_dose(dose, who + "contribution of " + name);
    }
}

} // namespace

LimitStatus status_of(const LimitCheck& check, double near_share) {
    // Written so that NaN reads as exceeded: a dose that was not computed is never within.
    if (check.exceeded || !(check.dose >= 0.0) || !(check.dose <= check.limit.value)) {
        return LimitStatus::exceeded;
    }
    return check.dose >= near_share * check.limit.value ? LimitStatus::near : LimitStatus::within;
}

std::string to_string(LimitStatus status) {
    switch (status) {
    case LimitStatus::within:
        return "within";
    case LimitStatus::near:
        return "near";
    case LimitStatus::exceeded:
        break;
    }
    return "exceeded";
}

const LimitCheck* binding_check(const CrewResult& crew) {
    const LimitCheck* best = nullptr;
    for (const auto& chk : crew.checks) {
        // NaN shares first: a dose that was not computed binds.
        const double share = chk.dose / chk.limit.value;
        if (!best) {
            best = &chk;
            continue;
        }
        const double best_share = best->dose / best->limit.value;
        if (!std::isnan(best_share) && !(share <= best_share)) {
            best = &chk;
        }
    }
    return best;
}

LedgerResult build_ledger(const Study& study, const LedgerOptions& options) {
    if (study.partial()) {
        throw std::logic_error("build_ledger: the study holds one location, the ledger needs all");
    }
    const Scenario& sc = study.scenario();
    LedgerResult out;
    const double uf = sc.limits.uncertainty_factor;
    for (std::size_t ci = 0; ci < sc.crew.size(); ++ci) {
        const CrewSpec& crew = sc.crew[ci];
        const std::vector<TimelineSpan> filled =
            crew_timeline(sc, crew, options.allow_gaps, out.gaps);

        CrewResult result;
        result.crew = crew.id;
        result.name = crew.name;
        // Each event as this crew member meets it: at their heliocentric distance when its
        // flare is seen (on a transit leg an event is stronger near the Sun and arrives sooner).
        std::vector<double> event_r;
        for (const auto& ev : sc.events) {
            const double r = sc.sun_distance(ci, ev.flare_seen);
            event_r.push_back(r);
            result.event_distances.push_back(
                {ev.id, r,
                 ci < sc.sun_tracks.size()
                     ? describe(sc.sun_tracks[ci].piece_at(ev.flare_seen).source,
                                sc.sun_tracks[ci].piece_at(ev.flare_seen).where)
                     : "at the site",
                 ev.fluence_scale_at(r, sc.mission.sep_fluence_exponent)});
        }
        double lowest_margin = 1e300;
        for (const auto& organ : ledger_organs()) {
            std::vector<std::string> lacking;
            for (const auto& span : filled) {
                if (!study.has_organ(span.location, organ) &&
                    std::find(lacking.begin(), lacking.end(), span.location) == lacking.end()) {
                    lacking.push_back(span.location);
                }
            }
            // The career effective dose is not dropped where the quick model stands: there it is
            // bounded from above by the model's organs (effective_upper_bound).
            const bool bounded =
                organ == "effective" && !lacking.empty() &&
                std::all_of(lacking.begin(), lacking.end(), [&](const std::string& loc) {
                    return std::all_of(
                        limited_organs().begin(), limited_organs().end(),
                        [&](const std::string& o) { return study.has_organ(loc, o); });
                });
            if (bounded) {
                result.estimated[organ] = lacking;
            } else if (!lacking.empty()) {
                result.not_evaluated[organ] = lacking;
                continue;
            }
            auto lacks = [&](const std::string& loc) {
                return std::find(lacking.begin(), lacking.end(), loc) != lacking.end();
            };
            // The effective dose is limited in mSv: its pieces carry the dose equivalent in
            // every field, so that the window arithmetic (on the RBE-weighted field) sums it.
            const bool effective = organ == "effective";
            auto as_limited = [effective](exposure::DoseQuantities d) {
                if (effective) {
                    d.rbe_weighted_GyEq = d.dose_equivalent_Sv;
                    d.absorbed_Gy = d.dose_equivalent_Sv;
                }
                return d;
            };
            std::vector<DosePiece> pieces;
            for (const auto& span : filled) {
                for (std::size_t e = 0; e < sc.events.size(); ++e) {
                    const EventSpec& ev = sc.events[e];
                    // Where the organ is bounded (effective_upper_bound), the event arrives
                    // as at the deeper organ of the bound.
                    std::string here = organ;
                    std::optional<exposure::DoseQuantities> bound;
                    if (lacks(span.location)) {
                        bound = effective_upper_bound(
                            [&](const std::string& o) {
                                return study.event_dose(span.location, o, ev, event_r[e]);
                            },
                            &here);
                    }
                    const ArrivalGroups& timing =
                        study.event_timing(span.location, here, ev, event_r[e]);
                    const double f =
                        timing.fraction_between(hours(span.start - ev.flare_seen),
                                                hours(span.end - ev.flare_seen), ev.profile);
                    if (f <= 0.0) {
                        continue;
                    }
                    const auto full =
                        bound ? *bound : study.event_dose(span.location, organ, ev, event_r[e]);
                    pieces.push_back({span.start, span.end, as_limited(full).scaled(f * uf), &ev,
                                      "SPE " + ev.id, span.label, &timing});
                }
                // GCR: the location's daily rate over the span, cut where phi changes.
                std::vector<Time> cuts{span.start};
                for (const auto& phase : sc.mission.gcr_phases) {
                    if (phase.from > span.start && phase.from < span.end) {
                        cuts.push_back(phase.from);
                    }
                }
                cuts.push_back(span.end);
                for (std::size_t c = 0; c + 1 < cuts.size(); ++c) {
                    const double phi = sc.mission.gcr_phi_at(cuts[c]);
                    const double days =
                        static_cast<double>((cuts[c + 1] - cuts[c]).total_seconds()) / 86400.0;
                    auto gcr = [&](const std::string& o) {
                        return study.gcr_daily_dose(span.location, o, phi).for_limits();
                    };
                    const auto rate =
                        lacks(span.location) ? effective_upper_bound(gcr, nullptr) : gcr(organ);
                    pieces.push_back({cuts[c], cuts[c + 1], as_limited(rate).scaled(days * uf),
                                      nullptr, kGcrSource, span.label});
                }
            }
            // Recorded doses: replace the modelled dose of their period (the pieces are cut
            // there) or add to it (doses the tool does not model).
            for (const auto& rec : sc.recorded) {
                if (rec.crew != crew.id) {
                    continue;
                }
                // A reading replaces the model only for the organs it gives: an organ it is
                // silent on keeps its modelled dose (dropping it would not be conservative).
                if (rec.replaces_model && stated_dose(rec.doses, organ)) {
                    std::vector<DosePiece> kept;
                    for (const auto& p : pieces) {
                        const double before = p.fraction_by(rec.start);
                        const double after = 1.0 - p.fraction_by(rec.end);
                        if (before > 0.0) {
                            DosePiece q = p;
                            q.end = std::min(p.end, rec.start);
                            q.dose = p.dose.scaled(before);
                            kept.push_back(q);
                        }
                        if (after > 0.0) {
                            DosePiece q = p;
                            q.start = std::max(p.start, rec.end);
                            q.dose = p.dose.scaled(after);
                            kept.push_back(q);
                        }
                    }
                    pieces = std::move(kept);
                }
                if (const auto value = stated_dose(rec.doses, organ)) {
                    const double gyeq = *value * 1e-3;
                    pieces.push_back({rec.start,
                                      rec.end,
                                      {gyeq, gyeq, gyeq},
                                      nullptr,
                                      "recorded (" + rec.source + ")",
                                      fmt::format("line {}", rec.where.line)});
                }
            }
            for (const auto& p : pieces) {
                require_dose(p.dose,
                             fmt::format("the {} dose of crew member '{}' from {} during {}", organ,
                                         crew.id, p.source, p.activity));
            }
            OrganResult r;
            r.organ = organ;
            for (const auto& p : pieces) {
                if (p.source == kGcrSource) {
                    r.gcr.add(p.dose);
                } else if (p.event) {
                    r.spe.add(p.dose);
                } else {
                    r.recorded.add(p.dose);
                }
                r.mission_mGyEq += 1e3 * p.dose.rbe_weighted_GyEq;
                r.mission_absorbed_mGy += 1e3 * p.dose.absorbed_Gy;
                r.mission_dose_equivalent_mSv += 1e3 * p.dose.dose_equivalent_Sv;
                if (organ == "bfo") {
                    result.contributors.emplace_back(p.source + " during " + p.activity,
                                                     1e3 * p.dose.rbe_weighted_GyEq);
                }
            }
            for (const auto& prior : crew.prior) {
                if (const auto value = stated_dose(prior.doses, organ)) {
                    const double gyeq = *value * 1e-3;
                    pieces.push_back({prior.start,
                                      prior.end,
                                      {gyeq, gyeq, gyeq},
                                      nullptr,
                                      "prior dose",
                                      fmt::format("line {}", prior.where.line)});
                }
            }
            r.career_mGyEq = cumulative(pieces, sc.mission.end);
            r.max_30d =
                window_maximum(pieces, boost::posix_time::hours(24 * 30), options.profile_step);
            r.max_365d =
                window_maximum(pieces, boost::posix_time::hours(24 * 365), options.profile_step);
            for (const auto& limit : sc.limits.limits) {
                if (limit.organ != organ) {
                    continue;
                }
                LimitCheck c;
                c.limit = limit;
                const WindowMax* w = nullptr;
                if (limit.window == "30-day") {
                    w = &r.max_30d;
                    c.dose = r.max_30d.dose_mGyEq;
                } else if (limit.window == "annual") {
                    w = &r.max_365d;
                    c.dose = r.max_365d.dose_mGyEq;
                } else {
                    c.dose = r.career_mGyEq;
                }
                c.margin = limit.value - c.dose;
                // Written so that a dose that is not a number can never read as within.
                c.exceeded = !(c.dose <= limit.value);
                if (w && w->dose_mGyEq > 0.0) {
                    c.window_text =
                        format_time(w->window_start) + " to " + format_time(w->window_end);
                    c.top_contributor = w->top_contributor;
                }
                out.any_exceeded = out.any_exceeded || c.exceeded;
                if (c.margin / limit.value < lowest_margin) {
                    lowest_margin = c.margin / limit.value;
                    result.pieces = pieces;
                }
                result.checks.push_back(c);
            }
            out.pieces[{crew.id, organ}] = pieces;
            result.organs.push_back(r);
        }
        std::sort(result.contributors.begin(), result.contributors.end(),
                  [](const auto& a, const auto& b) { return a.second > b.second; });
        result.budget = remaining_budget(result.checks, result.organs,
                                         hours(sc.mission.end - sc.mission.start) / 24.0);
        verify(result);
        out.crew.push_back(std::move(result));
    }
    return out;
}

} // namespace crewdose::planner
