#pragma once
// Shared by the phantom's tests (phantom_test, phantom_convergence_test): demo spectra, the
// MIRD densities, and phantom responses at a location.
#include "exposure/effective_dose.hpp"
#include "exposure/material_library.hpp"
#include "exposure/table_library.hpp"
#include "habitats/direction_set.hpp"
#include "habitats/phantom.hpp"
#include "planner/scenario/scenario.hpp"
#include "planner/study/ledger.hpp"
#include "planner/study/location_response.hpp"
#include "planner/study/study.hpp"

#include <algorithm>
#include <cmath>
#include <set>

namespace crewdose::phantom_test {

inline constexpr double kSoft = 0.9869; // MIRD soft tissue, g/cm3 (G4HumanPhantomMaterial)
inline constexpr double kBone = 1.4862; // MIRD skeleton

inline const exposure::Material& builtin(const std::string& id) {
    return *exposure::find_builtin_material(id);
}

// Demo spectra (invented parameters, not real events): the lunar demo's Band event and a harder
// one.
inline const exposure::ProtonSpectrum kBand(exposure::BandRigidity{1e10, 1.1, 3.5, 0.25},
                                            exposure::FitRange{10, 1000});
inline const exposure::ProtonSpectrum kHard(exposure::BandRigidity{1e9, 0.5, 2.5, 1.0},
                                            exposure::FitRange{10, 1000});

inline double dose_equivalent(const planner::OrganResponse& r, const exposure::ProtonSpectrum& s) {
    return exposure::fold(r.response,
                          exposure::node_fluences(s, r.response.node_energies_MeV_per_n))
        .for_limits()
        .dose_equivalent_Sv;
}

// Volume of an organ, cm3, on a regular midpoint grid of spacing h over its regions' boxes.
inline double volume_cm3(const habitats::PhantomOrgan& o, double h) {
    double v = 0.0;
    for (const auto& [region, share] : o.regions) {
        const auto [lo, hi] = region.bounds();
        std::size_t inside = 0;
        for (double x = lo.x + 0.5 * h; x < hi.x; x += h) {
            for (double y = lo.y + 0.5 * h; y < hi.y; y += h) {
                for (double z = lo.z + 0.5 * h; z < hi.z; z += h) {
                    inside += region.contains({x, y, z}) ? 1U : 0U;
                }
            }
        }
        v += static_cast<double>(inside) * h * h * h;
    }
    return v;
}

inline std::vector<planner::OrganResponse> phantom_responses(const planner::LocationGeometry& where,
                                                             std::size_t n_dirs,
                                                             std::size_t nodes_per_decade,
                                                             std::size_t points_per_direction,
                                                             const std::vector<double>& grid) {
    exposure::EnergyGridSpec spec;
    spec.nodes_per_decade = nodes_per_decade;
    exposure::TableLibrary tables(spec);
    const auto dirs = habitats::fibonacci_directions(n_dirs);
    const auto body =
        planner::phantom_body_depths(planner::shared_phantom(), habitats::Posture::standing, 30.0,
                                     dirs, grid, points_per_direction);
    return planner::body_responses(tables, builtin, where, dirs, body);
}

inline planner::LocationGeometry suited() {
    planner::LocationGeometry w;
    w.surroundings.ground = true;
    w.suit = planner::SuitModel{};
    return w;
}

inline planner::LocationGeometry shelled(const std::string& material, double g_cm2) {
    planner::LocationGeometry w;
    w.surroundings.ground = true;
    w.shell = {{material, g_cm2}};
    return w;
}

} // namespace crewdose::phantom_test
