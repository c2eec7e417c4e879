#include "material.hpp"

#include "element.hpp"
#include "parameter_error.hpp"
#include "units.hpp"

#include <cmath>
#include <set>
#include <string>

namespace crewdose::exposure {

namespace {

std::string known_elements_text() {
    std::string out;
    for (const auto& e : elements()) {
        out += out.empty() ? "" : " ";
        out += e.symbol;
    }
    return out;
}

} // namespace

Material::Material(MaterialSpec spec) : spec_(std::move(spec)) {
    if (!(spec_.density_g_cm3 > 0.0) || !std::isfinite(spec_.density_g_cm3)) {
        throw ParameterError("density_g_cm3", "must be a finite number > 0 g/cm3, got " +
                                                  std::to_string(spec_.density_g_cm3));
    }
    if (spec_.composition.empty()) {
        throw ParameterError("composition", "needs at least one element");
    }
    double sum = 0.0;
    double z_over_a = 0.0;
    double log_i_weighted = 0.0;
    std::set<int> seen;
    for (const auto& share : spec_.composition) {
        const auto element = element_by_Z(share.Z);
        if (!element) {
            throw ParameterError("composition",
                                 "element Z = " + std::to_string(share.Z) +
                                     " is not known; allowed: " + known_elements_text());
        }
        if (!seen.insert(share.Z).second) {
            throw ParameterError("composition",
                                 "element " + std::string(element->symbol) + " is listed twice");
        }
        if (!(share.mass_fraction > 0.0) || share.mass_fraction > 1.0) {
            throw ParameterError("mass_fraction", "of " + std::string(element->symbol) +
                                                      " must be in (0, 1], got " +
                                                      std::to_string(share.mass_fraction));
        }
        sum += share.mass_fraction;
        const double za = share.mass_fraction * share.Z / element->atomic_mass_g_mol;
        z_over_a += za;
        log_i_weighted += za * std::log(element->mean_excitation_eV);
    }
    if (std::abs(sum - 1.0) > 1e-3) {
        throw ParameterError("composition", "mass fractions sum to " + std::to_string(sum) +
                                                "; they must sum to 1 within 0.001");
    }
    // Fractions that sum to 1 within the tolerance are used as given: renormalising would
    // silently change a user's material.
    z_over_a_ = z_over_a;
    if (spec_.mean_excitation_eV) {
        if (!(*spec_.mean_excitation_eV > 0.0)) {
            throw ParameterError("mean_excitation_eV", "must be > 0 eV");
        }
        mean_excitation_eV_ = *spec_.mean_excitation_eV;
    } else {
        // Bragg additivity of ln I, weighted by electron density (ICRU Report 37, eq. 4.5).
        mean_excitation_eV_ = std::exp(log_i_weighted / z_over_a);
    }
    density_effect_ = spec_.density_effect
                          ? *spec_.density_effect
                          : sternheimer_peierls(mean_excitation_eV_, plasma_energy_eV(),
                                                spec_.phase == Phase::gas);
}

double Material::plasma_energy_eV() const noexcept {
    return kPlasmaEnergy_eV * std::sqrt(spec_.density_g_cm3 * z_over_a_);
}

} // namespace crewdose::exposure
