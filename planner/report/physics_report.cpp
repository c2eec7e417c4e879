#include "planner/report/physics_report.hpp"

#include "planner/report/document.hpp"
#include "planner/report/document_writer.hpp"

#include "exposure/element.hpp"
#include "exposure/material_library.hpp"

#include <fmt/format.h>

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

report::Document range_document(const exposure::Material& material,
                                const exposure::Particle& particle,
                                const std::vector<RangeRow>& rows) {
    using report::Field;
    report::Document doc;
    doc.group({"material",
               {{"id", material.id()},
                {"density_g_cm3", material.density_g_cm3()},
                {"mean_excitation_eV", material.mean_excitation_eV()}}});
    doc.group({"particle",
               {{"name", std::string(particle.name)},
                {"Z", std::int64_t{particle.Z}},
                {"A", std::int64_t{particle.A}}}});
    doc.text("{} in {} ({}; {} g/cm3; I = {} eV)",
             {Field{"particle", std::string(particle.name)}, Field{"material", material.id()},
              Field{"name", material.name()}, Field{"density", material.density_g_cm3()},
              Field{"I", material.mean_excitation_eV()}});
    doc.text("electronic stopping, continuous-slowing-down (CSDA) range");
    doc.blank();
    report::Table t;
    t.key = "rows";
    t.is_csv = true;
    using report::number_column;
    auto energy = number_column("energy_MeV_per_n", "energy", "MeV/n", 11);
    energy.rounding = report::Rounding::general;
    t.columns = {energy, number_column("stopping_MeV_cm2_g", "stopping power", "MeV cm2/g", 14),
                 number_column("let_keV_um", "LET", "keV/um", 10),
                 number_column("csda_range_g_cm2", "CSDA range", "g/cm2", 13),
                 number_column("csda_range_cm", "CSDA range", "cm", 13)};
    for (const auto& r : rows) {
        t.rows.push_back({r.energy_MeV_per_n, r.stopping_MeV_cm2_g, r.let_keV_um,
                          r.csda_range_g_cm2, r.csda_range_cm});
    }
    doc.table(std::move(t));
    doc.blank();
    doc.text("LET is unrestricted, in the material itself. Energies are kinetic energy per "
             "nucleon.");
    return doc;
}

std::string format_range_report(const exposure::Material& material,
                                const exposure::Particle& particle,
                                const std::vector<RangeRow>& rows, OutputFormat format) {
    return report::write(range_document(material, particle, rows), format);
}

report::Document materials_document() {
    const auto materials = exposure::builtin_materials();
    report::Document doc;
    doc.text("{} built-in materials (mass fractions; I marked * is the Bragg-additivity value)",
             {report::Field{"count", static_cast<std::int64_t>(materials.size())}});
    doc.blank();
    report::Table t;
    t.key = "materials";
    t.is_csv = true;
    using report::number_column;
    using report::text_column;
    // What only JSON or only CSV carries (the text shows the I marker and the composition).
    auto json_only = [](std::string key) {
        return text_column(std::move(key)).shown_in(false, true, false);
    };
    auto id = text_column("id", "id");
    id.min_width = 21;
    auto density = number_column("density_g_cm3", "g/cm3", "", 10);
    density.rounding = report::Rounding::general;
    density.gap = 1;
    auto excitation = number_column("mean_excitation_eV", "I (eV)", "", 8);
    excitation.rounding = report::Rounding::general;
    excitation.gap = 1;
    auto bragg = text_column("mean_excitation_is_bragg").shown_in(true, false, false);
    bragg.suffix_when_true = "*";
    bragg.gap = 0;
    bragg.min_width = 1;
    auto composition = text_column("composition", "composition").shown_in(true, false, true);
    composition.gap = 1;
    t.columns = {id,
                 json_only("name"),
                 density,
                 excitation,
                 bragg,
                 json_only("mean_excitation_is_own"),
                 text_column("i_value_origin").shown_in(false, false, true),
                 json_only("density_effect_tabulated"),
                 json_only("gas"),
                 composition,
                 json_only("composition"),
                 json_only("source")};
    for (const auto& m : materials) {
        report::Records comp;
        for (const auto& share : m.composition()) {
            comp.items.push_back({{"element", symbol_of(share.Z)},
                                  {"Z", std::int64_t{share.Z}},
                                  {"mass_fraction", share.mass_fraction}});
        }
        const bool own_I = m.has_own_mean_excitation();
        t.rows.push_back({m.id(), m.name(), m.density_g_cm3(), m.mean_excitation_eV(), !own_I,
                          own_I, std::string(own_I ? "published" : "bragg"),
                          m.has_tabulated_density_effect(), m.phase() == exposure::Phase::gas,
                          composition_text(m), std::move(comp), std::string(m.source())});
    }
    doc.table(std::move(t));
    doc.blank();
    doc.text("Sources of each material: crewdose materials --format json (field 'source').");
    return doc;
}

std::string format_materials_report(OutputFormat format) {
    return report::write(materials_document(), format);
}

} // namespace crewdose::planner
