#pragma once
// The bridge between geometry and physics: per organ, the response of a location as the
// equal-weight mean over directions of the response along each direction's combined path
// (atmosphere, scene walls, suit, tissue). DESIGN.md items 5 and 7: the fields are isotropic,
// every direction receives the full omnidirectional fluence, and directions blocked by the
// ground count as zero.
#include "exposure/response.hpp"
#include "exposure/table_library.hpp"
#include "habitats/scene.hpp"
#include "habitats/surroundings.hpp"

#include <functional>
#include <string>
#include <vector>

namespace crewdose::planner {

/// An organ of the quick screening body model: the same tissue depth in every direction
/// (conservative; common practice depths skin 0.07 mm, lens 3 mm, BFO 5 cm).
struct QuickOrgan {
    std::string name;
    double depth_g_cm2;
};
[[nodiscard]] std::vector<QuickOrgan> quick_body_model();

/// A suit layer on every direction (the planner's suit model for the quick body).
struct SuitLayer {
    std::string material_id;
    double areal_density_g_cm2;
};

/// Everything that sets the shielding around one dose point.
struct LocationGeometry {
    const habitats::Scene* scene = nullptr; ///< may be null: no structures
    habitats::Point3 point;                 ///< dose point, m
    habitats::Surroundings surroundings;
    std::string atmosphere_material_id = "mars-atmosphere";
    std::vector<SuitLayer> suit; ///< empty: no suit
};

/// The response of one organ at a location, and what the directions saw.
struct OrganResponse {
    std::string organ;
    exposure::PathResponse response; ///< mean over directions (blocked ones as zero)
    double blocked_fraction = 0.0;   ///< share of directions ending in the ground
};

/// Maps a material id from the geometry to a material; throws InputError when unknown.
using MaterialResolver = std::function<const exposure::Material&(const std::string&)>;

/// Responses for the quick body model's organs at a location, over `directions` (unit
/// vectors, equal weight).
[[nodiscard]] std::vector<OrganResponse>
quick_model_responses(exposure::TableLibrary& tables, const MaterialResolver& materials,
                      const LocationGeometry& where,
                      const std::vector<habitats::Vector3>& directions);

/// The layer path of one direction, outermost first, before any tissue: atmosphere (slant
/// column, when the site has one), the scene's walls from outside in, the suit.
[[nodiscard]] std::vector<habitats::PathSegment> external_path(const LocationGeometry& where,
                                                               habitats::Vector3 direction);

} // namespace crewdose::planner
