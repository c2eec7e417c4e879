#include "gcr.hpp"

#include "units.hpp"

#include <array>
#include <cmath>
#include <stdexcept>
#include <string>

namespace crewdose::exposure {
namespace {

// Heavier nuclei, Z = 4..28: abundances relative to oxygen = 1000 at 10.6 GeV/n measured by
// the French-Danish HEAO-3-C2 experiment (Engelmann et al. 1990, A&A 233, 96, table of
// relative abundances; 0.6 to 35 GeV/n, flown 1979-80), and its absolute oxygen intensity
// there, 0.0329 per (m2 sr s GeV/n). Lithium (Z = 3) is not in that table: its interstellar
// abundance comes from the spectral table below (kIsoLithiumC).
constexpr double kHeaoEnergy_MeV_per_n = 10600.0;
constexpr double kHeaoOxygen_per_m2_sr_s_GeV_n = 0.0329;
constexpr std::array<double, 29> kHeaoRelativeToOxygen1000{
    0.0,   // (index 0 unused)
    0.0,   // H: Burger LIS
    0.0,   // He: from the proton LIS, see below
    0.0,   // Li: not measured by HEAO-3-C2, see kIsoLithiumC
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
// Helium: the proton LIS per unit rigidity divided by r(R) = r0 (R / 10 GV)^-delta. r0 and delta
// are our fit (scripts/data/helium_lis.py) to the AMS-02 helium flux of Aguilar et al. 2021
// (Physics Reports 894, 1; tests/data/crdb) from 2 to 100 GV, at the phi (629 MV) that this LIS
// fits to the same report's protons; PAMELA's helium (Adriani et al. 2011, Science 332, 69) is
// held out as the test. (The constant p/He = 7 at equal rigidity used before, after Webber &
// Lezniak 1974, left helium at 0.72-0.84 of both measurements.)
constexpr double kHeliumRatioAt10GV = 5.4606;
constexpr double kHeliumRatioIndex = 0.0623;

// Spectral shape of the nuclei Z >= 3 outside the heliosphere: the form of the ISO 15390
// galactic cosmic ray model (after Nymmik et al. 1992, Nucl. Tracks Radiat. Meas. 20, 427),
//   J(R) = C_Z beta^alpha_Z R^-gamma_Z   per unit rigidity,
// with each element's own indices, as tabulated for Z = 1-28 by Matthiae, Berger, Mrigakshi &
// Reitz 2013 (Adv. Space Res. 51, 329, "A ready-to-use galactic cosmic ray model"). The values
// were transcribed from two independent public implementations of that model that agree with
// each other; they were not checked against the paper itself. Only the shape is used (the
// normalisation stays HEAO-3's at 10.6 GeV/n), and it is modulated by our force field.
// The heavy nuclei fall faster towards low energy than the proton LIS taken in their rigidity:
// with that shape the model had 1.3-2.2 times the measured Z >= 10 and Z >= 20 intensities
// between 0.3 and 2 GeV/n (tests/unit/gcr_test.cpp, emulsion measurements of 1965).
struct IsoIndices {
    double gamma;
    double alpha;
};
constexpr std::array<IsoIndices, 29> kIsoIndices{{
    {0.0, 0.0},   // (index 0 unused)
    {2.74, 2.85}, // H (not used: Burger LIS)
    {2.77, 3.12}, // He (not used: proton LIS with p/He = 7)
    {2.82, 3.41}, // Li
    {3.05, 4.30}, // Be
    {2.96, 3.93}, // B
    {2.76, 3.18}, // C
    {2.89, 3.77}, // N
    {2.70, 3.11}, // O
    {2.82, 4.05}, // F
    {2.76, 3.11}, // Ne
    {2.84, 3.14}, // Na
    {2.70, 3.65}, // Mg
    {2.77, 3.46}, // Al
    {2.66, 3.00}, // Si
    {2.89, 4.04}, // P
    {2.71, 3.30}, // S
    {3.00, 4.40}, // Cl
    {2.93, 4.33}, // Ar
    {3.05, 4.49}, // K
    {2.77, 2.93}, // Ca
    {2.97, 3.78}, // Sc
    {2.99, 3.79}, // Ti
    {2.94, 3.50}, // V
    {2.89, 3.28}, // Cr
    {2.74, 3.29}, // Mn
    {2.63, 3.01}, // Fe
    {2.63, 4.25}, // Co
    {2.63, 3.52}, // Ni
}};
// Lithium's abundance: the same table's scale factors C_Z for lithium and oxygen (0.0195 and
// 0.0874 in its units), compared at 10.6 GeV/n (see lithium_relative_to_oxygen_1000()).
constexpr double kIsoLithiumC = 0.0195;
constexpr double kIsoOxygenC = 0.0874;

double rigidity_of(const Particle& p, double T_MeV_per_n) {
    const double T = T_MeV_per_n * 1e-3; // GeV/n
    const double Tr = p.mass_per_nucleon_MeV() * 1e-3;
    return static_cast<double>(p.A) / static_cast<double>(p.Z) * std::sqrt(T * (T + 2.0 * Tr));
}

double beta_of(const Particle& p, double T_MeV_per_n) {
    const double Tr = p.mass_per_nucleon_MeV();
    return std::sqrt(T_MeV_per_n * (T_MeV_per_n + 2.0 * Tr)) / (T_MeV_per_n + Tr);
}

// The ISO 15390 form per unit energy per nucleon up to a constant: J(R) dR/dT with
// dR/dT = (A/Z) / beta, so beta^(alpha - 1) R^-gamma (the constant A/Z is in the scale).
double iso_shape(const Particle& p, double T) {
    const IsoIndices& k = kIsoIndices.at(static_cast<std::size_t>(p.Z));
    return std::pow(beta_of(p, T), k.alpha - 1.0) * std::pow(rigidity_of(p, T), -k.gamma);
}

// Helium's LIS per unit energy per nucleon: the proton's per unit rigidity, shape(R) beta_p(R)
// (the Burger form is per unit kinetic energy, and dT/dR = beta for a proton), divided by r(R),
// times dR/dT_n = (A/Z) / beta for the helium nucleus.
double helium_lis_shape(const Particle& p, double T) {
    const double R = rigidity_of(p, T);
    const double mp_GeV = kProtonMass_MeV * 1e-3;
    const double beta_p = R / std::sqrt(R * R + mp_GeV * mp_GeV);
    const double ratio = kHeliumRatioAt10GV * std::pow(R / 10.0, -kHeliumRatioIndex);
    return burger_lis_shape(R) * beta_p / ratio * static_cast<double>(p.A) /
           static_cast<double>(p.Z) / beta_of(p, T);
}

// The LIS shape of a nucleus per unit energy per nucleon, up to its scale.
double lis_shape(const Particle& p, double T) {
    if (p.Z == 1) {
        return burger_lis_shape(rigidity_of(p, T));
    }
    if (p.Z == 2) {
        return helium_lis_shape(p, T);
    }
    return iso_shape(p, T);
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

// J / J_LIS at T for the nucleus's LIS shape.
double modulation_factor(const Particle& p, double T, double phi_MV) {
    const double Ts = shifted_energy(p, T, phi_MV);
    return lis_shape(p, Ts) / lis_shape(p, T) * force_field_factor(p, T, Ts);
}

// Lithium per 1000 oxygen at 10.6 GeV/n outside the heliosphere, from the ISO-form table:
// C_Z (A/Z) beta^(alpha-1) R^-gamma for both. (The ISO table's abundances of secondary nuclei
// are rough: its Be/O there is 53 against HEAO-3's 87.3.)
double lithium_relative_to_oxygen_1000() {
    const Particle li = *particle_by_Z(3);
    const Particle o = *particle_by_Z(8);
    const auto scaled = [](const Particle& p, double C) {
        return C * static_cast<double>(p.A) / static_cast<double>(p.Z) *
               iso_shape(p, kHeaoEnergy_MeV_per_n);
    };
    return 1000.0 * scaled(li, kIsoLithiumC) / scaled(o, kIsoOxygenC);
}

// Relative abundance at 10.6 GeV/n: measured at 1 AU for Z = 4-28 (HEAO-3), interstellar for
// lithium (the ISO table); > 0 when the nucleus is included.
double relative_to_oxygen_1000(int Z) {
    if (Z == 3) {
        static const double lithium = lithium_relative_to_oxygen_1000();
        return lithium;
    }
    return kHeaoRelativeToOxygen1000.at(static_cast<std::size_t>(Z));
}

// The LIS per GeV/n at 10.6 GeV/n of a nucleus with a HEAO-3 abundance: the measured intensity
// taken back through the force field at the HEAO-3 epoch's potential.
double heao_lis_at_reference(const Particle& p) {
    const double measured = kHeaoRelativeToOxygen1000.at(static_cast<std::size_t>(p.Z)) / 1000.0 *
                            kHeaoOxygen_per_m2_sr_s_GeV_n;
    return measured / modulation_factor(p, kHeaoEnergy_MeV_per_n, kHeaoEpochPhi_MV);
}

// Scale c_Z of the LIS of nucleus Z: J_LIS(T) = c_Z lis_shape(T) per GeV/n.
double lis_scale(const Particle& p) {
    if (p.Z <= 2) {
        return 1.0; // helium's scale is in its shape
    }
    if (relative_to_oxygen_1000(p.Z) <= 0.0) {
        return 0.0;
    }
    // Lithium: its interstellar ratio to oxygen's LIS; the others: HEAO-3 taken back.
    const double lis =
        p.Z == 3 ? relative_to_oxygen_1000(3) / 1000.0 * heao_lis_at_reference(*particle_by_Z(8))
                 : heao_lis_at_reference(p);
    return lis / lis_shape(p, kHeaoEnergy_MeV_per_n);
}

} // namespace

std::string_view gcr_composition_source() {
    return "protons: Burger et al. 2000 LIS as given by Usoskin et al. 2005; helium: the proton "
           "LIS per unit rigidity over p/He = 5.46 (R / 10 GV)^-0.062, our fit to AMS-02 helium "
           "(Aguilar et al. 2021); Z = 3-28: "
           "each element's ISO 15390 spectral shape in rigidity (indices as tabulated by "
           "Matthiae et al. 2013), scaled to the HEAO-3-C2 abundances and oxygen intensity at "
           "10.6 GeV/n (Engelmann et al. 1990) taken back to the LIS with phi = 1000 MV; "
           "lithium's abundance from the same ISO table";
}

double burger_lis_shape(double P) {
    return 1.9e4 * std::pow(P, -2.78) / (1.0 + 0.4866 * std::pow(P, -2.51));
}

bool gcr_nucleus_included(int Z) {
    if (Z == 1 || Z == 2) {
        return true;
    }
    return Z >= 3 && Z <= 28 && relative_to_oxygen_1000(Z) > 0.0;
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
    return scales.at(static_cast<std::size_t>(particle.Z)) * lis_shape(particle, T) * 1e-3;
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
