#pragma once
// Body models behind one interface: what puts tissue in front of the organs at a location. The
// registry is the list in planner/scenario/body_models.hpp (one line per model, data only, so
// that the loader can check ids); body_models() and body_model() here give the models
// themselves. DEVELOPERS.md, "Adding a body model".
#include "planner/scenario/body_models.hpp"
#include "planner/scenario/scenario.hpp"
#include "planner/study/location_response.hpp"

#include "exposure/data_cache.hpp"
#include "exposure/range_table.hpp"
#include "exposure/table_library.hpp"
#include "habitats/phantom.hpp"
#include "habitats/vector.hpp"

#include <memory>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace crewdose::planner {

/// How a body is placed at a location: what its tissue depths depend on besides the directions.
struct BodyPlacement {
    habitats::Posture posture = habitats::Posture::standing;
    double heading_deg = 0.0; ///< compass azimuth the person faces
};

/// A body model's depths at one placement for both sources: on its SPE tissue grid over the SPE
/// directions, and on its GCR tissue grid over the GCR directions.
struct SourceBodyDepths {
    BodyDepths spe;
    BodyDepths gcr;
};

/// A body model: its organs, the energy grid its SPE responses need, and the tissue depths in
/// front of its organs (BodyDepths), from which body_responses() and the GCR marches
/// (gcr_body_doses, field_body_doses) make the organ responses at a location.
class BodyModel {
  public:
    explicit BodyModel(const BodyModelName& name) : name_(name) {}
    virtual ~BodyModel() = default;
    BodyModel(const BodyModel&) = delete;
    BodyModel& operator=(const BodyModel&) = delete;
    BodyModel(BodyModel&&) = delete;
    BodyModel& operator=(BodyModel&&) = delete;

    /// Its id as written in the scenario (location.body).
    [[nodiscard]] std::string_view id() const noexcept { return name_.id; }
    /// What it is, in one line (messages and --help).
    [[nodiscard]] std::string_view summary() const noexcept { return name_.summary; }
    /// True when location.posture applies to it.
    [[nodiscard]] bool has_posture() const noexcept { return name_.has_posture; }

    /// The organs it evaluates, in output order (each one of ledger_organs(); a limit on an
    /// organ it lacks is not evaluated where a crew member is at such a location).
    [[nodiscard]] virtual std::vector<std::string> organs() const = 0;
    /// The proton table grid of its SPE responses.
    [[nodiscard]] virtual exposure::EnergyGridSpec spe_grid() const = 0;
    /// Its depths on the SPE tissue grid over `directions` (unit vectors); `threads` may share
    /// the work (the result does not depend on it).
    [[nodiscard]] virtual BodyDepths spe_depths(const BodyPlacement& placement,
                                                const std::vector<habitats::Vector3>& directions,
                                                std::size_t threads = 1) const = 0;
    /// Its depths on the GCR march's tissue grid over `directions`.
    [[nodiscard]] virtual BodyDepths gcr_depths(const BodyPlacement& placement,
                                                const std::vector<habitats::Vector3>& directions,
                                                std::size_t threads = 1) const = 0;
    /// Both at once (a model may share the work between them): spe_depths over
    /// `spe_directions`, gcr_depths over `gcr_directions`.
    [[nodiscard]] virtual SourceBodyDepths
    depths(const BodyPlacement& placement, const std::vector<habitats::Vector3>& spe_directions,
           const std::vector<habitats::Vector3>& gcr_directions, std::size_t threads) const;
    /// Everything depths() depends on besides the code, spelled exactly (the cache across runs
    /// keeps its result under it); nullopt, the default, when the depths cost too little to be
    /// worth keeping.
    [[nodiscard]] virtual std::optional<std::string>
    depths_key(const BodyPlacement& placement, const std::vector<habitats::Vector3>& spe_directions,
               const std::vector<habitats::Vector3>& gcr_directions) const;
    /// Per organ of `body` (spe_depths' or gcr_depths'), every sample point's own tissue along
    /// each direction before it is split onto the grid, for reports; nullopt when the grid holds
    /// each organ's depths exactly (one depth per organ, as in BodyDepths).
    [[nodiscard]] virtual std::optional<std::vector<std::vector<DepthSample>>>
    depth_samples(const BodyPlacement& placement, const std::vector<habitats::Vector3>& directions,
                  const BodyDepths& body) const = 0;
    /// How the check report describes it for `mission` (what it is and its settings; the report
    /// adds " at " and the locations using it).
    [[nodiscard]] virtual std::string report_text(const Mission& mission) const = 0;
    /// The shielding report's heading of its organ table (one or more lines, each ending in
    /// '\n').
    [[nodiscard]] virtual std::string organ_table_heading() const = 0;

    /// Its organs' SPE (proton) responses at a location: body_responses() with spe_depths() for
    /// the location's placement. `tables` should be on spe_grid().
    [[nodiscard]] std::vector<OrganResponse>
    responses(exposure::TableLibrary& tables, const MaterialResolver& materials,
              const LocationGeometry& where,
              const std::vector<habitats::Vector3>& directions) const;

  private:
    const BodyModelName& name_;
};

/// The DataCache kind of a body model's depths.
inline constexpr std::string_view kBodyDepthsCacheKind = "body-depths";

/// `body.depths(...)` read from `cache` when it holds them under the model's depths_key()
/// (bit for bit what depths() computes), else computed and stored there; `cache` may be null.
[[nodiscard]] SourceBodyDepths cached_depths(const BodyModel& body, const BodyPlacement& placement,
                                             const std::vector<habitats::Vector3>& spe_directions,
                                             const std::vector<habitats::Vector3>& gcr_directions,
                                             std::size_t threads, const exposure::DataCache* cache);

/// The cache's payload of both sources' depths, and back (nullopt when `payload` does not
/// decode into depths of `spe_directions` and `gcr_directions` directions).
[[nodiscard]] std::string encode_body_depths(const SourceBodyDepths& depths);
[[nodiscard]] std::optional<SourceBodyDepths> decode_body_depths(std::string_view payload,
                                                                 std::size_t spe_directions,
                                                                 std::size_t gcr_directions);

/// Where a location places the body.
[[nodiscard]] BodyPlacement placement_of(const LocationGeometry& where);

/// Every registered body model, in the registry's order (planner/scenario/body_models.hpp).
[[nodiscard]] std::span<const BodyModel* const> body_models();
/// The model with this id; std::logic_error for an id the loader does not accept.
[[nodiscard]] const BodyModel& body_model(std::string_view id);

// The registry's models, each defined in its own file (planner/study/<id>_body_model.cpp).
#define CREWDOSE_DECLARE_BODY_MODEL(id, summary, has_posture, spe_directions)                      \
    [[nodiscard]] std::unique_ptr<BodyModel> make_body_model_##id(const BodyModelName& name);
CREWDOSE_BODY_MODELS(CREWDOSE_DECLARE_BODY_MODEL)
#undef CREWDOSE_DECLARE_BODY_MODEL

} // namespace crewdose::planner
