#pragma once
#include "material.hpp"
#include "particle.hpp"

namespace crewdose::exposure {

/// The parts of the Bethe stopping number L = L0 + z L1 + z^2 L2 at one energy, so that tests
/// and reports can see each correction.
struct BetheTerms {
    double beta2 = 0.0;        ///< beta^2 of the projectile
    double log_term = 0.0;     ///< 1/2 ln(2 m c^2 beta^2 gamma^2 Wmax / I^2) - beta^2
    double shell = 0.0;        ///< shell correction C/Z (subtracted)
    double half_density = 0.0; ///< density-effect correction delta/2 (subtracted)
    double barkas = 0.0;       ///< z L1, the Barkas (z^3) term (added)
    double bloch = 0.0;        ///< z^2 L2, the Bloch term (added, negative)
    /// Total stopping number L.
    [[nodiscard]] double stopping_number() const noexcept {
        return log_term - shell - half_density + barkas + bloch;
    }
};

/// Stopping number and its corrections for a bare nucleus of charge `z_eff` and the mass of
/// `particle` at kinetic energy per nucleon `energy_MeV_per_n` in `material`.
/// Bethe formula with the shell correction of Barkas & Berger 1964 (per element, combined by
/// electron share), the Barkas term of Ashley, Ritchie & Brandt 1972, the Bloch term (Bloch 1933)
/// and the Sternheimer density effect (PDG Review "Passage of particles through matter", eq. 34.5).
[[nodiscard]] BetheTerms bethe_terms(const Material& material, const Particle& particle,
                                     double energy_MeV_per_n, double z_eff);

/// Electronic mass stopping power from the Bethe formula with all its corrections, MeV cm2/g:
/// S = K z^2 <Z/A> / beta^2 * L. Valid above about 1 MeV/n for protons and alphas.
[[nodiscard]] double bethe_stopping_MeV_cm2_g(const Material& material, const Particle& particle,
                                              double energy_MeV_per_n, double z_eff);

/// Shell correction C/Z of one element of mean excitation energy I (eV) at eta = beta gamma,
/// Barkas & Berger 1964 polynomial; below its validity limit eta = 0.13 the value at 0.13 is used
/// (the join to the low-energy form happens in that region, see stopping.cpp).
[[nodiscard]] double shell_correction_over_Z(double mean_excitation_eV, int Z, double eta);

/// Barkas term L1 (to be multiplied by z) of one element Z at beta^2: the Ashley-Ritchie-Brandt
/// model with the ICRU Report 49 shell parameters. Meant for beta^2 above about 1e-3 (0.5 MeV
/// protons); the stopping model only uses it above its low-energy join.
[[nodiscard]] double barkas_L1_element(int Z, double beta2);
/// Barkas term L1 of a material: the elements' terms combined by their share of the electrons.
[[nodiscard]] double barkas_L1(const Material& material, double beta2);

/// Bloch term z^2 L2 of the stopping number for y = z alpha / beta (the charge is inside y):
/// z^2 L2 = -y^2 sum_{n>=1} 1 / (n (n^2 + y^2)) (Bloch 1933; ICRU Report 49 eq. 2.5).
[[nodiscard]] double bloch_term(double y);

} // namespace crewdose::exposure
