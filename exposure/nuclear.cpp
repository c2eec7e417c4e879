#include "nuclear.hpp"

#include "element.hpp"
#include "units.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {

double proton_reaction_cross_section_mb(int Z, double A, double E) {
    if (Z == 1) {
        // Kafexhiu et al. 2014 eq. 1: T_th = 2 m_pi + m_pi^2 / (2 m_p) = 0.2797 GeV.
        constexpr double kThreshold_GeV = 0.2797;
        const double x = E * 1e-3 / kThreshold_GeV;
        if (x <= 1.0) {
            return 0.0;
        }
        const double lx = std::log(x);
        const double rise = 1.0 - std::pow(x, -1.9);
        return (30.7 - 0.96 * lx + 0.18 * lx * lx) * rise * rise * rise;
    }
    if (E < 5.0) {
        return 0.0;
    }
    const double high =
        45.0 * std::pow(A, 0.7) * (1.0 + 0.016 * std::sin(5.3 - 2.63 * std::log(A)));
    return high * (1.0 - 0.62 * std::exp(-E / 200.0) * std::sin(10.9 * std::pow(E, -0.28)));
}

double proton_removal_cm2_g(const Material& material, double E) {
    double sigma = 0.0;
    for (const auto& share : material.composition()) {
        const auto element = element_by_Z(share.Z);
        if (!element) {
            throw std::logic_error("proton_removal: unknown element in " + material.id());
        }
        const double A = element->atomic_mass_g_mol;
        sigma += share.mass_fraction * kAvogadro_per_mol / A *
                 proton_reaction_cross_section_mb(share.Z, A, E) * 1e-27;
    }
    return sigma;
}

double nucleus_reaction_cross_section_mb(int Zp, double Ap, int Zt, double At, double E) {
    if (!(Ap >= 2.0) || !(At >= 1.0)) {
        throw std::logic_error("nucleus_reaction_cross_section_mb: need Ap >= 2 and At >= 1");
    }
    if (Zt == 1) {
        return proton_reaction_cross_section_mb(Zp, Ap, E);
    }
    constexpr double kR0_fm = 1.36;
    const double ap = std::cbrt(Ap);
    const double at = std::cbrt(At);
    const double inverse_sum = 1.0 / ap + 1.0 / at;
    const double b0 = 1.581 - 0.876 * inverse_sum;
    const double radius = ap + at - b0 * inverse_sum;
    return kPi * kR0_fm * kR0_fm * radius * radius * 10.0; // fm2 -> mb
}

double removal_cm2_g(const Material& material, const Particle& particle, double E) {
    if (particle.A == 1) { // the proton, and the neutron (charge-independent above 5 MeV)
        return proton_removal_cm2_g(material, E);
    }
    double sigma = 0.0;
    for (const auto& share : material.composition()) {
        const auto element = element_by_Z(share.Z);
        if (!element) {
            throw std::logic_error("removal_cm2_g: unknown element in " + material.id());
        }
        const double A = element->atomic_mass_g_mol;
        sigma += share.mass_fraction * kAvogadro_per_mol / A *
                 nucleus_reaction_cross_section_mb(particle.Z, particle.A, share.Z, A, E) * 1e-27;
    }
    return sigma;
}

namespace {

RangeTable fill_optical_depth(const RangeTable& table, const Material& material) {
    const LogGrid& g = table.grid();
    const Particle& particle = table.particle();
    std::vector<double> lambda(g.size(), 0.0);
    // Sigma(E) / S(E) dE per nucleon energy: S is the whole ion's stopping, so dE/dx per
    // nucleon is S / A and the integrand is A E Sigma / S d(ln E).
    auto integrand = [&](double lnE) {
        const double E = std::clamp(std::exp(lnE), g.front(), g.back());
        return particle.A * E * removal_cm2_g(material, particle, E) / table.stopping_MeV_cm2_g(E);
    };
    const double h = g.log_step();
    for (std::size_t i = 1; i < g.size(); ++i) {
        const double a = g.log_node(i - 1);
        lambda[i] = lambda[i - 1] +
                    h / 6.0 * (integrand(a) + 4.0 * integrand(a + 0.5 * h) + integrand(a + h));
    }
    return table.with_optical_depth(std::move(lambda));
}

} // namespace

RangeTable with_removal(const RangeTable& table, const Material& material) {
    return fill_optical_depth(table, material);
}

RangeTable with_proton_removal(const RangeTable& table, const Material& material) {
    if (table.particle().Z != 1) {
        throw std::logic_error("with_proton_removal: the table is not a proton table");
    }
    return fill_optical_depth(table, material);
}

} // namespace crewdose::exposure
