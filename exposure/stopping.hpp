#pragma once
#include "material.hpp"
#include "particle.hpp"

namespace crewdose::exposure {

/// Energies per nucleon (MeV/n) between which the low-energy fits hand over to the Bethe
/// formula: below `low` only the fit is used, above `high` only Bethe, and in between the two
/// are blended in log space with a smoothstep weight in ln E, so stopping power and its slope are
/// continuous.
struct JoinWindow {
    double low_MeV_per_n;
    double high_MeV_per_n;
};

/// The join window used for `particle` in `material`.
[[nodiscard]] JoinWindow join_window(const Material& material, const Particle& particle);

/// Effective charge of a heavy ion (Z >= 3) at kinetic energy per nucleon `energy_MeV_per_n`:
/// z_eff = z (1 - exp(-a beta^b z^-c)), the form of Barkas (1963, "Nuclear Research Emulsions"
/// vol. 1: a = 125, b = 1, c = 2/3) with a = 284.239, b = 1.10708, c = 0.792729 fitted to the
/// revised ICRU Report 73 water table for Z = 3-18 from 0.1 to 200 MeV/u
/// (scripts/data/fit_effective_charge.py; rms error of z_eff 1.4 % against Barkas's 5.9 %). It
/// stands in for what the scaling from the proton's stopping and the Bethe formula's corrections
/// miss for heavy ions at low velocity; above Z = 18 it is an extrapolation (ICRU 73 stops at
/// argon). Protons and alphas return their bare charge: their low-energy fits include the
/// charge state.
[[nodiscard]] double effective_charge(const Particle& particle, double energy_MeV_per_n);

/// Electronic mass stopping power from the published low-energy fits alone, MeV cm2/g:
/// ICRU 49 proton fits (heavy ions: scaled by z_eff^2 at equal velocity), ICRU 49 helium fits for
/// alphas; the compound's own fit where it has one, else Bragg additivity over its elements.
[[nodiscard]] double low_energy_stopping_MeV_cm2_g(const Material& material,
                                                   const Particle& particle,
                                                   double energy_MeV_per_n);

/// Electronic mass stopping power, MeV cm2/g, of `particle` at kinetic energy per nucleon
/// `energy_MeV_per_n` (> 0) in `material`: the low-energy fits joined to the Bethe formula with
/// shell, Barkas, Bloch and density-effect corrections (see JoinWindow). Energy loss of the
/// whole ion per g/cm2; divide by A for the loss of energy per nucleon.
[[nodiscard]] double electronic_stopping_MeV_cm2_g(const Material& material,
                                                   const Particle& particle,
                                                   double energy_MeV_per_n);

/// Unrestricted LET in the material, keV/um: stopping power x density / 10.
[[nodiscard]] double let_keV_um(const Material& material, const Particle& particle,
                                double energy_MeV_per_n);

} // namespace crewdose::exposure
