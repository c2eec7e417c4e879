#pragma once
// Storm-shelter sizing: how much of a material a shelter needs so that a design event, received
// in the shelter, plus the crew's other dose in the same 30 days stays within each target.
#include "planner/study/study.hpp"

#include <functional>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace crewdose::planner {

struct ShelterRequest {
    std::string event_id;
    std::string location_id;
    std::vector<std::string> materials{"water"};
    /// Targets in mGy-Eq by organ; organs not named keep their 30-day planning limit.
    std::map<std::string, double> targets;
    /// Thicken this solid of the location: a layer of the material is added directly inside
    /// its layer `layer_index` (0-based, outside first). Without it: a uniform shell around the
    /// dose point, the same in every direction.
    std::optional<std::string> solid_id;
    std::size_t layer_index = 0;
    double max_g_cm2 = 200.0; ///< the largest areal density tried
};

/// One point of the dose-thickness curve: the limit-check dose (uncertainty factor applied) of
/// the design event in the shelter, per organ, mGy-Eq.
struct ShelterPoint {
    double areal_density_g_cm2 = 0.0;
    std::map<std::string, double> event_mGyEq;
};

struct ShelterAnswer {
    std::string material;
    double density_g_cm3 = 0.0;
    bool achievable = false;          ///< a thickness up to max_g_cm2 meets every target
    bool none_needed = false;         ///< the targets are met with nothing added
    double areal_density_g_cm2 = 0.0; ///< the minimum found (when achievable)
    double thickness_cm = 0.0;
    std::optional<double> added_mass_kg; ///< for a named solid layer of a bounded shape
    double mass_per_area_kg_m2 = 0.0;
    std::string binding_organ;       ///< the organ whose target sets the answer
    std::vector<ShelterPoint> curve; ///< around the answer, increasing areal density
    int evaluations = 0;             ///< dose evaluations the root find used
    double searched_to_g_cm2 = 0.0;  ///< the largest areal density tried
    /// A named layer can grow only until it reaches the dose point or another solid.
    bool limited_by_room = false;
};

struct ShelterReport {
    ShelterRequest request;
    /// Per organ: the target, and the crew's highest 30-day dose from everything but this event
    /// (the other dose that shares the window; the highest crew member, wherever it lies).
    std::map<std::string, double> target_mGyEq;
    std::map<std::string, double> other_30d_mGyEq;
    /// Organs whose other 30-day dose alone already reaches or exceeds the target (or is not a
    /// number): no shelter can meet those targets, and no thickness is searched for.
    std::vector<std::string> other_alone_exceeds;
    /// Organs the shelter's body model gives that are not targets, and why: "cho at rover"
    /// (a crew member's ledger lacks them where the quick model stands), per organ.
    std::map<std::string, std::string> not_targets;
    std::vector<ShelterAnswer> answers;
    /// The heliocentric distance the event is taken at (shelter_sun_distance) and the factor on
    /// its spectrum as written there.
    double sun_distance_AU = 1.0;
    double fluence_scale = 1.0;
};

/// Where a shelter meets an event: a shelter on the surface at the site's distance; one in space
/// (a deep-space location, or any on a deep-space mission) at the nearest distance to the Sun
/// that any crew member reaches, where the event is strongest.
[[nodiscard]] double shelter_sun_distance(const Study& study, const std::string& location_id);

/// Reads one --target value, "ORGAN=VALUE" with an optional unit "mGyEq" (bfo=250mGyEq) into
/// `targets`; InputError naming --target otherwise.
void parse_shelter_target(const std::string& text, std::map<std::string, double>& targets);

/// Reads --layer "SOLID:LAYER" (LAYER: the layer's number, 1 = outermost, or its material id
/// when only one layer has it) against the scenario into `request`.
void parse_shelter_layer(const Study& study, const std::string& text, ShelterRequest& request);

/// Sizes the shelter for every requested material. `study` is the scenario's; InputError for
/// an unknown event, location, solid, layer, material or organ.
/// `progress`, when given, is told the share of the sizing done (0 to 1) as it goes.
[[nodiscard]] ShelterReport size_shelter(const Study& study, const ShelterRequest& request,
                                         const std::function<void(double)>& progress = {});

/// The event dose at the location with `areal_density_g_cm2` of `material` added as the
/// request says, per organ (uncertainty factor applied), mGy-Eq. Used by the root find and to
/// put an answer back into a plain evaluation.
[[nodiscard]] std::map<std::string, double> sheltered_event_dose(const Study& study,
                                                                 const ShelterRequest& request,
                                                                 const std::string& material,
                                                                 double areal_density_g_cm2);

} // namespace crewdose::planner
