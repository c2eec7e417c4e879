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

RangeTable with_proton_removal(const RangeTable& table, const Material& material) {
    if (table.particle().Z != 1) {
        throw std::logic_error("with_proton_removal: the table is not a proton table");
    }
    const LogGrid& g = table.grid();
    std::vector<double> lambda(g.size(), 0.0);
    auto integrand = [&](double lnE) { // Sigma(E) / S(E) dE = E Sigma / S d(ln E)
        const double E = std::clamp(std::exp(lnE), g.front(), g.back());
        return E * proton_removal_cm2_g(material, E) / table.stopping_MeV_cm2_g(E);
    };
    const double h = g.log_step();
    for (std::size_t i = 1; i < g.size(); ++i) {
        const double a = g.log_node(i - 1);
        lambda[i] = lambda[i - 1] +
                    h / 6.0 * (integrand(a) + 4.0 * integrand(a + 0.5 * h) + integrand(a + h));
    }
    return table.with_optical_depth(std::move(lambda));
}

} // namespace crewdose::exposure
