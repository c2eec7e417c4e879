#pragma once
#include <cstdint>
#include <optional>
#include <string_view>
#include <vector>

namespace crewdose::planner {

/// The whole of `text` as a finite number, or nullopt (empty, trailing characters, inf, nan).
[[nodiscard]] std::optional<double> parse_finite(std::string_view text);

/// `text` split at commas (items not trimmed; an empty text gives one empty item).
[[nodiscard]] std::vector<std::string_view> split_commas(std::string_view text);

/// A duration written as a number and a unit, the units of the command line's durations: s,
/// min, h or d ("90min", "1.5h", "2d"), in whole seconds; nullopt when `text` is not one, is
/// negative, is not a whole number of seconds or exceeds 1000 years (callers state their own
/// narrower range).
[[nodiscard]] std::optional<std::int64_t> parse_duration_s(std::string_view text);

} // namespace crewdose::planner
