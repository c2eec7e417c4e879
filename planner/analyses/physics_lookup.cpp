#include "planner/analyses/physics_lookup.hpp"

#include "planner/scenario/input_error.hpp"
#include "planner/scenario/number_parse.hpp"

#include "exposure/material_library.hpp"
#include "exposure/range_table.hpp"
#include "exposure/stopping.hpp"

#include <fmt/format.h>

#include <cmath>

namespace crewdose::planner {
namespace {

const SourceLocation kCommandLine{"command line", 0};

std::string trim(std::string_view s) {
    const auto first = s.find_first_not_of(" \t");
    if (first == std::string_view::npos) {
        return {};
    }
    const auto last = s.find_last_not_of(" \t");
    return std::string(s.substr(first, last - first + 1));
}

std::string material_ids() {
    std::string out;
    for (const auto& m : exposure::builtin_materials()) {
        out += out.empty() ? "" : ", ";
        out += m.id();
    }
    return out;
}

} // namespace

std::vector<double> parse_energy_list(std::string_view text, std::string_view field,
                                      double min_MeV_per_n, double max_MeV_per_n) {
    std::vector<double> out;
    for (const auto raw : split_commas(text)) {
        const std::string item = trim(raw);
        const auto value = parse_finite(item);
        if (!value) {
            throw InputError(kCommandLine, std::string(field),
                             fmt::format("'{}' is not a number; give energies in MeV per "
                                         "nucleon separated by commas, e.g. 1,10,100",
                                         item));
        }
        if (*value < min_MeV_per_n || *value > max_MeV_per_n) {
            throw InputError(kCommandLine, std::string(field),
                             fmt::format("{} MeV/n is outside the tables; allowed: {} to {} MeV/n",
                                         item, min_MeV_per_n, max_MeV_per_n));
        }
        out.push_back(*value);
    }
    return out;
}

const exposure::Material& material_by_id(std::string_view id, std::string_view option) {
    if (const auto* m = exposure::find_builtin_material(id)) {
        return *m;
    }
    throw InputError(kCommandLine, std::string(option),
                     fmt::format("no built-in material '{}'; allowed: {}", id, material_ids()));
}

exposure::Particle particle_by_name_or_throw(std::string_view name) {
    if (const auto p = exposure::particle_by_name(name)) {
        return *p;
    }
    throw InputError(kCommandLine, "--particle",
                     fmt::format("'{}' is not a particle crewdose transports; allowed: proton, "
                                 "alpha, or a bare nucleus up to nickel by name or symbol "
                                 "(carbon, C, oxygen, iron, Fe, ...; 'nitrogen', not 'N')",
                                 name));
}

std::vector<RangeRow> range_rows(const exposure::Material& material,
                                 const exposure::Particle& particle,
                                 const std::vector<double>& energies_MeV_per_n) {
    const exposure::RangeTable table(material, particle);
    std::vector<RangeRow> rows;
    rows.reserve(energies_MeV_per_n.size());
    for (const double E : energies_MeV_per_n) {
        RangeRow row{};
        row.energy_MeV_per_n = E;
        // The exact model value at the requested energy, not the table interpolant.
        row.stopping_MeV_cm2_g = exposure::electronic_stopping_MeV_cm2_g(material, particle, E);
        row.let_keV_um = exposure::let_keV_um(material, particle, E);
        row.csda_range_g_cm2 = table.range_g_cm2(E);
        row.csda_range_cm = row.csda_range_g_cm2 / material.density_g_cm3();
        rows.push_back(row);
    }
    return rows;
}
} // namespace crewdose::planner
