#pragma once
// The output formats every report writer offers.
#include <string_view>

namespace crewdose::planner {

enum class OutputFormat { text, json, csv };

/// "text", "json" or "csv"; InputError (field "--format") otherwise.
[[nodiscard]] OutputFormat parse_output_format(std::string_view text);

} // namespace crewdose::planner
