#pragma once
// The command line's parts: each subcommand adds itself and its options to the CLI11 app and
// returns the action that runs it once the arguments are parsed. The actions call the planner
// stages, write the report and return the exit code (0 success, 1 a limit or target not met);
// main() turns exceptions into messages and exit codes 2 and 3. Only cli/ includes CLI11.
#include "planner/report/output_format.hpp"
#include "planner/scenario/input_error.hpp"

#include <CLI/CLI.hpp>

#include <functional>
#include <string>

namespace crewdose::cli {

/// A subcommand and what it does when chosen.
struct Command {
    CLI::App* app;
    std::function<int()> run;
};

/// Writes a report to standard output as it is.
void write_stdout(const std::string& text);

// One per subcommand, in the order `crewdose --help` lists them.
[[nodiscard]] Command add_range_command(CLI::App& app);
[[nodiscard]] Command add_materials_command(CLI::App& app);
[[nodiscard]] Command add_depth_command(CLI::App& app);
[[nodiscard]] Command add_gcr_command(CLI::App& app);
[[nodiscard]] Command add_check_command(CLI::App& app);
[[nodiscard]] Command add_validate_command(CLI::App& app);
[[nodiscard]] Command add_shielding_command(CLI::App& app);
[[nodiscard]] Command add_shelter_command(CLI::App& app);
[[nodiscard]] Command add_storm_command(CLI::App& app);

} // namespace crewdose::cli
