#pragma once
// Printing times: RFC 3339 in UTC to the second ("2031-05-09T14:00:00Z"), and a fmt::formatter
// so that fmt can print boost::posix_time::ptime (fmt 9 does not use operator<<).
#include <boost/date_time/posix_time/posix_time_types.hpp>
#include <fmt/format.h>

#include <string>

namespace crewdose::planner {

/// "YYYY-MM-DDTHH:MM:SSZ": RFC 3339 in UTC, whole seconds, as --onset, --from and the scenario
/// read it back.
[[nodiscard]] std::string format_time(const boost::posix_time::ptime& t);
/// As format_time, with the fraction of the second when there is one
/// ("2032-01-03T07:58:11.25Z"): what --onset reads back to the same instant.
[[nodiscard]] std::string format_time_exact(const boost::posix_time::ptime& t);
/// A duration in hours, for reports.
[[nodiscard]] double hours(const boost::posix_time::time_duration& d);
/// A duration in the largest of the units d, h, min and s that holds it a whole number of
/// times ("10 min", "5 s", "90 s", "12 h", "2 d"), as --step spells it (with a space); below a
/// second or not whole seconds, in seconds with their decimals.
[[nodiscard]] std::string format_duration(const boost::posix_time::time_duration& d);
/// The duration of `h` hours, to the microsecond.
[[nodiscard]] boost::posix_time::time_duration duration_from_hours(double h);

} // namespace crewdose::planner

template <> struct fmt::formatter<boost::posix_time::ptime> : fmt::formatter<std::string> {
    auto format(const boost::posix_time::ptime& t, format_context& ctx) const {
        return fmt::formatter<std::string>::format(crewdose::planner::format_time(t), ctx);
    }
};
