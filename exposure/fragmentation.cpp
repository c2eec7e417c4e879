#include "fragmentation.hpp"

#include "element.hpp"
#include "nuclear.hpp"
#include "units.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {

namespace {

// Line of beta stability used by EPAX: Z_beta(A) = A / (1.98 + 0.0155 A^(2/3)).
double z_beta(double A) {
    return A / (1.98 + 0.0155 * std::pow(A, 2.0 / 3.0));
}

} // namespace

double epax3_cross_section_b(double Ap, double Zp, double At, double A, double Z) {
    if (!(A >= 1.0) || !(A < Ap) || !(Z >= 1.0) || !(At >= 1.0)) {
        return 0.0;
    }
    const double ratio = A / Ap; // fragment mass over projectile mass

    // Mass yield: S P exp(-P (Ap - A)), steeper close to the projectile.
    const double P = std::exp(-1.731 - 0.01399 * Ap);
    const double S = 0.270 * (std::cbrt(Ap) + std::cbrt(At) - 1.80);
    double yield = S * P * std::exp(-P * (Ap - A));
    if (ratio > 0.75) {
        yield *= std::exp(0.10 * Ap * (ratio - 0.75) * (ratio - 0.75));
    }

    // Most probable charge: the stability line, shifted (delta, smaller close to the
    // projectile), plus the projectile's memory of its own distance from stability.
    const double excess_p = Zp - z_beta(Ap); // > 0: proton-rich projectile
    double delta = A > 71.35 ? -1.087 + 0.03047 * A : 2.1353e-4 * A * A;
    if (ratio > 0.80) {
        delta *= 1.0 - 25.0 * (ratio - 0.80) * (ratio - 0.80);
    }
    const double memory = excess_p > 0.0
                              ? std::exp(-10.25 + 10.25 * ratio)
                              : ratio * ratio * (0.400 + 0.600 * ratio * ratio); // neutron-rich
    const double z_prob = z_beta(A) + delta + memory * excess_p + 0.0020 * A;

    // Width of the charge dispersion.
    const double r0 = 2.78 * std::exp((excess_p < 0.0 ? 0.0412 : 0.124) * excess_p);
    double R = r0 * std::exp(-0.015 * A + 0.320e-4 * A * A);
    if (ratio > 0.85) {
        R *= std::exp(30.0 * std::sqrt(Ap) * std::pow(ratio - 0.85, 3.0));
    }
    const double norm_R = std::sqrt(R / 3.14159);
    constexpr double kUn = 1.65; // neutron-rich side exponent
    constexpr double kUp = 2.10; // proton-rich side exponent

    double dispersion = 0.0;
    if (z_prob - Z > 0.0) {
        dispersion = norm_R * std::exp(-R * std::pow(z_prob - Z, kUn));
    } else {
        // Proton-rich side: the Gaussian-like fall turns into an exponential (a straight line
        // in log10) beyond z0.
        const double slope = 1.20 + 0.647 * std::pow(A / 2.0, 0.3);
        const double z0 = z_prob + slope * std::log(10.0) / (2.0 * R);
        if (Z > z0) {
            dispersion = norm_R * std::exp(-R * std::pow(std::fabs(z_prob - z0), kUp)) *
                         std::pow(10.0, -slope * (Z - z0));
        } else {
            dispersion = norm_R * std::exp(-R * std::pow(std::fabs(z_prob - Z), kUp));
        }
    }

    // Extra suppression of very neutron-rich fragments of neutron-rich projectiles.
    double brute = 1.0;
    if (excess_p < 0.0) {
        const double offset = excess_p + 2.4;
        if (z_beta(A) - Z > offset) {
            brute = std::pow(10.0,
                             -2.3e-3 * std::fabs(excess_p) * std::pow(z_beta(A) - Z + offset, 3.0));
        }
    }
    return brute * dispersion * yield;
}

ReactionChannels reaction_channels(int Zp, int Ap, double At) {
    if (Zp < 1 || Ap < Zp) {
        throw std::logic_error("reaction_channels: need 1 <= Zp <= Ap");
    }
    ReactionChannels out;
    if (Zp == 1) {
        return out; // a proton's reactions make only target fragments: not modelled
    }
    double remnant_total = 0.0;
    for (int Z = 3; Z <= Zp; ++Z) {
        double sum = 0.0;
        double sum_A = 0.0;
        const int A_max = std::min(Ap - 1, Ap - (Zp - Z));
        for (int A = Z; A <= A_max; ++A) {
            const double s = epax3_cross_section_b(Ap, Zp, At, A, Z);
            sum += s;
            sum_A += s * A;
        }
        if (sum > 0.0) {
            out.remnants.push_back({Z, sum, sum_A / sum});
            remnant_total += sum;
        }
    }
    // As fractions of the removal cross section (Sihver for nuclear targets, the proton-nucleus
    // one for hydrogen), at high energy where EPAX applies.
    const int Zt = At < 1.5 ? 1 : 2; // only hydrogen is told apart by the removal formula
    constexpr double kHighEnergy_MeV_per_n = 2000.0;
    const double removal_b =
        Zp >= 2 ? 1e-3 * nucleus_reaction_cross_section_mb(Zp, Ap, Zt, At, kHighEnergy_MeV_per_n)
                : 0.0;
    const double scale = remnant_total > removal_b ? 1.0 / remnant_total : 1.0 / removal_b;
    double remnant_fraction = 0.0;
    for (auto& c : out.remnants) {
        c.fraction *= scale;
        remnant_fraction += c.fraction;
        out.protons_per_reaction += c.fraction * (Zp - c.Z);
        out.neutrons_per_reaction += c.fraction * (Ap - c.mean_A - (Zp - c.Z));
    }
    out.breakup_fraction = std::max(0.0, 1.0 - remnant_fraction);
    out.protons_per_reaction += out.breakup_fraction * Zp;
    out.neutrons_per_reaction += out.breakup_fraction * (Ap - Zp);
    return out;
}

std::vector<double> partial_production_cm2_g(const Material& material, const Particle& projectile,
                                             double E) {
    std::vector<double> out(static_cast<std::size_t>(projectile.Z), 0.0);
    if (projectile.Z == 1) {
        return out;
    }
    for (const auto& share : material.composition()) {
        const auto element = element_by_Z(share.Z);
        if (!element) {
            throw std::logic_error("partial_production: unknown element in " + material.id());
        }
        const double At = element->atomic_mass_g_mol;
        const double removal =
            share.mass_fraction * kAvogadro_per_mol / At *
            nucleus_reaction_cross_section_mb(projectile.Z, projectile.A, share.Z, At, E) * 1e-27;
        const ReactionChannels ch = reaction_channels(projectile.Z, projectile.A, At);
        for (const auto& c : ch.remnants) {
            out[static_cast<std::size_t>(c.Z - 1)] += removal * c.fraction;
        }
        out[0] += removal * ch.protons_per_reaction;
    }
    return out;
}

} // namespace crewdose::exposure
