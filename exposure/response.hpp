#pragma once
// Dose at the end of a layer path per unit incident fluence in each incident-energy bin: the
// response vector that turns every later question into a weighted sum (DESIGN.md "Data flow").
#include "dosimetry.hpp"
#include "spectrum.hpp"
#include "transport.hpp"

#include <functional>
#include <span>
#include <vector>

namespace crewdose::exposure {

/// Responses of one path on the nodes E_j of the tables' common energy grid (MeV/n). The
/// incident fluence per unit ln E, psi(E) = E phi(E), is taken linear in ln E between nodes
/// (hat functions), and weight j is the integral of the dose per incident fluence d(E0)
/// against hat j, so that for any spectrum dose = sum_j weight_j psi(E_j). Units: Gy cm2,
/// Sv cm2, Gy-Eq cm2 per (particle/cm2 per unit ln E); a power law is interpolated better in
/// ln E than in E. Node weights, rather than bin averages, keep the stopping threshold
/// exact wherever it falls inside an interval: the error left is the spectrum's own curvature
/// between nodes, second order in the node spacing.
struct PathResponse {
    std::vector<double> node_energies_MeV_per_n;
    std::vector<DoseQuantities> with_removal;
    std::vector<DoseQuantities> without_removal;
};

/// The response of `path` for `particle` scored in `medium`, exact within the CSDA model up to
/// quadrature: one backward transport per grid node in exit-energy space, so the rise at the
/// stopping threshold is resolved however thick the shield.
[[nodiscard]] PathResponse path_response(std::span<const Layer> path, const DoseMedium& medium,
                                         const Particle& particle, const RbeModel& rbe);

/// The dose per fluence at every grid node of `medium` (the part of a response that does not
/// depend on the path), for callers that build many responses for one medium.
struct NodeDoses {
    const RangeTable* grid_table = nullptr; ///< the medium's table: its grid is the response's
    std::vector<DoseQuantities> per_node;
};
[[nodiscard]] NodeDoses node_doses(const DoseMedium& medium, const Particle& particle,
                                   const RbeModel& rbe);

/// path_response() with the node doses computed once; identical results.
[[nodiscard]] PathResponse path_response(std::span<const Layer> path, const NodeDoses& doses);

/// path_response() of external + tissue(t) for many tissue depths t behind one external path
/// (a body model's depth grid): the external layers' backward map (ln E0, ln dE0/dE, optical
/// depth as functions of the energy entering the tissue) is computed once on the grid nodes and
/// interpolated with 4-point Lagrange polynomials in ln E at each depth's tissue-entrance
/// energies. The fast path; path_response() is the reference it is tested against
/// (tests/unit/response_test). `tissue` is the tissue's table (usually doses' medium).
[[nodiscard]] std::vector<PathResponse> depth_responses(std::span<const Layer> external,
                                                        const RangeTable& tissue,
                                                        std::span<const double> depths_g_cm2,
                                                        const NodeDoses& doses);

/// A spectrum's fluence per unit ln E at the nodes, psi = E phi(E), and the part of it outside
/// the spectrum's fit range, particles/cm2.
struct NodeFluences {
    std::vector<double> per_unit_log_energy_per_cm2;
    std::vector<double> extrapolated_per_cm2;
};
[[nodiscard]] NodeFluences node_fluences(const ProtonSpectrum& spectrum,
                                         std::span<const double> nodes_MeV);

/// Dose from a response and a spectrum's node fluences: sum_j weight_j psi_j, both removal
/// cases.
[[nodiscard]] BracketedDose fold(const PathResponse& response, const NodeFluences& fluences);

/// The reference: the exact transmitted spectrum phi_out(E) = phi_in(E0) (dE0/dE) survival
/// integrated against the dose per fluence over exit energies (Simpson's rule in ln E with
/// `intervals` steps). `differential_in(E0)` is the incident differential fluence per cm2 per
/// MeV/n; incident energies outside [fit_min, fit_max] count as extrapolated.
[[nodiscard]] BracketedDose
exact_spectrum_dose(std::span<const Layer> path, const DoseMedium& medium, const Particle& particle,
                    const std::function<double(double)>& differential_in, FitRange fit,
                    const RbeModel& rbe, int intervals = 4000);

/// The LET spectrum at the dose point: fluence and absorbed dose per bin of unrestricted LET
/// in water, from the exact transmitted spectrum (no removal; the higher of the bracket).
struct LetSpectrum {
    std::vector<double> let_edges_keV_um; ///< bin edges, increasing
    std::vector<double> fluence_per_cm2;  ///< per bin
    std::vector<double> absorbed_Gy;      ///< per bin
};

/// Bins log-spaced from 0.1 to 1000 keV/um, `bins_per_decade` per decade.
[[nodiscard]] LetSpectrum let_spectrum(std::span<const Layer> path, const DoseMedium& medium,
                                       const Particle& particle,
                                       const std::function<double(double)>& differential_in,
                                       int bins_per_decade = 10, int intervals = 4000);

} // namespace crewdose::exposure
