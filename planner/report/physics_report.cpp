#include "planner/report/physics_report.hpp"

#include "planner/report/number_format.hpp"
#include "planner/study/result_guard.hpp"

#include "exposure/element.hpp"
#include "exposure/material_library.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>

namespace crewdose::planner {
namespace {

std::string symbol_of(int Z) {
    const auto e = exposure::element_by_Z(Z);
    return e ? std::string(e->symbol) : fmt::format("Z{}", Z);
}

std::string composition_text(const exposure::Material& m) {
    std::string out;
    for (const auto& share : m.composition()) {
        out += out.empty() ? "" : " ";
        out += fmt::format("{} {:.4g}", symbol_of(share.Z), share.mass_fraction);
    }
    return out;
}

} // namespace

std::string format_range_report(const exposure::Material& material,
                                const exposure::Particle& particle,
                                const std::vector<RangeRow>& rows, OutputFormat format) {
    if (format == OutputFormat::json) {
        nlohmann::json j;
        j["material"] = {{"id", material.id()},
                         {"density_g_cm3", material.density_g_cm3()},
                         {"mean_excitation_eV", material.mean_excitation_eV()}};
        j["particle"] = {{"name", particle.name}, {"Z", particle.Z}, {"A", particle.A}};
        j["rows"] = nlohmann::json::array();
        for (const auto& r : rows) {
            j["rows"].push_back({{"energy_MeV_per_n", r.energy_MeV_per_n},
                                 {"stopping_MeV_cm2_g", r.stopping_MeV_cm2_g},
                                 {"let_keV_um", r.let_keV_um},
                                 {"csda_range_g_cm2", r.csda_range_g_cm2},
                                 {"csda_range_cm", r.csda_range_cm}});
        }
        return dump_checked(j);
    }
    if (format == OutputFormat::csv) {
        std::string out =
            "energy_MeV_per_n,stopping_MeV_cm2_g,let_keV_um,csda_range_g_cm2,csda_range_cm\n";
        for (const auto& r : rows) {
            out += fmt::format("{:.10g},{:.10g},{:.10g},{:.10g},{:.10g}\n", r.energy_MeV_per_n,
                               r.stopping_MeV_cm2_g, r.let_keV_um, r.csda_range_g_cm2,
                               r.csda_range_cm);
        }
        return out;
    }
    std::string out =
        fmt::format("{} in {} ({}; {:.4g} g/cm3; I = {:.4g} eV)\n", particle.name, material.id(),
                    material.name(), material.density_g_cm3(), material.mean_excitation_eV());
    out += "electronic stopping, continuous-slowing-down (CSDA) range\n\n";
    out += fmt::format("  {:>11}  {:>14}  {:>10}  {:>13}  {:>13}\n", "energy", "stopping power",
                       "LET", "CSDA range", "CSDA range");
    out += fmt::format("  {:>11}  {:>14}  {:>10}  {:>13}  {:>13}\n", "MeV/n", "MeV cm2/g", "keV/um",
                       "g/cm2", "cm");
    for (const auto& r : rows) {
        out += fmt::format("  {:>11.4g}  {:>14}  {:>10}  {:>13}  {:>13}\n", r.energy_MeV_per_n,
                           significant(r.stopping_MeV_cm2_g, 4), significant(r.let_keV_um, 4),
                           significant(r.csda_range_g_cm2, 4), significant(r.csda_range_cm, 4));
    }
    out += "\nLET is unrestricted, in the material itself. Energies are kinetic energy per "
           "nucleon.\n";
    return out;
}

std::string format_materials_report(OutputFormat format) {
    const auto materials = exposure::builtin_materials();
    if (format == OutputFormat::json) {
        nlohmann::json j = nlohmann::json::array();
        for (const auto& m : materials) {
            nlohmann::json comp = nlohmann::json::array();
            for (const auto& share : m.composition()) {
                comp.push_back({{"element", symbol_of(share.Z)},
                                {"Z", share.Z},
                                {"mass_fraction", share.mass_fraction}});
            }
            j.push_back({{"id", m.id()},
                         {"name", m.name()},
                         {"density_g_cm3", m.density_g_cm3()},
                         {"mean_excitation_eV", m.mean_excitation_eV()},
                         {"mean_excitation_is_own", m.has_own_mean_excitation()},
                         {"density_effect_tabulated", m.has_tabulated_density_effect()},
                         {"gas", m.phase() == exposure::Phase::gas},
                         {"composition", comp},
                         {"source", m.source()}});
        }
        return dump_checked(nlohmann::json{{"materials", j}});
    }
    if (format == OutputFormat::csv) {
        std::string out = "id,density_g_cm3,mean_excitation_eV,i_value_origin,composition\n";
        for (const auto& m : materials) {
            out += fmt::format(
                "{},{:.10g},{:.10g},{},\"{}\"\n", m.id(), m.density_g_cm3(), m.mean_excitation_eV(),
                m.has_own_mean_excitation() ? "published" : "bragg", composition_text(m));
        }
        return out;
    }
    std::string out = fmt::format("{} built-in materials (mass fractions; I marked * is the "
                                  "Bragg-additivity value)\n\n",
                                  materials.size());
    out += fmt::format("  {:<21} {:>10} {:>9}  {}\n", "id", "g/cm3", "I (eV)", "composition");
    for (const auto& m : materials) {
        out += fmt::format("  {:<21} {:>10.4g} {:>8.4g}{} {}\n", m.id(), m.density_g_cm3(),
                           m.mean_excitation_eV(), m.has_own_mean_excitation() ? " " : "*",
                           composition_text(m));
    }
    out += "\nSources of each material: crewdose materials --format json (field 'source').\n";
    return out;
}

} // namespace crewdose::planner
