#pragma once
#include "particle.hpp"

namespace crewdose::exposure {

/// Magnetic rigidity R = p c / (Z e), GV, of `particle` at kinetic energy per nucleon
/// `energy_MeV_per_n`: R = (A / Z) sqrt(T (T + 2 m)) / 1000 with T and m per nucleon in MeV.
[[nodiscard]] double rigidity_GV(const Particle& particle, double energy_MeV_per_n);

/// Kinetic energy per nucleon, MeV/n, at rigidity `rigidity_GV` (inverse of rigidity_GV()):
/// T = sqrt((1000 R Z / A)^2 + m^2) - m.
[[nodiscard]] double energy_MeV_per_n_from_rigidity(const Particle& particle, double rigidity_GV);

/// Jacobian dR/dE, GV per (MeV/n): (A / (1000 Z)) (T + m) / sqrt(T (T + 2 m)).
[[nodiscard]] double rigidity_per_energy_GV_per_MeV_n(const Particle& particle,
                                                      double energy_MeV_per_n);

} // namespace crewdose::exposure
