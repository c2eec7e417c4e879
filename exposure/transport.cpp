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
        const double residual = std::exp(t.log_range(c_in)) - layer.areal_density_g_cm2;
        if (residual <= t.min_range_g_cm2()) {
            out.stopped = true;
            out.stopped_in_layer = i;
            out.survival = 0.0;
            return out;
        }
        const RangeTable::Cursor c_out = t.cursor_at_log_range(std::log(residual));
        if (removal == Removal::with) {
            optical_depth += t.optical_depth(c_in) - t.optical_depth(c_out);
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

BackwardResult transport_backward_log(std::span<const Layer> path, double log_exit,
                                      Removal removal) {
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
        const double log_R_in = std::log(std::exp(t.log_range(c_out)) + layer.areal_density_g_cm2);
        if (log_R_in > t.log_max_range()) {
            return out; // the incident energy lies above the tables
        }
        const RangeTable::Cursor c_in = t.cursor_at_log_range(log_R_in);
        log_jacobian += t.log_stopping(c_in) - t.log_stopping(c_out);
        if (removal == Removal::with) {
            optical_depth += t.optical_depth(c_in) - t.optical_depth(c_out);
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

} // namespace crewdose::exposure
