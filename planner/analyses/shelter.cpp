#include "planner/analyses/shelter.hpp"

#include "planner/study/body_model.hpp"
#include "planner/study/ledger.hpp"
#include "planner/study/result_guard.hpp"

#include "exposure/material_library.hpp"
#include "habitats/shape.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>

namespace crewdose::planner {
namespace {

const SourceLocation kCommandLine{"command line", 0};

const exposure::Material& material_of(const Study& study, const std::string& id,
                                      const std::string& option) {
    if (const auto* m = study.scenario().material(id)) {
        return *m;
    }
    throw InputError(kCommandLine, option,
                     fmt::format("unknown material '{}'; use a built-in material (crewdose "
                                 "materials) or one the scenario defines",
                                 id));
}

const EventSpec& event_of(const Study& study, const std::string& id) {
    return study.scenario().event_named(id, "--event");
}

const LocationSpec& location_of(const Study& study, const std::string& id) {
    return study.scenario().location_named(id, "--location");
}

// The location's solids with `thickness_m` of `material` inserted directly inside layer
// `layer_index` of solid `solid_id`.
std::vector<habitats::Solid> thickened(const Study& study, const LocationSpec& loc,
                                       const std::string& solid_id, std::size_t layer_index,
                                       const exposure::Material& material, double thickness_m) {
    std::vector<habitats::Solid> around;
    for (const auto& s : study.scenario().solids) {
        if (std::find(loc.solids.begin(), loc.solids.end(), s.id) == loc.solids.end()) {
            continue;
        }
        habitats::Solid copy = s;
        if (s.id == solid_id && thickness_m > 0.0) {
            copy.layers.insert(
                copy.layers.begin() + static_cast<std::ptrdiff_t>(layer_index) + 1,
                habitats::SolidLayer{material.id(), thickness_m, material.density_g_cm3()});
        }
        around.push_back(std::move(copy));
    }
    return around;
}

const habitats::Solid& solid_of(const Study& study, const LocationSpec& loc,
                                const ShelterRequest& r) {
    const std::string& id = *r.solid_id;
    if (std::find(loc.solids.begin(), loc.solids.end(), id) == loc.solids.end()) {
        throw InputError(kCommandLine, "--layer",
                         fmt::format("solid '{}' is not around location '{}'; its solids: {}", id,
                                     loc.id, fmt::join(loc.solids, ", ")));
    }
    for (const auto& s : study.scenario().solids) {
        if (s.id == id) {
            if (r.layer_index >= s.layers.size()) {
                throw InputError(kCommandLine, "--layer",
                                 fmt::format("solid '{}' has {} layers; give a layer number from "
                                             "1 to {} (outermost first)",
                                             id, s.layers.size(), s.layers.size()));
            }
            return s;
        }
    }
    throw std::logic_error("solid listed by a location but not defined: " + id);
}

// Depth of the inner face of layer `index` below the solid's outer surface, m.
double depth_below_layer(const habitats::Solid& s, std::size_t index) {
    double d = 0.0;
    for (std::size_t k = 0; k <= index; ++k) {
        d += s.layers[k].thickness_m;
    }
    return d;
}

// Whether `thickness_m` of `material` added inside the named layer leaves a valid geometry:
// the dose point outside every wall and no solids overlapping along any direction traced.
bool geometry_allows(const Study& study, const LocationSpec& loc, const ShelterRequest& r,
                     const exposure::Material& material, double thickness_m) {
    try {
        const habitats::Scene scene(
            thickened(study, loc, *r.solid_id, r.layer_index, material, thickness_m));
        for (const auto& d : study.directions(loc.id)) {
            (void)scene.trace(loc.point_m, d);
        }
        return true;
    } catch (const habitats::GeometryError&) {
        return false;
    }
}

// The largest areal density of `material` (up to `max_g_cm2`) the geometry takes in the named
// layer, g/cm2: bisection to 1e-4 of the maximum on geometry_allows.
double largest_allowed_g_cm2(const Study& study, const LocationSpec& loc, const ShelterRequest& r,
                             const exposure::Material& material, double max_g_cm2) {
    auto ok = [&](double x) {
        return geometry_allows(study, loc, r, material, x / material.density_g_cm3() * 1e-2);
    };
    if (ok(max_g_cm2)) {
        return max_g_cm2;
    }
    double lo = 0.0;
    double hi = max_g_cm2;
    while (hi - lo > 1e-4 * max_g_cm2) {
        const double mid = 0.5 * (lo + hi);
        (ok(mid) ? lo : hi) = mid;
    }
    return lo;
}

// The answer's event dose is within 0.5 % below what the other 30-day dose leaves of the target.
constexpr double kShortfall = 0.995;

} // namespace

namespace {

exposure::MarchOptions primaries_options() {
    exposure::MarchOptions o = gcr_march_options();
    o.secondaries = false;
    return o;
}

// The marches that add an event's secondaries to the sheltered doses (as Study does for the
// scenario's locations): on the GCR grid, the whole field and the primaries alone, with the
// study's cache across runs.
struct SecondaryMarches {
    explicit SecondaryMarches(const Study& study)
        : whole{tables, gcr_march_options(), study.cache()}, primaries{tables, primaries_options(),
                                                                       study.cache()} {}
    exposure::TableLibrary tables{gcr_grid()};
    exposure::FragmentTransport whole;
    exposure::FragmentTransport primaries;
};

} // namespace

double shelter_sun_distance(const Study& study, const std::string& location_id) {
    const Scenario& sc = study.scenario();
    const LocationSpec& loc = study.location(location_id);
    const bool in_space = sc.mission.site == SiteKind::deep_space || loc.deep_space;
    double r = sc.mission.sun_distance_AU;
    if (in_space) {
        for (const auto& track : sc.sun_tracks) {
            r = std::min(r, track.lowest_AU());
        }
    }
    return r;
}

namespace {

std::map<std::string, double> sheltered_dose(const Study& study, const ShelterRequest& r,
                                             const std::string& material_id,
                                             double areal_density_g_cm2,
                                             exposure::TableLibrary& tables,
                                             SecondaryMarches& secondary) {
    const Scenario& sc = study.scenario();
    const exposure::Material& material = material_of(study, material_id, "--material");
    const LocationSpec& loc = location_of(study, r.location_id);
    const EventSpec& ev = event_of(study, r.event_id);
    LocationGeometry where = study.geometry(loc.id);
    habitats::Scene scene;
    if (r.solid_id) {
        const double t_m = areal_density_g_cm2 / material.density_g_cm3() * 1e-2;
        scene = habitats::Scene(thickened(study, loc, *r.solid_id, r.layer_index, material, t_m));
        where.scene = &scene;
    } else if (areal_density_g_cm2 > 0.0) {
        where.shell.push_back({material.id(), areal_density_g_cm2});
    }
    const MaterialResolver materials = [&](const std::string& id) -> const exposure::Material& {
        return material_of(study, id, "--material");
    };
    // The event's secondaries behind the sheltered walls, on about 64 of the directions.
    const auto& dirs = study.directions(loc.id);
    const BodyDepths& body = study.body(loc.id);
    const std::vector<exposure::IonField> field{
        event_incident_field(secondary.whole, ev, sc.mission.sep_fluence_exponent)};
    const auto marched =
        field_body_doses({secondary.whole, secondary.primaries}, materials, where, dirs, body,
                         field, std::max<std::size_t>(1, dirs.size() / 64));
    // The event where the shelter is nearest the Sun (shelter_sun_distance).
    const double factor =
        ev.distance_factor(shelter_sun_distance(study, loc.id), sc.mission.sep_fluence_exponent);
    std::map<std::string, double> out;
    for (const auto& o : body_responses(tables, materials, where, dirs, body)) {
        if (o.organ == "effective") {
            continue; // no 30-day limit
        }
        const auto fluences = event_node_fluences(ev, sc.mission.sep_fluence_exponent,
                                                  o.response.node_energies_MeV_per_n);
        auto folded = exposure::fold(o.response, fluences);
        const auto k = static_cast<std::size_t>(
            std::find(body.organs.begin(), body.organs.end(), o.organ) - body.organs.begin());
        if (k < body.organs.size()) {
            folded.with_removal = apply_secondary_factor(
                folded.with_removal,
                secondary_factor(marched[0][k].with_removal, marched[0][k].without_removal));
        }
        out[o.organ] =
            1e3 * sc.limits.uncertainty_factor * factor * folded.for_limits().rbe_weighted_GyEq;
    }
    return out;
}

} // namespace

std::map<std::string, double> sheltered_event_dose(const Study& study, const ShelterRequest& r,
                                                   const std::string& material_id,
                                                   double areal_density_g_cm2) {
    exposure::TableLibrary tables(body_model(location_of(study, r.location_id).body).spe_grid());
    SecondaryMarches secondary(study);
    return sheltered_dose(study, r, material_id, areal_density_g_cm2, tables, secondary);
}

void parse_shelter_target(const std::string& text, std::map<std::string, double>& targets) {
    const auto eq = text.find('=');
    const std::string allowed =
        "write ORGAN=VALUE in mGy-Eq, for example bfo=250 or bfo=250mGyEq; organs: bfo, lens, "
        "skin, and at a phantom location heart, brain";
    if (eq == std::string::npos || eq == 0) {
        throw InputError(kCommandLine, "--target", fmt::format("'{}': {}", text, allowed));
    }
    const std::string organ = text.substr(0, eq);
    std::string value = text.substr(eq + 1);
    for (const std::string unit : {"mGyEq", "mGy-Eq"}) {
        if (value.size() > unit.size() && value.ends_with(unit)) {
            value.resize(value.size() - unit.size());
        }
    }
    std::size_t used = 0;
    double v = 0.0;
    try {
        v = std::stod(value, &used);
    } catch (const std::exception&) {
        used = 0;
    }
    if (used == 0 || used != value.size() || !std::isfinite(v)) {
        throw InputError(kCommandLine, "--target", fmt::format("'{}': {}", text, allowed));
    }
    targets[organ] = v;
}

void parse_shelter_layer(const Study& study, const std::string& text, ShelterRequest& request) {
    const auto colon = text.find(':');
    if (colon == std::string::npos || colon == 0 || colon + 1 == text.size()) {
        throw InputError(kCommandLine, "--layer",
                         fmt::format("'{}': write SOLID:LAYER, LAYER being the layer's number "
                                     "(1 = outermost) or its material",
                                     text));
    }
    const std::string solid_id = text.substr(0, colon);
    const std::string layer = text.substr(colon + 1);
    const habitats::Solid* solid = nullptr;
    for (const auto& s : study.scenario().solids) {
        if (s.id == solid_id) {
            solid = &s;
        }
    }
    if (!solid) {
        throw InputError(kCommandLine, "--layer", fmt::format("unknown solid '{}'", solid_id));
    }
    if (solid->layers.empty()) {
        throw InputError(kCommandLine, "--layer",
                         fmt::format("solid '{}' has no layers (it is one material); name a "
                                     "layered solid or leave --layer out for a uniform shell",
                                     solid_id));
    }
    std::size_t index = 0;
    bool found = false;
    if (std::all_of(layer.begin(), layer.end(), [](char c) { return c >= '0' && c <= '9'; })) {
        const unsigned long n = layer.size() <= 6 ? std::stoul(layer) : 0UL;
        if (n >= 1 && n <= solid->layers.size()) {
            index = n - 1;
            found = true;
        }
    } else {
        int matches = 0;
        for (std::size_t k = 0; k < solid->layers.size(); ++k) {
            if (solid->layers[k].material_id == layer) {
                index = k;
                ++matches;
            }
        }
        found = matches == 1;
    }
    if (!found) {
        std::string list;
        for (std::size_t k = 0; k < solid->layers.size(); ++k) {
            list += fmt::format("{}{} = {}", k ? ", " : "", k + 1, solid->layers[k].material_id);
        }
        throw InputError(kCommandLine, "--layer",
                         fmt::format("solid '{}' has no single layer '{}'; its layers, outermost "
                                     "first: {}",
                                     solid_id, layer, list));
    }
    request.solid_id = solid_id;
    request.layer_index = index;
}

ShelterReport size_shelter(const Study& study, const ShelterRequest& request,
                           const std::function<void(double)>& progress) {
    const Scenario& sc = study.scenario();
    ShelterReport rep;
    rep.request = request;
    const EventSpec& ev = event_of(study, request.event_id);
    const LocationSpec& loc = location_of(study, request.location_id);
    if (loc.shielding_table_file && request.solid_id) {
        throw InputError(kCommandLine, "--layer",
                         "location '" + loc.id +
                             "' uses an imported shielding table; size a uniform shell (leave "
                             "--layer out)");
    }
    const habitats::Solid* solid = request.solid_id ? &solid_of(study, loc, request) : nullptr;
    if (!(request.max_g_cm2 > 0.0 && request.max_g_cm2 <= 2000.0)) {
        throw InputError(kCommandLine, "--max-g-cm2", "must be a number > 0 and <= 2000");
    }
    // The other dose sharing the 30-day window: every piece of the ledger but this event's.
    LedgerOptions options;
    options.allow_gaps = true; // the check reports gaps; sizing charges them as the check would
    const LedgerResult ledger = build_ledger(study, options);
    // An organ can be a target when the location's body model gives it and every crew
    // member's ledger has it (heart and brain need the phantom wherever the crew goes).
    std::vector<std::string> organs;
    for (const auto& organ : ledger_organs()) {
        bool known = organ != "effective" && study.has_organ(loc.id, organ);
        std::vector<std::string> why;
        for (const auto& c : ledger.crew) {
            const auto missing = c.not_evaluated.find(organ);
            if (known && missing != c.not_evaluated.end()) {
                why.push_back(fmt::format("{} at {}", c.crew, fmt::join(missing->second, ", ")));
            }
        }
        if (known && why.empty()) {
            organs.push_back(organ);
        } else if (known) {
            // Said in the report, never dropped silently.
            rep.not_targets[organ] = fmt::format("{}", fmt::join(why, "; "));
        }
    }
    // Targets: the 30-day planning limits, overridden per organ.
    for (const auto& l : sc.limits.limits) {
        if (l.window == "30-day" &&
            std::find(organs.begin(), organs.end(), l.organ) != organs.end()) {
            rep.target_mGyEq[l.organ] = l.value;
        }
    }
    for (const auto& [organ, value] : request.targets) {
        if (std::find(organs.begin(), organs.end(), organ) == organs.end()) {
            throw InputError(
                kCommandLine, "--target",
                fmt::format("'{}' cannot be a target here; allowed: {} (heart and brain need "
                            "body = \"phantom\" at this location and wherever the crew goes)",
                            organ, fmt::join(organs, ", ")));
        }
        if (!(value > 0.0)) {
            throw InputError(kCommandLine, "--target",
                             fmt::format("{}: the target must be a dose > 0 mGy-Eq", organ));
        }
        rep.target_mGyEq[organ] = value;
    }
    for (const auto& [organ, target] : rep.target_mGyEq) {
        double worst = 0.0;
        for (const auto& crew : sc.crew) {
            // Checked before std::max, which would drop a NaN, and the sort below.
            worst = std::max(worst, require_dose(highest_30d_without(ledger, crew.id, organ, &ev),
                                                 "shelter: the other 30-day " + organ +
                                                     " dose of crew member '" + crew.id + "'"));
        }
        rep.other_30d_mGyEq[organ] = worst;
        // Written so that a dose that is not a number reads as beyond the target.
        if (!(worst < target)) {
            rep.other_alone_exceeds.push_back(organ);
        }
    }
    rep.sun_distance_AU = shelter_sun_distance(study, loc.id);
    rep.fluence_scale = ev.fluence_scale_at(rep.sun_distance_AU, sc.mission.sep_fluence_exponent);
    // The organ whose other dose is furthest beyond its target names the answer.
    std::stable_sort(rep.other_alone_exceeds.begin(), rep.other_alone_exceeds.end(),
                     [&](const std::string& x, const std::string& y) {
                         return rep.other_30d_mGyEq.at(x) / rep.target_mGyEq.at(x) >
                                rep.other_30d_mGyEq.at(y) / rep.target_mGyEq.at(y);
                     });
    exposure::TableLibrary tables(body_model(loc.body).spe_grid()); // shared by every evaluation
    SecondaryMarches secondary(study);
    const auto n_materials = static_cast<double>(request.materials.size());
    for (std::size_t m = 0; m < request.materials.size(); ++m) {
        const std::string& material_id = request.materials[m];
        const exposure::Material& material = material_of(study, material_id, "--material");
        ShelterAnswer a;
        a.material = material.id();
        a.density_g_cm3 = material.density_g_cm3();
        // A named layer grows inwards, pushing the layers inside it: it may grow only while the
        // dose point stays outside every wall and no solids come to overlap.
        double max_x = request.max_g_cm2;
        if (solid) {
            const double allowed =
                largest_allowed_g_cm2(study, loc, request, material, request.max_g_cm2);
            if (allowed < max_x) {
                max_x = allowed;
                a.limited_by_room = true;
            }
        }
        a.searched_to_g_cm2 = max_x;
        // The worst ratio (event + other) / target over the organs, and its organ.
        // Dose evaluations, kept by areal density (the curve reuses them): the worst ratio
        // (event + other) / target over the organs, and its organ.
        std::map<double, std::map<std::string, double>> seen;
        auto evaluate = [&](double x, std::string* organ) {
            auto it = seen.find(x);
            if (it == seen.end()) {
                ++a.evaluations;
                if (progress) {
                    // The number of evaluations is not known ahead: a share that grows
                    // towards the next material's start.
                    const double e = a.evaluations;
                    progress((static_cast<double>(m) + e / (e + 6.0)) / n_materials);
                }
                it = seen.emplace(x,
                                  sheltered_dose(study, request, material_id, x, tables, secondary))
                         .first;
            }
            double worst = 0.0;
            for (const auto& [o, target] : rep.target_mGyEq) {
                const double event = require_dose(
                    it->second.at(o), fmt::format("shelter: the event's {} dose behind {} g/cm2 "
                                                  "of {}",
                                                  o, x, material_id));
                // The event's share of what the other 30-day dose leaves of the target (> 0
                // here: a target the other dose reaches is never searched). <= 1 exactly
                // when event + other <= target, as before; but the search's 0.5 % now
                // applies to the event's dose, which the material changes, not to the total:
                // when the other dose takes most of a target, 0.5 % of the total was a
                // large share of the event and the answer came out coarse.
                const double ratio = event / (target - rep.other_30d_mGyEq.at(o));
                if (ratio > worst) {
                    worst = ratio;
                    if (organ) {
                        *organ = o;
                    }
                }
            }
            return worst;
        };
        const bool beyond_reach = !rep.other_alone_exceeds.empty();
        std::string organ;
        double lo = 0.0;
        double f_lo = beyond_reach ? 0.0 : evaluate(lo, &organ);
        a.binding_organ = beyond_reach ? rep.other_alone_exceeds.front() : organ;
        if (beyond_reach) {
            // The other dose alone is at or beyond a target: no thickness can meet it, and none
            // is searched for (the curve below still shows the event's dose).
        } else if (f_lo <= 1.0) {
            a.achievable = true;
            a.none_needed = true;
            a.binding_organ = organ;
        } else if (max_x > 0.0) {
            // Bracket: from 10 g/cm2 (or the maximum, if smaller) doubling up to the maximum.
            double hi = std::min(10.0, max_x);
            double f_hi = evaluate(hi, &organ);
            while (f_hi > 1.0 && hi < max_x) {
                lo = hi;
                f_lo = f_hi;
                hi = std::min(2.0 * hi, max_x);
                f_hi = evaluate(hi, &organ);
            }
            if (f_hi <= 1.0) {
                a.achievable = true;
                // Illinois regula falsi on ln(ratio), nearly linear in areal density inside
                // the bracket (the dose falls about exponentially): f(lo) > 1 >= f(hi).
                double g_lo = std::log(f_lo);
                double g_hi = std::log(f_hi);
                int side = 0;
                for (int it = 0; it < 60 && !(f_hi >= kShortfall); ++it) {
                    double x = hi - g_hi * (hi - lo) / (g_hi - g_lo);
                    if (!(x > lo && x < hi) || hi - lo < 1e-9 * max_x) {
                        x = 0.5 * (lo + hi);
                    }
                    std::string o;
                    const double f = evaluate(x, &o);
                    const double g = std::log(f);
                    if (f <= 1.0) {
                        hi = x;
                        f_hi = f;
                        g_hi = g;
                        organ = o;
                        if (side == 1) {
                            g_lo *= 0.5;
                        }
                        side = 1;
                    } else {
                        lo = x;
                        f_lo = f;
                        g_lo = g;
                        if (side == -1) {
                            g_hi *= 0.5;
                        }
                        side = -1;
                    }
                }
                a.areal_density_g_cm2 = hi;
            }
            a.binding_organ = organ;
        }
        if (a.achievable) {
            a.thickness_cm = a.areal_density_g_cm2 / a.density_g_cm3;
            a.mass_per_area_kg_m2 = 10.0 * a.areal_density_g_cm2;
            if (solid) {
                const double d0 = depth_below_layer(*solid, request.layer_index);
                const auto outer = habitats::inset(solid->shape, d0);
                const auto inner = habitats::inset(solid->shape, d0 + a.thickness_cm * 1e-2);
                const auto v_outer = outer ? habitats::volume_m3(*outer) : std::nullopt;
                const double v_inner = inner ? habitats::volume_m3(*inner).value_or(0.0) : 0.0;
                if (v_outer) {
                    a.added_mass_kg = (*v_outer - v_inner) * a.density_g_cm3 * 1e3;
                }
            }
        }
        // The curve around the answer (or up to the maximum when none is found).
        const double centre = a.achievable && !a.none_needed ? a.areal_density_g_cm2 : max_x / 2.0;
        for (const double f : {0.0, 0.5, 1.0, 1.5, 2.0}) {
            const double x = std::min(f * centre, max_x);
            if (!a.curve.empty() && x <= a.curve.back().areal_density_g_cm2) {
                continue;
            }
            (void)evaluate(x, nullptr);
            a.curve.push_back({x, seen.at(x)});
        }
        for (const double v : {a.areal_density_g_cm2, a.thickness_cm, a.mass_per_area_kg_m2,
                               a.added_mass_kg.value_or(0.0)}) {
            require_dose(v, "shelter: the answer for " + material_id);
        }
        rep.answers.push_back(std::move(a));
    }
    return rep;
}

} // namespace crewdose::planner
