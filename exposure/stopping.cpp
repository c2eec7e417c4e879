#include "stopping.hpp"

#include "bethe.hpp"
#include "element.hpp"
#include "low_energy_stopping.hpp"
#include "units.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>

namespace crewdose::exposure {
namespace {

// Mass stopping power from a fit family: the compound's own fit if it has one (selected by
// `compound_fit`), else Bragg additivity over the elements' fits (`element_fit`).
template <class CompoundFit, class ElementFit>
double fit_stopping(const Material& material, double T, CompoundFit compound_fit,
                    ElementFit element_fit, const char* family) {
    const auto& compound = material.low_energy_fit();
    if (compound) {
        if (const auto& fit = compound_fit(*compound)) {
            return cross_section_to_mass_stopping(fit->cross_section(T),
                                                  compound->formula_mass_g_mol);
        }
    }
    double s = 0.0;
    for (const auto& share : material.composition()) {
        const auto fit = element_fit(share.Z);
        const auto element = element_by_Z(share.Z);
        if (!fit || !element) {
            throw std::logic_error(std::string("no ICRU 49 ") + family +
                                   " fit for element Z = " + std::to_string(share.Z));
        }
        s += share.mass_fraction *
             cross_section_to_mass_stopping(fit->cross_section(T), element->atomic_mass_g_mol);
    }
    return s;
}

double proton_fit_stopping(const Material& material, double T_keV_per_u) {
    return fit_stopping(
        material, T_keV_per_u,
        [](const CompoundLowEnergyFit& c) -> const std::optional<ProtonFit>& { return c.proton; },
        proton_fit_for_element, "proton");
}

double helium_fit_stopping(const Material& material, double T_MeV) {
    return fit_stopping(
        material, T_MeV,
        [](const CompoundLowEnergyFit& c) -> const std::optional<HeliumFit>& { return c.helium; },
        helium_fit_for_element, "helium");
}

double smoothstep(double u) {
    if (u <= 0.0) {
        return 0.0;
    }
    if (u >= 1.0) {
        return 1.0;
    }
    return u * u * (3.0 - 2.0 * u);
}

} // namespace

JoinWindow join_window(const Material& material, const Particle& particle) {
    // Chosen against the ICRU 49 tables (PSTAR, ASTAR) for water, aluminium and polyethylene:
    // the proton fits hold to about 0.3 MeV and drift by up to 9 % at 1 MeV (polyethylene),
    // while Bethe with its corrections is within 1.7 % from 1 MeV up; the helium fits hold to
    // about 1 MeV/n. Figures: docs/model-notes.md, "Stopping-power accuracy".
    // The Bethe formula needs 2 m v^2 well above I, so for targets with a larger mean excitation
    // energy than aluminium (166 eV) the window moves up in proportion to I (lead: x 5).
    const double scale = std::max(1.0, material.mean_excitation_eV() / 166.0);
    if (particle.Z == 2) {
        return {0.5 * scale, 2.0 * scale};
    }
    return {0.2 * scale, 1.0 * scale};
}

double effective_charge(const Particle& particle, double energy_MeV_per_n) {
    const double z = particle.Z;
    if (particle.Z <= 2) {
        return z;
    }
    // Barkas's form with its constants refitted to ICRU Report 73 (see stopping.hpp).
    constexpr double a = 284.239;
    constexpr double b = 1.10708;
    constexpr double c = 0.792729;
    const double beta = std::sqrt(particle.beta2(energy_MeV_per_n));
    return z * (1.0 - std::exp(-a * std::pow(beta, b) / std::pow(z, c)));
}

double low_energy_stopping_MeV_cm2_g(const Material& material, const Particle& particle,
                                     double energy_MeV_per_n) {
    if (particle.Z == 2) {
        // The helium fit is per alpha-particle energy: He-3 takes the alpha's at its velocity.
        const double alpha_energy_MeV = particle.A == alpha().A
                                            ? energy_MeV_per_n * particle.A
                                            : energy_MeV_per_n * alpha().A *
                                                  alpha().mass_per_nucleon_MeV() /
                                                  particle.mass_per_nucleon_MeV();
        return helium_fit_stopping(material, alpha_energy_MeV);
    }
    // Proton fits take the energy per atomic mass unit at the projectile's velocity, keV/u.
    const double T_keV_per_u =
        1000.0 * energy_MeV_per_n * kAtomicMassUnit_MeV / particle.mass_per_nucleon_MeV();
    const double s_proton = proton_fit_stopping(material, T_keV_per_u);
    if (particle.Z == 1) {
        return s_proton;
    }
    const double z = effective_charge(particle, energy_MeV_per_n);
    return z * z * s_proton;
}

double electronic_stopping_MeV_cm2_g(const Material& material, const Particle& particle,
                                     double energy_MeV_per_n) {
    if (!(energy_MeV_per_n > 0.0) || !std::isfinite(energy_MeV_per_n)) {
        throw std::logic_error("electronic_stopping: energy must be finite and > 0");
    }
    const JoinWindow join = join_window(material, particle);
    if (energy_MeV_per_n <= join.low_MeV_per_n) {
        return low_energy_stopping_MeV_cm2_g(material, particle, energy_MeV_per_n);
    }
    const double z = effective_charge(particle, energy_MeV_per_n);
    const double s_bethe = bethe_stopping_MeV_cm2_g(material, particle, energy_MeV_per_n, z);
    if (energy_MeV_per_n >= join.high_MeV_per_n) {
        return s_bethe;
    }
    const double s_low = low_energy_stopping_MeV_cm2_g(material, particle, energy_MeV_per_n);
    if (!(s_bethe > 0.0) || !(s_low > 0.0)) {
        throw std::logic_error("electronic_stopping: non-positive stopping inside the join "
                               "window for " +
                               material.id());
    }
    const double w = smoothstep(std::log(energy_MeV_per_n / join.low_MeV_per_n) /
                                std::log(join.high_MeV_per_n / join.low_MeV_per_n));
    return std::exp((1.0 - w) * std::log(s_low) + w * std::log(s_bethe));
}

double let_keV_um(const Material& material, const Particle& particle, double energy_MeV_per_n) {
    // MeV cm2/g * g/cm3 = MeV/cm = 0.1 keV/um.
    return electronic_stopping_MeV_cm2_g(material, particle, energy_MeV_per_n) *
           material.density_g_cm3() * 0.1;
}

} // namespace crewdose::exposure
