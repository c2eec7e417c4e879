#pragma once
// Nuclear reactions that remove primary protons, and the optical depth they add to a range
// table (DESIGN.md physics item 2).
#include "material.hpp"
#include "range_table.hpp"

namespace crewdose::exposure {

/// Total reaction (non-elastic) cross section of a proton of kinetic energy `energy_MeV` on a
/// nucleus of atomic number Z and mass number A, in mb.
///  - A >= 2: Letaw, Silberberg & Tsao 1983 (ApJS 51, 271):
///      sigma = 45 A^0.7 [1 + 0.016 sin(5.3 - 2.63 ln A)] [1 - 0.62 exp(-E/200) sin(10.9 E^-0.28)]
///    used from 5 MeV up; below, inside the Coulomb barrier region where the formula is not
///    meant to hold, it is taken as zero (protons below 5 MeV cross < 0.04 g/cm2 of water).
///  - hydrogen: the p-p inelastic cross section of Kafexhiu et al. 2014 (Phys. Rev. D 90,
///    123014), zero below the pion-production threshold 279.7 MeV.
[[nodiscard]] double proton_reaction_cross_section_mb(int Z, double A, double energy_MeV);

/// Macroscopic removal cross section of a material for protons, cm2/g:
/// sum over elements of w_i N_A / A_i sigma_i(E).
[[nodiscard]] double proton_removal_cm2_g(const Material& material, double energy_MeV);

/// Total reaction cross section of a nucleus (charge Zp, mass number Ap >= 2) on a target
/// nucleus (Zt, At), in mb, energy-independent, for the high-energy regime of the galactic
/// cosmic rays (above about 100 MeV/n; used at all energies, where the ions that matter for
/// dose are fast):
///  - At >= 2: Sihver et al. 1993 (Phys. Rev. C 47, 1225), eq. 1:
///      sigma = pi r0^2 [Ap^(1/3) + At^(1/3) - b0 (Ap^(-1/3) + At^(-1/3))]^2,
///      r0 = 1.36 fm, b0 = 1.581 - 0.876 (Ap^(-1/3) + At^(-1/3));
///  - hydrogen target: by inverse kinematics the proton-nucleus cross section on the
///    projectile, proton_reaction_cross_section_mb(Zp, Ap, E) at the same energy per nucleon.
[[nodiscard]] double nucleus_reaction_cross_section_mb(int Zp, double Ap, int Zt, double At,
                                                       double energy_MeV_per_n);

/// Macroscopic removal cross section of a material for `particle` (any Z), cm2/g, at energy
/// per nucleon E: protons as proton_removal_cm2_g(), nuclei with the nucleus-nucleus form.
[[nodiscard]] double removal_cm2_g(const Material& material, const Particle& particle,
                                   double energy_MeV_per_n);

/// `table` (a range table of `material` for any particle) with its nuclear optical depth
/// filled from removal_cm2_g(), as with_proton_removal() does for protons.
[[nodiscard]] RangeTable with_removal(const RangeTable& table, const Material& material);

/// `proton_table` (a proton range table of `material`) with its nuclear optical depth filled:
/// Lambda(E) = integral from E_min to E of Sigma(E') / S(E') dE' (Simpson's rule per grid
/// interval), so that survival from E0 down to E is exp(-(Lambda(E0) - Lambda(E))).
[[nodiscard]] RangeTable with_proton_removal(const RangeTable& proton_table,
                                             const Material& material);

} // namespace crewdose::exposure
