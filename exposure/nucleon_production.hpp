#pragma once
// Light particles made when a nucleon (proton or neutron) reacts with a nucleus (DESIGN.md
// physics item 3): per reaction, the neutrons, protons, deuterons, tritons, helions and alphas
// emitted, by laboratory kinetic energy and hemisphere, the kinetic energy of the residual
// nuclei (target fragments, deposited where the reaction happens) and what nothing crewdose
// transports carries (photons, mesons). The number of reactions per unit path is the removal
// cross section of nuclear.hpp, so that every nucleon removed makes these products.
//
// Up to the evaluated tables' top energy (150 MeV for most elements): ENDF/B-VIII.1
// (endf_production.hpp), interpolated linearly in incident energy. From 250 MeV: our fit to
// measured (p,xn) spectra on C, Al, Fe and Pb from 256 MeV to 3 GeV (nucleon_fit_data.hpp,
// made by scripts/data/fit_nucleon_spectra.py) gives the neutrons; every other particle keeps
// its ratio to the neutrons in the 150 MeV evaluation, separately below and above 20 MeV of
// outgoing energy (evaporation and cascade). Between the two, a linear blend in incident
// energy. Stated approximations:
//  - a neutron projectile without its own evaluated table (or below it) takes the proton's
//    with neutrons and protons, tritons and helions exchanged (charge symmetry);
//  - an element without a usable table (none, or one ending below 100 MeV) takes the nearest
//    element's by atomic number, per reaction;
//  - hydrogen: no products (p-p reactions make mesons; the elastic scattering of neutrons on
//    hydrogen is np_elastic.hpp's, added by the march);
//  - energy and charge close exactly: products that would carry more than E + Q (or more
//    charge than the projectile and target hold) are scaled down to it, and what they leave
//    is counted as not transported.
#include "endf_production.hpp"

#include <array>
#include <span>
#include <string_view>
#include <vector>

namespace crewdose::exposure {

/// Up to the table's top (at most this) the evaluated data; from kFitFrom_MeV the fit.
inline constexpr double kEvaluatedUpTo_MeV = 150.0;
inline constexpr double kFitFrom_MeV = 250.0;
/// Outgoing energy that separates evaporation from cascade particles in the model, MeV (an
/// edge of yield_edges_MeV(): 10^1.3).
inline constexpr double kCascadeFrom_MeV = 19.952623149688797;

/// Outgoing laboratory kinetic-energy bins of every yield, MeV: [0, 0.1), then 10 per decade
/// from 0.1 MeV to 100 GeV (the evaluated tables' bins, extended).
[[nodiscard]] std::span<const double> yield_edges_MeV();

/// What one reaction emits.
struct ReactionYield {
    /// Particles per reaction in each outgoing bin, into the forward (cos theta_lab > 0) and
    /// backward hemispheres; indexed by LightParticle.
    std::array<std::vector<double>, kLightParticles> forward;
    std::array<std::vector<double>, kLightParticles> backward;
    double recoil_MeV = 0.0;    ///< kinetic energy of products heavier than He-4 (residual nuclei)
    double other_MeV = 0.0;     ///< photons, mesons, excitation: not transported
    double available_MeV = 0.0; ///< E + Q, shared by the above and the light particles
    double q_MeV = 0.0;         ///< mass-balance Q (negative: energy spent on binding)
    double charge_in = 0.0;     ///< target Z plus the projectile's charge
    double residual_charge = 0.0; ///< charge left on the residual nuclei

    /// Kinetic energy of the light particles per reaction, MeV (bins at their mid energy).
    [[nodiscard]] double light_MeV() const;
    /// Charge of the light particles per reaction.
    [[nodiscard]] double light_charge() const;
};

/// Mass and charge numbers of a light particle.
[[nodiscard]] int light_particle_A(LightParticle p);
[[nodiscard]] int light_particle_Z(LightParticle p);

/// The yield of one reaction of a proton (or neutron) of kinetic energy `energy_MeV` on element
/// Z (natural isotopic mix). Zero yield below the data's lowest energy, and for hydrogen.
[[nodiscard]] ReactionYield nucleon_reaction_yield(int Z, bool neutron_projectile,
                                                   double energy_MeV);

/// The neutron spectrum of the high-energy fit, neutrons per reaction per MeV at outgoing
/// energy E' for a proton of energy E on mass number A (nucleon_fit_data.hpp; for tests and
/// reports).
[[nodiscard]] double fitted_neutron_spectrum_per_MeV(double A, double E_MeV, double Eout_MeV);

} // namespace crewdose::exposure
