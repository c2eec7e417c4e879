#include "planner/report/check_chart.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/number_format.hpp"
#include "planner/scenario/time_format.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <set>
#include <stdexcept>

namespace crewdose::planner {
namespace {

using boost::posix_time::time_duration;

const time_duration kThirtyDays = boost::posix_time::hours(24 * 30);

// The unit of an organ's ledger: the effective dose is in mSv, every organ dose in mGy-Eq.
const char* unit_of(const std::string& organ) {
    return organ == "effective" ? "mSv" : "mGy-Eq";
}

// A number for a chart's text: a value that was not computed says so, never a number.
std::string shown(double value) {
    return std::isfinite(value) ? significant(value, 3) : std::string("not computed");
}

// "12.3 mGy-Eq", or "not computed" (without a unit) for a value that was not computed.
std::string amount(double value, const std::string& unit) {
    return std::isfinite(value) ? significant(value, 3) + " " + unit : "not computed";
}

// The check of `window` with the highest share of its limit used; a dose that is not a number
// counts as the highest, so that it cannot hide behind a computed one.
const LimitCheck* highest_share(const CrewResult& crew, const std::string& window) {
    const LimitCheck* best = nullptr;
    double best_share = -std::numeric_limits<double>::infinity();
    for (const auto& c : crew.checks) {
        if (c.limit.window != window) {
            continue;
        }
        const double share = c.dose / c.limit.value;
        const double rank = std::isnan(share) ? std::numeric_limits<double>::infinity() : share;
        if (!best || rank > best_share) {
            best = &c;
            best_share = rank;
        }
    }
    return best;
}

// The kinds of activity the charts shade, in the order of their rows.
const std::vector<std::pair<ActivityKind, std::string>>& shaded_kinds() {
    static const std::vector<std::pair<ActivityKind, std::string>> kinds{
        {ActivityKind::eva, "EVA"},
        {ActivityKind::rover, "rover"},
        {ActivityKind::shelter, "shelter"}};
    return kinds;
}

struct Timeline {
    Time start;
    Time end;
    [[nodiscard]] double days(const Time& t) const { return hours(t - start) / 24.0; }
};

// The times a curve is drawn at: the mission's ends, every piece boundary inside the mission,
// each of them 30 days later (where a rolling window's slope changes), hourly inside event
// pieces (the profile's shape) and `extra`.
std::vector<Time> sample_times(const Timeline& tl, const std::vector<DosePiece>& pieces,
                               const std::vector<Time>& extra) {
    std::set<Time> times{tl.start, tl.end};
    const auto add = [&](const Time& t) {
        if (t >= tl.start && t <= tl.end) {
            times.insert(t);
        }
    };
    for (const auto& p : pieces) {
        for (const Time& t : {p.start, p.end}) {
            add(t);
            add(t + kThirtyDays);
        }
        if (p.event) {
            for (Time t = p.start; t < p.end; t += boost::posix_time::hours(1)) {
                add(t);
                add(t + kThirtyDays);
            }
        }
    }
    for (const auto& t : extra) {
        add(t);
    }
    return {times.begin(), times.end()};
}

svg::Chart timeline_chart(const Scenario& sc, const Timeline& tl, const CrewSpec& crew) {
    svg::Chart c;
    c.x.title = fmt::format("days from the mission start (day 0 = {})", format_time(tl.start));
    c.x.exact = true;
    c.y.from_zero = true;
    for (const auto& [kind, label] : shaded_kinds()) {
        c.band_kinds.push_back(label);
    }
    // A crew member without rover drives (or shelter stays) gets no empty row for them.
    c.hide_empty_band_kinds = true;
    for (const auto& a : sc.activities) {
        if (std::find(a.crew.begin(), a.crew.end(), crew.id) == a.crew.end()) {
            continue;
        }
        for (std::size_t k = 0; k < shaded_kinds().size(); ++k) {
            if (shaded_kinds()[k].first == a.kind) {
                c.bands.push_back({tl.days(a.start), tl.days(a.end), k});
            }
        }
    }
    for (const auto& e : sc.events) {
        c.markers.push_back({tl.days(e.flare_seen), "SPE " + e.id + ": flare seen"});
    }
    return c;
}

svg::Chart rolling_chart(const Scenario& sc, const Timeline& tl, const CrewSpec& crew,
                         const LimitCheck& check, const OrganResult& organ,
                         const std::vector<DosePiece>& pieces) {
    const std::string& o = check.limit.organ;
    svg::Chart c = timeline_chart(sc, tl, crew);
    c.title =
        fmt::format("30-day {} dose: the dose in the 30 days up to each time", organ_label(o));
    c.y.title = fmt::format("30-day dose ({})", unit_of(o));
    std::vector<Time> extra;
    if (organ.max_30d.dose_mGyEq > 0.0) {
        extra.push_back(organ.max_30d.window_end);
    }
    const auto times = sample_times(tl, pieces, extra);
    std::vector<Time> before;
    before.reserve(times.size());
    for (const auto& t : times) {
        before.push_back(t - kThirtyDays);
    }
    const auto to = cumulative_at(pieces, times);
    const auto from = cumulative_at(pieces, before);
    svg::Series s;
    s.label = fmt::format("30-day {} dose", organ_label(o));
    for (std::size_t i = 0; i < times.size(); ++i) {
        double d = to[i] - from[i];
        // A difference of two sums can come out a rounding error below zero; anything more
        // negative than that stays as it is and is shown as not computed.
        if (d < 0.0 && d >= -1e-12 * std::max(1.0, std::abs(to[i]))) {
            d = 0.0;
        }
        s.x.push_back(tl.days(times[i]));
        s.y.push_back(d);
    }
    c.series.push_back(std::move(s));
    c.levels.push_back({check.limit.value, fmt::format("30-day planning limit {} {}",
                                                       shown(check.limit.value), unit_of(o))});
    c.notes.push_back(fmt::format("Drawn for the {}: of this crew member's 30-day limits, the "
                                  "one with the highest share used.",
                                  o == "effective" ? "effective dose" : organ_label(o)));
    c.notes.push_back(organ.max_30d.dose_mGyEq > 0.0
                          ? fmt::format("Highest 30-day dose (the ledger's): {}, {} to {}.",
                                        amount(organ.max_30d.dose_mGyEq, unit_of(o)),
                                        format_time(organ.max_30d.window_start),
                                        format_time(organ.max_30d.window_end))
                          : fmt::format("Highest 30-day dose (the ledger's): {}.",
                                        amount(organ.max_30d.dose_mGyEq, unit_of(o))));
    return c;
}

svg::Chart career_chart(const Scenario& sc, const Timeline& tl, const CrewSpec& crew,
                        const LimitCheck& check, const OrganResult& organ,
                        const std::vector<DosePiece>& pieces) {
    const std::string& o = check.limit.organ;
    svg::Chart c = timeline_chart(sc, tl, crew);
    c.title = fmt::format("Career {} dose: the prior dose plus the mission so far", organ_label(o));
    c.y.title = fmt::format("career dose ({})", unit_of(o));
    const auto times = sample_times(tl, pieces, {});
    const auto cumulative = cumulative_at(pieces, times);
    svg::Series s;
    s.label = fmt::format("career {} dose", organ_label(o));
    for (std::size_t i = 0; i < times.size(); ++i) {
        s.x.push_back(tl.days(times[i]));
        s.y.push_back(cumulative[i]);
    }
    c.series.push_back(std::move(s));
    c.levels.push_back({check.limit.value, fmt::format("career planning limit {} {}",
                                                       shown(check.limit.value), unit_of(o))});
    c.notes.push_back(fmt::format("Drawn for the {}: of this crew member's career limits, the "
                                  "one with the highest share used.",
                                  o == "effective" ? "effective dose" : organ_label(o)));
    c.notes.push_back(fmt::format("Career dose at the mission end (the ledger's): {}.",
                                  amount(organ.career_mGyEq, unit_of(o))));
    return c;
}

std::string heading(const CrewResult& c, double near_share) {
    const LimitCheck* b = binding_check(c);
    const std::string who =
        c.name.empty() || c.name == c.crew ? c.crew : fmt::format("{} ({})", c.name, c.crew);
    if (!b) {
        return who + ": no limit evaluated";
    }
    const LimitStatus st = status_of(*b, near_share);
    const double share = 100.0 * b->dose / b->limit.value;
    return fmt::format("{}: binding limit {} {} {} {}; dose {} ({}); {}", who,
                       organ_label(b->limit.organ), b->limit.window, shown(b->limit.value),
                       unit_of(b->limit.organ), amount(b->dose, unit_of(b->limit.organ)),
                       std::isfinite(share) ? fmt::format("{:.0f} % used", share)
                                            : std::string("share not computed"),
                       st == LimitStatus::exceeded ? "EXCEEDED" : to_string(st));
}

} // namespace

svg::Figure check_figure(const Study& study, const LedgerResult& ledger, double near_share) {
    const Scenario& sc = study.scenario();
    const Timeline tl{sc.mission.start, sc.mission.end};
    svg::Figure f;
    f.id = "crewdose-check";
    f.title = fmt::format("crewdose check: {}", sc.mission.name);
    f.subtitle.push_back(fmt::format("scenario {}; mission {} to {}", sc.file,
                                     format_time(sc.mission.start), format_time(sc.mission.end)));
    f.subtitle.push_back(fmt::format(
        "Doses from the check's ledger: SPE and GCR, uncertainty factor {:.2f} applied; organ "
        "doses RBE-weighted (mGy-Eq), the effective dose in mSv.",
        sc.limits.uncertainty_factor));
    f.boxed_note = chart_caution_note();
    for (const auto& c : ledger.crew) {
        svg::Panel p;
        p.heading = heading(c, near_share);
        const auto crew_spec = std::find_if(sc.crew.begin(), sc.crew.end(),
                                            [&](const CrewSpec& s) { return s.id == c.crew; });
        if (crew_spec == sc.crew.end()) {
            throw std::logic_error("check_figure: crew member '" + c.crew +
                                   "' of the ledger is not in the scenario");
        }
        std::vector<std::string> drawn; // the organ of each chart
        for (const char* window : {"30-day", "career"}) {
            const LimitCheck* check = highest_share(c, window);
            if (!check) {
                continue;
            }
            const auto organ =
                std::find_if(c.organs.begin(), c.organs.end(),
                             [&](const OrganResult& r) { return r.organ == check->limit.organ; });
            const auto pieces = ledger.pieces.find({c.crew, check->limit.organ});
            if (organ == c.organs.end() || pieces == ledger.pieces.end()) {
                continue;
            }
            p.charts.push_back(
                std::string(window) == "30-day"
                    ? rolling_chart(sc, tl, *crew_spec, *check, *organ, pieces->second)
                    : career_chart(sc, tl, *crew_spec, *check, *organ, pieces->second));
            drawn.push_back(check->limit.organ);
        }
        // What the text report says about organs the body model does not give or bounds.
        for (std::size_t k = 0; k < p.charts.size(); ++k) {
            if (const auto it = c.estimated.find(drawn[k]); it != c.estimated.end()) {
                p.charts[k].notes.push_back(fmt::format(
                    "The {} dose is an upper bound where the quick body model stands "
                    "({}).",
                    organ_label(drawn[k]), fmt::format("{}", fmt::join(it->second, ", "))));
            }
        }
        if (!c.not_evaluated.empty() && !p.charts.empty()) {
            std::vector<std::string> organs;
            for (const auto& [organ, locations] : c.not_evaluated) {
                organs.push_back(organ_label(organ));
            }
            p.charts.front().notes.push_back(
                fmt::format("Not evaluated for this crew member, so not drawn: {} (the quick body "
                            "model gives no such dose; see the report).",
                            fmt::join(organs, ", ")));
        }
        f.panels.push_back(std::move(p));
    }
    return f;
}

std::string format_check_chart(const Study& study, const LedgerResult& ledger, double near_share) {
    return svg::render_svg(check_figure(study, ledger, near_share));
}

} // namespace crewdose::planner
