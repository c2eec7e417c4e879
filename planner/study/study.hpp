#pragma once
// A scenario with its per-(location, organ) responses computed once per run.
#include "planner/scenario/scenario.hpp"
#include "planner/study/body_model.hpp"
#include "planner/study/location_response.hpp"

#include "exposure/data_cache.hpp"
#include "exposure/table_library.hpp"
#include "habitats/directional_shielding.hpp"

#include <functional>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <tuple>

namespace crewdose::planner {

/// Energy grid density of the GCR range tables and responses (nodes per decade). Convergence
/// against 128 per decade, all 27 nuclei at phi = 400 MV behind 1, 10 and 40 g/cm2 aluminium
/// plus 5 cm water, absorbed dose and dose equivalent, both removal cases: 8 differ by up to
/// 0.26 %, 12 by 0.12 %, 16 by 0.06 %, 32 by 0.02 %; the march with fragments, 12 against 48
/// behind 20 g/cm2 aluminium or 100 g/cm2 regolith plus 5 cm tissue: 0.13-0.31 %. Twelve
/// keeps the GCR part of a run with the phantom (whose organs need 12 tissue depths per
/// direction) within its budget; the GCR model's own uncertainty is tens of per cent.
inline constexpr std::size_t kGcrNodesPerDecade = 12;
/// Largest depth step of the check's GCR march with reactions and secondaries, g/cm2 (the
/// march's own default is 4). Convergence against 2 g/cm2 steps (tests/unit/
/// phantom_convergence_test: phantom organs behind a suit, 20 g/cm2 aluminium and 150 g/cm2
/// regolith, dose equivalent and absorbed dose): within 1.1 % (4 g/cm2: 0.3 %, at 1.5 times
/// the cost of the march); the model's own uncertainty is tens of per cent.
inline constexpr double kGcrMarchStep_g_cm2 = 8.0;
/// The SPE secondaries are computed on every kSpeSecondaryStride-th direction of the GCR set
/// (64 of the default 256): a ratio of two marches of one field, whose direction sampling
/// largely cancels (on the lunar demo every event dose of every organ is within 0.9 % of the
/// one with all 256 directions; measured when the stride was chosen).
inline constexpr std::size_t kSpeSecondaryStride = 4;
/// The march options of the check's GCR march with reactions: projectile fragments and the
/// secondaries of nucleon reactions (MarchOptions::secondaries).
[[nodiscard]] exposure::MarchOptions gcr_march_options();
/// The energy grid of the GCR tables (10 keV/n to 100 GeV/n).
[[nodiscard]] exposure::EnergyGridSpec gcr_grid();

/// An event's dose at one location and organ split by arrival time: the grid nodes grouped by
/// their arrival delay after flare_seen (groups one minute wide, or 1 % of the delay when that
/// is wider), each with its share of the dose. A fixed-arrival event has one group. Each
/// group's share follows the event's time profile from its own arrival.
struct ArrivalGroups {
    std::vector<double> delay_h; ///< ascending once prepared
    std::vector<double> share;   ///< sums to 1 (all zero when the event gives no dose here)
    /// Share of the dose received between a_h and b_h hours after flare_seen: the sum over
    /// groups, or, once prepare() has run for `p`, the difference of cumulative() at both ends.
    [[nodiscard]] double fraction_between(double a_h, double b_h, const EventProfile& p) const;
    /// Share of the dose received by tau_h hours after flare_seen for the prepared profile, in
    /// O(log groups): the profile's closed form summed over the groups that have arrived, from
    /// running sums of the shares weighted by exp(-(d_last - d_g) / T) for its two time constants
    /// (bounded by 1: no overflow whatever the delays and time constants).
    [[nodiscard]] double cumulative(double tau_h) const;
    /// Builds the running sums for profile `p` (the ledger and the storm sweep then take
    /// fraction_between() from them); orders the groups by delay first.
    void prepare(const EventProfile& p);

  private:
    double rise_h_ = 0.0; ///< the prepared profile (0: none)
    double decay_h_ = 0.0;
    std::vector<double> sum_share_;
    std::vector<double> sum_decay_; ///< sum_g share_g exp(-(d_k - d_g) / decay), g <= k
    std::vector<double> sum_fast_;  ///< the same with c = 1 / (1 / rise + 1 / decay)
};

/// Arrival groups of an event's dose from its nodes' (energy, dose) pairs: grouped by their
/// scatter-free delay (EventSpec::delay_h) one minute or 1 % wide, shares summing to 1.
[[nodiscard]] ArrivalGroups arrival_groups(std::vector<std::pair<double, double>> nodes,
                                           const EventSpec& event);

/// Away from the site, an event's arrival is computed on a grid of heliocentric distances this
/// fine (per AU): 0.01 AU moves the arrival of 10-1000 MeV protons by under 1 % (the path
/// length itself is uncertain by tens of per cent); its fluence scales with the exact distance.
inline constexpr double kArrivalBinsPerAU = 100.0;
/// The grid point of a distance.
[[nodiscard]] long arrival_bin(double r_AU);
/// The grid points the crew's distance tracks pass through (Scenario::sun_tracks), ascending:
/// the distances at which an event's arrival (and its flux all-clear) is tabulated. Empty when
/// every crew member stays at the site's distance for the whole mission.
[[nodiscard]] std::vector<long> arrival_bins(const Scenario& scenario);

/// An event's node fluences for a response's nodes, scaled from the distance its spectrum is
/// given at to the site (EventSpec::fluence_scale).
[[nodiscard]] exposure::NodeFluences event_node_fluences(const EventSpec& event, double exponent,
                                                         std::span<const double> nodes_MeV);

/// An event's protons at the site (its spectrum times the fluence scaling to the site, on the
/// march's energy nodes): the incident field of its secondaries' march.
[[nodiscard]] exposure::IonField event_incident_field(const exposure::FragmentTransport& march,
                                                      const EventSpec& event, double exponent);
/// The whole field's dose over the primaries' (both with reactions), quantity by quantity (1
/// where the primaries give nothing).
[[nodiscard]] exposure::DoseQuantities secondary_factor(const exposure::DoseQuantities& whole,
                                                        const exposure::DoseQuantities& primaries);
/// `primaries` times `factor`, quantity by quantity.
[[nodiscard]] exposure::DoseQuantities
apply_secondary_factor(const exposure::DoseQuantities& primaries,
                       const exposure::DoseQuantities& factor);

/// The grid of phi (MV) the GCR is computed on when phi comes by month from a recorded series.
inline constexpr double kPhiNode_MV = 100.0;

/// Responses of every location and organ, shared by every crew member and activity.
class Study {
  public:
    /// Computes every response; InputError (naming the location or event) when the input
    /// leads to a dose that is not a finite number >= 0. With `only_location` (a command-line
    /// `--location`, InputError naming it if unknown) the study holds that one location alone:
    /// a view of one place (`shielding`) computes one place; a partial study has no ledger.
    /// `progress`, when given, is told the share of the locations' work done (0 to 1) as each
    /// piece finishes; it is called from the worker threads, one call at a time. `cache` (may
    /// be null: none; it must outlive the study) keeps what depends on no scenario across runs:
    /// the march data of each material and the phantom's tissue depths (the results are bit
    /// for bit the same without it).
    explicit Study(Scenario scenario, const std::optional<std::string>& only_location = {},
                   const std::function<void(double)>& progress = {},
                   const exposure::DataCache* cache = nullptr);
    // Locations point into the scenario held here: a Study stays where it was built.
    Study(const Study&) = delete;
    Study& operator=(const Study&) = delete;
    Study(Study&&) = delete;
    Study& operator=(Study&&) = delete;

    [[nodiscard]] const Scenario& scenario() const noexcept { return sc_; }
    /// True when built for one location only (its scenario lists that location alone).
    [[nodiscard]] bool partial() const noexcept { return partial_; }
    /// The organ response at a location (organ: bfo, lens, skin).
    [[nodiscard]] const OrganResponse& response(const std::string& location,
                                                const std::string& organ) const;
    /// Limit-check dose quantities of an event's whole fluence at a location and organ (folded
    /// once per run, at construction).
    [[nodiscard]] exposure::DoseQuantities
    event_dose(const std::string& location, const std::string& organ, const EventSpec& event) const;
    /// How that dose arrives in time (energy-dependent arrival), by event id.
    [[nodiscard]] const ArrivalGroups& event_timing(const std::string& location,
                                                    const std::string& organ,
                                                    const EventSpec& event) const;
    /// The same for a crew member at heliocentric distance r_AU (Scenario::sun_distance): the
    /// fluence scaled from the site's distance to r (EventSpec::distance_factor, exactly the
    /// site's dose there), the arrival at r on the kArrivalBinsPerAU grid.
    [[nodiscard]] exposure::DoseQuantities event_dose(const std::string& location,
                                                      const std::string& organ,
                                                      const EventSpec& event, double r_AU) const;
    [[nodiscard]] const ArrivalGroups& event_timing(const std::string& location,
                                                    const std::string& organ,
                                                    const EventSpec& event, double r_AU) const;
    [[nodiscard]] const LocationSpec& location(const std::string& id) const;
    /// The geometry of a location and the directions its responses were computed over.
    [[nodiscard]] const LocationGeometry& geometry(const std::string& id) const;
    [[nodiscard]] const std::vector<habitats::Vector3>& directions(const std::string& id) const;
    [[nodiscard]] std::size_t direction_count() const noexcept { return directions_; }
    /// The threads a run may use: the hardware's, or CREWDOSE_THREADS (at least 1). Results never
    /// depend on it.
    [[nodiscard]] std::size_t threads() const noexcept { return threads_; }
    /// The cache across runs it was given (null: none), for analyses that march again.
    [[nodiscard]] const exposure::DataCache* cache() const noexcept { return cache_; }
    /// The body model of a location, on its SPE directions.
    [[nodiscard]] const BodyDepths& body(const std::string& location) const;
    /// True when the location's body model gives `organ` (ledger_organs(): the quick model
    /// lacks heart, brain and effective).
    [[nodiscard]] bool has_organ(const std::string& location, const std::string& organ) const;

    /// GCR dose rate at a location and organ for modulation potential phi (one of the values
    /// the mission uses: every such value is computed at construction), per day, nuclei
    /// Z = 1..28: with_removal is the march with nuclear reactions (removal and projectile
    /// fragments), without_removal the march without any; limits use for_limits(), the higher.
    /// With phi by date (Mission::gcr_phi_series) the rates are computed on the kPhiNode_MV grid
    /// and interpolated linearly in phi between its two nodes (above the true curve, which is
    /// convex); std::out_of_range for a phi the mission does not use.
    [[nodiscard]] exposure::BracketedDose
    gcr_daily_dose(const std::string& location, const std::string& organ, double phi_MV) const;

    /// The factor that adds an event's secondaries to its primary dose (with reactions) at a
    /// location and organ: whole field over primaries, per quantity (1 if not computed).
    [[nodiscard]] exposure::DoseQuantities
    spe_factor(const std::string& location, const std::string& organ, const EventSpec& event) const;

  private:
    Scenario sc_;
    std::vector<std::unique_ptr<habitats::Scene>> scenes_;
    std::map<std::pair<std::string, std::string>, OrganResponse> responses_;
    std::map<std::string, LocationGeometry> geometries_;
    std::map<std::tuple<std::string, std::string, std::string>, exposure::DoseQuantities>
        event_doses_;
    std::map<std::tuple<std::string, std::string, std::string>, ArrivalGroups> event_timing_;
    /// The same away from the site, by arrival_bin().
    std::map<std::tuple<std::string, std::string, std::string, long>, ArrivalGroups>
        event_timing_off_site_;
    std::map<std::string, std::vector<habitats::Vector3>> location_directions_;
    std::map<std::string, BodyDepths> bodies_;
    std::map<std::string, BodyDepths> gcr_bodies_;
    std::size_t directions_ = 0;
    bool partial_ = false;
    std::size_t threads_ = 1;
    const exposure::DataCache* cache_ = nullptr;
    std::map<std::tuple<std::string, std::string, double>, exposure::BracketedDose> gcr_rates_;
    std::map<std::tuple<std::string, std::string, std::string>, exposure::DoseQuantities>
        spe_factors_;
};

} // namespace crewdose::planner
