#pragma once
// The bridge between geometry and physics: per organ, the response of a location as the
// equal-weight mean over directions of the response along each direction's combined path
// (atmosphere, scene walls, suit, tissue). DESIGN.md items 5 and 7: the fields are isotropic,
// every direction receives the full omnidirectional fluence, and directions blocked by the
// ground count as zero.
#include "planner/scenario/location_model.hpp"
#include "planner/study/body_depths.hpp"

#include "exposure/fragment_transport.hpp"
#include "exposure/response.hpp"
#include "exposure/table_library.hpp"
#include "habitats/directional_shielding.hpp"
#include "habitats/phantom.hpp"
#include "habitats/scene.hpp"
#include "habitats/surroundings.hpp"

#include <functional>
#include <map>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace crewdose::planner {

/// Everything that sets the shielding around one dose point.
struct LocationGeometry {
    const habitats::Scene* scene = nullptr; ///< may be null: no structures
    /// Imported shielding instead of a scene (each direction takes the nearest table row);
    /// evaluate such a location over the table's own directions.
    const habitats::DirectionalShielding* imported = nullptr;
    habitats::Point3 point; ///< dose point, m
    habitats::Surroundings surroundings;
    std::string atmosphere_material_id = "mars-atmosphere";
    std::optional<SuitModel> suit; ///< no suit when empty
    double heading_deg = 0.0;      ///< compass azimuth the person faces
    /// Lying on the back puts a suit's pack under the wearer instead of behind.
    habitats::Posture posture = habitats::Posture::standing;
    /// A uniform shell around the dose point, the same in every direction that is not blocked,
    /// inside the walls and outside the suit (shelter sizing adds one), outermost first.
    std::vector<habitats::PathSegment> shell;
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

/// The same for any transported particle (the GCR nuclei): the tables of `particle` in every
/// material crossed, tissue as the dose medium.
[[nodiscard]] std::vector<OrganResponse>
quick_model_responses(exposure::TableLibrary& tables, const MaterialResolver& materials,
                      const LocationGeometry& where,
                      const std::vector<habitats::Vector3>& directions,
                      const exposure::Particle& particle);

/// Responses of a body model's organs at a location: per direction, one path response for each
/// grid depth some organ needs, combined with the organs' weights (BodyDepths). `body` must
/// have been built for `directions` (or be direction-independent).
[[nodiscard]] std::vector<OrganResponse>
body_responses(exposure::TableLibrary& tables, const MaterialResolver& materials,
               const LocationGeometry& where, const std::vector<habitats::Vector3>& directions,
               const BodyDepths& body, const exposure::Particle& particle = exposure::proton());

/// Two marches of one field: for the GCR bracket, with nuclear reactions (removal, projectile
/// fragments and the secondaries: the modelled physics) and without any (every nucleus keeps
/// its charge), limits using the higher of each quantity; for an SPE's secondary factor, the
/// whole field and the primaries alone.
struct GcrMarches {
    exposure::FragmentTransport& with_reactions;
    exposure::FragmentTransport& without_reactions;
};

/// GCR dose rates per day of the quick body model's organs at a location, per modulation
/// potential: the whole ion field (exposure::gcr_free_space_field) marched through each
/// direction's combined path, the organs scored one after the other along the tissue (so the
/// external path is crossed once per direction, phi and march), the equal-weight mean over
/// `directions` with blocked ones as zero. Keyed by (organ, phi); with_removal is the march
/// with reactions, without_removal the one without.
[[nodiscard]] std::map<std::pair<std::string, double>, exposure::BracketedDose>
gcr_quick_model_doses(const GcrMarches& marches, const MaterialResolver& materials,
                      const LocationGeometry& where,
                      const std::vector<habitats::Vector3>& directions,
                      std::span<const double> phis_MV);

/// The same for any body model: along each direction the field is marched through the tissue
/// grid depths the organs need, in increasing order, and each organ takes its weights of the
/// doses there.
[[nodiscard]] std::map<std::pair<std::string, double>, exposure::BracketedDose>
gcr_body_doses(const GcrMarches& marches, const MaterialResolver& materials,
               const LocationGeometry& where, const std::vector<habitats::Vector3>& directions,
               const BodyDepths& body, std::span<const double> phis_MV);

/// The organ doses of any incident fields (each IonField as from gcr_free_space_field(), on
/// the marches' grid) at a location: each field marched through each direction's path and the
/// tissue, both marches; the equal-weight mean over every `direction_stride`-th direction of
/// `directions` (blocked ones as zero). Result [field][organ], organs in body.organs order.
[[nodiscard]] std::vector<std::vector<exposure::BracketedDose>>
field_body_doses(const GcrMarches& marches, const MaterialResolver& materials,
                 const LocationGeometry& where, const std::vector<habitats::Vector3>& directions,
                 const BodyDepths& body, std::span<const exposure::IonField> fields,
                 std::size_t direction_stride = 1);

/// The layer path of one direction, outermost first, before any tissue: atmosphere (slant
/// column, when the site has one), the scene's walls from outside in, any uniform shell, the suit.
[[nodiscard]] std::vector<habitats::PathSegment> external_path(const LocationGeometry& where,
                                                               habitats::Vector3 direction);

} // namespace crewdose::planner
