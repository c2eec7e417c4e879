#pragma once
// A study as the scenario file describes it: validated, immutable, every item keeping the
// file and line where the user wrote it (scenarios/README.md documents every key).
#include "input_error.hpp"
#include "location_response.hpp"

#include "exposure/gcr.hpp"
#include "exposure/material.hpp"
#include "exposure/spectrum.hpp"
#include "habitats/scene.hpp"

#include <boost/date_time/posix_time/posix_time_types.hpp>

#include <map>
#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace crewdose::planner {

using Time = boost::posix_time::ptime;

enum class SiteKind { moon, mars, deep_space };

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
    /// when the scenario gives none, the solar-minimum example (the conservative choice).
    double gcr_phi_MV = exposure::kExampleSolarMinimumPhi_MV;
    bool gcr_phi_given = false;
    /// Later values of phi, each from its date on (sorted, after mission start).
    struct GcrPhase {
        SourceLocation where;
        Time from;
        double phi_MV;
    };
    std::vector<GcrPhase> gcr_phases;
    /// Directions for the GCR responses (the GCR dose varies slowly with direction).
    std::size_t gcr_directions = kDefaultGcrDirections;
    /// phi at time t.
    [[nodiscard]] double gcr_phi_at(const Time& t) const;
};

struct LocationSpec {
    SourceLocation where;
    std::string id;
    habitats::Point3 point_m;
    SourceLocation point_where;      ///< line of point_m (or of the entry)
    std::vector<std::string> solids; ///< ids of the solids around it
    std::optional<std::string> shielding_table_file;
    std::optional<SuitModel> suit;
    double heading_deg = 0.0;
    bool deep_space = false; ///< surroundings: no ground, no atmosphere
};

/// The time profile of an event: intensity proportional to (1 - exp(-t/rise)) exp(-t/decay)
/// after arrival (t >= 0), so the fraction received by t is closed-form.
struct EventProfile {
    double rise_h = 1.0;
    double decay_h = 12.0;
    /// Fraction of the event's fluence received by `hours` after arrival (0..1).
    [[nodiscard]] double fraction_by(double hours) const;
};

struct EventSpec {
    SourceLocation where;
    std::string id;
    Time flare_seen;
    double arrival_delay_h = 0.0;
    exposure::ProtonSpectrum spectrum;
    std::string spectrum_text;
    EventProfile profile;
    [[nodiscard]] Time arrival() const;
};

/// Organ doses as the scenario gives them for prior history and recorded periods, mGy-Eq for
/// organs and mSv for the effective dose.
struct OrganDoses {
    std::map<std::string, double> mGyEq; ///< by organ id (bfo, lens, skin)
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
    Mission mission;
    std::vector<exposure::Material> materials; ///< user materials
    std::map<std::string, SourceLocation> material_lines;
    std::vector<habitats::Solid> solids;
    std::map<std::string, SourceLocation> solid_lines;
    std::vector<LocationSpec> locations;
    std::vector<EventSpec> events;
    std::vector<CrewSpec> crew;
    std::vector<ActivitySpec> activities;
    std::vector<RecordedSpec> recorded;
    LimitsSpec limits;

    /// A material by id: the scenario's own first, then the built-in library; nullptr if none.
    [[nodiscard]] const exposure::Material* material(const std::string& id) const;
};

/// Planning-default limits (each labelled with its basis; never official).
[[nodiscard]] std::vector<Limit> default_limits();

/// Reads and validates a scenario file; InputError with file:line: key on any problem.
[[nodiscard]] Scenario load_scenario(const std::string& path);
/// The same from text (tests), with `file_name` used in messages.
[[nodiscard]] Scenario parse_scenario(const std::string& text, const std::string& file_name);

[[nodiscard]] std::string to_string(ActivityKind kind);
/// "moon", "mars" or "deep-space", as the scenario file spells it.
[[nodiscard]] std::string to_string(SiteKind site);

} // namespace crewdose::planner
