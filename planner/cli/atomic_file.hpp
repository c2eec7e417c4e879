#pragma once
// Writing report files safely: never half a file, never through a planted link, never over an
// input or over another output of the same run.
#include <string>
#include <utility>
#include <vector>

namespace crewdose::planner {

/// Writes `contents` to `path` through a temporary file created exclusively (O_EXCL, so a
/// name planted there, a symbolic link included, is never followed or reused) in the same
/// folder, flushed to disk, then renamed over `path`: a failure never leaves half a file or
/// destroys the old one. A new file gets the permissions of the process's umask; a replaced
/// one keeps its own. InputError (field `field`) when the folder cannot be written or `path`
/// is a folder.
void write_file_atomically(const std::string& path, const std::string& contents,
                           const std::string& field);

/// A file named on the command line: its option (or "scenario") and its path.
struct NamedFile {
    std::string option;
    std::string path;
};

/// InputError (field: the output's option) when an output cannot be written where it is named:
/// the path is a folder, or its folder does not exist or is not writable. Checked before a run,
/// so that a bad path costs no computation and nothing is written; write_file_atomically still
/// reports anything that goes wrong later. Outputs with an empty path are skipped.
void refuse_unwritable_outputs(const std::vector<NamedFile>& outputs);

/// InputError when an output names the same file as an input (the scenario, a shielding table)
/// or as another output: the same path after resolving '.', '..' and links, or the same file
/// under another name (a hard link). Outputs with an empty path are skipped.
void refuse_clashing_outputs(const std::vector<NamedFile>& inputs,
                             const std::vector<NamedFile>& outputs);

} // namespace crewdose::planner
