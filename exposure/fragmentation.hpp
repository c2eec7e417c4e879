#pragma once
// Projectile fragmentation of the GCR nuclei (DESIGN.md physics item 8): what a nucleus
// becomes when it reacts in a shield, as partial cross sections for the straight-ahead,
// velocity-conserving transport of fragment_transport.hpp.
#include "material.hpp"
#include "particle.hpp"

#include <vector>

namespace crewdose::exposure {

/// EPAX version 3.1 (Suemmerer 2012, Phys. Rev. C 86, 014601, with its erratum Phys. Rev. C 87,
/// 039903): the cross section, in barn, for producing the fragment (A, Z) by fragmentation of
/// the projectile (Ap, Zp) on a target of mass number At at high energy (energy-independent;
/// meant for energies above about 100 MeV/n). The mass yield
///   Y(A) = S P exp(-P (Ap - A)),  S = 0.27 b (Ap^1/3 + At^1/3 - 1.80),  P = exp(-1.731 -
///   0.01399 Ap),
/// steepened for A/Ap > 0.75, times a charge dispersion about the most probable charge
/// Z_prob(A) with width R(A) and different exponents on the neutron-rich and proton-rich sides.
/// The parameterization was fitted to projectiles from about argon upwards on nuclear targets;
/// crewdose also uses it for the lighter GCR nuclei and for hydrogen targets (At = 1), both
/// stated extrapolations. Returns 0 for A >= Ap or A < 1.
[[nodiscard]] double epax3_cross_section_b(double Ap, double Zp, double At, double A, double Z);

/// One way a reaction of a projectile ends: its heaviest remnant, of charge `Z` (3 <= Z <= Zp;
/// Z = Zp is neutron removal, the projectile's element survives), with the probability
/// `fraction` per reaction and the remnant's mean mass number `mean_A` (from the EPAX
/// isotope distribution).
struct FragmentChannel {
    int Z = 0;
    double fraction = 0.0;
    double mean_A = 0.0;
};

/// What one reaction of the projectile (Zp, Ap) on a target nucleus of mass number At makes,
/// per reaction (the total is the removal cross section of nuclear.hpp):
///  - heavy remnants Z >= 3: the EPAX 3.1 cross sections summed over the isotopes that the
///    nucleon budget allows (A <= Ap - (Zp - Z)), as fractions of the removal cross section;
///    scaled down when their sum would exceed it, never up: on carbon and aluminium EPAX's sum
///    for Z >= 10 projectiles is only 0.62-0.69 of the Sihver removal cross section, so about a
///    third of those reactions end as breakup;
///  - the rest of the reactions leave no remnant heavier than helium ("breakup");
///  - charge balance (this project's closure rule, not EPAX): the charge the remnant lacks,
///    Zp - Z (all of Zp in a breakup), leaves as protons moving with the projectile's velocity;
///    the nucleons left over leave as neutrons, which crewdose does not transport (they are
///    named in every report as left out). Protons are the lightest choice: the secondary
///    helium ions a real breakup also makes would add dose (Z^2 = 4 for two charges instead of
///    2), so the light-fragment dose is a lower estimate.
/// Projectiles with Zp <= 2 have only the breakup channel. Protons make nothing (target
/// fragments are not modelled).
struct ReactionChannels {
    std::vector<FragmentChannel> remnants; ///< by increasing Z
    double breakup_fraction = 0.0;
    /// Protons emitted per reaction: sum over remnants of fraction (Zp - Z), plus
    /// breakup_fraction Zp.
    double protons_per_reaction = 0.0;
    /// Neutrons per reaction, from the remnants' mean mass numbers (>= 0).
    double neutrons_per_reaction = 0.0;
};
[[nodiscard]] ReactionChannels reaction_channels(int Zp, int Ap, double At);

/// Macroscopic partial cross sections of a material, cm2/g, at energy per nucleon E: for the
/// projectile `projectile`, per fragment charge Zf = 1..Zp (index Zf - 1), the production rate
/// of that element per g/cm2 (remnants, and at Zf = 1 the emitted protons), so that
///   d phi_f / dx = ... + sum_p partial[p][f] phi_p.
/// The element-by-element sum uses each element's removal cross section (nuclear.hpp) times
/// its channel fractions. The Zf = Zp entry is the neutron-removal channel, which returns the
/// projectile's own element.
[[nodiscard]] std::vector<double> partial_production_cm2_g(const Material& material,
                                                           const Particle& projectile,
                                                           double energy_MeV_per_n);

} // namespace crewdose::exposure
