#pragma once
// The cache across runs as the command line uses it: where it lives (the XDG base-directory
// specification's user cache folder), which build it belongs to, and --no-cache. The study
// only sees an exposure::DataCache, or none.
#include "planner/study/disk_cache.hpp"

#include <CLI/CLI.hpp>

#include <filesystem>
#include <memory>
#include <optional>
#include <string>

namespace crewdose::cli {

/// The user's cache folder for crewdose: $XDG_CACHE_HOME/crewdose when XDG_CACHE_HOME is an
/// absolute path, else $HOME/.cache/crewdose (the specification ignores a relative one);
/// nullopt when neither gives an absolute path.
[[nodiscard]] std::optional<std::filesystem::path> user_cache_folder();

/// The identity of this executable: the version and the GNU build id the linker wrote into it
/// (a digest of the linked code and data, so it changes whenever the code that computes a
/// cached entry, or a compiled-in table it reads, can have changed). Empty when the
/// executable carries none.
[[nodiscard]] std::string executable_build_id();

/// Adds --no-cache to a command that computes doses.
void add_no_cache_flag(CLI::App* command, bool& no_cache);

/// The cache of a run: none with --no-cache; otherwise the user's cache folder, or none with a
/// one-line note on standard error when it cannot be used (the run goes on without).
[[nodiscard]] std::unique_ptr<planner::DiskCache> open_run_cache(bool no_cache);

} // namespace crewdose::cli
