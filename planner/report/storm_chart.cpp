#include "planner/report/storm_chart.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/number_format.hpp"
#include "planner/scenario/time_format.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <limits>

namespace crewdose::planner {
namespace {

using boost::posix_time::time_duration;

// A share of a limit for a chart's text: "123 %", or "not computed", never a number then.
std::string percent(double ratio) {
    return svg::drawable(ratio, true) ? fmt::format("{:.0f} %", 100.0 * ratio)
                                      : std::string("not computed");
}

// Whether a share of a limit reads as within it: a share that was not computed (not a
// number, infinite or negative) never does.
bool within(double ratio) {
    return svg::drawable(ratio, true) && ratio < 1.0;
}

// A crew member's organ with the highest share of its limit; one that is not a number counts
// as the highest, so that it cannot hide behind a computed one.
const StormOrgan* worst_organ(const StormCrew& c) {
    const StormOrgan* worst = nullptr;
    double rank = -std::numeric_limits<double>::infinity();
    for (const auto& o : c.organs) {
        const double r =
            std::isnan(o.ratio()) ? std::numeric_limits<double>::infinity() : o.ratio();
        if (!worst || r > rank) {
            worst = &o;
            rank = r;
        }
    }
    return worst;
}

std::string who(const StormCrew& c) {
    return c.name.empty() || c.name == c.crew ? c.crew : fmt::format("{} ({})", c.name, c.crew);
}

struct Bin {
    Time start;
    Time end; ///< the next bin's start, or the sweep's end
    double ratio = 0.0;
};

} // namespace

svg::Figure storm_figure(const StormContext& ctx, const StormSweep& s) {
    const Scenario& sc = ctx.study().scenario();
    const auto days = [&](const Time& t) {
        return hours(t - s.from) / 24.0;
    };
    const time_duration bin_width = boost::posix_time::hours(s.profile_bin_h);

    svg::Figure f;
    f.id = "crewdose-storm";
    f.title = fmt::format("crewdose storm sweep: event {}", s.event_id);
    f.subtitle.push_back(fmt::format("scenario {}; t0 from {} to {}, every {} plus the {} "
                                     "breakpoints ({} onsets)",
                                     sc.file, format_time(s.from), format_time(s.to),
                                     format_duration(s.step),
                                     ctx.responds() ? "policy" : "timeline", s.onsets));
    f.subtitle.push_back(fmt::format(
        "{}; uncertainty factor {:.2f} applied. Share of a limit: (the event's dose {} + the crew "
        "member's highest other 30-day dose) / the 30-day planning limit, as if both fell in one "
        "window.",
        ctx.responds() ? "The crew follow the scenario's [storm_response]"
                       : "No response (--no-response): the crew keep to the planned timeline",
        sc.limits.uncertainty_factor, ctx.responds() ? "with the response" : "without a response"));
    std::string cautions = caution_text();
    std::replace(cautions.begin(), cautions.end(), '\n', ' ');
    f.boxed_note = cautions +
                   "A share that was not computed is never drawn as a value: its line breaks and "
                   "the stretch is marked \"not computed\"; it is hatched as no-go, never read "
                   "as within a limit.";

    // The profile's bins, each to the next one's start at most (the last to the sweep's end).
    std::vector<Bin> bins;
    for (const auto& [t, r] : s.profile) {
        bins.push_back({t, std::min(t + bin_width, s.to), r});
    }
    bool all_within = !s.any_exceeded();
    for (const auto& b : bins) {
        all_within = all_within && within(b.ratio);
    }

    svg::Chart c;
    c.title =
        fmt::format("Highest share of a 30-day planning limit over the crew, per {} of onset t0",
                    profile_bin_text(s.profile_bin_h));
    c.x.title =
        fmt::format("onset t0 (days from the sweep's start; day 0 = {})", format_time(s.from));
    c.x.exact = true;
    c.x.from_zero = true;
    c.y.title = "share of the 30-day limit (%)";
    c.y.from_zero = true;
    // Short row names: they stand left of the plot, in its margin.
    // EVAs and rover drives share the rows: both take the crew outside the refuge.
    c.band_kinds = {"EVA/drive: go", "EVA/drive: NO-GO", "t0: NO-GO"};

    // The profile as a step: a bin's value holds across the bin.
    svg::Series curve;
    curve.label = "highest share";
    bool gaps = false;
    for (std::size_t k = 0; k < bins.size(); ++k) {
        const auto& b = bins[k];
        gaps = gaps || (k > 0 && bins[k - 1].end < b.start);
        for (const Time& t : {b.start, b.end}) {
            curve.x.push_back(days(t));
            curve.y.push_back(100.0 * b.ratio);
        }
    }
    if (!curve.x.empty()) {
        c.series.push_back(std::move(curve));
    }
    c.levels.push_back({100.0, "30-day planning limit (100 %)"});

    for (const auto& e : s.evas) {
        c.bands.push_back(
            {days(e.start), days(e.end),
             static_cast<std::size_t>(e.go() ? StormBand::eva_go : StormBand::eva_no_go)});
    }
    // No-go onsets: neighbouring bins at or above the limit (or not computed) form one band.
    std::vector<std::pair<Time, Time>> no_go;
    for (const auto& b : bins) {
        if (within(b.ratio)) {
            continue;
        }
        if (!no_go.empty() && no_go.back().second == b.start) {
            no_go.back().second = b.end;
        } else {
            no_go.emplace_back(b.start, b.end);
        }
    }
    for (const auto& [a, b] : no_go) {
        // A bin of zero width (the sweep's last onset on a bin's start) is still shown.
        c.bands.push_back({days(a), std::max(days(b), days(a) + 1e-9),
                           static_cast<std::size_t>(StormBand::no_go)});
    }

    // The worst onset over the crew, marked at its time.
    const std::pair<Time, StormCrew>* worst = nullptr;
    double worst_rank = -std::numeric_limits<double>::infinity();
    for (const auto& w : s.worst) {
        const double r = w.second.worst_ratio();
        const double rank = std::isnan(r) ? std::numeric_limits<double>::infinity() : r;
        if (!worst || rank > worst_rank) {
            worst = &w;
            worst_rank = rank;
        }
    }
    if (worst) {
        const StormOrgan* o = worst_organ(worst->second);
        c.markers.push_back(
            {days(worst->first),
             fmt::format("worst t0 {}: {}{}", format_time(worst->first),
                         percent(worst->second.worst_ratio()),
                         o ? fmt::format(" ({}, {})", worst->second.crew, organ_label(o->organ))
                           : std::string())});
    }

    std::vector<std::string> organ_labels;
    for (const auto& o : ctx.organs()) {
        organ_labels.push_back(organ_label(o));
    }
    c.notes.push_back(fmt::format(
        "Each step: the highest share over the crew and the checked organs ({}) among the onsets "
        "in the {} from its start (the sweep's profile, as in the text report).",
        fmt::join(organ_labels, ", "), profile_bin_text(s.profile_bin_h)));
    c.notes.push_back("Hatched: EVAs and rover drives, go or NO-GO (NO-GO: an onset inside it "
                      "breaks a 30-day limit, or no onset of the sweep falls inside it), and the "
                      "onsets t0 that reach or exceed 100 % of a 30-day limit or were not "
                      "computed (t0: NO-GO).");
    if (gaps) {
        c.notes.push_back(fmt::format("Some bins of {} hold no onset (--step {} is longer): the "
                                      "line joins across them.",
                                      profile_bin_text(s.profile_bin_h), format_duration(s.step)));
    }
    for (const auto& [onset, crew] : s.worst) {
        const StormOrgan* o = worst_organ(crew);
        c.notes.push_back(
            fmt::format("Worst onset for {}: t0 {}, {} at {} of its 30-day limit{}.", who(crew),
                        format_time(onset), o ? organ_label(o->organ) : std::string("no organ"),
                        percent(crew.worst_ratio()), crew.exceeded() ? ", EXCEEDED" : ""));
    }
    const std::size_t kListed = 8;
    for (std::size_t k = 0; k < no_go.size() && k < kListed; ++k) {
        c.notes.push_back(fmt::format("NO-GO: onsets from {} to {} reach or exceed a 30-day limit "
                                      "(or were not computed).",
                                      format_time(no_go[k].first), format_time(no_go[k].second)));
    }
    if (no_go.size() > kListed) {
        c.notes.push_back(fmt::format("... and {} more no-go stretches (see the report).",
                                      no_go.size() - kListed));
    }
    for (const auto& e : s.evas) {
        if (!e.swept()) {
            c.notes.push_back(fmt::format("NOT SWEPT: {}, {} to {}: no onset of the sweep falls "
                                          "inside it.",
                                          e.label, format_time(e.start), format_time(e.end)));
        } else if (!e.go()) {
            c.notes.push_back(fmt::format("NO-GO: {}, {} to {}: worst t0 {}, {} {} at {}.", e.label,
                                          format_time(e.start), format_time(e.end),
                                          format_time(e.worst_onset), e.crew, organ_label(e.organ),
                                          percent(e.ratio)));
        }
    }
    if (!ctx.unchecked_note().empty()) {
        c.notes.push_back("Not checked: " + ctx.unchecked_note() + ".");
    }

    svg::Panel p;
    p.heading = s.any_exceeded() ? "A 30-DAY PLANNING LIMIT IS EXCEEDED at some onset."
                : all_within
                    ? "Every 30-day planning limit is met at every onset tried."
                    : "SOME ONSETS WERE NOT COMPUTED: they are not known to be within the limits.";
    p.charts.push_back(std::move(c));
    f.panels.push_back(std::move(p));
    return f;
}

std::string format_storm_chart(const StormContext& context, const StormSweep& sweep) {
    return svg::render_svg(storm_figure(context, sweep));
}

} // namespace crewdose::planner
