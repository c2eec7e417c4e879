#include "response.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {
namespace {

const RangeTable& grid_table(std::span<const Layer> path, const DoseMedium& medium) {
    for (const auto& layer : path) {
        if (layer.table->grid().size() != medium.medium->grid().size() ||
            layer.table->grid().front() != medium.medium->grid().front()) {
            throw std::logic_error("path_response: every table must share one energy grid");
        }
    }
    return *medium.medium;
}

DoseQuantities lerp(const DoseQuantities& a, const DoseQuantities& b, double u) {
    return {a.absorbed_Gy + (b.absorbed_Gy - a.absorbed_Gy) * u,
            a.dose_equivalent_Sv + (b.dose_equivalent_Sv - a.dose_equivalent_Sv) * u,
            a.rbe_weighted_GyEq + (b.rbe_weighted_GyEq - a.rbe_weighted_GyEq) * u};
}

DoseQuantities minus(const DoseQuantities& a, const DoseQuantities& b) {
    return {a.absorbed_Gy - b.absorbed_Gy, a.dose_equivalent_Sv - b.dose_equivalent_Sv,
            a.rbe_weighted_GyEq - b.rbe_weighted_GyEq};
}

// Cumulative moments of the dose per incident fluence d over ln E0,
// G0(E0) = integral d dE0'/E0' and G1(E0) = integral d ln(E0') dE0'/E0' up to E0, known at the
// incident energies of the exit-grid nodes and interpolated linearly in E0 between them.
struct Cumulative {
    std::vector<double> incident; // E0_j, increasing
    std::vector<DoseQuantities> G0;
    std::vector<DoseQuantities> G1;
    DoseQuantities slope_above; // d beyond the last point

    void at(double E0, DoseQuantities& g0, DoseQuantities& g1) const {
        if (incident.empty() || E0 < incident.front()) {
            g0 = g1 = {};
            return;
        }
        if (E0 >= incident.back()) {
            const double le = std::log(incident.back());
            const double lE = std::log(E0);
            g0 = G0.back();
            g0 += slope_above.scaled(lE - le);
            g1 = G1.back();
            g1 += slope_above.scaled(0.5 * (lE * lE - le * le));
            return;
        }
        const auto it = std::upper_bound(incident.begin(), incident.end(), E0);
        const std::size_t j = static_cast<std::size_t>(it - incident.begin()) - 1;
        const double u = (E0 - incident[j]) / (incident[j + 1] - incident[j]);
        g0 = lerp(G0[j], G0[j + 1], u);
        g1 = lerp(G1[j], G1[j + 1], u);
    }
};

} // namespace

PathResponse path_response(std::span<const Layer> path, const DoseMedium& medium,
                           const Particle& particle, const RbeModel& rbe) {
    const RangeTable& table = grid_table(path, medium);
    const LogGrid& g = table.grid();
    const std::size_t n = g.size();
    std::vector<double> node(n);
    for (std::size_t j = 0; j < n; ++j) {
        node[j] = std::clamp(std::exp(g.log_node(j)), g.front(), g.back());
    }

    // Exit-energy space: one backward transport per grid node gives E0, dE0/dE and survival.
    // The weights per unit exit energy w = d(E) dE0/dE (x survival) integrate (trapezoid in
    // ln E) to the moments G0, G1 of the dose per incident fluence d(E0).
    Cumulative with;
    Cumulative without;
    DoseQuantities w_prev[2];
    double inv_prev = 0.0; // 1 / E0 of the previous node
    double log_prev = 0.0; // ln E0 of the previous node
    const double h = g.log_step();
    for (std::size_t j = 0; j < n; ++j) {
        const BackwardResult b = transport_backward_log(path, g.log_node(j), Removal::with);
        if (!b.reachable) {
            break;
        }
        const DoseQuantities d = dose_per_fluence_at_node(medium, particle, j, rbe);
        const DoseQuantities w[2] = {d.scaled(b.jacobian * b.survival), d.scaled(b.jacobian)};
        Cumulative* cum[2] = {&with, &without};
        for (int m = 0; m < 2; ++m) {
            DoseQuantities g0;
            DoseQuantities g1;
            const double inv = 1.0 / b.incident_MeV_per_n;
            const double lg = b.log_incident;
            if (j == 0) {
                // Exit energies below the grid: weight held constant down to zero, all at E0_0.
                g0 = w[m].scaled(node[0] * inv);
                g1 = g0.scaled(lg);
            } else {
                g0 = cum[m]->G0.back();
                g0 += w_prev[m].scaled(0.5 * h * node[j - 1] * inv_prev);
                g0 += w[m].scaled(0.5 * h * node[j] * inv);
                g1 = cum[m]->G1.back();
                g1 += w_prev[m].scaled(0.5 * h * node[j - 1] * inv_prev * log_prev);
                g1 += w[m].scaled(0.5 * h * node[j] * inv * lg);
            }
            cum[m]->incident.push_back(b.incident_MeV_per_n);
            cum[m]->G0.push_back(g0);
            cum[m]->G1.push_back(g1);
            w_prev[m] = w[m];
        }
        with.slope_above = d.scaled(b.survival);
        without.slope_above = d;
        inv_prev = 1.0 / b.incident_MeV_per_n;
        log_prev = b.log_incident;
    }

    // Hat-function weights: over interval [E_k, E_k+1] the fluence per unit ln E, psi = E phi,
    // is taken linear in u = ln(E0 / E_k) / h, so node k+1 gets integral d u dE0/E0 and node k
    // integral d (1 - u) dE0/E0.
    PathResponse r;
    r.node_energies_MeV_per_n = node;
    r.with_removal.assign(n, DoseQuantities{});
    r.without_removal.assign(n, DoseQuantities{});
    const Cumulative* cum[2] = {&with, &without};
    std::vector<DoseQuantities>* out[2] = {&r.with_removal, &r.without_removal};
    for (int m = 0; m < 2; ++m) {
        DoseQuantities lo0;
        DoseQuantities lo1;
        cum[m]->at(node[0], lo0, lo1);
        for (std::size_t k = 0; k + 1 < n; ++k) {
            DoseQuantities hi0;
            DoseQuantities hi1;
            cum[m]->at(node[k + 1], hi0, hi1);
            const DoseQuantities M0 = minus(hi0, lo0);
            const DoseQuantities M1 = minus(hi1, lo1);
            // integral d u dE0/E0 = (M1 - ln(E_k) M0) / (ln E_k+1 - ln E_k)
            const DoseQuantities upper = minus(M1, M0.scaled(g.log_node(k))).scaled(1.0 / h);
            (*out[m])[k + 1] += upper;
            (*out[m])[k] += minus(M0, upper);
            lo0 = hi0;
            lo1 = hi1;
        }
    }
    return r;
}

NodeFluences node_fluences(const ProtonSpectrum& spectrum, std::span<const double> nodes) {
    NodeFluences f;
    f.per_unit_log_energy_per_cm2.resize(nodes.size());
    f.extrapolated_per_cm2.resize(nodes.size());
    const FitRange fit = spectrum.fit_range();
    for (std::size_t j = 0; j < nodes.size(); ++j) {
        const double psi = nodes[j] * spectrum.differential_fluence_per_cm2_MeV(nodes[j]);
        f.per_unit_log_energy_per_cm2[j] = psi;
        f.extrapolated_per_cm2[j] = (nodes[j] < fit.min_MeV || nodes[j] > fit.max_MeV) ? psi : 0.0;
    }
    return f;
}

BracketedDose fold(const PathResponse& response, const NodeFluences& fluences) {
    if (fluences.per_unit_log_energy_per_cm2.size() != response.with_removal.size()) {
        throw std::logic_error("fold: node counts differ");
    }
    BracketedDose out;
    double extrapolated = 0.0;
    for (std::size_t j = 0; j < response.with_removal.size(); ++j) {
        const double psi = fluences.per_unit_log_energy_per_cm2[j];
        out.with_removal += response.with_removal[j].scaled(psi);
        out.without_removal += response.without_removal[j].scaled(psi);
        extrapolated += response.without_removal[j].absorbed_Gy * fluences.extrapolated_per_cm2[j];
    }
    const double total = out.for_limits().absorbed_Gy;
    out.extrapolated_share = total > 0.0 ? extrapolated / total : 0.0;
    return out;
}

BracketedDose exact_spectrum_dose(std::span<const Layer> path, const DoseMedium& medium,
                                  const Particle& particle,
                                  const std::function<double(double)>& differential_in,
                                  FitRange fit, const RbeModel& rbe, int intervals) {
    const LogGrid& g = grid_table(path, medium).grid();
    BracketedDose out;
    const ForwardResult top = transport_forward(path, g.back(), Removal::without);
    if (top.stopped) {
        return out;
    }
    if (intervals % 2 != 0) {
        ++intervals;
    }
    const double lo = std::log(g.front());
    const double hi = std::log(top.exit_energy_MeV_per_n);
    const double h = (hi - lo) / intervals;
    double extrapolated = 0.0;
    // Integrand per unit exit energy, both removal cases.
    auto integrand = [&](double E, DoseQuantities& with, DoseQuantities& without, bool& extrap) {
        const BackwardResult b = transport_backward(path, E, Removal::with);
        if (!b.reachable) {
            with = without = {};
            extrap = false;
            return;
        }
        const double phi = differential_in(b.incident_MeV_per_n) * b.jacobian;
        without = dose_per_fluence(medium, particle, E, rbe).scaled(phi);
        with = without.scaled(b.survival);
        extrap = b.incident_MeV_per_n < fit.min_MeV || b.incident_MeV_per_n > fit.max_MeV;
    };
    for (int i = 0; i <= intervals; ++i) {
        const double E = std::clamp(std::exp(lo + i * h), g.front(), g.back());
        const double weight = (i == 0 || i == intervals) ? 1.0 : (i % 2 == 1 ? 4.0 : 2.0);
        DoseQuantities with;
        DoseQuantities without;
        bool extrap = false;
        integrand(E, with, without, extrap);
        const double f = weight * h / 3.0 * E;
        out.with_removal += with.scaled(f);
        out.without_removal += without.scaled(f);
        if (extrap) {
            extrapolated += without.absorbed_Gy * f;
        }
        if (i == 0) {
            // Exit energies below the grid, weight held constant down to zero.
            out.with_removal += with.scaled(E);
            out.without_removal += without.scaled(E);
            if (extrap) {
                extrapolated += without.absorbed_Gy * E;
            }
        }
    }
    const double total = out.for_limits().absorbed_Gy;
    out.extrapolated_share = total > 0.0 ? extrapolated / total : 0.0;
    return out;
}

LetSpectrum let_spectrum(std::span<const Layer> path, const DoseMedium& medium,
                         const Particle& particle,
                         const std::function<double(double)>& differential_in, int bins_per_decade,
                         int intervals) {
    LetSpectrum out;
    const int bins = 4 * bins_per_decade; // 0.1 .. 1000 keV/um
    for (int i = 0; i <= bins; ++i) {
        out.let_edges_keV_um.push_back(0.1 *
                                       std::pow(10.0, static_cast<double>(i) / bins_per_decade));
    }
    out.fluence_per_cm2.assign(static_cast<std::size_t>(bins), 0.0);
    out.absorbed_Gy.assign(static_cast<std::size_t>(bins), 0.0);
    const LogGrid& g = grid_table(path, medium).grid();
    const ForwardResult top = transport_forward(path, g.back(), Removal::without);
    if (top.stopped) {
        return out;
    }
    const double lo = std::log(g.front());
    const double hi = std::log(top.exit_energy_MeV_per_n);
    const double h = (hi - lo) / intervals;
    const RbeModel rbe{};
    // Midpoint rule in ln E: each slice's fluence goes to the LET bin of its midpoint.
    for (int i = 0; i < intervals; ++i) {
        const double E = std::clamp(std::exp(lo + (i + 0.5) * h), g.front(), g.back());
        const BackwardResult b = transport_backward(path, E, Removal::without);
        if (!b.reachable) {
            continue;
        }
        const double fluence = differential_in(b.incident_MeV_per_n) * b.jacobian * E * h;
        const double let = 0.1 * medium.water->stopping_MeV_cm2_g(E);
        const auto bin =
            static_cast<std::ptrdiff_t>(std::floor(std::log10(let / 0.1) * bins_per_decade));
        if (bin < 0 || bin >= bins) {
            continue;
        }
        out.fluence_per_cm2[static_cast<std::size_t>(bin)] += fluence;
        out.absorbed_Gy[static_cast<std::size_t>(bin)] +=
            fluence * dose_per_fluence(medium, particle, E, rbe).absorbed_Gy;
    }
    return out;
}

} // namespace crewdose::exposure
