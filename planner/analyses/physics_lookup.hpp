#pragma once
// The `range` and `materials` look-ups: the stopping and range physics behind a shielding
// result, and the command-line names of materials and particles (the reports are
// report/physics_report.hpp).
#include "exposure/material.hpp"
#include "exposure/particle.hpp"

#include <string>
#include <string_view>
#include <vector>

namespace crewdose::planner {

/// A comma-separated list of kinetic energies per nucleon in MeV/n, each finite and inside
/// [min, max]; InputError naming `field` and the offending item otherwise.
[[nodiscard]] std::vector<double> parse_energy_list(std::string_view text, std::string_view field,
                                                    double min_MeV_per_n, double max_MeV_per_n);

/// Built-in material by id, or InputError (field "--material") listing the ids allowed.
[[nodiscard]] const exposure::Material& material_by_id(std::string_view id,
                                                       std::string_view option = "--material");
/// Particle by name, or InputError (field "--particle") saying what is allowed.
[[nodiscard]] exposure::Particle particle_by_name_or_throw(std::string_view name);

/// One row of the range table.
struct RangeRow {
    double energy_MeV_per_n;
    double stopping_MeV_cm2_g;
    double let_keV_um;
    double csda_range_g_cm2;
    double csda_range_cm;
};

/// Rows for `energies` (MeV/n) from a freshly built range table.
[[nodiscard]] std::vector<RangeRow> range_rows(const exposure::Material& material,
                                               const exposure::Particle& particle,
                                               const std::vector<double>& energies_MeV_per_n);

} // namespace crewdose::planner
