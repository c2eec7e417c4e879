#include "planner/analyses/storm.hpp"

#include "planner/scenario/number_parse.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <exception>
#include <set>
#include <span>
#include <system_error>
#include <thread>

namespace crewdose::planner {
namespace {

using boost::posix_time::time_duration;

time_duration minutes_d(double m) {
    return duration_from_hours(m / 60.0);
}

bool outside(const TimelineSpan& s) {
    return s.activity &&
           (s.activity->kind == ActivityKind::eva || s.activity->kind == ActivityKind::rover);
}

bool in_transit(const TimelineSpan& s) {
    return s.activity && s.activity->kind == ActivityKind::transit;
}

// The span a crew member is in when the warning comes (spans sorted, not overlapping). A
// warning at the very instant an EVA or drive starts counts as before it: the crew have not
// gone out, so they are in the span that ends there (the same response as a warning a second
// earlier, never a walk back from a place they were about to leave). An EVA that opens the
// timeline has no span before it: there the crew are taken as out.
const TimelineSpan* warned_in(std::span<const TimelineSpan> spans, Time warning) {
    for (std::size_t k = 0; k < spans.size(); ++k) {
        const TimelineSpan& s = spans[k];
        if (s.start <= warning && warning < s.end) {
            if (outside(s) && s.start == warning && k > 0 && spans[k - 1].end == warning) {
                return &spans[k - 1];
            }
            return &s;
        }
    }
    return nullptr;
}

// The spans of a crew member's timeline (sorted, not overlapping) that end at or after `from`
// and start at or before `to`, found by bisection. (A span ending at `from` is kept: it is
// where the crew are when warned at the start of an EVA that begins at `from`.)
std::span<const TimelineSpan> overlapping(const std::vector<TimelineSpan>& spans, Time from,
                                          Time to) {
    const auto lo = std::partition_point(spans.begin(), spans.end(),
                                         [&](const TimelineSpan& s) { return s.end < from; });
    const auto hi =
        std::partition_point(lo, spans.end(), [&](const TimelineSpan& s) { return s.start <= to; });
    return {lo, hi};
}

} // namespace

namespace {

// How long crew on an EVA or drive take to reach cover once warned.
time_duration return_time(const ActivitySpec& a, const StormPolicy& policy) {
    double minutes = a.return_min.value_or(policy.eva_return_min);
    if (a.distance_km) {
        const double speed =
            a.kind == ActivityKind::rover ? policy.drive_speed_km_h : policy.walk_speed_km_h;
        minutes = 60.0 * *a.distance_km / speed;
    }
    return minutes_d(minutes);
}

// What a piece of a responded timeline is.
enum class Piece { planned, returning, moving, covered, moving_after_transit, cancelled };

// The response's decisions for one crew member and one onset, made once.
struct Response {
    const TimelineSpan* at_warning = nullptr;
    std::string cover; // location id under cover
    Time covered;      // when the crew member is under cover (or, in transit, unused)
    bool keeps_plan = false;
    Time landed;         // keeps_plan: the end of the transit
    Time landed_covered; // ... plus move_to_shelter_min
};

// Calls emit(a, b, location, kind, planned span) for the responded timeline in time order,
// without building it: the planned spans outside the storm window pass through unchanged.
template <class Emit>
void respond_each(std::span<const TimelineSpan> planned, const StormPolicy& policy,
                  const StormTimes& t, Emit&& emit) {
    auto pass_through = [&] {
        for (const auto& s : planned) {
            emit(s.start, s.end, s.location, Piece::planned, s);
        }
    };
    if (!(t.all_clear > t.warning) || planned.empty()) {
        pass_through();
        return;
    }
    const TimelineSpan* at_warning = warned_in(planned, t.warning);
    if (!at_warning) {
        pass_through(); // the warning comes after the timeline ends
        return;
    }
    Response r;
    r.at_warning = at_warning;
    r.cover = policy.shelter;
    time_duration delay = minutes_d(policy.move_to_shelter_min);
    if (outside(*at_warning)) {
        const auto& a = *at_warning->activity;
        r.cover = a.refuge.value_or(policy.shelter);
        delay = return_time(a, policy);
    }
    // In transit the crew can only use the vehicle's own shelter, if it has one.
    const bool transit_refuge = in_transit(*at_warning) && at_warning->activity->refuge;
    if (transit_refuge) {
        r.cover = *at_warning->activity->refuge;
    }
    r.keeps_plan = in_transit(*at_warning) && !transit_refuge;
    r.covered = t.warning + delay;
    if (outside(*at_warning)) {
        // The plan already brings the crew back by the activity's end: the response never keeps
        // them out longer than planned.
        r.covered = std::min(r.covered, at_warning->end);
    }
    // A transit without a shelter on board that ends during the storm: from its end the crew
    // take move_to_shelter_min to reach the shelter.
    r.landed = r.keeps_plan ? at_warning->end : t.warning;
    r.landed_covered = r.landed + minutes_d(policy.move_to_shelter_min);
    // Outside activities interrupted or cancelled by the warning: their remaining time after
    // the all-clear is spent where the response left the crew member.
    auto cancelled = [&](const TimelineSpan& s) {
        return outside(s) && s.start < t.all_clear && s.end > t.warning;
    };
    // The storm window: from the warning to the all-clear or the end of the last cancelled
    // activity; cut where the location can change.
    Time window_end = t.all_clear;
    for (const auto& s : planned) {
        if (cancelled(s)) {
            window_end = std::max(window_end, s.end);
        }
    }
    window_end = std::min(window_end, planned.back().end);
    std::vector<Time> cuts{t.warning, std::min(r.covered, t.all_clear), t.all_clear, window_end};
    if (r.keeps_plan && r.landed < t.all_clear) {
        cuts.push_back(r.landed);
        cuts.push_back(std::min(r.landed_covered, t.all_clear));
    }
    for (const auto& s : planned) {
        for (const Time x : {s.start, s.end}) {
            if (x > t.warning && x < window_end) {
                cuts.push_back(x);
            }
        }
    }
    std::sort(cuts.begin(), cuts.end());
    cuts.erase(std::unique(cuts.begin(), cuts.end()), cuts.end());
    std::size_t k = 0; // the planned span at the current time
    // Before the warning: the plan.
    for (; k < planned.size() && planned[k].start < t.warning; ++k) {
        const auto& s = planned[k];
        emit(s.start, std::min(s.end, t.warning), s.location, Piece::planned, s);
        if (s.end > t.warning) {
            break;
        }
    }
    // The window.
    for (std::size_t c = 0; c + 1 < cuts.size(); ++c) {
        const Time a = cuts[c];
        const Time b = cuts[c + 1];
        if (a < t.warning || a >= window_end) {
            continue;
        }
        while (k < planned.size() && planned[k].end <= a) {
            ++k;
        }
        if (k == planned.size()) {
            break;
        }
        const TimelineSpan& p = planned[k];
        if (p.start > a) {
            continue; // a gap in the plan (not possible after crew_timeline)
        }
        if (a < t.all_clear) {
            if (r.keeps_plan && in_transit(p)) {
                emit(a, b, p.location, Piece::planned, p); // no shelter on board: plan goes on
            } else if (r.keeps_plan && a < r.landed_covered) {
                emit(a, b, p.location, Piece::moving_after_transit, p);
            } else if (a < r.covered && !r.keeps_plan) {
                emit(a, b, at_warning->location,
                     outside(*at_warning) ? Piece::returning : Piece::moving, *at_warning);
            } else {
                emit(a, b, r.cover, Piece::covered, p);
            }
        } else if (cancelled(p)) {
            emit(a, b, r.cover, Piece::cancelled, p);
        } else {
            emit(a, b, p.location, Piece::planned, p);
        }
    }
    // After the window: the plan.
    for (; k < planned.size(); ++k) {
        const auto& s = planned[k];
        if (s.end <= window_end) {
            continue;
        }
        emit(std::max(s.start, window_end), s.end, s.location, Piece::planned, s);
    }
}

} // namespace

std::vector<TimelineSpan> respond(const std::vector<TimelineSpan>& planned,
                                  const StormPolicy& policy, const StormTimes& t) {
    std::vector<TimelineSpan> out;
    const TimelineSpan* at_warning = warned_in(planned, t.warning);
    respond_each(
        planned, policy, t,
        [&](Time a, Time b, const std::string& location, Piece kind, const TimelineSpan& p) {
            if (!(b > a)) {
                return;
            }
            TimelineSpan piece{a, b, location, p.label, p.activity};
            switch (kind) {
            case Piece::planned:
                break;
            case Piece::returning:
                piece.label = "storm response: returning from " + p.label;
                break;
            case Piece::moving:
                piece.label = "storm response: moving to the shelter from " + p.label;
                break;
            case Piece::moving_after_transit:
                piece.label = "storm response: moving to the shelter after " +
                              (at_warning ? at_warning->label : p.label);
                break;
            case Piece::covered:
                piece.label = (at_warning && in_transit(*at_warning)
                                   ? "storm response: in the vehicle's shelter at "
                                   : (at_warning && outside(*at_warning)
                                          ? "storm response: under cover at "
                                          : "storm response: in the shelter at ")) +
                              location;
                piece.activity = nullptr;
                break;
            case Piece::cancelled:
                piece.label = "storm response: " + p.label + " cancelled, stays at " + location;
                piece.activity = nullptr;
                break;
            }
            if (!out.empty() && out.back().location == piece.location &&
                out.back().label == piece.label && out.back().end == piece.start) {
                out.back().end = piece.end;
            } else {
                out.push_back(std::move(piece));
            }
        });
    return out;
}

Time all_clear_time(const StormPolicy& policy, const EventSpec& ev, Time onset,
                    double fluence_exponent) {
    const Time warning = onset + minutes_d(policy.warning_delay_min);
    if (!policy.all_clear_above_MeV) {
        return std::max(warning, onset + minutes_d(60.0 * policy.all_clear_h));
    }
    // Flux above E (per cm2 s sr of the omnidirectional fluence / 4 pi) at tau hours after
    // t0: energy bins 64 per decade from E to 10 GeV, each following the profile from its own
    // arrival.
    const double e_min = *policy.all_clear_above_MeV;
    const auto bins = static_cast<std::size_t>(std::ceil(64.0 * std::log10(1e4 / e_min)));
    std::vector<double> fluence(bins);
    std::vector<double> delay(bins);
    const double scale = ev.fluence_scale(fluence_exponent);
    for (std::size_t k = 0; k < bins; ++k) {
        const double lo = e_min * std::pow(10.0, static_cast<double>(k) / 64.0);
        const double hi = e_min * std::pow(10.0, static_cast<double>(k + 1) / 64.0);
        fluence[k] = scale * (ev.spectrum.integral_fluence_per_cm2(lo) -
                              ev.spectrum.integral_fluence_per_cm2(hi));
        delay[k] = ev.delay_h(std::sqrt(lo * hi));
    }
    constexpr double kFourPi = 4.0 * 3.14159265358979323846;
    auto flux = [&](double tau_h) {
        double f = 0.0;
        for (std::size_t k = 0; k < bins; ++k) {
            f += fluence[k] * ev.profile.rate_per_h(tau_h - delay[k]);
        }
        return f / 3600.0 / kFourPi;
    };
    bool above = false;
    for (int m = 1; m <= 10 * 24 * 60; ++m) {
        const double tau = m / 60.0;
        const bool now_above = flux(tau) >= policy.all_clear_flux_per_cm2_s_sr;
        if (above && !now_above) {
            return std::max(warning, onset + minutes_d(static_cast<double>(m)));
        }
        above = above || now_above;
    }
    return above ? onset + boost::posix_time::hours(240) : warning;
}

double StormCrew::worst_ratio() const {
    double r = 0.0;
    for (const auto& o : organs) {
        const double x = o.ratio();
        if (std::isnan(x)) {
            return x; // a ratio that is not a number never reads as within
        }
        r = std::max(r, x);
    }
    return r;
}

bool StormWhatIf::any_exceeded() const {
    return std::any_of(crew.begin(), crew.end(), [](const StormCrew& c) { return c.exceeded(); });
}

bool StormSweep::any_exceeded() const {
    return std::any_of(worst.begin(), worst.end(),
                       [](const auto& w) { return w.second.exceeded(); });
}

StormContext::StormContext(const Study& study, const std::string& event_id, bool respond)
    : study_(study), respond_(respond) {
    const Scenario& sc = study.scenario();
    event_ = &sc.event_named(event_id, "--event");
    if (respond && !sc.storm.given) {
        throw InputError({sc.file, 0}, "storm_response",
                         "the scenario has no [storm_response] section, which the what-if needs "
                         "(see scenarios/README.md); run with --no-response to see the event "
                         "over the planned timeline");
    }
    std::vector<Gap> gaps;
    for (const auto& c : sc.crew) {
        planned_.push_back(crew_timeline(sc, c, true, gaps));
        // The sweep's fast path bisects the timeline: it must be in time order, not overlapping.
        const auto& p = planned_.back();
        for (std::size_t k = 0; k < p.size(); ++k) {
            if (!(p[k].start <= p[k].end) || (k > 0 && p[k - 1].end > p[k].start)) {
                throw std::logic_error("storm: a crew timeline out of time order");
            }
        }
        // Crew members on the same timeline (an EVA pair, a crew that moves together) get the
        // same event dose at every onset: the sweep computes it once.
        const auto same = [](const TimelineSpan& x, const TimelineSpan& y) {
            return x.start == y.start && x.end == y.end && x.location == y.location &&
                   x.activity == y.activity;
        };
        std::size_t twin = planned_.size() - 1;
        for (std::size_t j = 0; j + 1 < planned_.size(); ++j) {
            if (std::equal(p.begin(), p.end(), planned_[j].begin(), planned_[j].end(), same) &&
                (sc.sun_tracks.empty() || sc.sun_tracks[j] == sc.sun_tracks[planned_.size() - 1])) {
                twin = j;
                break;
            }
        }
        twin_.push_back(twin);
    }
    // BFO, lens and skin for everyone; heart and brain for a crew member when every location
    // the what-if can put them at gives them (the planned timeline, the shelter and the
    // activities' refuges: the event may come anywhere and the response may move them).
    organs_ = limited_organs();
    std::vector<std::string> unchecked;
    const std::vector<std::string>& candidates = phantom_limited_organs();
    std::vector<std::vector<bool>> can(sc.crew.size());
    for (std::size_t i = 0; i < sc.crew.size(); ++i) {
        std::vector<std::string> places;
        if (respond_) {
            places.push_back(sc.storm.shelter);
        }
        for (const auto& s : planned_[i]) {
            places.push_back(s.location);
            if (respond_ && s.activity && s.activity->refuge) {
                places.push_back(*s.activity->refuge);
            }
        }
        std::vector<std::pair<std::string, std::string>> left_out; // organ, a quick location
        for (const auto& organ : candidates) {
            const auto quick = std::find_if(places.begin(), places.end(), [&](const auto& l) {
                return !study.has_organ(l, organ);
            });
            can[i].push_back(quick == places.end());
            if (quick != places.end()) {
                if (!left_out.empty() && left_out.back().second == *quick) {
                    left_out.back().first += " and " + organ;
                } else {
                    left_out.emplace_back(organ, *quick);
                }
            }
        }
        for (const auto& [organs, where] : left_out) {
            unchecked.push_back(fmt::format("{} for {} (location {} uses the {} body model)",
                                            organs, sc.crew[i].id, where,
                                            study.location(where).body));
        }
    }
    std::vector<std::size_t> candidate_index; // organs_ index -> candidates index, or npos
    candidate_index.assign(organs_.size(), std::string::npos);
    for (std::size_t q = 0; q < candidates.size(); ++q) {
        if (std::any_of(can.begin(), can.end(), [&](const auto& c) { return c[q]; })) {
            organs_.push_back(candidates[q]);
            candidate_index.push_back(q);
        }
    }
    if (organs_.size() > kMaxStormOrgans) {
        throw std::logic_error("storm: more organs than kMaxStormOrgans");
    }
    for (std::size_t i = 0; i < sc.crew.size(); ++i) {
        std::array<bool, kMaxStormOrgans> checked{};
        for (std::size_t k = 0; k < organs_.size(); ++k) {
            checked[k] = candidate_index[k] == std::string::npos || can[i][candidate_index[k]];
        }
        checked_.push_back(checked);
    }
    for (std::size_t k = 0; k < unchecked.size(); ++k) {
        unchecked_note_ += (k ? "; " : "") + unchecked[k];
    }
    LedgerOptions options;
    options.allow_gaps = true;
    const LedgerResult ledger = build_ledger(study, options);
    // Per crew member and organ: the highest 30-day dose from everything else; per organ its
    // 30-day planning limit (both indexed like organs_).
    for (const auto& c : sc.crew) {
        StormDoses d{};
        for (std::size_t k = 0; k < organs_.size(); ++k) {
            d[k] = highest_30d_without(ledger, c.id, organs_[k], event_);
        }
        other_by_index_.push_back(d);
    }
    for (std::size_t k = 0; k < organs_.size(); ++k) {
        for (const auto& l : sc.limits.limits) {
            if (l.window == "30-day" && l.organ == organs_[k]) {
                limit_by_index_[k] = l.value;
            }
        }
        if (!(limit_by_index_[k] > 0.0)) {
            throw std::logic_error("storm: every organ needs a 30-day planning limit");
        }
    }
    const double uf = sc.limits.uncertainty_factor;
    // Per location and organ: the whole event at the site (its dose, how it arrives), and, for
    // a dispersed event, how it arrives at each distance of the 0.01 AU grid the crew reach.
    const std::vector<long> track_bins = arrival_bins(sc);
    const std::vector<long> bins = event_->fixed_arrival ? std::vector<long>{} : track_bins;
    double last = 0.0; // the last group's arrival, anywhere
    auto fill = [&](std::unordered_map<std::string, PerOrgan>& table,
                    const std::function<const ArrivalGroups&(const std::string&,
                                                             const std::string&)>& timing) {
        for (const auto& loc : sc.locations) {
            auto& c = table[loc.id];
            for (std::size_t k = 0; k < organs_.size(); ++k) {
                if (!study.has_organ(loc.id, organs_[k])) {
                    c[k] = {0.0, nullptr, k}; // no crew member checked for it can be here
                    continue;
                }
                c[k] = {1e3 * uf * study.event_dose(loc.id, organs_[k], *event_).rbe_weighted_GyEq,
                        &timing(loc.id, organs_[k]), k};
                if (!c[k].timing->delay_h.empty()) {
                    last = std::max(last, c[k].timing->delay_h.back());
                }
                for (std::size_t q = 0; q < k; ++q) {
                    if (c[q].timing && c[q].timing->delay_h == c[k].timing->delay_h &&
                        c[q].timing->share == c[k].timing->share) {
                        c[k].same_timing_as = q;
                        break;
                    }
                }
            }
        }
    };
    fill(by_location_,
         [&](const std::string& loc, const std::string& organ) -> const ArrivalGroups& {
             return study.event_timing(loc, organ, *event_);
         });
    for (const long b : bins) {
        const double r = static_cast<double>(b) / kArrivalBinsPerAU;
        fill(by_bin_[b],
             [&](const std::string& loc, const std::string& organ) -> const ArrivalGroups& {
                 return study.event_timing(loc, organ, *event_, r);
             });
    }
    // Beyond the last group's arrival plus 40 decay times the profile has delivered all but
    // e^-40 of the event.
    horizon_h_ = last + event_->profile.rise_h + 40.0 * event_->profile.decay_h;
    // The event's time course relative to t0 does not depend on t0: one all-clear search at the
    // site, and one per grid distance when the all-clear follows the flux (which depends on how
    // strong the event is there and when it arrives).
    if (respond_) {
        all_clear_after_h_ = hours(
            all_clear_time(sc.storm, *event_, sc.mission.start, sc.mission.sep_fluence_exponent) -
            sc.mission.start);
        if (sc.storm.all_clear_above_MeV) {
            for (const long b : track_bins) {
                const double r = static_cast<double>(b) / kArrivalBinsPerAU;
                const EventSpec there = event_->seen_at(r, sc.mission.path_length_at(r));
                all_clear_by_bin_[b] = hours(all_clear_time(sc.storm, there, sc.mission.start,
                                                            sc.mission.sep_fluence_exponent) -
                                             sc.mission.start);
            }
        }
    }
}

StormContext::Where StormContext::where(std::size_t crew, Time onset) const {
    const Scenario& sc = study_.scenario();
    Where w;
    w.table = &by_location_;
    w.r_AU = sc.sun_distance(crew, onset);
    if (w.r_AU == event_->sun_distance_AU) {
        return w; // at the site: the site's table, factor 1
    }
    w.factor = event_->distance_factor(w.r_AU, sc.mission.sep_fluence_exponent);
    if (!event_->fixed_arrival) {
        w.table = &by_bin_.at(arrival_bin(w.r_AU));
    }
    return w;
}

double StormContext::all_clear_after_h(Time onset) const {
    if (all_clear_by_bin_.empty()) {
        return all_clear_after_h_;
    }
    // The all-clear is given when it holds for every crew member: the latest of their own.
    const Scenario& sc = study_.scenario();
    double latest = 0.0;
    for (std::size_t i = 0; i < sc.crew.size(); ++i) {
        const double r = sc.sun_distance(i, onset);
        latest =
            std::max(latest, r == event_->sun_distance_AU ? all_clear_after_h_
                                                          : all_clear_by_bin_.at(arrival_bin(r)));
    }
    return latest;
}

void StormContext::add_piece(StormDoses& d, Time from, Time to, const PerOrgan& c, Time onset,
                             double factor) const {
    const double a = hours(from - onset);
    const double b = hours(to - onset);
    StormDoses fraction{};
    for (std::size_t k = 0; k < organs_.size(); ++k) {
        if (c[k].same_timing_as != k) {
            fraction[k] = fraction[c[k].same_timing_as];
        } else if (c[k].timing) {
            fraction[k] = c[k].timing->fraction_between(a, b, event_->profile);
        }
        d[k] += factor * c[k].mGyEq * fraction[k];
    }
}

StormDoses StormContext::doses_over(std::span<const TimelineSpan> spans, Time onset,
                                    std::size_t crew) const {
    const Time stop = onset + minutes_d(60.0 * horizon_h_);
    const Where at = where(crew, onset);
    StormDoses d{};
    for (const auto& s : spans) {
        if (s.end <= onset || s.start >= stop) {
            continue;
        }
        add_piece(d, std::max(s.start, onset), std::min(s.end, stop), at.table->at(s.location),
                  onset, at.factor);
    }
    return d;
}

double StormContext::other(std::size_t crew, std::size_t k) const {
    return other_by_index_.at(crew).at(k);
}

double StormContext::limit(std::size_t k) const {
    return limit_by_index_.at(k);
}

StormTimes StormContext::times_at(Time onset) const {
    StormTimes t;
    t.onset = onset;
    t.warning = onset + minutes_d(study_.scenario().storm.warning_delay_min);
    t.all_clear = respond_ ? onset + minutes_d(60.0 * all_clear_after_h(onset)) : t.warning;
    return t;
}

double StormContext::worst_ratio_at(Time onset, std::size_t i, StormDoses* with_mGyEq) const {
    const StormDoses d = doses_at(onset, i);
    if (with_mGyEq) {
        *with_mGyEq = d;
    }
    return ratio_of(i, d);
}

double StormContext::ratio_of(std::size_t i, const StormDoses& d) const {
    double worst = 0.0;
    for (std::size_t k = 0; k < organs_.size(); ++k) {
        if (checked_[i][k]) {
            worst = std::max(worst, (d[k] + other_by_index_[i][k]) / limit_by_index_[k]);
        }
    }
    return worst;
}

StormDoses StormContext::doses_at(Time onset, std::size_t i) const {
    const StormTimes t = times_at(onset);
    StormDoses d{};
    const Time stop = onset + minutes_d(60.0 * horizon_h_);
    const Where at = where(i, onset);
    // Back-to-back pieces at one place are taken as one (the event's time course is evaluated
    // at the ends of the run only): the same dose as piece by piece (at()) to rounding.
    Time run_from;
    Time run_to;
    const PerOrgan* run_at = nullptr;
    auto take = [&](Time a, Time b, const std::string& location) {
        if (b <= onset || a >= stop) {
            return;
        }
        a = std::max(a, onset);
        b = std::min(b, stop);
        const PerOrgan& here = at.table->at(location);
        if (run_at == &here && run_to == a) {
            run_to = b;
            return;
        }
        if (run_at) {
            add_piece(d, run_from, run_to, *run_at, onset, at.factor);
        }
        run_from = a;
        run_to = b;
        run_at = &here;
    };
    if (respond_) {
        // Only the spans that meet [onset, stop) or the storm window (up to the span holding the
        // all-clear) shape the response's pieces in [onset, stop): the same pieces, in the same
        // order, as over the whole timeline, in time independent of the timeline's length.
        respond_each(overlapping(planned_[i], onset, std::max(stop, t.all_clear)),
                     study_.scenario().storm, t,
                     [&](Time a, Time b, const std::string& location, Piece, const TimelineSpan&) {
                         take(a, b, location);
                     });
    } else {
        for (const auto& s : overlapping(planned_[i], onset, stop)) {
            take(s.start, s.end, s.location);
        }
    }
    if (run_at) {
        add_piece(d, run_from, run_to, *run_at, onset, at.factor);
    }
    return d;
}

StormWhatIf StormContext::at(Time onset) const {
    const Scenario& sc = study_.scenario();
    StormWhatIf w;
    w.event_id = event_->id;
    w.respond = respond_;
    w.times = times_at(onset);
    for (std::size_t i = 0; i < sc.crew.size(); ++i) {
        StormCrew c;
        c.crew = sc.crew[i].id;
        c.name = sc.crew[i].name;
        const auto spans = respond_ ? respond(planned_[i], sc.storm, w.times) : planned_[i];
        const auto without = doses_over(planned_[i], onset, i);
        const auto with = doses_over(spans, onset, i);
        const Where here = where(i, onset);
        c.sun_distance_AU = here.r_AU;
        c.fluence_scale = event_->fluence_scale_at(here.r_AU, sc.mission.sep_fluence_exponent);
        if (i < sc.sun_tracks.size()) {
            const auto& piece = sc.sun_tracks[i].piece_at(onset);
            c.distance_basis = describe(piece.source, piece.where);
        }
        for (std::size_t k = 0; k < organs_.size(); ++k) {
            if (!checked_[i][k]) {
                continue;
            }
            const std::string& organ = organs_[k];
            const std::string what = "storm what-if, crew member '" + c.crew + "', " + organ;
            c.organs.push_back({organ, require_dose(without[k], what + " without the response"),
                                require_dose(with[k], what + " with the response"),
                                require_dose(other_by_index_[i][k], what + " other 30-day dose"),
                                limit_by_index_[k]});
        }
        const Time shown_until = std::max(w.times.all_clear, onset) + boost::posix_time::hours(12);
        for (const auto& s : spans) {
            if (s.end > onset && s.start < shown_until) {
                c.responded.push_back(s);
            }
        }
        w.crew.push_back(std::move(c));
    }
    return w;
}

long sweep_profile_bin_h(Time from, Time to) {
    const double span_h = static_cast<double>((to - from).total_seconds()) / 3600.0;
    for (const long h : {6L, 12L, 24L, 48L, 96L, 168L, 336L}) {
        if (span_h / static_cast<double>(h) <= static_cast<double>(kMaxProfileBins)) {
            return h;
        }
    }
    return 672; // 28 days; a mission is at most a few years (the loader's bound)
}

std::string profile_bin_text(long hours) {
    if (hours % 24 != 0) {
        return fmt::format("{} hours", hours);
    }
    return hours == 24 ? std::string("1 day") : fmt::format("{} days", hours / 24);
}

StormSweep sweep_storm(const StormContext& ctx, Time from, Time to, time_duration step,
                       const std::function<void(double)>& progress) {
    const Scenario& sc = ctx.study().scenario();
    const EventSpec& ev = ctx.event();
    StormSweep out;
    out.event_id = ev.id;
    out.step = step;
    out.from = from;
    out.to = to;
    out.profile_bin_h = sweep_profile_bin_h(from, to);
    // A bound on the work a command line can ask for (a year at 30 s is about 1.05 million).
    const double count = static_cast<double>((to - from).total_seconds()) /
                         static_cast<double>(step.total_seconds());
    if (!(count <= static_cast<double>(kMaxSweepOnsets))) {
        throw InputError({"command line", 0}, "--step",
                         fmt::format("{} onsets from --from to --to; at most {} are swept: "
                                     "give a longer --step or a shorter --from/--to",
                                     static_cast<long long>(count), kMaxSweepOnsets));
    }
    std::set<Time> onsets;
    for (Time t = from; t <= to; t += step) {
        onsets.insert(t);
    }
    // Onsets where the policy changes: the warning, the first arrival or the all-clear meeting
    // the start or end of an outside activity; each also one second earlier (the other side).
    const time_duration warn = minutes_d(sc.storm.warning_delay_min);
    const time_duration first = minutes_d(60.0 * ev.delay_h(1e4));
    std::vector<time_duration> leads{time_duration(0, 0, 0), warn, first,
                                     minutes_d(60.0 * ctx.all_clear_after_h())};
    auto add = [&](Time o) {
        for (const Time x : {o, o - boost::posix_time::seconds(1)}) {
            if (x >= from && x <= to) {
                onsets.insert(x);
            }
        }
    };
    // The outside activities (EVAs and drives), each with its crew members' indices.
    std::vector<std::pair<const ActivitySpec*, std::vector<std::size_t>>> outside_activities;
    for (const auto& a : sc.activities) {
        const bool out_of_doors = a.kind == ActivityKind::eva || a.kind == ActivityKind::rover;
        if (!out_of_doors && a.kind != ActivityKind::transit) {
            continue;
        }
        for (const Time edge : {a.start, a.end}) {
            for (const auto& lead : leads) {
                add(edge - lead);
            }
            // Away from the site the first particles arrive sooner or later than there.
            for (std::size_t i = 0; i < sc.crew.size(); ++i) {
                const double r = sc.sun_distance(i, edge);
                if (!ev.fixed_arrival && r != ev.sun_distance_AU &&
                    std::find(a.crew.begin(), a.crew.end(), sc.crew[i].id) != a.crew.end()) {
                    add(edge -
                        minutes_d(60.0 * ev.seen_at(r, sc.mission.path_length_at(r)).delay_h(1e4)));
                }
            }
        }
        if (!out_of_doors) {
            continue;
        }
        // A warning at the activity's very start keeps the crew in (warned_in), one a second
        // later finds them out: that side of the edge too.
        add(a.start - warn + boost::posix_time::seconds(1));
        // The warning plus the return time meeting the activity's end: from there on the
        // response keeps the crew out as long as the plan does.
        add(a.end - warn - return_time(a, sc.storm));
        std::vector<std::size_t> members;
        for (std::size_t i = 0; i < sc.crew.size(); ++i) {
            if (std::find(a.crew.begin(), a.crew.end(), sc.crew[i].id) != a.crew.end()) {
                members.push_back(i);
            }
        }
        outside_activities.emplace_back(&a, std::move(members));
        StormSweep::Eva e;
        e.label = fmt::format("{} at {} ({})", to_string(a.kind), a.location, activity_origin(a));
        e.start = a.start;
        e.end = a.end;
        out.evas.push_back(e);
    }
    out.onsets = onsets.size();
    out.worst.resize(sc.crew.size());
    const std::vector<Time> order(onsets.begin(), onsets.end());
    const std::size_t n_crew = sc.crew.size();
    // Each outside activity's onsets, as a range of indices into `order`, taken in order of
    // their first onset (so an onset meets only the activities around it).
    std::vector<std::pair<std::size_t, std::size_t>> inside(outside_activities.size());
    std::vector<std::size_t> by_first(outside_activities.size());
    for (std::size_t k = 0; k < outside_activities.size(); ++k) {
        const ActivitySpec& a = *outside_activities[k].first;
        const auto index = [&](Time x) {
            return static_cast<std::size_t>(std::lower_bound(order.begin(), order.end(), x) -
                                            order.begin());
        };
        inside[k] = {index(a.start), index(a.end)};
        by_first[k] = k;
    }
    std::stable_sort(by_first.begin(), by_first.end(), [&](std::size_t x, std::size_t y) {
        return inside[x].first < inside[y].first;
    });
    // The onsets are cut into fixed chunks, swept by the threads in any order and merged in
    // chunk order: the earliest onset wins a tie, as in one pass, whatever the thread count.
    struct EvaBest {
        double ratio = -1.0;
        std::size_t onset = 0;
        std::size_t crew = 0;
        std::size_t organ = 0;
    };
    struct Partial {
        std::vector<double> worst_ratio;
        std::vector<std::size_t> worst_onset;
        std::map<Time, double> profile;
        std::vector<EvaBest> evas;
    };
    const time_duration bin = boost::posix_time::hours(out.profile_bin_h);
    const std::size_t chunk = 4096;
    const std::size_t n_chunks = (order.size() + chunk - 1) / chunk;
    std::vector<Partial> partial(n_chunks);
    auto sweep_chunk = [&](std::size_t c) {
        Partial& p = partial[c];
        p.worst_ratio.assign(n_crew, -1.0);
        p.worst_onset.assign(n_crew, 0);
        p.evas.assign(outside_activities.size(), {});
        const std::size_t begin = c * chunk;
        const std::size_t end = std::min(order.size(), begin + chunk);
        std::vector<std::size_t> active;
        std::size_t next = 0; // into by_first
        for (; next < by_first.size() && inside[by_first[next]].first <= begin; ++next) {
            if (inside[by_first[next]].second > begin) {
                active.push_back(by_first[next]);
            }
        }
        std::vector<double> ratio(n_crew);
        std::vector<StormDoses> doses(n_crew);
        for (std::size_t x = begin; x < end; ++x) {
            const Time o = order[x];
            for (std::size_t i = 0; i < n_crew; ++i) {
                const std::size_t j = ctx.twin(i);
                doses[i] = j < i ? doses[j] : ctx.doses_at(o, i);
                ratio[i] =
                    require_dose(ctx.ratio_of(i, doses[i]), "storm sweep share of a 30-day limit");
                if (ratio[i] > p.worst_ratio[i]) {
                    p.worst_ratio[i] = ratio[i];
                    p.worst_onset[i] = x;
                }
                const Time b =
                    from + bin * static_cast<int>((o - from).total_seconds() / bin.total_seconds());
                auto& in_bin = p.profile[b];
                in_bin = std::max(in_bin, ratio[i]);
            }
            for (; next < by_first.size() && inside[by_first[next]].first <= x; ++next) {
                active.push_back(by_first[next]);
            }
            std::erase_if(active, [&](std::size_t k) { return inside[k].second <= x; });
            for (const std::size_t k : active) {
                EvaBest& e = p.evas[k];
                for (const std::size_t i : outside_activities[k].second) {
                    if (ratio[i] <= e.ratio) {
                        continue;
                    }
                    std::size_t worst_k = 0;
                    for (std::size_t q = 1; q < ctx.organs().size(); ++q) {
                        if (ctx.checked(i, q) &&
                            (doses[i][q] + ctx.other(i, q)) / ctx.limit(q) >
                                (doses[i][worst_k] + ctx.other(i, worst_k)) / ctx.limit(worst_k)) {
                            worst_k = q;
                        }
                    }
                    e = {ratio[i], x, i, worst_k};
                }
            }
        }
    };
    std::atomic<std::size_t> next_chunk{0};
    std::atomic<std::size_t> chunks_done{0};
    const std::size_t threads = std::clamp<std::size_t>(ctx.study().threads(), 1, n_chunks);
    std::vector<std::exception_ptr> failures(threads);
    auto worker = [&](std::size_t t) {
        try {
            for (std::size_t c = next_chunk++; c < n_chunks; c = next_chunk++) {
                sweep_chunk(c);
                const std::size_t done = ++chunks_done;
                if (t == 0 && progress) {
                    progress(static_cast<double>(done) / static_cast<double>(n_chunks));
                }
            }
        } catch (...) {
            failures[t] = std::current_exception();
            next_chunk = n_chunks; // the others stop at their next chunk
        }
    };
    {
        std::vector<std::thread> pool;
        try {
            for (std::size_t t = 1; t < threads; ++t) {
                pool.emplace_back(worker, t);
            }
        } catch (const std::system_error&) {
            // No more threads to be had: the ones started, and this one, take every chunk.
        }
        worker(0);
        for (auto& th : pool) {
            th.join();
        }
    }
    for (const auto& f : failures) {
        if (f) {
            std::rethrow_exception(f);
        }
    }
    std::vector<double> worst_ratio(n_crew, -1.0);
    std::vector<Time> worst_onset(n_crew, from);
    std::map<Time, double> profile;
    for (const Partial& p : partial) {
        for (std::size_t i = 0; i < n_crew; ++i) {
            if (p.worst_ratio[i] > worst_ratio[i]) {
                worst_ratio[i] = p.worst_ratio[i];
                worst_onset[i] = order[p.worst_onset[i]];
            }
        }
        for (const auto& [b, r] : p.profile) {
            auto& in_bin = profile[b];
            in_bin = std::max(in_bin, r);
        }
        for (std::size_t k = 0; k < out.evas.size(); ++k) {
            const EvaBest& e = p.evas[k];
            if (e.ratio > out.evas[k].ratio) {
                out.evas[k].ratio = e.ratio;
                out.evas[k].worst_onset = order[e.onset];
                out.evas[k].crew = sc.crew[e.crew].id;
                out.evas[k].organ = ctx.organs()[e.organ];
            }
        }
    }
    out.profile.assign(profile.begin(), profile.end());
    for (const auto& bin_ratio : out.profile) {
        require_dose(bin_ratio.second, "storm sweep profile ratio");
    }
    for (const auto& e : out.evas) {
        require_finite(e.ratio, "storm sweep ratio of " + e.label);
    }
    // The worst onsets in full (with the doses without the response and the timeline).
    for (std::size_t i = 0; i < sc.crew.size(); ++i) {
        out.worst[i] = {worst_onset[i], ctx.at(worst_onset[i]).crew[i]};
    }
    return out;
}

Time parse_command_time(const std::string& text, const std::string& option) {
    bool bad_year = false;
    if (const auto t = parse_rfc3339(text, &bad_year)) {
        return *t;
    }
    throw InputError({"command line", 0}, option,
                     bad_year ? fmt::format("'{}': the year must lie from 1400 to 9999", text)
                              : fmt::format("'{}' is not an RFC 3339 date-time with its offset; "
                                            "write for example 2032-03-11T10:30:00Z",
                                            text));
}

time_duration parse_duration(const std::string& text, const std::string& option) {
    // The scenario stage's reading of a duration, in the command line's narrower range.
    const auto s = parse_duration_s(text);
    if (s && *s >= 1 && *s <= 864000) {
        return boost::posix_time::seconds(static_cast<long>(*s));
    }
    throw InputError({"command line", 0}, option,
                     fmt::format("'{}': write a duration from 1 s to 10 days with its unit, in "
                                 "whole seconds, for example 10min, 1min, 30s, 2h, 1d",
                                 text));
}
} // namespace crewdose::planner
