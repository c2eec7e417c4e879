#pragma once
#include "material.hpp"
#include "particle.hpp"
#include "range_table.hpp"

#include <map>
#include <memory>
#include <string>
#include <utility>

namespace crewdose::exposure {

/// Range tables built on demand and kept for the run, one per (material, particle), all on the
/// same energy grid; every table carries its nuclear optical depth (nuclear.hpp). References stay
/// valid as long as the library lives. Not thread-safe: fill it before any parallel use.
class TableLibrary {
  public:
    explicit TableLibrary(EnergyGridSpec grid = {}) : grid_(grid) {}

    /// The table of `particle` in `material`, built the first time it is asked for. Materials
    /// are told apart by id: two different materials must not share one.
    const RangeTable& table(const Material& material, const Particle& particle);

    [[nodiscard]] const EnergyGridSpec& grid() const noexcept { return grid_; }
    [[nodiscard]] std::size_t size() const noexcept { return tables_.size(); }

  private:
    EnergyGridSpec grid_;
    std::map<std::pair<std::string, int>, std::unique_ptr<RangeTable>> tables_;
};

} // namespace crewdose::exposure
