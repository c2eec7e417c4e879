#include "planner/cli/run_steps.hpp"

#include "planner/cli/atomic_file.hpp"
#include "planner/cli/command.hpp"

#include <unistd.h>

#include <cstdio>
#include <cstdlib>
#include <utility>

namespace crewdose::cli {

planner::Scenario load_for_outputs(const std::string& scenario_path,
                                   const std::vector<planner::NamedFile>& outputs,
                                   bool refuse_gaps) {
    // A path that cannot be written fails now, before the computation.
    planner::refuse_unwritable_outputs(outputs);
    auto sc = planner::load_scenario(scenario_path);
    if (refuse_gaps) {
        planner::refuse_timeline_gaps(sc);
    }
    // Before the study is built: a clashing output costs no computation.
    planner::refuse_clashing_outputs(scenario_inputs(sc, scenario_path), outputs);
    return sc;
}

planner::Study compute_study(planner::Scenario scenario, ProgressLine& progress,
                             const exposure::DataCache* cache,
                             const std::optional<std::string>& only_location,
                             const std::string& stage) {
    progress.stage(stage);
    return planner::Study(
        std::move(scenario), only_location, [&progress](double f) { progress.update(f); }, cache);
}

bool colour_wanted(const std::string& out_path, planner::OutputFormat format) {
    return out_path.empty() && format == planner::OutputFormat::text &&
           isatty(fileno(stdout)) != 0 && std::getenv("NO_COLOR") == nullptr;
}

void write_outputs(const std::vector<PreparedFile>& files, const std::string& report,
                   const std::string& out_path) {
    for (const auto& f : files) {
        if (!f.path.empty()) {
            planner::write_file_atomically(f.path, f.text, f.option);
        }
    }
    write_report(report, out_path);
}

} // namespace crewdose::cli
