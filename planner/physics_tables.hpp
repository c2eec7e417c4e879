#pragma once
// The `range` and `materials` commands: look-up tables of the stopping and range physics for
// engineers who want to see the numbers behind a shielding result.
#include "exposure/material.hpp"
#include "exposure/particle.hpp"

#include <string>
#include <string_view>
#include <vector>

namespace crewdose::planner {

enum class OutputFormat { text, json, csv };

/// "text", "json" or "csv"; InputError (field "--format") otherwise.
[[nodiscard]] OutputFormat parse_output_format(std::string_view text);

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

/// The range report in the chosen format (text: 4 significant figures; json: full precision).
[[nodiscard]] std::string format_range_report(const exposure::Material& material,
                                              const exposure::Particle& particle,
                                              const std::vector<RangeRow>& rows,
                                              OutputFormat format);

/// The list of built-in materials in the chosen format.
[[nodiscard]] std::string format_materials_report(OutputFormat format);

} // namespace crewdose::planner
