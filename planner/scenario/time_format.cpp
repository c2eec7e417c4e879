#include "planner/scenario/time_format.hpp"

#include <cmath>
#include <cstdint>
#include <utility>

namespace crewdose::planner {

std::string format_time(const boost::posix_time::ptime& t) {
    const auto d = t.date();
    const auto tod = t.time_of_day();
    // Always with seconds: RFC 3339 as the command line and the scenario read it back.
    return fmt::format("{:04d}-{:02d}-{:02d}T{:02d}:{:02d}:{:02d}Z", static_cast<int>(d.year()),
                       static_cast<int>(d.month()), static_cast<int>(d.day()), tod.hours(),
                       tod.minutes(), tod.seconds());
}

std::string format_time_exact(const boost::posix_time::ptime& t) {
    std::string text = format_time(t);
    const auto us = t.time_of_day().total_microseconds() % 1'000'000;
    if (us != 0) {
        std::string fraction = fmt::format(".{:06d}", us);
        while (fraction.back() == '0') {
            fraction.pop_back();
        }
        text.insert(text.size() - 1, fraction);
    }
    return text;
}

double hours(const boost::posix_time::time_duration& d) {
    return static_cast<double>(d.total_microseconds()) / 3.6e9;
}

std::string format_duration(const boost::posix_time::time_duration& d) {
    const std::int64_t us = d.total_microseconds();
    if (us != 0 && us % 1'000'000 == 0) {
        const std::int64_t s = us / 1'000'000;
        for (const auto& [unit, seconds] : {std::pair{"d", 86400}, std::pair{"h", 3600},
                                            std::pair{"min", 60}, std::pair{"s", 1}}) {
            if (s % seconds == 0) {
                return fmt::format("{} {}", s / seconds, unit);
            }
        }
    }
    return fmt::format("{} s", static_cast<double>(us) / 1e6);
}

boost::posix_time::time_duration duration_from_hours(double h) {
    return boost::posix_time::microseconds(static_cast<std::int64_t>(std::llround(h * 3.6e9)));
}

} // namespace crewdose::planner
