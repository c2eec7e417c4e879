// Reading a scenario file (TOML, toml++) into a validated Scenario. Every error names the
// file, the line and the key, says what is wrong and what is allowed. Unknown keys are errors.
#include "planner/scenario/scenario.hpp"

#include "exposure/arrival.hpp"
#include "planner/scenario/routine.hpp"
#include "planner/scenario/sha256.hpp"
#include "planner/scenario/shielding_table_file.hpp"
#include "planner/scenario/spectrum_spec.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/scenario/toml_section.hpp"

#include "exposure/element.hpp"
#include "exposure/material_library.hpp"
#include "exposure/parameter_error.hpp"
#include "exposure/solar_cycle.hpp"
#include "habitats/direction_set.hpp"

#include "planner/scenario/toml.hpp"
#include "planner/scenario/toml_text.hpp"
#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>

namespace crewdose::planner {
namespace {

using toml_read::entries;
using toml_read::from_toml;
using toml_read::kMaxLength_m;
using toml_read::Section;

// Plausible ranges of the scenario's numbers (scenarios/README.md lists every one). They keep
// each value inside what the physics and the timeline represent; none is a physical limit (the
// bound on lengths, kMaxLength_m, is in toml_section.hpp, whose Section::point uses it).
/// Densities: from far below a thin gas (the Martian surface atmosphere is about 1.5e-5 g/cm3,
/// common practice) to above osmium, the densest element (22.6 g/cm3, from memory).
constexpr double kMinDensity_g_cm3 = 1e-7;
constexpr double kMaxDensity_g_cm3 = 25.0;
/// Mean excitation energies: the lowest of any element is hydrogen's 19.2 eV and the highest
/// tabulated ones are below 1000 eV (ICRU Report 37 / 49, from memory).
constexpr double kMinExcitation_eV = 10.0;
constexpr double kMaxExcitation_eV = 1000.0;
/// One suit layer: 100 g/cm2 is far beyond any suit.
constexpr double kMaxSuitLayer_g_cm2 = 100.0;
/// A dose entry (prior, recorded, a limit): 10,000 mGy-Eq or mSv, far above any career dose; a
/// larger number is a slip of units.
constexpr double kMaxDoseEntry = 10000.0;
/// An event's fixed arrival delay: particles arrive within hours to a day or two of the flare
/// (common practice); 10 days is the bound.
constexpr double kMaxArrivalDelay_h = 240.0;
/// Heliocentric distances (the site, a spectrum's, a crew member's): from inside Mercury's orbit
/// to beyond Neptune's; the fluence scaling and the Parker spiral are uncertain far outside.
constexpr double kMinSunDistance_AU = 0.1;
constexpr double kMaxSunDistance_AU = 40.0;
constexpr const char* kSunDistanceRange = "must be a heliocentric distance from 0.1 to 40 AU";
/// Response times (warnings, moves, returns): two days.
constexpr double kMaxMinutes = 2880.0;
/// Largest scenario file read (a 3-year plan of 10,000 activities is about 1 MiB).
constexpr std::uintmax_t kMaxScenarioBytes = 64u << 20;
/// The years a mission may lie in.
constexpr int kFirstMissionYear = 1950;
constexpr int kLastMissionYear = 2500;

/// phi by date from the recorded solar cycle (exposure/solar_cycle.hpp): a value per calendar
/// month of the mission, rounded down to a multiple of kRecordedPhiStep_MV (a lower phi lets
/// more GCR in: the rounding never lowers the dose, and months of nearly the same phi share
/// one GCR computation), written as the mission's phi at its start and a phase at each month
/// whose rounded value differs.
void apply_recorded_cycle(Mission& mission, const SourceLocation& where) {
    auto rounded = [](int year, int month) {
        const double phi = exposure::recorded_cycle_phi_MV(year, month);
        return std::floor(phi / kRecordedPhiStep_MV) * kRecordedPhiStep_MV;
    };
    const auto d0 = mission.start.date();
    int year = d0.year();
    int month = d0.month();
    mission.gcr_phi_MV = rounded(year, month);
    mission.gcr_phi_given = true;
    mission.gcr_phi_series = kRecordedCyclePhi;
    mission.gcr_phases.clear();
    double last = mission.gcr_phi_MV;
    for (;;) {
        month = month == 12 ? 1 : month + 1;
        year = month == 1 ? year + 1 : year;
        const Time from(boost::gregorian::date(static_cast<unsigned short>(year),
                                               static_cast<unsigned short>(month), 1));
        if (!(from < mission.end)) {
            break;
        }
        const double phi = rounded(year, month);
        if (phi != last) {
            mission.gcr_phases.push_back({where, from, phi});
            last = phi;
        }
    }
}

/// The message for an id that names no location: "unknown location 'x'; allowed: a, b, c".
std::string unknown_location(const std::string& id, const std::set<std::string>& ids) {
    return fmt::format("unknown location '{}'; allowed: {}", id, fmt::join(ids, ", "));
}

OrganDoses read_doses(const Section& s) {
    OrganDoses d;
    for (const auto& organ : ledger_organs()) {
        if (organ == "effective") {
            continue;
        }
        if (s.has(organ + "_mGyEq")) {
            d.mGyEq[organ] = s.within(organ + "_mGyEq", 0.0, kMaxDoseEntry, "mGy-Eq");
        }
    }
    if (s.has("effective_mSv")) {
        d.effective_mSv = s.within("effective_mSv", 0.0, kMaxDoseEntry, "mSv");
    }
    return d;
}

std::set<std::string> with_dose_keys(std::set<std::string> keys) {
    for (const auto& organ : ledger_organs()) {
        if (organ != "effective") {
            keys.insert(organ + "_mGyEq");
        }
    }
    keys.insert("effective_mSv");
    return keys;
}

habitats::Shape read_shape(const Section& s, const std::string& shape) {
    if (shape == "sphere") {
        return habitats::Sphere{s.point("center_m"), s.above("radius_m", 0.0, kMaxLength_m, "m")};
    }
    if (shape == "cylinder") {
        return habitats::Cylinder{s.point("base_m"), s.unit_vector("axis"),
                                  s.above("height_m", 0.0, kMaxLength_m, "m"),
                                  s.above("radius_m", 0.0, kMaxLength_m, "m")};
    }
    if (shape == "box") {
        const auto h = s.numbers("half_size_m", 3);
        for (double v : h) {
            if (!(v > 0.0 && v <= kMaxLength_m)) {
                s.fail("half_size_m",
                       fmt::format("every half size must be more than 0 and at most {} m",
                                   kMaxLength_m));
            }
        }
        habitats::Box b{s.point("center_m"), {h[0], h[1], h[2]}};
        if (s.has("axis_u") || s.has("axis_v")) {
            b.u = s.unit_vector("axis_u");
            const habitats::Vector3 v = s.unit_vector("axis_v");
            if (std::abs(habitats::dot(b.u, v)) > 1e-9) {
                s.fail("axis_v", "must be perpendicular to axis_u");
            }
            b.v = v;
            b.w = habitats::cross(b.u, b.v);
        }
        return b;
    }
    if (shape == "dome") {
        return habitats::Dome{s.point("center_m"), s.above("radius_m", 0.0, kMaxLength_m, "m")};
    }
    if (shape == "slab") {
        return habitats::Slab{s.point("outer_point_m"), s.unit_vector("normal"),
                              s.above("thickness_m", 0.0, kMaxLength_m, "m")};
    }
    s.fail("shape", "'" + shape +
                        "' is not a supported shape; allowed: sphere, cylinder, box, "
                        "dome, slab (the ground is the site's own)");
}

std::vector<SuitLayer> read_suit_layers(const Section& s, const std::string& key,
                                        const std::string& file) {
    std::vector<SuitLayer> out;
    const auto* a = s.need(key).as_array();
    if (!a || !a->is_array_of_tables()) {
        s.fail(key, "must be an array of { material = \"...\", areal_density_g_cm2 = ... }");
    }
    for (const auto& e : *a) {
        const Section l(*e.as_table(), file, s.field(key), {"material", "areal_density_g_cm2"});
        out.push_back({l.text("material"),
                       l.above("areal_density_g_cm2", 0.0, kMaxSuitLayer_g_cm2, "g/cm2")});
    }
    return out;
}

} // namespace

std::optional<Time> parse_rfc3339(const std::string& text, bool* bad_year) {
    try {
        check_toml_text(text, "command line");
    } catch (const InputError&) {
        return std::nullopt;
    }
    toml::table t;
    try {
        t = toml::parse("t = " + text);
    } catch (const toml::parse_error&) {
        return std::nullopt;
    }
    const auto* dt = t["t"].as_date_time();
    if (!dt || !dt->get().offset || t.size() != 1) {
        return std::nullopt;
    }
    const auto time = from_toml(dt->get());
    if (bad_year) {
        *bad_year = !time;
    }
    return time;
}

Scenario parse_scenario(const std::string& text, const std::string& file) {
    check_toml_text(text, file);
    toml::table root;
    try {
        root = toml::parse(text, file);
    } catch (const toml::parse_error& e) {
        throw InputError({file, static_cast<int>(e.source().begin.line)}, "syntax",
                         std::string(e.description()));
    }
    const Section top(root, file, "scenario",
                      {"mission", "material", "solid", "location", "event", "crew", "activity",
                       "routine", "recorded", "limits", "storm_response"});
    Scenario sc;
    sc.file_sha256 = sha256_hex(text);
    sc.file = file;

    // [mission]
    {
        const Section m(top.table("mission"), file, "mission",
                        {"name", "site", "start", "end", "directions", "terrain_mask",
                         "surface_pressure_Pa", "scale_height_km", "gcr_phi_MV", "gcr_modulation",
                         "gcr_phi_by_date", "gcr_directions", "phantom_directions",
                         "sun_distance_AU", "sep_path_length_AU", "sep_fluence_exponent",
                         "trajectory"});
        sc.mission.where = m.where();
        sc.mission.name = m.text("name");
        const std::string site = m.text("site");
        if (site == "moon") {
            sc.mission.site = SiteKind::moon;
        } else if (site == "mars") {
            sc.mission.site = SiteKind::mars;
        } else if (site == "deep-space") {
            sc.mission.site = SiteKind::deep_space;
        } else {
            m.fail("site", "'" + site + "' is not a site; allowed: moon, mars, deep-space");
        }
        sc.mission.start = m.time("start");
        sc.mission.end = m.time("end");
        if (!(sc.mission.end > sc.mission.start)) {
            m.fail("end", "must be after mission.start");
        }
        for (const auto& [key, t] :
             {std::pair{"start", sc.mission.start}, std::pair{"end", sc.mission.end}}) {
            const int year = t.date().year();
            if (year < kFirstMissionYear || year > kLastMissionYear) {
                m.fail(key, fmt::format("the year {} is outside the years a mission may lie in, "
                                        "{} to {}",
                                        year, kFirstMissionYear, kLastMissionYear));
            }
        }
        if (m.has("directions")) {
            const double n = m.number("directions");
            if (!(n >= 16 && n <= 65536) || n != std::floor(n)) {
                m.fail("directions", "must be a whole number from 16 to 65536");
            }
            sc.mission.directions = static_cast<std::size_t>(n);
        }
        if (m.has("terrain_mask")) {
            const auto* a = m.need("terrain_mask").as_array();
            std::vector<std::pair<double, double>> pts;
            if (!a) {
                m.fail("terrain_mask", "must be an array of [azimuth_deg, elevation_deg] pairs");
            }
            for (const auto& e : *a) {
                const auto* pair = e.as_array();
                if (!pair || pair->size() != 2 || !(*pair)[0].is_number() ||
                    !(*pair)[1].is_number()) {
                    m.fail("terrain_mask", "each entry must be [azimuth_deg, elevation_deg]");
                }
                pts.emplace_back((*pair)[0].value<double>().value_or(0.0),
                                 (*pair)[1].value<double>().value_or(0.0));
            }
            try {
                sc.mission.terrain_mask = habitats::TerrainMask(pts);
            } catch (const std::invalid_argument& e) {
                m.fail("terrain_mask", e.what());
            }
        }
        // The Martian atmosphere's keys: on another site they would be read and ignored.
        for (const char* key : {"surface_pressure_Pa", "scale_height_km"}) {
            if (m.has(key) && sc.mission.site != SiteKind::mars) {
                m.fail(key, fmt::format("applies only to site = \"mars\" (the Martian "
                                        "atmosphere); this mission's site is '{}', which has "
                                        "no atmosphere: remove the key or set site = \"mars\"",
                                        site));
            }
        }
        if (m.has("surface_pressure_Pa")) {
            sc.mission.surface_pressure_Pa = m.within("surface_pressure_Pa", kMinSurfacePressure_Pa,
                                                      kMaxSurfacePressure_Pa, "Pa");
        }
        if (m.has("scale_height_km")) {
            sc.mission.scale_height_km = m.within("scale_height_km", 5.0, 30.0, "km");
        }
        if (sc.mission.site == SiteKind::mars) {
            sc.mission.sun_distance_AU = 1.52;
        }
        if (m.has("sun_distance_AU")) {
            const double r = m.number("sun_distance_AU");
            if (!(r >= kMinSunDistance_AU && r <= kMaxSunDistance_AU)) {
                m.fail("sun_distance_AU", kSunDistanceRange);
            }
            sc.mission.sun_distance_AU = r;
        }
        sc.mission.sep_path_length_AU =
            exposure::parker_spiral_length_AU(sc.mission.sun_distance_AU);
        if (m.has("sep_path_length_AU")) {
            const double l = m.number("sep_path_length_AU");
            if (!(l >= sc.mission.sun_distance_AU && l <= 100.0)) {
                m.fail("sep_path_length_AU",
                       "must be at least the site's distance from the Sun (sun_distance_AU) and "
                       "at most 100 AU");
            }
            sc.mission.sep_path_length_AU = l;
        }
        if (m.has("trajectory")) {
            const auto* a = m.need("trajectory").as_array();
            if (!a || !a->is_array_of_tables()) {
                m.fail("trajectory", "must be an array of tables [[mission.trajectory]] with at "
                                     "and sun_distance_AU");
            }
            for (const auto& e : *a) {
                const Section g(*e.as_table(), file, "mission.trajectory",
                                {"at", "sun_distance_AU"});
                Mission::TrajectoryPoint p{g.where(), g.time("at"), g.number("sun_distance_AU")};
                if (!(p.r_AU >= kMinSunDistance_AU && p.r_AU <= kMaxSunDistance_AU)) {
                    g.fail("sun_distance_AU", kSunDistanceRange);
                }
                if (p.at < sc.mission.start || p.at > sc.mission.end) {
                    g.fail("at",
                           fmt::format("{} lies outside the mission ({} to {})", format_time(p.at),
                                       format_time(sc.mission.start), format_time(sc.mission.end)));
                }
                if (!sc.mission.trajectory.empty() && !(p.at > sc.mission.trajectory.back().at)) {
                    g.fail("at", "must be later than the previous entry's at");
                }
                sc.mission.trajectory.push_back(p);
            }
            if (sc.mission.trajectory.size() < 2) {
                m.fail("trajectory", "needs at least two [[mission.trajectory]] entries (a "
                                     "distance is interpolated between dates)");
            }
        }
        if (m.has("sep_fluence_exponent")) {
            const double x = m.number("sep_fluence_exponent");
            if (!(x >= 0.0 && x <= 5.0)) {
                m.fail("sep_fluence_exponent", "must be a number from 0 to 5");
            }
            sc.mission.sep_fluence_exponent = x;
        }
        auto phi_value = [](const Section& s, const std::string& key) {
            const double phi = s.number(key);
            if (const auto problem = implausible_phi(phi, fmt::format("{:g}", phi))) {
                s.fail(key, *problem);
            }
            return phi;
        };
        if (m.has("gcr_phi_MV")) {
            sc.mission.gcr_phi_MV = phi_value(m, "gcr_phi_MV");
            sc.mission.gcr_phi_given = true;
        }
        if (m.has("phantom_directions")) {
            const double n = m.number("phantom_directions");
            if (!(n >= 16 && n <= 65536) || n != std::floor(n)) {
                m.fail("phantom_directions", "must be a whole number from 16 to 65536");
            }
            sc.mission.phantom_directions = static_cast<std::size_t>(n);
        }
        if (m.has("gcr_directions")) {
            const double n = m.number("gcr_directions");
            if (!(n >= 16 && n <= 65536) || n != std::floor(n)) {
                m.fail("gcr_directions", "must be a whole number from 16 to 65536");
            }
            sc.mission.gcr_directions = static_cast<std::size_t>(n);
        }
        if (m.has("gcr_modulation")) {
            const auto* a = m.need("gcr_modulation").as_array();
            if (!a || !a->is_array_of_tables()) {
                m.fail("gcr_modulation",
                       "must be an array of tables [[mission.gcr_modulation]] with from and "
                       "phi_MV");
            }
            for (const auto& e : *a) {
                const Section g(*e.as_table(), file, "mission.gcr_modulation", {"from", "phi_MV"});
                Mission::GcrPhase phase{g.where(), g.time("from"), phi_value(g, "phi_MV")};
                if (!(phase.from > sc.mission.start) || !(phase.from < sc.mission.end)) {
                    g.fail("from", "must lie inside the mission (after mission.start, before "
                                   "mission.end); the value at the start is mission.gcr_phi_MV");
                }
                if (!sc.mission.gcr_phases.empty() &&
                    !(phase.from > sc.mission.gcr_phases.back().from)) {
                    g.fail("from", "must be later than the previous entry's from");
                }
                sc.mission.gcr_phases.push_back(phase);
                sc.mission.gcr_phi_given = true;
            }
        }
        if (m.has("gcr_phi_by_date")) {
            const std::string source = m.text("gcr_phi_by_date");
            if (source != kRecordedCyclePhi) {
                m.fail("gcr_phi_by_date", fmt::format("'{}' is not a phi series; allowed: {}",
                                                      source, kRecordedCyclePhi));
            }
            for (const char* other : {"gcr_phi_MV", "gcr_modulation"}) {
                if (m.has(other)) {
                    m.fail(other, "cannot be given with gcr_phi_by_date (phi comes from the "
                                  "recorded cycle); give one or the other");
                }
            }
            apply_recorded_cycle(sc.mission, m.at(*m.node("gcr_phi_by_date")));
        }
        if (!sc.mission.gcr_phi_given) {
            // No phi given: by month from the recorded cycle, said so in every report.
            apply_recorded_cycle(sc.mission, m.where());
            sc.mission.gcr_phi_given = false;
        }
    }

    // [[material]]
    for (const auto* t : entries(root, "material", file)) {
        const Section s(
            *t, file, "material",
            {"id", "name", "density_g_cm3", "composition", "mean_excitation_eV", "gas"});
        exposure::MaterialSpec spec;
        spec.id = s.text("id");
        if (exposure::find_builtin_material(spec.id) || sc.material_lines.count(spec.id)) {
            s.fail("id", "'" + spec.id +
                             "' is already defined (built-in materials: see "
                             "'crewdose materials'); choose another id");
        }
        spec.name = s.text_or("name", spec.id);
        spec.density_g_cm3 =
            s.within("density_g_cm3", kMinDensity_g_cm3, kMaxDensity_g_cm3, "g/cm3");
        const Section comp(s.table("composition"), file, "material.composition", [] {
            std::set<std::string> symbols;
            for (const auto& e : exposure::elements()) {
                symbols.insert(std::string(e.symbol));
            }
            return symbols;
        }());
        for (const auto& [key, node] : s.table("composition")) {
            const std::string sym(key.str());
            spec.composition.push_back({exposure::element_by_symbol(sym)->Z,
                                        comp.above(sym, 0.0, 1.0, "(mass fraction)")});
        }
        if (s.has("mean_excitation_eV")) {
            spec.mean_excitation_eV =
                s.within("mean_excitation_eV", kMinExcitation_eV, kMaxExcitation_eV, "eV");
        }
        if (s.has("gas") && s.boolean("gas")) {
            spec.phase = exposure::Phase::gas;
        }
        spec.source = "scenario " + file;
        try {
            sc.materials.emplace_back(std::move(spec));
        } catch (const exposure::ParameterError& e) {
            throw InputError(s.where(), "material." + e.field(), e.detail());
        }
        sc.material_lines[sc.materials.back().id()] = s.where();
    }

    auto require_material = [&](const Section& s, const std::string& key, const std::string& id) {
        if (!sc.material(id)) {
            s.fail(key, "unknown material '" + id +
                            "'; use a built-in id ('crewdose materials') "
                            "or define it in a [[material]] entry");
        }
    };

    // [[solid]]
    for (const auto* t : entries(root, "solid", file)) {
        const Section s(*t, file, "solid",
                        {"id", "shape", "center_m", "radius_m", "base_m", "axis", "height_m",
                         "half_size_m", "axis_u", "axis_v", "outer_point_m", "normal",
                         "thickness_m", "layers", "core"});
        habitats::Solid solid;
        solid.id = s.text("id");
        if (sc.solid_lines.count(solid.id)) {
            s.fail("id", "'" + solid.id + "' is defined twice");
        }
        solid.shape = read_shape(s, s.text("shape"));
        if (s.has("layers")) {
            const auto* a = s.need("layers").as_array();
            if (!a || !a->is_array_of_tables()) {
                s.fail("layers", "must be an array of { material = \"...\", thickness_m = ... }");
            }
            for (const auto& e : *a) {
                const Section l(*e.as_table(), file, "solid.layers",
                                {"material", "thickness_m", "density_g_cm3"});
                const std::string id = l.text("material");
                require_material(l, "material", id);
                const double density =
                    l.has("density_g_cm3")
                        ? l.within("density_g_cm3", kMinDensity_g_cm3, kMaxDensity_g_cm3, "g/cm3")
                        : sc.material(id)->density_g_cm3();
                solid.layers.push_back(
                    {id, l.above("thickness_m", 0.0, kMaxLength_m, "m"), density});
            }
        }
        if (s.has("core")) {
            const std::string id = s.text("core");
            require_material(s, "core", id);
            solid.core = habitats::SolidLayer{id, 0.0, sc.material(id)->density_g_cm3()};
        }
        if (solid.layers.empty() && !solid.core) {
            s.fail("layers", "a solid needs layers, a core material, or both");
        }
        sc.solid_lines[solid.id] = s.where();
        sc.solids.push_back(std::move(solid));
    }

    // [[location]]
    std::set<std::string> location_ids;
    for (const auto* t : entries(root, "location", file)) {
        const Section s(*t, file, "location",
                        {"id", "point_m", "solids", "shielding_table", "body", "suit",
                         "heading_deg", "posture", "surroundings"});
        LocationSpec loc;
        loc.where = s.where();
        loc.id = s.text("id");
        if (!location_ids.insert(loc.id).second) {
            s.fail("id", "'" + loc.id + "' is defined twice");
        }
        loc.point_m = s.has("point_m") ? s.point("point_m") : habitats::Point3{0, 0, 1.0};
        loc.point_where = s.has("point_m") ? s.at(s.need("point_m")) : s.where();
        if (s.has("solids")) {
            loc.solids = s.strings("solids");
            for (const auto& id : loc.solids) {
                if (!sc.solid_lines.count(id)) {
                    s.fail("solids", "unknown solid '" + id + "'");
                }
            }
        }
        if (s.has("shielding_table")) {
            if (s.has("solids")) {
                s.fail("shielding_table", "give either solids or a shielding table, not both");
            }
            loc.shielding_table_file = s.text("shielding_table");
            // Relative to the scenario file's folder.
            const auto path = std::filesystem::path(file).parent_path() / *loc.shielding_table_file;
            loc.shielding_table = read_shielding_table(
                path.string(), [&sc](const std::string& id) { return sc.material(id) != nullptr; },
                s.at(s.need("shielding_table")), s.field("shielding_table"));
        }
        loc.body = s.text_or("body", loc.body);
        const BodyModelName* body = find_body_model_name(loc.body);
        if (!body) {
            s.fail("body", "'" + loc.body + "'; allowed: " + allowed_body_models());
        }
        const std::string posture = s.text_or("posture", "standing");
        if (posture == "lying") {
            loc.posture = habitats::Posture::lying;
        } else if (posture != "standing") {
            s.fail("posture", "'" + posture +
                                  "'; allowed: standing, lying (on the back, head towards "
                                  "heading_deg)");
        }
        if (s.has("posture") && !body->has_posture) {
            std::vector<std::string_view> with_posture;
            for (const auto& n : body_model_names()) {
                if (n.has_posture) {
                    with_posture.push_back(n.id);
                }
            }
            s.fail("posture", fmt::format("only the {} has a posture; set body = \"{}\"",
                                          fmt::join(with_posture, " or the "),
                                          with_posture.empty() ? "" : with_posture.front()));
        }
        if (s.has("suit")) {
            const toml::node& n = s.need("suit");
            if (const auto* b = n.as_boolean()) {
                if (b->get()) {
                    loc.suit = SuitModel{};
                }
            } else if (const auto* st = n.as_table()) {
                const Section su(*st, file, "location.suit",
                                 {"layers", "pack", "pack_half_angle_deg"});
                SuitModel m;
                if (su.has("layers")) {
                    m.all_around = read_suit_layers(su, "layers", file);
                }
                if (su.has("pack")) {
                    m.pack = read_suit_layers(su, "pack", file);
                }
                if (su.has("pack_half_angle_deg")) {
                    m.pack_half_angle_deg = su.above("pack_half_angle_deg", 0.0, 180.0, "degrees");
                }
                for (const auto& l : m.all_around) {
                    require_material(su, "layers", l.material_id);
                }
                for (const auto& l : m.pack) {
                    require_material(su, "pack", l.material_id);
                }
                loc.suit = m;
            } else {
                s.fail("suit", "must be true, false, or a table { layers, pack, "
                               "pack_half_angle_deg }");
            }
        }
        if (s.has("heading_deg")) {
            loc.heading_deg = s.within("heading_deg", -360.0, 360.0, "degrees");
        }
        const std::string surroundings = s.text_or("surroundings", "site");
        if (surroundings == "deep-space") {
            loc.deep_space = true;
        } else if (surroundings != "site") {
            s.fail("surroundings", "'" + surroundings +
                                       "'; allowed: site (the mission's ground "
                                       "and atmosphere), deep-space (a transit cabin)");
        }
        sc.locations.push_back(std::move(loc));
    }

    // [[event]]
    std::set<std::string> event_ids;
    for (const auto* t : entries(root, "event", file)) {
        const Section s(*t, file, "event",
                        {"id", "flare_seen", "arrival_delay_h", "spectrum", "rise_h", "decay_h",
                         "spectrum_at_AU"});
        const std::string id = s.text("id");
        if (!event_ids.insert(id).second) {
            s.fail("id", "'" + id + "' is defined twice");
        }
        const std::string text_spec = s.text("spectrum");
        EventSpec ev{s.where(),
                     id,
                     s.time("flare_seen"),
                     false,
                     0.0,
                     parse_spectrum(text_spec, "event.spectrum", s.at(s.need("spectrum"))),
                     text_spec,
                     EventProfile{},
                     std::nullopt};
        if (s.has("arrival_delay_h")) {
            ev.fixed_arrival = true;
            ev.arrival_delay_h = s.within("arrival_delay_h", 0.0, kMaxArrivalDelay_h, "h");
        }
        ev.path_length_AU = sc.mission.sep_path_length_AU;
        ev.sun_distance_AU = sc.mission.sun_distance_AU;
        if (s.has("spectrum_at_AU")) {
            const double r = s.number("spectrum_at_AU");
            if (!(r >= kMinSunDistance_AU && r <= kMaxSunDistance_AU)) {
                s.fail("spectrum_at_AU", kSunDistanceRange);
            }
            ev.spectrum_at_AU = r;
        } else if (text_spec.rfind("library:", 0) == 0) {
            ev.spectrum_at_AU = 1.0; // the library's fits are of events observed near Earth
        }
        if (s.has("rise_h")) {
            ev.profile.rise_h = s.within("rise_h", 0.01, 240.0, "h");
        }
        if (s.has("decay_h")) {
            ev.profile.decay_h = s.within("decay_h", 0.1, 2400.0, "h");
        }
        if (ev.flare_seen < sc.mission.start || ev.flare_seen > sc.mission.end) {
            s.fail("flare_seen",
                   fmt::format("{} lies outside the mission ({} to {})", format_time(ev.flare_seen),
                               format_time(sc.mission.start), format_time(sc.mission.end)));
        }
        sc.events.push_back(std::move(ev));
    }

    // [[crew]]
    std::set<std::string> crew_ids;
    for (const auto* t : entries(root, "crew", file)) {
        const Section s(*t, file, "crew", {"id", "name", "prior", "prior_totals"});
        CrewSpec c;
        c.where = s.where();
        c.id = s.text("id");
        if (!crew_ids.insert(c.id).second) {
            s.fail("id", "'" + c.id + "' is defined twice");
        }
        c.name = s.text_or("name", c.id);
        if (s.has("prior")) {
            const auto* a = s.need("prior").as_array();
            if (!a || !a->is_array_of_tables()) {
                s.fail("prior", "must be an array of { start, end, bfo_mGyEq, ... } tables");
            }
            for (const auto& e : *a) {
                const Section p(*e.as_table(), file, "crew.prior",
                                with_dose_keys({"start", "end"}));
                PriorPeriod pp{p.where(), p.time("start"), p.time("end"), read_doses(p)};
                if (!(pp.end > pp.start)) {
                    p.fail("end", "must be after start");
                }
                if (pp.end > sc.mission.start) {
                    p.fail("end", "a prior period must end by mission.start");
                }
                c.prior.push_back(std::move(pp));
            }
        }
        if (s.has("prior_totals")) {
            const Section p(s.table("prior_totals"), file, "crew.prior_totals", with_dose_keys({}));
            // Totals with no dates are placed at mission start, where they count against
            // every window that includes it (the conservative choice).
            c.prior.push_back({p.where(), sc.mission.start, sc.mission.start, read_doses(p)});
        }
        sc.crew.push_back(std::move(c));
    }
    if (sc.crew.empty()) {
        throw InputError({file, 0}, "crew",
                         "the scenario has no [[crew]] entry; a plan needs at least one crew "
                         "member, with activities covering the mission");
    }

    // [[activity]], and each instance of every [[routine]]'s activities (routine.hpp)
    const std::set<std::string> activity_keys{"crew",   "kind",        "location",
                                              "start",  "end",         "return_min",
                                              "refuge", "distance_km", "sun_distance_AU"};
    for (const auto& e : activity_tables(root, file, sc.mission, activity_keys)) {
        const Section s(e.table(), file, e.name, activity_keys, e.origin);
        ActivitySpec a;
        a.where = s.where();
        a.instance = e.routine;
        a.crew = s.strings("crew");
        if (a.crew.empty()) {
            s.fail("crew", "names no crew member; give a crew id or a list of ids");
        }
        for (const auto& id : a.crew) {
            if (!crew_ids.count(id)) {
                s.fail("crew", "unknown crew member '" + id + "'");
            }
        }
        const std::string kind = s.text("kind");
        static const std::map<std::string, ActivityKind> kKinds{
            {"stay", ActivityKind::stay},       {"sleep", ActivityKind::sleep},
            {"eva", ActivityKind::eva},         {"rover", ActivityKind::rover},
            {"transit", ActivityKind::transit}, {"shelter", ActivityKind::shelter}};
        const auto k = kKinds.find(kind);
        if (k == kKinds.end()) {
            s.fail("kind", "'" + kind + "'; allowed: stay, sleep, eva, rover, transit, shelter");
        }
        a.kind = k->second;
        a.location = s.text("location");
        if (!location_ids.count(a.location)) {
            s.fail("location", unknown_location(a.location, location_ids));
        }
        a.start = s.time("start");
        a.end = s.time("end");
        if (!(a.end > a.start)) {
            s.fail("end", "must be after start (activities need a positive duration)");
        }
        if (a.start < sc.mission.start || a.end > sc.mission.end) {
            s.fail(a.start < sc.mission.start ? "start" : "end",
                   fmt::format("lies outside the mission ({} to {})", format_time(sc.mission.start),
                               format_time(sc.mission.end)));
        }
        const bool outside = a.kind == ActivityKind::eva || a.kind == ActivityKind::rover;
        for (const std::string key : {"return_min", "distance_km"}) {
            if (s.has(key) && !outside) {
                s.fail(key, "applies to kind = \"eva\" or \"rover\" only");
            }
        }
        if (s.has("return_min") && s.has("distance_km")) {
            s.fail("distance_km", "give return_min or distance_km, not both");
        }
        if (s.has("distance_km")) {
            a.distance_km = s.within("distance_km", 0.0, 1000.0, "km");
        }
        if (s.has("refuge") && !outside && a.kind != ActivityKind::transit) {
            s.fail("refuge", "applies to kind = \"eva\", \"rover\" or \"transit\" only");
        }
        if (s.has("return_min")) {
            a.return_min = s.within("return_min", 0.0, kMaxMinutes, "minutes");
        }
        if (s.has("refuge")) {
            a.refuge = s.text("refuge");
            if (!location_ids.count(*a.refuge)) {
                s.fail("refuge", unknown_location(*a.refuge, location_ids));
            }
        }
        if (s.has("sun_distance_AU")) {
            const auto& node = s.need("sun_distance_AU");
            std::vector<double> r;
            if (node.is_number()) {
                r.push_back(s.number("sun_distance_AU"));
            } else if (const auto* pair = node.as_array(); pair && pair->size() == 2 &&
                                                           (*pair)[0].is_number() &&
                                                           (*pair)[1].is_number()) {
                for (const auto& x : *pair) {
                    r.push_back(x.value<double>().value_or(-1.0));
                }
            } else {
                s.fail("sun_distance_AU", "must be a distance in AU, or [at start, at end]");
            }
            for (const double x : r) {
                if (!(x >= kMinSunDistance_AU && x <= kMaxSunDistance_AU)) {
                    s.fail("sun_distance_AU", kSunDistanceRange);
                }
            }
            a.sun_distance_AU = {r.front(), r.back()};
        }
        sc.activities.push_back(std::move(a));
    }

    // [[recorded]]
    for (const auto* t : entries(root, "recorded", file)) {
        const Section s(*t, file, "recorded",
                        with_dose_keys({"crew", "start", "end", "source", "replaces_model"}));
        RecordedSpec r{s.where(),     s.text("crew"), s.time("start"),
                       s.time("end"), read_doses(s),  s.text("source"),
                       true};
        if (!crew_ids.count(r.crew)) {
            s.fail("crew", "unknown crew member '" + r.crew + "'");
        }
        if (!(r.end > r.start)) {
            s.fail("end", "must be after start");
        }
        if (s.has("replaces_model")) {
            r.replaces_model = s.boolean("replaces_model");
        }
        if (r.start < sc.mission.start || r.end > sc.mission.end) {
            s.fail(r.start < sc.mission.start ? "start" : "end",
                   fmt::format("lies outside the mission ({} to {}); a dose received "
                               "before the mission belongs in the crew member's prior history "
                               "(crew.prior)",
                               format_time(sc.mission.start), format_time(sc.mission.end)));
        }
        if (r.doses.mGyEq.empty() && !r.doses.effective_mSv) {
            s.fail("source", "the reading gives no dose; give at least one of bfo_mGyEq, "
                             "lens_mGyEq, skin_mGyEq, heart_mGyEq, brain_mGyEq, effective_mSv");
        }
        // Two readings of one organ over overlapping periods would count twice, or (when both
        // replace the model) leave it to the order in the file which one counts.
        for (const auto& other : sc.recorded) {
            if (other.crew != r.crew || !(r.start < other.end && other.start < r.end)) {
                continue;
            }
            for (const auto& organ : ledger_organs()) {
                const bool mine = organ == "effective" ? r.doses.effective_mSv.has_value()
                                                       : r.doses.mGyEq.count(organ) > 0;
                const bool theirs = organ == "effective" ? other.doses.effective_mSv.has_value()
                                                         : other.doses.mGyEq.count(organ) > 0;
                if (mine && theirs) {
                    s.fail("start", fmt::format("overlaps the reading at line {} for crew member "
                                                "'{}' and organ {}; readings of one organ must "
                                                "not overlap in time (split or merge them)",
                                                other.where.line, r.crew, organ));
                }
            }
        }
        sc.recorded.push_back(std::move(r));
    }

    // [storm_response]
    if (top.has("storm_response")) {
        const Section s(top.table("storm_response"), file, "storm_response",
                        {"shelter", "warning_delay_min", "move_to_shelter_min", "eva_return_min",
                         "walk_speed_km_h", "drive_speed_km_h", "all_clear_h",
                         "all_clear_above_MeV", "all_clear_flux_per_cm2_s_sr"});
        StormPolicy& p = sc.storm;
        p.where = s.where();
        p.given = true;
        p.shelter = s.text("shelter");
        if (!location_ids.count(p.shelter)) {
            s.fail("shelter", unknown_location(p.shelter, location_ids));
        }
        if (s.has("warning_delay_min")) {
            p.warning_delay_min = s.within("warning_delay_min", 0.0, kMaxMinutes, "minutes");
        }
        if (s.has("move_to_shelter_min")) {
            p.move_to_shelter_min = s.within("move_to_shelter_min", 0.0, kMaxMinutes, "minutes");
        }
        if (s.has("eva_return_min")) {
            p.eva_return_min = s.within("eva_return_min", 0.0, kMaxMinutes, "minutes");
        }
        if (s.has("walk_speed_km_h")) {
            p.walk_speed_km_h = s.within("walk_speed_km_h", 0.1, 20.0, "km/h");
        }
        if (s.has("drive_speed_km_h")) {
            p.drive_speed_km_h = s.within("drive_speed_km_h", 0.1, 200.0, "km/h");
        }
        if (s.has("all_clear_h") && s.has("all_clear_above_MeV")) {
            s.fail("all_clear_h", "give either all_clear_h (a fixed time) or "
                                  "all_clear_above_MeV with all_clear_flux_per_cm2_s_sr, not both");
        }
        if (s.has("all_clear_h")) {
            p.all_clear_h = s.above("all_clear_h", 0.0, 720.0, "h");
        }
        if (s.has("all_clear_above_MeV")) {
            p.all_clear_above_MeV = s.within("all_clear_above_MeV", 1.0, 1000.0, "MeV");
        }
        if (s.has("all_clear_flux_per_cm2_s_sr")) {
            if (!p.all_clear_above_MeV) {
                s.fail("all_clear_flux_per_cm2_s_sr", "needs all_clear_above_MeV");
            }
            p.all_clear_flux_per_cm2_s_sr =
                s.above("all_clear_flux_per_cm2_s_sr", 0.0, 1e6, "protons/(cm2 s sr)");
        }
    }

    // [limits]
    sc.limits.limits = default_limits();
    if (top.has("limits")) {
        std::set<std::string> keys{"uncertainty_factor"};
        for (const auto& l : sc.limits.limits) {
            keys.insert(l.organ + "_" + (l.window == "30-day" ? "30d" : l.window) +
                        (l.organ == "effective" ? "_mSv" : "_mGyEq"));
        }
        const Section s(top.table("limits"), file, "limits", keys);
        sc.limits.where = s.where();
        if (s.has("uncertainty_factor")) {
            sc.limits.uncertainty_factor = s.within("uncertainty_factor", 1.0, 10.0, "");
        }
        for (auto& l : sc.limits.limits) {
            const std::string key = l.organ + "_" + (l.window == "30-day" ? "30d" : l.window) +
                                    (l.organ == "effective" ? "_mSv" : "_mGyEq");
            if (s.has(key)) {
                l.value =
                    s.above(key, 0.0, kMaxDoseEntry, l.organ == "effective" ? "mSv" : "mGy-Eq");
                l.basis = "scenario " + file + " (user value)";
            }
        }
    }

    // Semantic checks that need everything: overlapping activities of one crew member,
    // dose points inside walls or between overlapping solids.
    for (const auto& c : sc.crew) {
        const std::vector<const ActivitySpec*> mine = activities_of(sc, c.id);
        if (mine.empty()) {
            throw InputError(c.where, "crew",
                             fmt::format("crew member '{}' has no activities; add [[activity]] "
                                         "entries that cover the mission",
                                         c.id));
        }
        for (std::size_t i = 1; i < mine.size(); ++i) {
            if (mine[i]->start < mine[i - 1]->end) {
                // An activity of a routine starts where its `at` puts it in its instance: the
                // message names that key, the rule's line and the instance, as the routine's
                // other messages do.
                const auto& routine = mine[i]->instance;
                throw InputError(
                    mine[i]->where, routine ? "routine.activity.at" : "activity.start",
                    fmt::format(
                        "crew member '{}' is already busy until {} ({}, from {}) when "
                        "this one starts at {}; activities of one crew member must not "
                        "overlap{}",
                        c.id, format_time(mine[i - 1]->end), activity_origin_text(*mine[i - 1]),
                        format_time(mine[i - 1]->start), format_time(mine[i]->start),
                        routine ? fmt::format(" (the instance of {} of the routine at "
                                              "line {})",
                                              format_time(routine->start), routine->routine_line)
                                : std::string()));
            }
        }
    }
    // Solids a location lists together must not overlap anywhere (a test of the solids
    // themselves, not of the rays from a dose point), and each dose point must lie outside
    // every wall: traced along the very direction sets the study uses, so a file this accepts
    // never fails on its geometry later.
    std::set<std::pair<std::string, std::string>> pairs_checked;
    for (const auto& loc : sc.locations) {
        std::vector<habitats::Solid> around;
        for (const auto& s : sc.solids) {
            if (std::find(loc.solids.begin(), loc.solids.end(), s.id) != loc.solids.end()) {
                around.push_back(s);
            }
        }
        for (std::size_t i = 0; i < around.size(); ++i) {
            for (std::size_t j = i + 1; j < around.size(); ++j) {
                if (!pairs_checked.insert({around[i].id, around[j].id}).second) {
                    continue;
                }
                if (const auto p = habitats::overlap_point(around[i], around[j])) {
                    throw InputError(
                        sc.solid_lines.at(around[j].id), "solid",
                        fmt::format("'{}' overlaps solid '{}' (line {}), for example at ({:.3g}, "
                                    "{:.3g}, {:.3g}) m; solids that a location lists together "
                                    "must not overlap (location '{}', line {})",
                                    around[j].id, around[i].id,
                                    sc.solid_lines.at(around[i].id).line, p->x, p->y, p->z, loc.id,
                                    loc.where.line));
                }
            }
        }
        if (around.empty()) {
            continue;
        }
        const habitats::Scene scene(std::move(around));
        const std::size_t spe_count = spe_direction_count(sc.mission, loc.body);
        try {
            for (const std::size_t n : {spe_count, sc.mission.gcr_directions}) {
                for (const auto& d : habitats::fibonacci_directions(n)) {
                    (void)scene.trace(loc.point_m, d);
                }
            }
        } catch (const habitats::GeometryError& e) {
            throw InputError(loc.point_where, "location.point_m", e.what());
        }
    }
    sc.sun_tracks = build_sun_distance_tracks(sc);
    return sc;
}

Scenario load_scenario(const std::string& path) {
    namespace fs = std::filesystem;
    std::error_code ec;
    const auto status = fs::status(path, ec);
    if (ec || !fs::exists(status)) {
        throw InputError({path, 0}, "file", "does not exist");
    }
    if (!fs::is_regular_file(status)) {
        throw InputError({path, 0}, "file",
                         fs::is_directory(status)
                             ? "is a folder; give the scenario file (a .toml file)"
                             : "is not a regular file; give the scenario file (a .toml file)");
    }
    const auto size = fs::file_size(path, ec);
    if (ec || size > kMaxScenarioBytes) {
        throw InputError({path, 0}, "file",
                         fmt::format("is larger than {} MiB, the most a scenario may be",
                                     kMaxScenarioBytes >> 20));
    }
    std::ifstream in(path, std::ios::binary);
    if (!in) {
        throw InputError({path, 0}, "file", "cannot be read");
    }
    std::ostringstream buf;
    buf << in.rdbuf();
    return parse_scenario(buf.str(), path);
}

} // namespace crewdose::planner
