#include "transport.hpp"

#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {

ForwardResult transport_forward(std::span<const Layer> path, double incident_MeV_per_n,
                                Removal removal) {
    ForwardResult out;
    double log_E = std::log(incident_MeV_per_n);
    double optical_depth = 0.0;
    for (std::size_t i = 0; i < path.size(); ++i) {
        const Layer& layer = path[i];
        if (layer.areal_density_g_cm2 <= 0.0) {
            continue;
        }
        const RangeTable& t = *layer.table;
        const RangeTable::Cursor c_in = t.cursor_at_log_energy(log_E);
        const double R_in = std::exp(t.log_range(c_in));
        const double residual = R_in - layer.areal_density_g_cm2;
        if (residual <= t.min_range_g_cm2()) {
            out.stopped = true;
            out.stopped_in_layer = i;
            out.survival = 0.0;
            return out;
        }
        const RangeTable::Cursor c_out = t.cursor_at_log_range(std::log(residual));
        if (removal == Removal::with) {
            optical_depth += t.optical_depth(c_in, R_in) - t.optical_depth(c_out, residual);
        }
        log_E = c_out.log_E;
    }
    out.exit_energy_MeV_per_n = std::exp(log_E);
    if (path.empty() || log_E == std::log(incident_MeV_per_n)) {
        out.exit_energy_MeV_per_n = incident_MeV_per_n; // nothing crossed: bit for bit
    }
    out.survival = std::exp(-optical_depth);
    return out;
}

BackwardResult transport_backward(std::span<const Layer> path, double exit_MeV_per_n,
                                  Removal removal) {
    return transport_backward_log(path, std::log(exit_MeV_per_n), removal);
}

namespace {

// One backward pass; `hints` is empty (search every look-up) or holds one interval per layer.
BackwardResult backward(std::span<const Layer> path, double log_exit, Removal removal,
                        std::span<std::size_t> hints) {
    BackwardResult out;
    double log_E = log_exit;
    double log_jacobian = 0.0;
    double optical_depth = 0.0;
    for (std::size_t k = path.size(); k-- > 0;) {
        const Layer& layer = path[k];
        if (layer.areal_density_g_cm2 <= 0.0) {
            continue;
        }
        const RangeTable& t = *layer.table;
        const RangeTable::Cursor c_out = t.cursor_at_log_energy(log_E);
        const double R_out = std::exp(t.log_range(c_out));
        const double R_in = R_out + layer.areal_density_g_cm2;
        const double log_R_in = std::log(R_in);
        if (log_R_in > t.log_max_range()) {
            return out; // the incident energy lies above the tables
        }
        const RangeTable::Cursor c_in = hints.empty() ? t.cursor_at_log_range(log_R_in)
                                                      : t.cursor_at_log_range(log_R_in, hints[k]);
        log_jacobian += t.log_stopping(c_in) - t.log_stopping(c_out);
        if (removal == Removal::with) {
            optical_depth += t.optical_depth(c_in, R_in) - t.optical_depth(c_out, R_out);
        }
        log_E = c_in.log_E;
    }
    out.reachable = true;
    out.log_incident = log_E;
    out.incident_MeV_per_n = std::exp(log_E);
    out.jacobian = std::exp(log_jacobian);
    out.survival = std::exp(-optical_depth);
    return out;
}

} // namespace

BackwardResult transport_backward_log(std::span<const Layer> path, double log_exit,
                                      Removal removal) {
    return backward(path, log_exit, removal, {});
}

BackwardResult transport_backward_log(std::span<const Layer> path, double log_exit, Removal removal,
                                      std::span<std::size_t> hints) {
    if (hints.size() != path.size()) {
        throw std::logic_error("transport_backward_log: one hint per layer is needed");
    }
    return backward(path, log_exit, removal, hints);
}

BackwardLogs transport_backward_sweep_logs(std::span<const Layer> path,
                                           std::span<const double> log_exits, Removal removal) {
    std::size_t m = log_exits.size(); // energies still reachable
    std::vector<double> log_E(log_exits.begin(), log_exits.end());
    std::vector<double> log_jacobian(m, 0.0);
    std::vector<double> optical_depth(m, 0.0);
    for (std::size_t k = path.size(); k-- > 0;) {
        const Layer& layer = path[k];
        if (layer.areal_density_g_cm2 <= 0.0) {
            continue;
        }
        const RangeTable& t = *layer.table;
        const double top = t.log_max_range();
        std::size_t hint = 0;
        for (std::size_t j = 0; j < m; ++j) {
            const RangeTable::Cursor c_out = t.cursor_at_log_energy(log_E[j]);
            const double R_out = std::exp(t.log_range(c_out));
            const double R_in = R_out + layer.areal_density_g_cm2;
            const double log_R_in = std::log(R_in);
            if (log_R_in > top) {
                m = j; // incident energies increase with exit energy: the rest are out too
                break;
            }
            const RangeTable::Cursor c_in = t.cursor_at_log_range(log_R_in, hint);
            log_jacobian[j] += t.log_stopping(c_in) - t.log_stopping(c_out);
            if (removal == Removal::with) {
                optical_depth[j] += t.optical_depth(c_in, R_in) - t.optical_depth(c_out, R_out);
            }
            log_E[j] = c_in.log_E;
        }
    }
    log_E.resize(m);
    log_jacobian.resize(m);
    optical_depth.resize(m);
    return {std::move(log_E), std::move(log_jacobian), std::move(optical_depth)};
}

std::vector<BackwardResult> transport_backward_sweep(std::span<const Layer> path,
                                                     std::span<const double> log_exits,
                                                     Removal removal) {
    const BackwardLogs logs = transport_backward_sweep_logs(path, log_exits, removal);
    std::vector<BackwardResult> out(logs.log_incident.size());
    for (std::size_t j = 0; j < out.size(); ++j) {
        out[j].reachable = true;
        out[j].log_incident = logs.log_incident[j];
        out[j].incident_MeV_per_n = std::exp(logs.log_incident[j]);
        out[j].jacobian = std::exp(logs.log_jacobian[j]);
        out[j].survival = std::exp(-logs.optical_depth[j]);
    }
    return out;
}

} // namespace crewdose::exposure
