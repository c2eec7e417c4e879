#include "rigidity.hpp"

#include <cmath>

namespace crewdose::exposure {

double rigidity_GV(const Particle& particle, double energy_MeV_per_n) {
    const double m = particle.mass_per_nucleon_MeV();
    const double T = energy_MeV_per_n;
    return static_cast<double>(particle.A) / particle.Z * std::sqrt(T * (T + 2.0 * m)) * 1e-3;
}

double energy_MeV_per_n_from_rigidity(const Particle& particle, double rigidity) {
    const double m = particle.mass_per_nucleon_MeV();
    const double pc_per_n = 1e3 * rigidity * particle.Z / static_cast<double>(particle.A);
    // sqrt(p^2 + m^2) - m, written to keep precision when p << m.
    return pc_per_n * pc_per_n / (std::sqrt(pc_per_n * pc_per_n + m * m) + m);
}

double rigidity_per_energy_GV_per_MeV_n(const Particle& particle, double energy_MeV_per_n) {
    const double m = particle.mass_per_nucleon_MeV();
    const double T = energy_MeV_per_n;
    return static_cast<double>(particle.A) / particle.Z * 1e-3 * (T + m) /
           std::sqrt(T * (T + 2.0 * m));
}

} // namespace crewdose::exposure
