#include "gcr.hpp"

#include <array>
#include <cmath>
#include <stdexcept>
#include <string>

namespace crewdose::exposure {
namespace {

constexpr double kPi = 3.14159265358979323846;

// Heavier nuclei, Z = 4..28: abundances relative to oxygen = 1000 at 10.6 GeV/n measured by
// the French-Danish HEAO-3-C2 experiment (Engelmann et al. 1990, A&A 233, 96, table of
// relative abundances; 0.6 to 35 GeV/n, flown 1979-80), and its absolute oxygen intensity
// there, 0.0329 per (m2 sr s GeV/n). Lithium (Z = 3) is not in that table and we found no other
// published value: it is left out (see gcr_abundance_source()).
constexpr double kHeaoEnergy_MeV_per_n = 10600.0;
constexpr double kHeaoOxygen_per_m2_sr_s_GeV_n = 0.0329;
constexpr std::array<double, 29> kHeaoRelativeToOxygen1000{
    0.0,   // (index 0 unused)
    0.0,   // H: Burger LIS
    0.0,   // He: from the proton LIS, see below
    0.0,   // Li: no published value found
    87.3,  // Be
    192.5, // B
    986.3, // C
    218.7, // N
    1000,  // O
    15.5,  // F
    152.2, // Ne
    26.1,  // Na
    197.3, // Mg
    31.3,  // Al
    163.4, // Si
    5.3,   // P
    29.9,  // S
    5.2,   // Cl
    9.3,   // Ar
    6.1,   // K
    18.1,  // Ca
    3.1,   // Sc
    10.0,  // Ti
    5.2,   // V
    10.7,  // Cr
    8.8,   // Mn
    110.0, // Fe
    0.38,  // Co
    7.0};  // Ni
// HEAO-3 measured near solar maximum; its intensities are taken back to the LIS with the force
// field at this potential (an assumption of ours: the solar-maximum example value).
constexpr double kHeaoEpochPhi_MV = 1000.0;
// Helium: Webber & Lezniak 1974 (Astrophys. Space Sci. 30, 361): "on a rigidity representation
// the P/He ratio is also a constant ~7 above ~3 GeV". With the same LIS shape in rigidity for
// both, the proton-to-helium intensity ratio per unit rigidity at high rigidity is 7.
constexpr double kProtonToHeliumAtEqualRigidity = 7.0;

double rigidity_of(const Particle& p, double T_MeV_per_n) {
    const double T = T_MeV_per_n * 1e-3; // GeV/n
    const double Tr = p.mass_per_nucleon_MeV() * 1e-3;
    return static_cast<double>(p.A) / static_cast<double>(p.Z) * std::sqrt(T * (T + 2.0 * Tr));
}

// Force field (Gleeson & Axford 1968): the energy per nucleon outside the heliosphere, T + Phi
// with Phi = (Z/A) phi, and the factor J(T) / J_LIS(T + Phi) = T (T + 2 T_r) / (Ts (Ts + 2 T_r)).
double shifted_energy(const Particle& p, double T, double phi_MV) {
    return T + static_cast<double>(p.Z) / static_cast<double>(p.A) * phi_MV;
}

double force_field_factor(const Particle& p, double T, double Ts) {
    const double Tr = p.mass_per_nucleon_MeV();
    return T * (T + 2.0 * Tr) / (Ts * (Ts + 2.0 * Tr));
}

// J / J_LIS at T for the shape in the particle's rigidity.
double modulation_factor(const Particle& p, double T, double phi_MV) {
    const double Ts = shifted_energy(p, T, phi_MV);
    return burger_lis_shape(rigidity_of(p, Ts)) / burger_lis_shape(rigidity_of(p, T)) *
           force_field_factor(p, T, Ts);
}

// Scale c_Z of the LIS of nucleus Z: J_LIS(T) = c_Z burger_lis_shape(P_Z(T)) per GeV/n.
double lis_scale(const Particle& p) {
    if (p.Z == 1) {
        return 1.0;
    }
    if (p.Z == 2) {
        // Per unit rigidity J = c shape(P) beta Z/A for the nucleus and shape(P) beta for the
        // proton; at high rigidity (beta -> 1) the ratio is A / (Z c).
        return static_cast<double>(p.A) / static_cast<double>(p.Z) / kProtonToHeliumAtEqualRigidity;
    }
    const double relative = kHeaoRelativeToOxygen1000.at(static_cast<std::size_t>(p.Z));
    if (relative <= 0.0) {
        return 0.0;
    }
    const double measured = relative / 1000.0 * kHeaoOxygen_per_m2_sr_s_GeV_n;
    const double lis = measured / modulation_factor(p, kHeaoEnergy_MeV_per_n, kHeaoEpochPhi_MV);
    return lis / burger_lis_shape(rigidity_of(p, kHeaoEnergy_MeV_per_n));
}

} // namespace

std::string_view gcr_composition_source() {
    return "protons: Burger et al. 2000 LIS as given by Usoskin et al. 2005; helium: proton "
           "LIS in rigidity with p/He = 7 at equal rigidity (Webber & Lezniak 1974); Z = 4-28: "
           "HEAO-3-C2 abundances and oxygen intensity at 10.6 GeV/n (Engelmann et al. 1990), "
           "taken back to the LIS with phi = 1000 MV; lithium left out (no published value "
           "found)";
}

double burger_lis_shape(double P) {
    return 1.9e4 * std::pow(P, -2.78) / (1.0 + 0.4866 * std::pow(P, -2.51));
}

bool gcr_nucleus_included(int Z) {
    if (Z == 1 || Z == 2) {
        return true;
    }
    return Z >= 3 && Z <= 28 && kHeaoRelativeToOxygen1000.at(static_cast<std::size_t>(Z)) > 0.0;
}

double gcr_lis(const Particle& particle, double T) {
    if (!(T > 0.0)) {
        return 0.0;
    }
    if (particle.Z < 1 || particle.Z > 28) {
        throw std::logic_error("gcr_lis: the GCR model covers Z = 1 to 28");
    }
    // Scales per Z, computed once (particles() is fixed).
    static const std::array<double, 29> scales = [] {
        std::array<double, 29> c{};
        for (const auto& p : particles()) {
            c.at(static_cast<std::size_t>(p.Z)) = lis_scale(p);
        }
        return c;
    }();
    return scales.at(static_cast<std::size_t>(particle.Z)) *
           burger_lis_shape(rigidity_of(particle, T)) * 1e-3;
}

double gcr_modulated(const Particle& particle, double T, double phi_MV) {
    if (!(phi_MV >= 0.0)) {
        throw std::logic_error("gcr_modulated: the modulation potential must be >= 0");
    }
    const double Ts = shifted_energy(particle, T, phi_MV);
    return gcr_lis(particle, Ts) * force_field_factor(particle, T, Ts);
}

double gcr_omnidirectional_per_cm2_day_MeV_n(const Particle& particle, double T, double phi_MV) {
    constexpr double kCm2_per_m2 = 1e-4;
    constexpr double kSeconds_per_day = 86400.0;
    return 4.0 * kPi * gcr_modulated(particle, T, phi_MV) * kCm2_per_m2 * kSeconds_per_day;
}

NodeFluences gcr_node_fluences(const Particle& particle, double phi_MV,
                               std::span<const double> nodes) {
    NodeFluences f;
    f.per_unit_log_energy_per_cm2.resize(nodes.size());
    f.extrapolated_per_cm2.assign(nodes.size(), 0.0);
    for (std::size_t j = 0; j < nodes.size(); ++j) {
        f.per_unit_log_energy_per_cm2[j] =
            nodes[j] * gcr_omnidirectional_per_cm2_day_MeV_n(particle, nodes[j], phi_MV);
    }
    return f;
}

IonField gcr_free_space_field(const FragmentTransport& march, double phi_MV) {
    IonField field = march.empty_field();
    const auto& E = march.energies();
    for (const auto& p : particles()) {
        if (p.Z > FragmentTransport::kMaxZ || !gcr_nucleus_included(p.Z)) {
            continue;
        }
        auto& psi = field.psi[static_cast<std::size_t>(p.Z - 1)];
        for (std::size_t m = 0; m < E.size(); ++m) {
            psi[m] = E[m] * gcr_omnidirectional_per_cm2_day_MeV_n(p, E[m], phi_MV);
        }
    }
    return field;
}

} // namespace crewdose::exposure
