// crewdose command line: the subcommands (one file each, cli/*_command.cpp) and the exit codes;
// no physics here.
#include "planner/cli/command.hpp"
#include "planner/cli/provenance.hpp"
#include "planner/study/result_guard.hpp"

#include "exposure/parameter_error.hpp"

#include <fmt/format.h>

#include <cstdio>
#include <exception>
#include <filesystem>
#include <string>
#include <vector>

namespace crewdose::cli {

void write_stdout(const std::string& text) {
    std::fwrite(text.data(), 1, text.size(), stdout);
}

std::vector<planner::NamedFile> scenario_inputs(const planner::Scenario& scenario,
                                                const std::string& scenario_path) {
    std::vector<planner::NamedFile> inputs{{"scenario", scenario_path}};
    for (const auto& loc : scenario.locations) {
        if (loc.shielding_table_file) {
            inputs.push_back(
                {"shielding table",
                 (std::filesystem::path(scenario_path).parent_path() / *loc.shielding_table_file)
                     .string()});
        }
    }
    return inputs;
}

void add_quiet_flag(CLI::App* command, bool& quiet) {
    command->add_flag("--quiet,-q", quiet,
                      "no progress line (one shows on standard error only when it is a terminal "
                      "and the run takes over a second; never in a file, a pipe or CI)");
}

double near_share_of(double percent) {
    if (!(percent >= 1.0 && percent <= 100.0)) {
        throw InputError(
            {"command line", 0}, "--near",
            fmt::format("{:g} is not a percentage of the limit; allowed: 1 to 100", percent));
    }
    return percent / 100.0;
}

void write_report(const std::string& text, const std::string& out_path) {
    if (out_path.empty()) {
        write_stdout(text);
    } else {
        planner::write_file_atomically(out_path, text, "--out");
    }
}

} // namespace crewdose::cli

namespace {

constexpr int kExitBadInput = 2;
/// A result that could not be computed or an unexpected error: a defect of crewdose, never an
/// abort, and nothing written.
constexpr int kExitInternalFault = 3;

} // namespace

int main(int argc, char** argv) {
    using namespace crewdose;
    CLI::App app{"crewdose: radiation dose planning for crewed lunar, Mars and deep-space "
                 "missions.\n\nResults support, and never replace, review by licensed "
                 "radiation-protection staff.\nExit codes: 0 success; 1 a planning limit or "
                 "target not met (check, storm, shelter); 2 bad input or usage; 3 internal "
                 "fault (a result that could not be computed: nothing is written).",
                 "crewdose"};
    app.require_subcommand(1);
    app.set_version_flag("--version", "crewdose " + cli::tool_version());

    const std::vector<cli::Command> commands{
        cli::add_range_command(app),    cli::add_materials_command(app),
        cli::add_events_command(app),   cli::add_depth_command(app),
        cli::add_gcr_command(app),      cli::add_check_command(app),
        cli::add_validate_command(app), cli::add_shielding_command(app),
        cli::add_shelter_command(app),  cli::add_storm_command(app),
        cli::add_compare_command(app)};

    try {
        app.parse(argc, argv);
    } catch (const CLI::CallForHelp& e) {
        return app.exit(e);
    } catch (const CLI::CallForAllHelp& e) {
        return app.exit(e);
    } catch (const CLI::CallForVersion& e) {
        return app.exit(e);
    } catch (const CLI::ParseError& e) {
        std::fprintf(stderr, "crewdose: %s\nRun 'crewdose --help' for the commands.\n", e.what());
        return kExitBadInput;
    }

    try {
        for (const auto& c : commands) {
            if (c.app->parsed()) {
                return c.run();
            }
        }
    } catch (const InputError& e) {
        std::fprintf(stderr, "crewdose: %s\n", e.what());
        return kExitBadInput;
    } catch (const exposure::ParameterError& e) {
        std::fprintf(stderr, "crewdose: %s\n", e.what());
        return kExitBadInput;
    } catch (const planner::ResultFault& e) {
        std::fprintf(stderr,
                     "crewdose: internal fault: %s. No result was written; this is a defect of "
                     "crewdose, please report it with the input.\n",
                     e.what());
        return kExitInternalFault;
    } catch (const std::exception& e) {
        std::fprintf(stderr,
                     "crewdose: internal fault: %s. No result was written; this is a defect of "
                     "crewdose, please report it with the input.\n",
                     e.what());
        return kExitInternalFault;
    } catch (...) {
        std::fprintf(stderr, "crewdose: internal fault of unknown kind. No result was written; "
                             "this is a defect of crewdose, please report it with the input.\n");
        return kExitInternalFault;
    }
    return 0;
}
