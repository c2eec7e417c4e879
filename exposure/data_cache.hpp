#pragma once
// A store of computed data that outlives the run: what the physics computes from nothing but
// compiled-in data and a few inputs (the march data of a material, the phantom's tissue depths)
// is kept by key and read back instead of computed again. exposure knows no files: the planner
// gives the store (planner/study/disk_cache.hpp) and says whether there is one at all.
#include <optional>
#include <string>
#include <string_view>

namespace crewdose::exposure {

/// Payloads by kind (a short name: what the data are) and key (every input the data depend
/// on, spelled exactly). A store must tell the build apart itself (an entry of another build is
/// never returned) and must be safe to call from several threads at once.
class DataCache {
  public:
    DataCache() = default;
    virtual ~DataCache() = default;
    DataCache(const DataCache&) = delete;
    DataCache& operator=(const DataCache&) = delete;
    DataCache(DataCache&&) = delete;
    DataCache& operator=(DataCache&&) = delete;

    /// The payload stored for (kind, key), byte for byte as stored, or nullopt when there is
    /// none that can be trusted.
    [[nodiscard]] virtual std::optional<std::string> load(std::string_view kind,
                                                          std::string_view key) const = 0;
    /// Keeps `payload` for (kind, key), replacing any entry there. Never throws: a store that
    /// cannot keep it drops it.
    virtual void store(std::string_view kind, std::string_view key,
                       std::string_view payload) const noexcept = 0;
};

} // namespace crewdose::exposure
