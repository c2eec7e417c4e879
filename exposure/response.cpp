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

// Both removal cases side by side: index 0 with removal, 1 without.
struct Pair {
    DoseQuantities q[2];
};

// Cumulative moments of the dose per incident fluence d over ln E0,
// G0(E0) = integral d dE0'/E0' and G1(E0) = integral d ln(E0') dE0'/E0' up to E0, known at the
// incident energies of the exit-grid nodes and interpolated linearly in E0 between them.
struct Cumulative {
    std::vector<double> incident;     // E0_j, increasing
    std::vector<double> log_incident; // ln E0_j
    std::vector<Pair> G0;
    std::vector<Pair> G1;
    Pair slope_above; // d beyond the last point

    // The moments at E0 (ln E0 = log_E0). `hint` carries the interval of the previous look-up:
    // the hat weights query increasing energies, so the walk is O(1) per query.
    void at(double E0, double log_E0, Pair& g0, Pair& g1, std::size_t& hint) const {
        if (incident.empty() || E0 < incident.front()) {
            g0 = g1 = Pair{};
            return;
        }
        if (E0 >= incident.back()) {
            const double le = log_incident.back();
            for (int m = 0; m < 2; ++m) {
                g0.q[m] = G0.back().q[m];
                g0.q[m] += slope_above.q[m].scaled(log_E0 - le);
                g1.q[m] = G1.back().q[m];
                g1.q[m] += slope_above.q[m].scaled(0.5 * (log_E0 * log_E0 - le * le));
            }
            return;
        }
        // incident[j] <= E0 < incident[j+1], walked from the hint.
        std::size_t j = std::min(hint, incident.size() - 2);
        while (j + 2 < incident.size() && E0 >= incident[j + 1]) {
            ++j;
        }
        while (j > 0 && E0 < incident[j]) {
            --j;
        }
        hint = j;
        const double u = (E0 - incident[j]) / (incident[j + 1] - incident[j]);
        for (int m = 0; m < 2; ++m) {
            g0.q[m] = lerp(G0[j].q[m], G0[j + 1].q[m], u);
            g1.q[m] = lerp(G1[j].q[m], G1[j + 1].q[m], u);
        }
    }
};

} // namespace

NodeDoses node_doses(const DoseMedium& medium, const Particle& particle, const RbeModel& rbe) {
    NodeDoses out;
    out.grid_table = medium.medium;
    const std::size_t n = medium.medium->grid().size();
    out.per_node.reserve(n);
    for (std::size_t j = 0; j < n; ++j) {
        out.per_node.push_back(dose_per_fluence_at_node(medium, particle, j, rbe));
    }
    return out;
}

PathResponse path_response(std::span<const Layer> path, const DoseMedium& medium,
                           const Particle& particle, const RbeModel& rbe) {
    grid_table(path, medium);
    return path_response(path, node_doses(medium, particle, rbe));
}

namespace {

void check_grid(std::span<const Layer> path, const RangeTable& table) {
    for (const auto& layer : path) {
        if (layer.table->grid().size() != table.grid().size() ||
            layer.table->grid().front() != table.grid().front()) {
            throw std::logic_error("path_response: every table must share one energy grid");
        }
    }
}

// The response from the backward transport of every exit node (sweep[j] for node j; nodes
// beyond the sweep's end are unreachable).
PathResponse assemble(const std::vector<BackwardResult>& sweep, const NodeDoses& doses);

} // namespace

PathResponse path_response(std::span<const Layer> path, const NodeDoses& doses) {
    const RangeTable& table = *doses.grid_table;
    check_grid(path, table);
    const LogGrid& g = table.grid();
    std::vector<double> log_exits(g.size());
    for (std::size_t j = 0; j < g.size(); ++j) {
        log_exits[j] = g.log_node(j);
    }
    return assemble(transport_backward_sweep(path, log_exits, Removal::with), doses);
}

std::vector<PathResponse> depth_responses(std::span<const Layer> external, const RangeTable& tissue,
                                          std::span<const double> depths_g_cm2,
                                          const NodeDoses& doses) {
    const RangeTable& table = *doses.grid_table;
    check_grid(external, table);
    const Layer tissue_layer{&tissue, 0.0};
    check_grid(std::span<const Layer>(&tissue_layer, 1), table);
    const LogGrid& g = table.grid();
    const std::size_t n = g.size();
    std::vector<double> log_nodes(n);
    for (std::size_t j = 0; j < n; ++j) {
        log_nodes[j] = g.log_node(j);
    }
    // The external map on the nodes: entering the tissue at node energy e_i.
    const BackwardLogs ext = transport_backward_sweep_logs(external, log_nodes, Removal::with);
    const std::vector<double>& ext_log_E0 = ext.log_incident;
    const std::vector<double>& ext_log_jac = ext.log_jacobian;
    const std::vector<double>& ext_od = ext.optical_depth;
    const std::size_t m_ext = ext_log_E0.size(); // nodes whose incident energy is in the tables
    const double h = g.log_step();
    const double log0 = log_nodes[0];
    std::vector<PathResponse> out;
    out.reserve(depths_g_cm2.size());
    std::vector<BackwardResult> sweep;
    // The tissue layer, from each exit node back to the tissue entrance: the step of
    // transport_backward_sweep_logs(), specialised to exits at the grid nodes, where the
    // table's node values give the range, stopping and optical depth without a look-up (the
    // general sweep costs this path a fifth more time).
    const double top = tissue.log_max_range();
    const std::vector<double>& log_S = tissue.log_stopping_nodes();
    const std::vector<double>& tau = tissue.optical_depth_nodes();
    for (const double depth : depths_g_cm2) {
        sweep.clear();
        std::size_t hint = 0;
        for (std::size_t j = 0; j < n; ++j) {
            const double R_in = tissue.range_at_node(j) + depth;
            const double log_R_in = std::log(R_in);
            if (log_R_in > top) {
                break; // incident energies increase with exit energy: the rest are out too
            }
            const RangeTable::Cursor c_in = tissue.cursor_at_log_range(log_R_in, hint);
            const double log_jac_t = tissue.log_stopping(c_in) - log_S[j];
            const double od_t = tau.empty() ? 0.0 : tissue.optical_depth(c_in, R_in) - tau[j];
            // Where the tissue-entrance energy falls among the nodes the external map knows.
            const double x = (c_in.log_E - log0) / h;
            if (m_ext < 4 || x > static_cast<double>(m_ext - 1)) {
                break; // beyond the tables once through the external layers too
            }
            const auto i0 = static_cast<std::size_t>(
                std::clamp(std::floor(x) - 1.0, 0.0, static_cast<double>(m_ext - 4)));
            const double u = x - static_cast<double>(i0);
            // 4-point Lagrange weights at u for nodes i0 .. i0+3 (offsets 0..3).
            const double w0 = -(u - 1) * (u - 2) * (u - 3) / 6.0;
            const double w1 = u * (u - 2) * (u - 3) / 2.0;
            const double w2 = -u * (u - 1) * (u - 3) / 2.0;
            const double w3 = u * (u - 1) * (u - 2) / 6.0;
            auto lagrange = [&](const std::vector<double>& f) {
                return w0 * f[i0] + w1 * f[i0 + 1] + w2 * f[i0 + 2] + w3 * f[i0 + 3];
            };
            BackwardResult r;
            r.reachable = true;
            r.log_incident = lagrange(ext_log_E0);
            r.incident_MeV_per_n = std::exp(r.log_incident);
            r.jacobian = std::exp(log_jac_t + lagrange(ext_log_jac));
            r.survival = std::exp(-(od_t + std::max(0.0, lagrange(ext_od))));
            sweep.push_back(r);
        }
        out.push_back(assemble(sweep, doses));
    }
    return out;
}

namespace {

PathResponse assemble(const std::vector<BackwardResult>& sweep, const NodeDoses& doses) {
    const RangeTable& table = *doses.grid_table;
    const LogGrid& g = table.grid();
    const std::size_t n = g.size();
    std::vector<double> node(n);
    for (std::size_t j = 0; j < n; ++j) {
        node[j] = table.energy_at_node(j);
    }

    // Exit-energy space: one backward transport per grid node gives E0, dE0/dE and survival.
    // The weights per unit exit energy w = d(E) dE0/dE (x survival) integrate (trapezoid in
    // ln E) to the moments G0, G1 of the dose per incident fluence d(E0).
    Cumulative cum;
    cum.incident.reserve(n);
    cum.log_incident.reserve(n);
    cum.G0.reserve(n);
    cum.G1.reserve(n);
    Pair w_prev;
    double inv_prev = 0.0; // 1 / E0 of the previous node
    double log_prev = 0.0; // ln E0 of the previous node
    const double h = g.log_step();
    for (std::size_t j = 0; j < sweep.size(); ++j) {
        const BackwardResult& b = sweep[j];
        const DoseQuantities& d = doses.per_node[j];
        const Pair w{{d.scaled(b.jacobian * b.survival), d.scaled(b.jacobian)}};
        const double inv = 1.0 / b.incident_MeV_per_n;
        const double lg = b.log_incident;
        Pair g0;
        Pair g1;
        for (int m = 0; m < 2; ++m) {
            if (j == 0) {
                // Exit energies below the grid: weight held constant down to zero, all at E0_0.
                g0.q[m] = w.q[m].scaled(node[0] * inv);
                g1.q[m] = g0.q[m].scaled(lg);
            } else {
                const double a = 0.5 * h * node[j - 1] * inv_prev;
                const double c = 0.5 * h * node[j] * inv;
                g0.q[m] = cum.G0.back().q[m];
                g0.q[m] += w_prev.q[m].scaled(a);
                g0.q[m] += w.q[m].scaled(c);
                g1.q[m] = cum.G1.back().q[m];
                g1.q[m] += w_prev.q[m].scaled(a * log_prev);
                g1.q[m] += w.q[m].scaled(c * lg);
            }
        }
        cum.incident.push_back(b.incident_MeV_per_n);
        cum.log_incident.push_back(lg);
        cum.G0.push_back(g0);
        cum.G1.push_back(g1);
        w_prev = w;
        cum.slope_above = Pair{{d.scaled(b.survival), d}};
        inv_prev = inv;
        log_prev = lg;
    }

    // Hat-function weights: over interval [E_k, E_k+1] the fluence per unit ln E, psi = E phi,
    // is taken linear in u = ln(E0 / E_k) / h, so node k+1 gets integral d u dE0/E0 and node k
    // integral d (1 - u) dE0/E0.
    PathResponse r;
    r.node_energies_MeV_per_n = node;
    r.with_removal.assign(n, DoseQuantities{});
    r.without_removal.assign(n, DoseQuantities{});
    std::vector<DoseQuantities>* out[2] = {&r.with_removal, &r.without_removal};
    Pair lo0;
    Pair lo1;
    std::size_t hint = 0;
    cum.at(node[0], g.log_node(0), lo0, lo1, hint);
    for (std::size_t k = 0; k + 1 < n; ++k) {
        Pair hi0;
        Pair hi1;
        cum.at(node[k + 1], g.log_node(k + 1), hi0, hi1, hint);
        for (int m = 0; m < 2; ++m) {
            const DoseQuantities M0 = minus(hi0.q[m], lo0.q[m]);
            const DoseQuantities M1 = minus(hi1.q[m], lo1.q[m]);
            // integral d u dE0/E0 = (M1 - ln(E_k) M0) / (ln E_k+1 - ln E_k)
            const DoseQuantities upper = minus(M1, M0.scaled(g.log_node(k))).scaled(1.0 / h);
            (*out[m])[k + 1] += upper;
            (*out[m])[k] += minus(M0, upper);
        }
        lo0 = hi0;
        lo1 = hi1;
    }
    return r;
}

} // namespace

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
