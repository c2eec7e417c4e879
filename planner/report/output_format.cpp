#include "planner/report/output_format.hpp"

#include "planner/scenario/input_error.hpp"

#include <fmt/format.h>

#include <string>

namespace crewdose::planner {
namespace {

const SourceLocation kCommandLine{"command line", 0};

} // namespace

OutputFormat parse_output_format(std::string_view text) {
    if (text == "text") {
        return OutputFormat::text;
    }
    if (text == "json") {
        return OutputFormat::json;
    }
    if (text == "csv") {
        return OutputFormat::csv;
    }
    throw InputError(kCommandLine, "--format",
                     fmt::format("'{}' is not a format; allowed: text, json, csv", text));
}

} // namespace crewdose::planner
