#pragma once
// The command line's parts: each subcommand adds itself and its options to the CLI11 app and
// returns the action that runs it once the arguments are parsed. The actions call the planner
// stages, write the report and return the exit code (0 success, 1 a limit or target not met);
// main() turns exceptions into messages and exit codes 2 and 3. Only cli/ includes CLI11.
#include "planner/cli/atomic_file.hpp"
#include "planner/cli/provenance.hpp"
#include "planner/report/output_format.hpp"
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/scenario.hpp"

#include <CLI/CLI.hpp>

#include <functional>
#include <string>
#include <vector>

namespace crewdose::cli {

/// A subcommand and what it does when chosen.
struct Command {
    CLI::App* app;
    std::function<int()> run;
};

/// Writes a report to standard output as it is.
void write_stdout(const std::string& text);

/// The files a run on `scenario` reads (the scenario, its locations' shielding tables), which
/// no output may overwrite (planner::refuse_clashing_outputs).
[[nodiscard]] std::vector<planner::NamedFile> scenario_inputs(const planner::Scenario& scenario,
                                                              const std::string& scenario_path);

/// `text` to standard output, or written atomically to `out_path` (option --out) when one is
/// given.
void write_report(const std::string& text, const std::string& out_path);

/// --near PERCENT as the share of a limit from which a dose is "near" (0.01 to 1); InputError
/// naming --near outside 1 to 100 (a NaN included).
[[nodiscard]] double near_share_of(double percent);

/// Adds --quiet (no progress line) to a command that can run for seconds.
void add_quiet_flag(CLI::App* command, bool& quiet);

/// The help text of every --out option.
inline constexpr const char* kOutHelp =
    "write the report to this file instead of standard output (written whole, only when the "
    "run succeeds; never over an input)";

// One per subcommand, in the order `crewdose --help` lists them.
[[nodiscard]] Command add_range_command(CLI::App& app);
[[nodiscard]] Command add_materials_command(CLI::App& app);
[[nodiscard]] Command add_events_command(CLI::App& app);
[[nodiscard]] Command add_depth_command(CLI::App& app);
[[nodiscard]] Command add_gcr_command(CLI::App& app);
[[nodiscard]] Command add_check_command(CLI::App& app);
[[nodiscard]] Command add_validate_command(CLI::App& app);
[[nodiscard]] Command add_shielding_command(CLI::App& app);
[[nodiscard]] Command add_shelter_command(CLI::App& app);
[[nodiscard]] Command add_storm_command(CLI::App& app);
[[nodiscard]] Command add_compare_command(CLI::App& app);

} // namespace crewdose::cli
