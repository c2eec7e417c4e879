#include "bethe.hpp"

#include "element.hpp"
#include "units.hpp"

#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {

namespace {

// Ashley, Ritchie & Brandt 1972 (Phys. Rev. B 5, 2393) function F(W) of the Barkas term, as
// tabulated for ICRU Report 49 (transcribed from the public Geant4 G4EmCorrections table).
struct FPoint {
    double w;
    double f;
};
constexpr FPoint kArbF[] = {
    {0.02, 21.5}, {0.03, 20.0}, {0.04, 18.0}, {0.05, 15.6},  {0.06, 15.0},   {0.07, 14.0},
    {0.08, 13.5}, {0.09, 13.0}, {0.1, 12.2},  {0.2, 9.25},   {0.3, 7.0},     {0.4, 6.0},
    {0.5, 4.5},   {0.6, 3.5},   {0.7, 3.0},   {0.8, 2.5},    {0.9, 2.0},     {1.0, 1.7},
    {1.2, 1.2},   {1.3, 1.0},   {1.4, 0.86},  {1.5, 0.7},    {1.6, 0.61},    {1.7, 0.52},
    {1.8, 0.5},   {1.9, 0.43},  {2.0, 0.42},  {2.1, 0.3},    {2.4, 0.2},     {3.0, 0.13},
    {3.08, 0.1},  {3.1, 0.09},  {3.3, 0.08},  {3.5, 0.07},   {3.8, 0.06},    {4.0, 0.051},
    {4.1, 0.04},  {4.8, 0.03},  {5.0, 0.024}, {5.1, 0.02},   {6.0, 0.013},   {6.5, 0.01},
    {7.0, 0.009}, {7.1, 0.008}, {8.0, 0.006}, {9.0, 0.0032}, {10.0, 0.0025},
};

double arb_F(double w) {
    constexpr std::size_t n = sizeof(kArbF) / sizeof(kArbF[0]);
    if (w <= kArbF[0].w) {
        return kArbF[0].f;
    }
    if (w >= kArbF[n - 1].w) {
        return kArbF[n - 1].f * kArbF[n - 1].w / w;
    }
    std::size_t i = 1;
    while (kArbF[i].w < w) {
        ++i;
    }
    const auto& a = kArbF[i - 1];
    const auto& b = kArbF[i];
    return a.f + (b.f - a.f) * (w - a.w) / (b.w - a.w);
}

// Shell parameter b of the ARB model per target element, as chosen in ICRU Report 49.
double arb_b(int Z) {
    if (Z == 2) {
        return 0.6;
    }
    if (Z <= 10 || Z == 18) {
        return 1.8;
    }
    if (Z <= 25) {
        return 1.4;
    }
    if (Z <= 50) {
        return 1.35;
    }
    return 1.3;
}

} // namespace

double barkas_L1_element(int Z, double beta2) {
    // L1 = F(b / sqrt(X)) / (sqrt(Z) X^(3/2)),  X = beta^2 / (alpha^2 Z)   (ICRU 49 eq. 2.4).
    const double dz = Z;
    const double x = beta2 / (kFineStructure * kFineStructure * dz);
    return arb_F(arb_b(Z) / std::sqrt(x)) / (std::sqrt(dz) * x * std::sqrt(x));
}

double barkas_L1(const Material& material, double beta2) {
    // Stopping numbers of a compound combine with each element's share of the electrons.
    double sum = 0.0;
    for (const auto& share : material.composition()) {
        const auto element = element_by_Z(share.Z);
        const double electrons = share.mass_fraction * share.Z / element->atomic_mass_g_mol;
        sum += electrons * barkas_L1_element(share.Z, beta2);
    }
    return sum / material.z_over_a_mol_g();
}

namespace {

double barkas_berger_C(double I, double eta) {
    const double e2 = 1.0 / (eta * eta);
    const double e4 = e2 * e2;
    const double e6 = e4 * e2;
    return (0.422377 * e2 + 0.0304043 * e4 - 0.00038106 * e6) * 1e-6 * I * I +
           (3.858019 * e2 - 0.1667989 * e4 + 0.00157955 * e6) * 1e-9 * I * I * I;
}

} // namespace

double shell_correction_over_Z(double mean_excitation_eV, int Z, double eta) {
    // Barkas & Berger 1964 (NAS-NRC Publ. 1133), as given in the PDG Review and ICRU Report 37:
    // C = (0.422377 eta^-2 + 0.0304043 eta^-4 - 0.00038106 eta^-6) 1e-6 I^2
    //   + (3.858019 eta^-2 - 0.1667989 eta^-4 + 0.00157955 eta^-6) 1e-9 I^3,  I in eV,
    // valid for eta >= 0.13 (about 8 MeV for protons). Below that the polynomial turns over and
    // diverges, while the true correction keeps growing towards the K-shell velocity; crewdose
    // continues it linearly in ln(eta) with the polynomial's mean slope over eta = 0.13..0.2.
    // That continuation is a numerical choice of this project, checked against ICRU 49 from
    // 2 to 8 MeV (tests/reference/stopping_icru49_test.cpp), not a published formula.
    constexpr double kEtaValid = 0.13;
    constexpr double kEtaSlope = 0.2;
    const double I = mean_excitation_eV;
    double c = 0.0;
    if (eta >= kEtaValid) {
        c = barkas_berger_C(I, eta);
    } else {
        const double c_valid = barkas_berger_C(I, kEtaValid);
        const double slope =
            (c_valid - barkas_berger_C(I, kEtaSlope)) / std::log(kEtaSlope / kEtaValid);
        c = c_valid + slope * std::log(kEtaValid / eta);
    }
    return c / static_cast<double>(Z);
}

double bloch_term(double y) {
    // -y^2 sum 1/(n (n^2 + y^2)): the terms up to N = 24 + 2y are summed and the remainder is
    // the midpoint-rule integral from N + 1/2, (1 / (2 y^2)) ln(1 + y^2 / (N + 1/2)^2)
    // (relative error below 1e-6 for every y; it tends to 1/(2 (N + 1/2)^2) as y -> 0).
    const double y2 = y * y;
    const int terms = 24 + static_cast<int>(std::ceil(2.0 * y));
    double sum = 0.0;
    for (int n = 1; n <= terms; ++n) {
        const double dn = n;
        sum += 1.0 / (dn * (dn * dn + y2));
    }
    const double edge = terms + 0.5;
    const double tail =
        y2 > 1e-12 ? std::log1p(y2 / (edge * edge)) / (2.0 * y2) : 1.0 / (2.0 * edge * edge);
    return -y2 * (sum + tail);
}

BetheTerms bethe_terms(const Material& material, const Particle& particle, double energy_MeV_per_n,
                       double z_eff) {
    if (!(energy_MeV_per_n > 0.0)) {
        throw std::logic_error("bethe_terms: energy must be > 0");
    }
    BetheTerms t;
    const double gamma = particle.gamma(energy_MeV_per_n);
    const double beta2 = particle.beta2(energy_MeV_per_n);
    const double bg2 = beta2 * gamma * gamma;
    const double mass_ratio = kElectronMass_MeV / particle.mass_MeV;
    // Largest energy transfer to a free electron (PDG eq. 34.4).
    const double w_max =
        2.0 * kElectronMass_MeV * bg2 / (1.0 + 2.0 * gamma * mass_ratio + mass_ratio * mass_ratio);
    const double I_MeV = material.mean_excitation_eV() * 1e-6;
    t.beta2 = beta2;
    t.log_term = 0.5 * std::log(2.0 * kElectronMass_MeV * bg2 * w_max / (I_MeV * I_MeV)) - beta2;

    // Shell correction per element, combined with each element's share of the electrons.
    const double eta = std::sqrt(bg2);
    double shell = 0.0;
    for (const auto& share : material.composition()) {
        const auto element = element_by_Z(share.Z);
        const double electrons = share.mass_fraction * share.Z / element->atomic_mass_g_mol;
        shell += electrons * shell_correction_over_Z(element->mean_excitation_eV, share.Z, eta);
    }
    t.shell = shell / material.z_over_a_mol_g();

    t.half_density = 0.5 * material.density_effect().delta(std::log10(eta));
    t.barkas = z_eff * barkas_L1(material, beta2);
    const double y = z_eff * kFineStructure / std::sqrt(beta2);
    t.bloch = bloch_term(y);
    return t;
}

double bethe_stopping_MeV_cm2_g(const Material& material, const Particle& particle,
                                double energy_MeV_per_n, double z_eff) {
    const BetheTerms t = bethe_terms(material, particle, energy_MeV_per_n, z_eff);
    return kBetheK_MeV_cm2_per_mol * material.z_over_a_mol_g() * z_eff * z_eff / t.beta2 *
           t.stopping_number();
}

} // namespace crewdose::exposure
