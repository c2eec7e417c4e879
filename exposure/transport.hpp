#pragma once
// Straight-ahead continuous-slowing-down transport of a charged particle through an ordered
// path of shield layers (DESIGN.md physics item 3). The same code serves protons, alphas and
// heavier ions: every layer carries the range table of the transported particle.
#include "range_table.hpp"

#include <span>
#include <vector>

namespace crewdose::exposure {

/// One layer crossed on the way to the dose point: the transported particle's range table in
/// the layer's material (shared, not owned; it must outlive the path) and its areal density.
struct Layer {
    const RangeTable* table = nullptr;
    double areal_density_g_cm2 = 0.0;
};

/// Layers in the order the particle crosses them: outermost first, the dose point after the
/// last one. An empty path is the free field.
using LayerPath = std::vector<Layer>;

/// Whether nuclear reactions remove particles. Removal is not conservative until secondaries
/// are modelled (their energy partly reappears as secondary nucleons), so limit checks use the
/// higher dose of the two.
enum class Removal { with, without };

/// A particle followed forwards from its incident energy.
struct ForwardResult {
    bool stopped = false;             ///< came to rest before the dose point (exit < grid min)
    double exit_energy_MeV_per_n = 0; ///< energy at the dose point when not stopped
    double survival = 1.0;            ///< probability of no nuclear reaction on the way
    std::size_t stopped_in_layer = 0; ///< index of the layer where it stopped, if stopped
};

/// Forward CSDA transport of one particle of incident energy `incident_MeV_per_n` (inside the
/// tables): in each layer R(E_out) = R(E_in) - t; survival exp(-(Lambda(E_in) - Lambda(E_out))).
[[nodiscard]] ForwardResult transport_forward(std::span<const Layer> path,
                                              double incident_MeV_per_n, Removal removal);

/// The incident particle that arrives at the dose point with a given energy.
struct BackwardResult {
    bool reachable = false;        ///< false when the incident energy would exceed the tables
    double incident_MeV_per_n = 0; ///< E0
    double log_incident = 0;       ///< ln E0
    double jacobian = 1.0;         ///< dE0/dE = prod S_i(E_in,i) / S_i(E_out,i)
    double survival = 1.0;         ///< as in ForwardResult
};

/// Backward CSDA transport from the exit energy `exit_MeV_per_n` at the dose point, layer by
/// layer outwards: R(E_in) = R(E_out) + t. With it the transmitted spectrum is
/// phi_out(E) = phi_in(E0) * jacobian * survival, exact within the CSDA model.
[[nodiscard]] BackwardResult transport_backward(std::span<const Layer> path, double exit_MeV_per_n,
                                                Removal removal);

/// transport_backward() from ln of the exit energy (saves a log in loops over grid nodes).
[[nodiscard]] BackwardResult transport_backward_log(std::span<const Layer> path, double log_exit,
                                                    Removal removal);

/// transport_backward_log() for a sweep over increasing exit energies: `hints` holds one
/// range-table interval per layer (start with zeros) and is carried from call to call, so the
/// look-ups walk instead of search. Same results as the unhinted call.
[[nodiscard]] BackwardResult transport_backward_log(std::span<const Layer> path, double log_exit,
                                                    Removal removal, std::span<std::size_t> hints);

/// transport_backward_log() for many exit energies at once, `log_exits` increasing: layer by
/// layer over all energies, so that the independent energies overlap in the processor. Returns
/// the results of the reachable prefix (the energies whose incident energy is inside the
/// tables); identical to one call per energy.
[[nodiscard]] std::vector<BackwardResult>
transport_backward_sweep(std::span<const Layer> path, std::span<const double> log_exits,
                         Removal removal);

/// transport_backward_sweep() in logs, before the exponentials: per reachable exit energy
/// ln E0, ln dE0/dE and the nuclear optical depth (survival = exp(-optical_depth)), for callers
/// that compose a sweep with another map (exposure::depth_responses).
struct BackwardLogs {
    std::vector<double> log_incident;
    std::vector<double> log_jacobian;
    std::vector<double> optical_depth;
};
[[nodiscard]] BackwardLogs transport_backward_sweep_logs(std::span<const Layer> path,
                                                         std::span<const double> log_exits,
                                                         Removal removal);

} // namespace crewdose::exposure
