#pragma once
// A scenario with its per-(location, organ) responses computed once per run.
#include "location_response.hpp"
#include "scenario.hpp"

#include "exposure/table_library.hpp"
#include "habitats/directional_shielding.hpp"

#include <map>
#include <memory>
#include <string>
#include <tuple>

namespace crewdose::planner {

/// Responses of every location and organ, shared by every crew member and activity.
class Study {
  public:
    explicit Study(Scenario scenario);

    [[nodiscard]] const Scenario& scenario() const noexcept { return sc_; }
    /// The organ response at a location (organ: bfo, lens, skin).
    [[nodiscard]] const OrganResponse& response(const std::string& location,
                                                const std::string& organ) const;
    /// Limit-check dose quantities of an event's whole fluence at a location and organ (folded
    /// once per run, at construction).
    [[nodiscard]] exposure::DoseQuantities
    event_dose(const std::string& location, const std::string& organ, const EventSpec& event) const;
    [[nodiscard]] const LocationSpec& location(const std::string& id) const;
    /// The geometry of a location and the directions its responses were computed over.
    [[nodiscard]] const LocationGeometry& geometry(const std::string& id) const;
    [[nodiscard]] const std::vector<habitats::Vector3>& directions(const std::string& id) const;
    [[nodiscard]] std::size_t direction_count() const noexcept { return directions_; }

  private:
    Scenario sc_;
    exposure::TableLibrary tables_;
    std::vector<std::unique_ptr<habitats::Scene>> scenes_;
    std::vector<std::unique_ptr<habitats::DirectionalShielding>> imported_;
    std::map<std::pair<std::string, std::string>, OrganResponse> responses_;
    std::map<std::string, LocationGeometry> geometries_;
    std::map<std::tuple<std::string, std::string, std::string>, exposure::DoseQuantities>
        event_doses_;
    std::map<std::string, std::vector<habitats::Vector3>> location_directions_;
    std::size_t directions_ = 0;
};

} // namespace crewdose::planner
