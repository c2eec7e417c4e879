#include "transport.hpp"

#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {

ForwardResult transport_forward(std::span<const Layer> path, double incident_MeV_per_n,
                                Removal removal) {
    ForwardResult out;
    double E = incident_MeV_per_n;
    double optical_depth = 0.0;
    for (std::size_t i = 0; i < path.size(); ++i) {
        const Layer& layer = path[i];
        if (layer.areal_density_g_cm2 <= 0.0) {
            continue;
        }
        const RangeTable& t = *layer.table;
        const double residual = t.range_g_cm2(E) - layer.areal_density_g_cm2;
        if (residual <= t.min_range_g_cm2()) {
            out.stopped = true;
            out.stopped_in_layer = i;
            out.survival = 0.0;
            return out;
        }
        const double E_out = t.energy_MeV_per_n(residual);
        if (removal == Removal::with) {
            optical_depth += t.optical_depth(E) - t.optical_depth(E_out);
        }
        E = E_out;
    }
    out.exit_energy_MeV_per_n = E;
    out.survival = std::exp(-optical_depth);
    return out;
}

BackwardResult transport_backward(std::span<const Layer> path, double exit_MeV_per_n,
                                  Removal removal) {
    BackwardResult out;
    double E = exit_MeV_per_n;
    double log_jacobian = 0.0;
    double optical_depth = 0.0;
    for (std::size_t k = path.size(); k-- > 0;) {
        const Layer& layer = path[k];
        if (layer.areal_density_g_cm2 <= 0.0) {
            continue;
        }
        const RangeTable& t = *layer.table;
        const double R_in = t.range_g_cm2(E) + layer.areal_density_g_cm2;
        if (R_in > t.max_range_g_cm2()) {
            return out; // the incident energy lies above the tables
        }
        const double E_in = t.energy_MeV_per_n(R_in);
        log_jacobian += std::log(t.stopping_MeV_cm2_g(E_in) / t.stopping_MeV_cm2_g(E));
        if (removal == Removal::with) {
            optical_depth += t.optical_depth(E_in) - t.optical_depth(E);
        }
        E = E_in;
    }
    out.reachable = true;
    out.incident_MeV_per_n = E;
    out.jacobian = std::exp(log_jacobian);
    out.survival = std::exp(-optical_depth);
    return out;
}

} // namespace crewdose::exposure
