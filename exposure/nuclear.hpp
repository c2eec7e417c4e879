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

/// `proton_table` (a proton range table of `material`) with its nuclear optical depth filled:
/// Lambda(E) = integral from E_min to E of Sigma(E') / S(E') dE' (Simpson's rule per grid
/// interval), so that survival from E0 down to E is exp(-(Lambda(E0) - Lambda(E))).
[[nodiscard]] RangeTable with_proton_removal(const RangeTable& proton_table,
                                             const Material& material);

} // namespace crewdose::exposure
