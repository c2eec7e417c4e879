#pragma once
// [[routine]]: a block of activities that repeats with a period ("a day of sleep, stay, EVA,
// stay, every day from ... until ..."), written once and expanded when the scenario is read
// into one activity table per instance, which the [[activity]] reader then checks like any
// other: everything after the loader sees plain activities (scenarios/README.md, [[routine]]).
#include "planner/scenario/scenario.hpp"
#include "planner/scenario/toml_section.hpp"

#include <cstddef>
#include <set>
#include <string>
#include <vector>

namespace crewdose::planner {

/// The most activities all the routines of one scenario may expand to: a 3-year plan of 10
/// activities a day is 11,000; more is a mistaken period or date.
constexpr std::size_t kMaxRoutineActivities = 100000;
/// A routine's period, `every`: from 1 minute to 366 days.
constexpr std::int64_t kMinRoutinePeriod_s = 60;
constexpr std::int64_t kMaxRoutinePeriod_s = 366 * 86400;

/// One table for the [[activity]] reader: an [[activity]] entry as written, or one instance of
/// a routine's activity (its [[routine.activity]] table with `start` and `end` for the
/// instance in place of `at` and `for`, and the routine's `crew` when it gives none).
struct ActivityTable {
    const toml::table* entry = nullptr; ///< an [[activity]] entry, or null for an instance
    toml::table instance;               ///< the instance's table when `entry` is null
    std::string name;                   ///< "activity" or "routine.activity", for messages
    /// For an instance: the line of its [[routine.activity]] entry (which every message about
    /// the activity names, here and later) and which instance it is.
    std::optional<toml_read::Origin> origin;
    /// For an instance: its start and the line of its [[routine]] (ActivitySpec::instance).
    std::optional<ActivitySpec::RoutineInstance> routine;
    int order_line = 0; ///< the line of the [[activity]] or [[routine]] header: file order

    [[nodiscard]] const toml::table& table() const { return entry ? *entry : instance; }
};

/// Every [[activity]] entry and every instance of every [[routine]]'s activities, in the
/// order of the file (a routine's instances in time order at the routine's place). Checks the
/// routines themselves (period, from, until, except, at, for; instances inside the mission,
/// within their period and not past `until`; at most kMaxRoutineActivities); a routine's
/// activity may give the keys in `activity_keys` except start and end. InputError naming the
/// file, line and key, and the instance's date for a fault of one instance.
[[nodiscard]] std::vector<ActivityTable>
activity_tables(const toml::table& root, const std::string& file, const Mission& mission,
                const std::set<std::string>& activity_keys);

} // namespace crewdose::planner
