#pragma once
#include <optional>
#include <span>
#include <string_view>

namespace crewdose::exposure {

/// A chemical element as stopping-power theory needs it.
struct Element {
    int Z;                     ///< atomic number
    std::string_view symbol;   ///< chemical symbol, for example "Al"
    std::string_view name;     ///< English name, for example "aluminium"
    double atomic_mass_g_mol;  ///< standard atomic weight, g/mol
    double mean_excitation_eV; ///< mean excitation energy I of the element, eV
};

/// Every element crewdose knows, ordered by Z.
[[nodiscard]] std::span<const Element> elements();
/// Element by atomic number; nullopt if crewdose does not carry it.
[[nodiscard]] std::optional<Element> element_by_Z(int Z);
/// Element by chemical symbol, case-sensitive ("Fe"); nullopt if unknown.
[[nodiscard]] std::optional<Element> element_by_symbol(std::string_view symbol);

} // namespace crewdose::exposure
