#pragma once
// What every JSON and CSV output says about the run that made it: the tool and its version,
// the scenario file and the SHA-256 of its content, and the time of the run (RFC 3339, UTC;
// the SOURCE_DATE_EPOCH convention of reproducible builds fixes it, which the expected-output
// tests use). Added here, at the command line, the only stage that knows the run; the reports
// themselves stay free of it. Text reports already name the scenario in their title.
#include "planner/report/output_format.hpp"
#include "planner/scenario/scenario.hpp"

#include <string>
#include <utility>
#include <vector>

namespace crewdose::cli {

struct RunStamp {
    std::string version;
    std::string scenario;        ///< the path as given; empty for commands without a scenario
    std::string scenario_sha256; ///< empty with it
    std::string scenario_b;      ///< `compare`'s second plan; empty otherwise
    std::string scenario_b_sha256;
    std::string run_at;
};

/// The stamp of this run, for a command that read `scenario` (nullptr: none). The time is now,
/// or SOURCE_DATE_EPOCH (whole seconds since 1970-01-01T00:00:00Z) when that is set; a value
/// that is not such a number is an InputError naming it.
[[nodiscard]] RunStamp run_stamp(const planner::Scenario* scenario,
                                 const planner::Scenario* second = nullptr);

/// `output` with the stamp: JSON gains a "provenance" object, CSV a first line beginning with
/// "# " (readers that skip comment lines, such as pandas with comment='#', read on); text is
/// returned as it is.
[[nodiscard]] std::string stamped(const std::string& output, planner::OutputFormat format,
                                  const RunStamp& stamp);

/// The stamp as an HTML page's foot (label and value): the tool, the scenario (both plans for
/// `compare`) with its SHA-256, the run time.
[[nodiscard]] std::vector<std::pair<std::string, std::string>> html_about(const RunStamp& stamp);

/// "crewdose <version>", the build's project version.
[[nodiscard]] std::string tool_version();

} // namespace crewdose::cli
