#pragma once
// The galactic cosmic ray background (DESIGN.md physics item 8): nuclei Z = 1 to 28 from a
// local interstellar spectrum (LIS) modulated by the force-field approximation.
#include "fragment_transport.hpp"
#include "particle.hpp"
#include "response.hpp"

#include <span>
#include <string_view>

namespace crewdose::exposure {

/// The LIS of Burger, Potgieter & Heber 2000 (J. Geophys. Res. 105, 27447) in the form used by
/// Usoskin, Alanko-Huotari, Kovaltsov & Mursula 2005 (J. Geophys. Res. 110, A12108), eq. 2:
///   J_LIS(T) = 1.9e4 P^-2.78 / (1 + 0.4866 P^-2.51)   per (m2 s sr GeV/n),
/// P(T) = sqrt(T (T + 2 T_r)) in GV for protons, T in GeV/n, T_r = 0.938 GeV.
/// This is the shape as a function of P; see gcr_lis() for other nuclei.
[[nodiscard]] double burger_lis_shape(double P_GV);

/// Whether nucleus Z has a LIS in this model (Z = 1 to 28: all of them).
[[nodiscard]] bool gcr_nucleus_included(int Z);
/// Where the composition comes from, for reports.
[[nodiscard]] std::string_view gcr_composition_source();

/// LIS of `particle` at kinetic energy per nucleon T, particles per (m2 s sr MeV/n).
/// Protons: burger_lis_shape() at the proton's rigidity. Helium: the same shape taken in its
/// own rigidity P = (A/Z) sqrt(T (T + 2 T_r)) (so A/Z = 2 doubles the rigidity at one energy
/// per nucleon), scaled by the p/He ratio at equal rigidity. Z = 3..28: each element's ISO
/// 15390 shape C beta^alpha R^-gamma per unit rigidity, scaled (gcr_composition_source()):
/// Z = 4..28 to the HEAO-3 intensities at 10.6 GeV/n taken back with the force field, lithium
/// to the ISO table's interstellar Li/O ratio there.
/// T_r is the particle's rest energy per nucleon (nuclear mass / A; 938.27 MeV for the
/// proton). Zero for a nucleus not included.
[[nodiscard]] double gcr_lis(const Particle& particle, double T_MeV_per_n);

/// Force-field modulation (Gleeson & Axford 1968, ApJ 154, 1011) of the LIS with modulation
/// potential phi (MV): Phi = (Z/A) phi per nucleon and
///   J(T) = J_LIS(T + Phi) T (T + 2 T_r) / ((T + Phi) (T + Phi + 2 T_r)),
/// particles per (m2 s sr MeV/n). phi belongs to the LIS it was derived with (Usoskin et al.
/// use this LIS): a phi from a reconstruction made with another LIS is not interchangeable.
[[nodiscard]] double gcr_modulated(const Particle& particle, double T_MeV_per_n, double phi_MV);

/// Omnidirectional differential fluence rate in free space (isotropic field: 4 pi times the
/// per-steradian intensity), particles per (cm2 day MeV/n).
[[nodiscard]] double gcr_omnidirectional_per_cm2_day_MeV_n(const Particle& particle,
                                                           double T_MeV_per_n, double phi_MV);

/// Node fluences of the modulated spectrum for a response's nodes: psi = E phi(E) per cm2 per
/// day per unit ln E (nothing is marked extrapolated).
[[nodiscard]] NodeFluences gcr_node_fluences(const Particle& particle, double phi_MV,
                                             std::span<const double> nodes_MeV_per_n);

/// The free-space field of every included nucleus for the fragmentation march, on its nodes:
/// psi = E phi(E), omnidirectional, per cm2 per day per unit ln E (the march adds the
/// fragments).
[[nodiscard]] IonField gcr_free_space_field(const FragmentTransport& march, double phi_MV);

/// Example modulation potentials for this LIS (planning examples, not forecasts).
inline constexpr double kExampleSolarMinimumPhi_MV = 400.0;
inline constexpr double kExampleSolarMaximumPhi_MV = 1000.0;

} // namespace crewdose::exposure
