#include "study.hpp"

#include "shielding_table_file.hpp"

#include "habitats/direction_set.hpp"

#include <algorithm>
#include <filesystem>
#include <stdexcept>

namespace crewdose::planner {

Study::Study(Scenario scenario) : sc_(std::move(scenario)), directions_(sc_.mission.directions) {
    const MaterialResolver materials = [this](const std::string& id) -> const exposure::Material& {
        const auto* m = sc_.material(id);
        if (!m) {
            throw std::logic_error("unvalidated material id " + id);
        }
        return *m;
    };
    const auto dirs = habitats::fibonacci_directions(directions_);
    for (const auto& loc : sc_.locations) {
        LocationGeometry where;
        where.point = loc.point_m;
        where.suit = loc.suit;
        where.heading_deg = loc.heading_deg;
        if (!loc.deep_space && sc_.mission.site != SiteKind::deep_space) {
            where.surroundings.ground = true;
            where.surroundings.mask = sc_.mission.terrain_mask;
            if (sc_.mission.site == SiteKind::mars) {
                where.surroundings.atmosphere = habitats::mars_atmosphere(
                    sc_.mission.surface_pressure_Pa, sc_.mission.scale_height_km);
            }
        }
        std::vector<habitats::Vector3> loc_dirs = dirs;
        if (loc.shielding_table_file) {
            const auto base = std::filesystem::path(sc_.file).parent_path();
            auto known = [this](const std::string& id) {
                return sc_.material(id) != nullptr;
            };
            imported_.push_back(std::make_unique<habitats::DirectionalShielding>(
                read_shielding_table((base / *loc.shielding_table_file).string(), known)));
            where.imported = imported_.back().get();
            loc_dirs = where.imported->directions;
        } else {
            std::vector<habitats::Solid> around;
            for (const auto& s : sc_.solids) {
                if (std::find(loc.solids.begin(), loc.solids.end(), s.id) != loc.solids.end()) {
                    around.push_back(s);
                }
            }
            scenes_.push_back(std::make_unique<habitats::Scene>(std::move(around)));
            where.scene = scenes_.back().get();
        }
        geometries_[loc.id] = where;
        location_directions_[loc.id] = loc_dirs;
        for (auto& r : quick_model_responses(tables_, materials, where, loc_dirs)) {
            const std::string organ = r.organ;
            responses_.emplace(std::make_pair(loc.id, organ), std::move(r));
        }
    }
    // Every event folded once with every response: the ledger asks for these per activity.
    for (const auto& ev : sc_.events) {
        for (const auto& [key, r] : responses_) {
            const auto fluences =
                exposure::node_fluences(ev.spectrum, r.response.node_energies_MeV_per_n);
            event_doses_[{key.first, key.second, ev.id}] =
                exposure::fold(r.response, fluences).for_limits();
        }
    }
}

const OrganResponse& Study::response(const std::string& location, const std::string& organ) const {
    return responses_.at({location, organ});
}

exposure::DoseQuantities Study::event_dose(const std::string& location, const std::string& organ,
                                           const EventSpec& event) const {
    return event_doses_.at({location, organ, event.id});
}

const LocationGeometry& Study::geometry(const std::string& id) const {
    return geometries_.at(id);
}

const std::vector<habitats::Vector3>& Study::directions(const std::string& id) const {
    return location_directions_.at(id);
}

const LocationSpec& Study::location(const std::string& id) const {
    for (const auto& l : sc_.locations) {
        if (l.id == id) {
            return l;
        }
    }
    throw std::logic_error("unknown location " + id);
}

} // namespace crewdose::planner
