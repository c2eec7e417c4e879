#pragma once
// A study as the scenario file describes it: validated, immutable, every item keeping the
// file and line where the user wrote it (scenarios/README.md documents every key).
#include "planner/scenario/body_models.hpp"
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/location_model.hpp"
#include "planner/scenario/sun_distance.hpp"

#include "habitats/directional_shielding.hpp"
#include "habitats/phantom.hpp"
#include "habitats/scene.hpp"
#include "habitats/surroundings.hpp"

#include "exposure/gcr.hpp"
#include "exposure/material.hpp"
#include "exposure/spectrum.hpp"

#include <boost/date_time/posix_time/posix_time_types.hpp>

#include <map>
#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace crewdose::planner {

using Time = boost::posix_time::ptime;

enum class SiteKind { moon, mars, deep_space };

/// The GCR modulation potential phi a scenario or a command line may give, MV, in the
/// convention of the Burger et al. 2000 LIS (Usoskin et al. 2005). The floor, 100 MV, is half
/// the lowest modulation of the space era: monthly values in the deep minimum of 2009 were
/// about 200 to 250 MV in this convention (from memory). So no real value is refused, while phi
/// typed in GV (a number of at most 3) is. The ceiling, 3000 MV, is far above the strongest maxima
/// (about 1500 MV, from memory).
inline constexpr double kMinPhi_MV = 100.0;
inline constexpr double kMaxPhi_MV = 3000.0;

/// The Martian surface pressure a scenario or a command line may give, Pa: one range for
/// both. The floor is below the summit of Olympus Mons (about 70 Pa) and the ceiling above the
/// floor of Hellas (about 1200 Pa, both from memory), so no site on Mars is refused, while a
/// typical pressure typed in hPa or mbar (6 to 9) is.
inline constexpr double kMinSurfacePressure_Pa = 10.0;
inline constexpr double kMaxSurfacePressure_Pa = 2000.0;

/// Why `phi_MV` is not a plausible modulation potential, or nullopt when it is: the allowed
/// range and, for a value that reads as GV, the value in MV ("0.45 looks like GV; give 450").
/// `as_typed` is how the value is named in the message (the number, or the option's text).
[[nodiscard]] std::optional<std::string> implausible_phi(double phi_MV,
                                                         const std::string& as_typed);

struct Mission {
    SourceLocation where;
    std::string name;
    SiteKind site = SiteKind::moon;
    Time start;
    Time end;
    std::size_t directions = kDefaultDirections;
    habitats::TerrainMask terrain_mask;
    double surface_pressure_Pa = 750.0; ///< Mars only
    double scale_height_km = 11.1;      ///< Mars only
    /// GCR modulation potential phi (MV, for the Usoskin et al. 2005 LIS) from mission start;
    /// when the scenario gives none, the loader takes it by month from the recorded solar cycle
    /// (gcr_phi_series set, gcr_phi_given false).
    double gcr_phi_MV = exposure::kExampleSolarMinimumPhi_MV;
    bool gcr_phi_given = false;
    /// The phi series the values come from when the scenario asks for phi by date
    /// (gcr_phi_by_date = kRecordedCyclePhi); empty when phi was given (or defaulted).
    std::string gcr_phi_series;
    /// Later values of phi, each from its date on (sorted, after mission start).
    struct GcrPhase {
        SourceLocation where;
        Time from;
        double phi_MV;
    };
    std::vector<GcrPhase> gcr_phases;
    /// Heliocentric distance of the site, AU (default 1 at the Moon and in deep space, 1.52 at
    /// Mars, its mean distance), and the length of the field line the solar particles follow
    /// (default: the Parker spiral at that distance for a 350 km/s wind, 1.2 AU at 1 AU). Both
    /// set the scatter-free arrival of events without a fixed arrival_delay_h; both uncertain.
    double sun_distance_AU = 1.0;
    double sep_path_length_AU = 0.0;
    /// Fluence of an event scales as (r / r_spectrum)^-exponent from the distance its spectrum
    /// is given at to the site (default 2, inverse square: uncertain; observed values spread).
    double sep_fluence_exponent = 2.0;
    /// Optional heliocentric distance by date ([[mission.trajectory]]), for crew in space
    /// (transits, deep-space locations) between its first and last date; interpolated linearly.
    struct TrajectoryPoint {
        SourceLocation where;
        Time at;
        double r_AU;
    };
    std::vector<TrajectoryPoint> trajectory;
    /// The field-line length for a crew member at heliocentric distance r: the Parker spiral at
    /// r, times the ratio of a given sep_path_length_AU to the spiral at the site (1 without).
    [[nodiscard]] double path_length_at(double r_AU) const;
    /// Directions for the GCR responses (the GCR dose varies slowly with direction).
    std::size_t gcr_directions = kDefaultGcrDirections;
    /// Directions for the SPE responses of phantom locations (each direction costs one path
    /// response per tissue depth of the phantom's grid).
    std::size_t phantom_directions = kDefaultPhantomDirections;
    /// phi at time t.
    [[nodiscard]] double gcr_phi_at(const Time& t) const;
};

/// mission.gcr_phi_by_date's one value: phi by month from the last recorded solar cycle
/// (exposure/solar_cycle.hpp), rounded down to kRecordedPhiStep_MV.
inline constexpr const char* kRecordedCyclePhi = "recorded-cycle";
inline constexpr double kRecordedPhiStep_MV = 25.0;

struct LocationSpec {
    SourceLocation where;
    std::string id;
    habitats::Point3 point_m;
    SourceLocation point_where;                      ///< line of point_m (or of the entry)
    std::vector<std::string> solids;                 ///< ids of the solids around it
    std::optional<std::string> shielding_table_file; ///< as written in the scenario
    /// The imported table itself, read when the scenario is loaded.
    std::optional<habitats::DirectionalShielding> shielding_table;
    std::optional<SuitModel> suit;
    double heading_deg = 0.0;
    bool deep_space = false; ///< surroundings: no ground, no atmosphere
    /// The body model's id, one of the registry's (planner/scenario/body_models.hpp): the quick
    /// screening model (skin, lens, BFO at fixed depths) or the stylised phantom (adds heart,
    /// brain and the effective dose).
    std::string body{default_body_model_name().id};
    habitats::Posture posture = habitats::Posture::standing;
};

/// The time profile of an event: intensity proportional to (1 - exp(-t/rise)) exp(-t/decay)
/// after arrival (t >= 0), so the fraction received by t is closed-form.
struct EventProfile {
    double rise_h = 1.0;
    double decay_h = 12.0;
    /// Fraction of the event's fluence received by `hours` after arrival (0..1).
    [[nodiscard]] double fraction_by(double hours) const;
    /// The intensity: d fraction_by / dt, per hour.
    [[nodiscard]] double rate_per_h(double hours) const;
};

struct EventSpec {
    SourceLocation where;
    std::string id;
    Time flare_seen;
    /// Fixed arrival: every energy arrives arrival_delay_h after flare_seen. Otherwise
    /// (dispersed) each energy arrives scatter-free, L / v(E) - r / c after flare_seen.
    bool fixed_arrival = false;
    double arrival_delay_h = 0.0;
    exposure::ProtonSpectrum spectrum;
    std::string spectrum_text;
    EventProfile profile;
    /// Heliocentric distance the spectrum is given at, AU (default: the site's).
    std::optional<double> spectrum_at_AU;
    /// The mission's field-line length and site distance (copied here by the loader).
    double path_length_AU = 1.2;
    double sun_distance_AU = 1.0;
    /// Hours from flare_seen until protons of energy E arrive (the fixed delay, or scatter-free).
    [[nodiscard]] double delay_h(double energy_MeV) const;
    /// The fixed arrival, or for a dispersed event the arrival of 1 GeV protons (the first).
    [[nodiscard]] Time arrival() const;
    /// Factor on the spectrum's fluence for the site's distance (1 when given at the site).
    [[nodiscard]] double fluence_scale(double exponent) const;
    /// Factor on the spectrum's fluence at heliocentric distance r: (r / r_spectrum)^-exponent,
    /// r_spectrum being spectrum_at_AU or, without it, the site's distance.
    [[nodiscard]] double fluence_scale_at(double r_AU, double exponent) const;
    /// The dose at distance r over the dose at the site (exactly 1 at the site's distance).
    [[nodiscard]] double distance_factor(double r_AU, double exponent) const;
    /// The event as met at heliocentric distance r along a field line of `path_AU`: the same
    /// spectrum and source distance, scaled and arriving there.
    [[nodiscard]] EventSpec seen_at(double r_AU, double path_AU) const;
};

/// Organ doses as the scenario gives them for prior history and recorded periods, mGy-Eq for
/// organs and mSv for the effective dose.
struct OrganDoses {
    std::map<std::string, double> mGyEq; ///< by organ id (bfo, lens, skin, heart, brain)
    std::optional<double> effective_mSv;
};

struct PriorPeriod {
    SourceLocation where;
    Time start;
    Time end;
    OrganDoses doses;
};

struct CrewSpec {
    SourceLocation where;
    std::string id;
    std::string name;
    std::vector<PriorPeriod> prior; ///< dated, or totals placed at mission start (zero length)
};

enum class ActivityKind { stay, sleep, eva, rover, transit, shelter };

struct ActivitySpec {
    SourceLocation where;
    std::vector<std::string> crew;
    ActivityKind kind = ActivityKind::stay;
    std::string location;
    Time start;
    Time end;
    /// EVAs and rover drives: minutes to get back under cover once a storm warning comes
    /// (default: storm_response.eva_return_min), and where to (default: the shelter; a
    /// pressurised rover may be nearer). Transits: the vehicle's own shelter, reached in
    /// storm_response.move_to_shelter_min (without one the plan goes on).
    std::optional<double> return_min;
    std::optional<std::string> refuge;
    /// Or: how far from cover the EVA goes, km; the return time is then distance / the policy's
    /// traverse speed.
    std::optional<double> distance_km;
    /// Heliocentric distance during the activity, AU, at its start and end (interpolated);
    /// without it, see build_sun_distance_tracks.
    std::optional<std::pair<double, double>> sun_distance_AU;
    /// An activity of a [[routine]]: the start of its instance and the line of the routine
    /// (`where` is the line of its [[routine.activity]] entry); nullopt for an [[activity]].
    struct RoutineInstance {
        Time start;
        int routine_line = 0;
    };
    std::optional<RoutineInstance> instance;
};

/// Where an activity was written, for reports: "line 80", or for an activity of a routine
/// "line 84, instance of 2035-06-10T09:00:00Z" (the rule's line and the instance), so that
/// each instance is told apart from the others.
[[nodiscard]] std::string activity_origin(const ActivitySpec& a);
/// The same for messages: "the activity at line 80", or "the activity at line 84 in the
/// instance of 2035-06-10T09:00:00Z of the routine at line 80".
[[nodiscard]] std::string activity_origin_text(const ActivitySpec& a);

/// What the crew do when a storm warning comes ([storm_response]): the policy of the storm
/// what-ifs. Times after the flare is seen at the site (t0).
struct StormPolicy {
    SourceLocation where;
    bool given = false;  ///< the scenario has the section
    std::string shelter; ///< location id
    double warning_delay_min = 10.0;
    double move_to_shelter_min = 15.0; ///< crew inside (not on EVA, not in transit)
    double eva_return_min = 30.0;      ///< default for EVAs and rover drives
    double walk_speed_km_h = 3.0;      ///< for EVAs that give distance_km
    double drive_speed_km_h = 10.0;    ///< for rover drives that give distance_km
    double all_clear_h = 24.0;         ///< fixed all-clear after t0 ...
    /// ... or, when set, the all-clear comes once the omnidirectional-per-steradian flux above
    /// all_clear_above_MeV has fallen below all_clear_flux_per_cm2_s_sr (after its peak).
    std::optional<double> all_clear_above_MeV;
    double all_clear_flux_per_cm2_s_sr = 1.0;
};

struct RecordedSpec {
    SourceLocation where;
    std::string crew;
    Time start;
    Time end;
    OrganDoses doses;
    std::string source;
    bool replaces_model = true;
};

/// A planning limit on one organ over a window.
struct Limit {
    std::string organ;  ///< bfo, lens, skin, or "effective"
    std::string window; ///< "30-day", "annual", "career"
    double value;       ///< mGy-Eq, or mSv for effective
    std::string basis;  ///< where the default comes from
};

struct LimitsSpec {
    SourceLocation where;
    double uncertainty_factor = 1.0;
    std::vector<Limit> limits;
};

/// The whole validated study.
struct Scenario {
    std::string file;
    /// SHA-256 of the scenario text as read (sha256.hpp): outputs carry it with `file`.
    std::string file_sha256;
    Mission mission;
    std::vector<exposure::Material> materials; ///< user materials
    std::map<std::string, SourceLocation> material_lines;
    std::vector<habitats::Solid> solids;
    std::map<std::string, SourceLocation> solid_lines;
    std::vector<LocationSpec> locations;
    std::vector<EventSpec> events;
    StormPolicy storm;
    std::vector<CrewSpec> crew;
    std::vector<ActivitySpec> activities;
    std::vector<RecordedSpec> recorded;
    LimitsSpec limits;
    /// Each crew member's heliocentric distance along the mission (crew order), built by the
    /// loader once the timeline is checked.
    std::vector<SunDistanceTrack> sun_tracks;

    /// Crew member `crew`'s (index into crew) heliocentric distance at t, AU: the site's when
    /// the scenario was not built by the loader.
    [[nodiscard]] double sun_distance(std::size_t crew_index, const Time& t) const;
    /// A material by id: the scenario's own first, then the built-in library; nullptr if none.
    [[nodiscard]] const exposure::Material* material(const std::string& id) const;
    /// The event or location a command-line option names; InputError naming `option` and the
    /// ids the scenario defines otherwise.
    [[nodiscard]] const EventSpec& event_named(const std::string& id,
                                               const std::string& option) const;
    [[nodiscard]] const LocationSpec& location_named(const std::string& id,
                                                     const std::string& option) const;
};

/// The activities crew member `crew_id` takes part in, ordered by start (activities that start
/// at the same instant keep their order in the file). Every walk along one crew member's
/// timeline starts here.
[[nodiscard]] std::vector<const ActivitySpec*> activities_of(const Scenario& sc,
                                                             std::string_view crew_id);

/// A stretch of the mission that a crew member's activities leave uncovered.
struct TimelineGap {
    std::string crew;
    Time from;
    Time to;
    SourceLocation where; ///< the activity before the gap (after it, for a gap at the start)
};
/// Every gap of every crew member's timeline, in crew order and then in time.
[[nodiscard]] std::vector<TimelineGap> timeline_gaps(const Scenario& sc);
/// InputError at the activity next to the first gap, unless the timelines have none. `check`
/// and `validate` call it unless --allow-gaps.
void refuse_timeline_gaps(const Scenario& sc);

/// Planning-default limits (each labelled with its basis; never official).
[[nodiscard]] std::vector<Limit> default_limits();

/// The organs with organ-dose limits (bfo, lens, skin), in the order reports list them.
[[nodiscard]] const std::vector<std::string>& limited_organs();
/// The organs with limits that only the phantom gives: heart (circulatory) and brain (CNS).
[[nodiscard]] const std::vector<std::string>& phantom_limited_organs();
/// Every organ the ledger tracks: limited_organs(), phantom_limited_organs(), then
/// "effective" (the effective dose, mSv, carried in the mGy-Eq fields).
[[nodiscard]] const std::vector<std::string>& ledger_organs();
/// An organ's name in reports: "BFO" for bfo, the id otherwise.
[[nodiscard]] std::string organ_label(const std::string& organ);

/// An RFC 3339 date-time with its offset ("2032-03-11T10:30:00Z"), read as TOML reads it; nullopt
/// when the text is not one, or its year lies outside 1400..9999 (then `bad_year` is set).
[[nodiscard]] std::optional<Time> parse_rfc3339(const std::string& text, bool* bad_year = nullptr);

/// Reads and validates a scenario file; InputError with file:line: key on any problem.
[[nodiscard]] Scenario load_scenario(const std::string& path);
/// The same from text (tests), with `file_name` used in messages.
[[nodiscard]] Scenario parse_scenario(const std::string& text, const std::string& file_name);

[[nodiscard]] std::string to_string(ActivityKind kind);
/// The number of directions the SPE responses of a location with solids and body model `body`
/// (a registered id) are computed over: mission.directions or mission.phantom_directions.
[[nodiscard]] std::size_t spe_direction_count(const Mission& mission, std::string_view body);
/// "moon", "mars" or "deep-space", as the scenario file spells it.
[[nodiscard]] std::string to_string(SiteKind site);

} // namespace crewdose::planner
