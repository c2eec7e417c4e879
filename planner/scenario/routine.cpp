#include "planner/scenario/routine.hpp"

#include "planner/scenario/number_parse.hpp"
#include "planner/scenario/time_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cstdint>

namespace crewdose::planner {
namespace {

using toml_read::Section;
constexpr std::int64_t kMicroseconds = 1000000;

// A duration as the fewest words: "2d", "6h", "90min", "45s".
std::string duration_text(std::int64_t s) {
    if (s != 0 && s % 86400 == 0) {
        return fmt::format("{}d", s / 86400);
    }
    if (s != 0 && s % 3600 == 0) {
        return fmt::format("{}h", s / 3600);
    }
    if (s != 0 && s % 60 == 0) {
        return fmt::format("{}min", s / 60);
    }
    return fmt::format("{}s", s);
}

// The duration `key` ("2d", "90min"), whole seconds from `lo_s` to `hi_s`; `range` says so in
// the message.
std::int64_t duration_key(const Section& s, const std::string& key, std::int64_t lo_s,
                          std::int64_t hi_s, std::string_view what, std::string_view range) {
    const std::string text = s.text(key);
    const auto v = parse_duration_s(text);
    if (!v || *v < lo_s || *v > hi_s) {
        s.fail(key, fmt::format("'{}': write {} as a number and a unit (s, min, h or d), a whole "
                                "number of seconds {}; for example 1d, 7d, 12h, 90min",
                                text, what, range));
    }
    return *v;
}

toml::date_time to_toml(const Time& t) {
    const auto day = t.date();
    const auto tod = t.time_of_day();
    return toml::date_time{toml::date{static_cast<int>(day.year()), static_cast<int>(day.month()),
                                      static_cast<int>(day.day())},
                           toml::time{static_cast<int>(tod.hours()),
                                      static_cast<int>(tod.minutes()),
                                      static_cast<int>(tod.seconds()),
                                      static_cast<std::uint32_t>(tod.fractional_seconds() * 1000)},
                           toml::time_offset{}};
}

// One activity of a routine: its table and where it lies within each instance.
struct Step {
    const toml::table* table;
    SourceLocation where;
    std::int64_t at_s;
    std::int64_t for_s;
};

// Appends the instances of the routine `r` to `out`; `total` counts the activities every
// routine so far expanded to.
void expand(const toml::table& r, const std::string& file, const Mission& mission,
            const std::set<std::string>& step_keys, std::vector<ActivityTable>& out,
            std::size_t& total) {
    const Section s(r, file, "routine", {"crew", "from", "every", "until", "except", "activity"});
    const int line = s.where().line;
    const Time from = s.time("from");
    const std::int64_t every_s =
        duration_key(s, "every", kMinRoutinePeriod_s, kMaxRoutinePeriod_s, "the period",
                     fmt::format("from {} to {}", duration_text(kMinRoutinePeriod_s),
                                 duration_text(kMaxRoutinePeriod_s)));
    const Time until = s.has("until") ? s.time("until") : mission.end;
    if (!(until > from)) {
        s.fail(s.has("until") ? "until" : "from",
               fmt::format("the routine would end (until = {}{}) before it starts (from = {}); "
                           "until must be after from",
                           format_time(until), s.has("until") ? "" : ", mission.end",
                           format_time(from)));
    }
    // Instances start at from, from + every, ... before until.
    const std::int64_t every_us = every_s * kMicroseconds;
    const std::int64_t count = ((until - from).total_microseconds() + every_us - 1) / every_us;
    const auto instance_start = [&](std::int64_t k) {
        return from + boost::posix_time::microseconds(k * every_us);
    };

    std::optional<toml::array> crew;
    if (s.has("crew")) {
        crew.emplace();
        for (const auto& id : s.strings("crew")) {
            crew->push_back(id);
        }
    }

    const toml::node* listed = s.node("activity");
    if (!listed) {
        throw InputError(s.where(), "routine.activity",
                         "the routine has no activities; write each as a [[routine.activity]] "
                         "entry after the [[routine]] (kind, location, at, for)");
    }
    const auto* array = listed->as_array();
    if (!array || array->empty() || !array->is_array_of_tables()) {
        s.fail("activity", "must be written as [[routine.activity]] entries");
    }
    std::vector<Step> steps;
    std::int64_t next_at_s = 0;
    for (const auto& node : *array) {
        const toml::table& t = *node.as_table();
        const Section a(t, file, "routine.activity", step_keys);
        const std::int64_t at_s =
            a.has("at")
                ? duration_key(
                      a, "at", 0, every_s - 1, "the start within the period (less than every)",
                      fmt::format("from 0 to less than every = {}", duration_text(every_s)))
                : next_at_s;
        const std::int64_t for_s =
            duration_key(a, "for", 1, kMaxRoutinePeriod_s, "the duration",
                         fmt::format("more than 0, at most every = {}", duration_text(every_s)));
        if (at_s + for_s > every_s) {
            const std::string next = count > 1 ? fmt::format(" when the next starts at {}",
                                                             format_time(instance_start(1)))
                                               : std::string(" past its period");
            a.fail("for",
                   fmt::format("the activity ends {} after the start of its instance, after the "
                               "period every = {}: the instance of {} would still run{}; "
                               "a routine's activities lie within its period (at + for <= every; "
                               "without at, an activity starts where the one before it ends)",
                               duration_text(at_s + for_s), duration_text(every_s),
                               format_time(from), next));
        }
        if (!a.has("crew") && !crew) {
            a.fail("crew", "is required here: give crew on the [[routine]] (for all its "
                           "activities) or on the activity");
        }
        next_at_s = at_s + for_s;
        steps.push_back({&t, a.where(), at_s, for_s});
    }

    std::set<std::int64_t> skipped; // instance numbers
    if (s.has("except")) {
        const auto* listed_times = s.need("except").as_array();
        if (!listed_times) {
            s.fail("except", "must be an array of date-times, each the start of an instance to "
                             "leave out");
        }
        for (const auto& e : *listed_times) {
            const auto* dt = e.as_date_time();
            const auto t = dt && dt->get().offset ? toml_read::from_toml(dt->get()) : std::nullopt;
            if (!t) {
                s.fail("except", "must hold RFC 3339 date-times with their UTC offset, each the "
                                 "start of an instance to leave out (e.g. 2035-06-18T09:00:00Z)");
            }
            const std::int64_t offset_us = (*t - from).total_microseconds();
            if (offset_us < 0 || offset_us % every_us != 0 || offset_us / every_us >= count) {
                s.fail("except",
                       fmt::format("{} is not the start of an instance; instances start at from "
                                   "= {} and every {} after it, the last at {}",
                                   format_time(*t), format_time(from), duration_text(every_s),
                                   format_time(instance_start(count - 1))));
            }
            if (!skipped.insert(offset_us / every_us).second) {
                s.fail("except", fmt::format("lists {} twice", format_time(*t)));
            }
        }
    }

    // Bounded before anything is built: an absurd period or date fails here, not in memory.
    const auto kept = static_cast<std::size_t>(count) - skipped.size();
    if (kept > kMaxRoutineActivities || kept * steps.size() > kMaxRoutineActivities - total) {
        s.fail("every", fmt::format("the routine would expand to {} activities ({} instances); "
                                    "all routines together may expand to at most {} activities "
                                    "(check from, until and every)",
                                    kept * steps.size(), kept, kMaxRoutineActivities));
    }
    total += kept * steps.size();

    for (std::int64_t k = 0; k < count; ++k) {
        if (skipped.count(k)) {
            continue;
        }
        const Time t0 = instance_start(k);
        for (const auto& step : steps) {
            const Time start = t0 + boost::posix_time::seconds(step.at_s);
            const Time end = start + boost::posix_time::seconds(step.for_s);
            if (start >= until) {
                continue; // the routine ends part way through its block
            }
            if (start < mission.start || end > mission.end) {
                s.fail(start < mission.start ? "from" : "until",
                       fmt::format("the instance of {} lies outside the mission: its activity at "
                                   "line {} runs from {} to {}, the mission from {} to {}",
                                   format_time(t0), step.where.line, format_time(start),
                                   format_time(end), format_time(mission.start),
                                   format_time(mission.end)));
            }
            if (end > until) {
                s.fail("until", fmt::format("the instance of {}: its activity at line {} runs from "
                                            "{} to {}, past until = {}; nothing of a routine is "
                                            "cut short: set until to the start or end of one of "
                                            "its activities",
                                            format_time(t0), step.where.line, format_time(start),
                                            format_time(end), format_time(until)));
            }
            ActivityTable e;
            e.instance = *step.table;
            e.instance.erase("at");
            e.instance.erase("for");
            e.instance.insert_or_assign("start", to_toml(start));
            e.instance.insert_or_assign("end", to_toml(end));
            if (crew && !e.instance.contains("crew")) {
                e.instance.insert_or_assign("crew", *crew);
            }
            e.name = "routine.activity";
            e.origin = toml_read::Origin{
                step.where, fmt::format(" (the instance of {} of the routine at line {})",
                                        format_time(t0), line)};
            e.routine = ActivitySpec::RoutineInstance{t0, line};
            e.order_line = line;
            out.push_back(std::move(e));
        }
    }
}

} // namespace

std::vector<ActivityTable> activity_tables(const toml::table& root, const std::string& file,
                                           const Mission& mission,
                                           const std::set<std::string>& activity_keys) {
    std::vector<ActivityTable> out;
    for (const auto* t : toml_read::entries(root, "activity", file)) {
        ActivityTable e;
        e.entry = t;
        e.name = "activity";
        e.order_line = static_cast<int>(t->source().begin.line);
        out.push_back(std::move(e));
    }
    std::set<std::string> step_keys = activity_keys;
    step_keys.erase("start");
    step_keys.erase("end");
    step_keys.insert({"at", "for"});
    std::size_t total = 0;
    for (const auto* r : toml_read::entries(root, "routine", file)) {
        expand(*r, file, mission, step_keys, out, total);
    }
    // The order of the file, so that a routine written in place of the activities it repeats
    // gives the scenario the same activities in the same order.
    std::stable_sort(out.begin(), out.end(), [](const ActivityTable& x, const ActivityTable& y) {
        return x.order_line < y.order_line;
    });
    return out;
}

} // namespace crewdose::planner
