#pragma once
// The cache across runs on disk: one file per entry in a folder (the command line gives the
// user's cache folder, $XDG_CACHE_HOME/crewdose or ~/.cache/crewdose, and the build's identity).
// An entry is written whole to a temporary file in the folder and renamed over its name, so a
// concurrent run sees the old entry or the new one, never a part. Each entry carries a header:
//
//   8 bytes   magic "crewdose"
//   8 bytes   kFormatVersion (little-endian)
//   8 + n     the entry's identity: kind, build id and key, each ending in a line break
//   8 bytes   payload size
//   8 + 64    SHA-256 of the payload (hex)
//   payload
//
// An entry that is not exactly that (another format, another build, another key under the same
// file name, a short or long file, a payload whose digest differs) is not returned: the caller
// computes the data again and the store overwrites the entry. The file name is the kind and
// the digest of kind and key, not of the build: a new build replaces the old build's entries
// instead of adding to them. Each entry is read and checked once per DiskCache (one per run):
// the payloads it has read or stored are kept in memory for the other threads' marches.
#include "exposure/data_cache.hpp"

#include <atomic>
#include <cstddef>
#include <filesystem>
#include <map>
#include <memory>
#include <mutex>
#include <optional>
#include <string>
#include <string_view>

namespace crewdose::planner {

/// What a DiskCache did, for tests and benchmarks.
struct DiskCacheCounts {
    std::size_t hits = 0;     ///< entries returned (read from disk or kept in memory)
    std::size_t misses = 0;   ///< no entry under the name
    std::size_t rejected = 0; ///< an entry there that could not be trusted (see above)
    std::size_t stored = 0;   ///< entries written
    std::size_t failed = 0;   ///< entries that could not be written (dropped)
};

class DiskCache final : public exposure::DataCache {
  public:
    /// Version of the entry layout; entries of another are rebuilt.
    static constexpr std::uint64_t kFormatVersion = 1;
    /// Largest entry read, bytes (the largest written is below 1 MiB).
    static constexpr std::size_t kMaxEntryBytes = std::size_t{64} << 20;

    /// The cache in `folder` (created with mode 0700 when missing, as the XDG base-directory
    /// specification asks) for the build `build_id` (not empty). nullptr when the folder cannot
    /// be made or written, with the reason in `why_not`.
    [[nodiscard]] static std::unique_ptr<DiskCache>
    open(const std::filesystem::path& folder, std::string build_id, std::string* why_not);

    [[nodiscard]] std::optional<std::string> load(std::string_view kind,
                                                  std::string_view key) const override;
    void store(std::string_view kind, std::string_view key,
               std::string_view payload) const noexcept override;

    [[nodiscard]] const std::filesystem::path& folder() const noexcept { return folder_; }
    /// The file an entry lives in.
    [[nodiscard]] std::filesystem::path entry_path(std::string_view kind,
                                                   std::string_view key) const;
    [[nodiscard]] DiskCacheCounts counts() const noexcept;

  private:
    DiskCache(std::filesystem::path folder, std::string build_id);
    [[nodiscard]] std::string identity(std::string_view kind, std::string_view key) const;

    /// The payload kept for (kind, key) in memory, if any; and keeping one.
    [[nodiscard]] std::optional<std::string> remembered(const std::string& name) const;
    void remember(const std::string& name, std::string_view payload) const;

    std::filesystem::path folder_;
    std::string build_id_;
    mutable std::mutex memory_mutex_;
    mutable std::map<std::string, std::string> memory_; ///< by kind, line break, key
    mutable std::atomic<std::size_t> hits_{0};
    mutable std::atomic<std::size_t> misses_{0};
    mutable std::atomic<std::size_t> rejected_{0};
    mutable std::atomic<std::size_t> stored_{0};
    mutable std::atomic<std::size_t> failed_{0};
};

} // namespace crewdose::planner
