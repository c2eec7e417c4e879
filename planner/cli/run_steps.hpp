#pragma once
// The steps every scenario command takes in the same order, so that bad input writes nothing
// and costs no computation: check that every output can be written, read the scenario, refuse
// an output that would overwrite one of its inputs, compute the study under the progress line;
// then prepare every file in full before writing any.
#include "planner/cli/atomic_file.hpp"
#include "planner/cli/progress.hpp"
#include "planner/report/output_format.hpp"
#include "planner/scenario/scenario.hpp"
#include "planner/study/study.hpp"

#include <optional>
#include <string>
#include <vector>

namespace crewdose::cli {

/// The scenario at `scenario_path` for a command writing `outputs` (option and path; an empty
/// path is an option not given): an output that cannot be written is refused before anything is
/// read; with `refuse_gaps` a timeline with gaps is refused; then an output that would
/// overwrite the scenario or a file it names is refused. InputError on each.
[[nodiscard]] planner::Scenario load_for_outputs(const std::string& scenario_path,
                                                 const std::vector<planner::NamedFile>& outputs,
                                                 bool refuse_gaps = false);

/// The study of `scenario` (of `only_location` alone when given), its progress shown as the
/// stage `stage` of `progress`, with the cache across runs `cache` (null: none; it must outlive
/// the study).
[[nodiscard]] planner::Study
compute_study(planner::Scenario scenario, ProgressLine& progress, const exposure::DataCache* cache,
              const std::optional<std::string>& only_location = {},
              const std::string& stage = "computing each location's doses");

/// A file of an option such as --chart, prepared in full; written only when `path` was given.
struct PreparedFile {
    const char* option;
    std::string path;
    std::string text;
};

/// Whether a text report goes to a terminal that wants colour: text format, no --out, standard
/// output a terminal, and NO_COLOR unset (no-color.org, common practice).
[[nodiscard]] bool colour_wanted(const std::string& out_path, planner::OutputFormat format);

/// Writes every prepared file whose path was given (each atomically, in order), then the report
/// to standard output or to `out_path` (--out).
void write_outputs(const std::vector<PreparedFile>& files, const std::string& report,
                   const std::string& out_path);

} // namespace crewdose::cli
