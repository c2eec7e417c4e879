#pragma once
#include <optional>
#include <string_view>
#include <vector>

namespace crewdose::planner {

/// The whole of `text` as a finite number, or nullopt (empty, trailing characters, inf, nan).
[[nodiscard]] std::optional<double> parse_finite(std::string_view text);

/// `text` split at commas (items not trimmed; an empty text gives one empty item).
[[nodiscard]] std::vector<std::string_view> split_commas(std::string_view text);

} // namespace crewdose::planner
