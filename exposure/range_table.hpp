#pragma once
#include "interpolation.hpp"
#include "material.hpp"
#include "particle.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace crewdose::exposure {

/// Energy grid of every range table: log-spaced in kinetic energy per nucleon.
struct EnergyGridSpec {
    double min_MeV_per_n = 0.01;       ///< 10 keV/n
    double max_MeV_per_n = 1.0e5;      ///< 100 GeV/n
    std::size_t nodes_per_decade = 64; // ranges converged to 1e-4 (4x denser changes < 9e-5)
};

/// CSDA range table of one particle in one material: an immutable value, built once and shared.
///
/// Nodes hold ln S(E), ln R(E) (and, once filled, the nuclear optical depth) on a log grid in
/// energy per nucleon. Between nodes ln R and ln S are linear in ln E, which is monotone, and
/// E(R) inverts that same interpolant exactly. R(E_min) is the low-energy form's own range from
/// zero energy, not zero.
///
/// Out-of-range policy: energies or ranges outside the grid are a caller bug (std::out_of_range);
/// the grid covers 10 keV/n to 100 GeV/n, everything a transport step can reach, and callers
/// handle "stopped" (E below E_min) themselves via range_g_cm2(min_energy()).
class RangeTable {
  public:
    RangeTable(const Material& material, const Particle& particle, EnergyGridSpec grid = {});

    /// A table for any stopping law: `stopping_MeV_cm2_g(E)` for the whole ion at energy per
    /// nucleon E, and the range at the grid's lowest energy. Used for manufactured-solution
    /// tests of the transport code and for stopping laws given as data.
    static RangeTable from_stopping_law(std::string id, const Particle& particle,
                                        const std::function<double(double)>& stopping_MeV_cm2_g,
                                        double range_at_min_g_cm2, EnergyGridSpec grid = {});

    [[nodiscard]] const Particle& particle() const noexcept { return particle_; }
    [[nodiscard]] const std::string& material_id() const noexcept { return material_id_; }
    [[nodiscard]] double min_energy_MeV_per_n() const noexcept { return grid_.front(); }
    [[nodiscard]] double max_energy_MeV_per_n() const noexcept { return grid_.back(); }
    [[nodiscard]] const LogGrid& grid() const noexcept { return grid_; }

    /// Electronic stopping power (whole ion), MeV cm2/g, interpolated from the nodes.
    [[nodiscard]] double stopping_MeV_cm2_g(double energy_MeV_per_n) const;
    /// CSDA range, g/cm2.
    [[nodiscard]] double range_g_cm2(double energy_MeV_per_n) const;
    /// Energy per nucleon whose CSDA range is `range_g_cm2` (exact inverse of range_g_cm2()).
    [[nodiscard]] double energy_MeV_per_n(double range_g_cm2) const;
    /// Smallest and largest range on the table, g/cm2.
    [[nodiscard]] double min_range_g_cm2() const noexcept;
    [[nodiscard]] double max_range_g_cm2() const noexcept;

    /// A position on the table in log space: ln E and the grid interval holding it. Transport
    /// loops chain look-ups through cursors so that each layer costs one exp and one log.
    struct Cursor {
        double log_E;
        std::size_t interval;
    };
    /// Cursor at ln E (inside the table; std::out_of_range otherwise).
    [[nodiscard]] Cursor cursor_at_log_energy(double log_E) const {
        const double lo = grid_.log_front();
        const double hi = log_E_top_;
        if (!(log_E >= lo - 1e-12 && log_E <= hi + 1e-12)) {
            throw_energy_outside();
        }
        return {std::clamp(log_E, lo, hi), grid_.interval_of_log(log_E)};
    }
    /// Cursor at ln R (inside the table; std::out_of_range otherwise): the exact inverse of
    /// log_range().
    [[nodiscard]] Cursor cursor_at_log_range(double log_R) const;
    /// cursor_at_log_range() for monotone sweeps: the search starts at interval `hint` (the
    /// previous look-up's) and walks, so a sweep over increasing ranges costs O(1) per step.
    /// `hint` is updated to the interval found. Same result as the unhinted look-up.
    [[nodiscard]] Cursor cursor_at_log_range(double log_R, std::size_t& hint) const;
    // The interpolants below are linear in ln E on each interval, written with the interval's
    // precomputed slope (no division in the transport loops).
    [[nodiscard]] double log_range(const Cursor& c) const noexcept {
        const std::size_t i = c.interval;
        return log_R_[i] + slope_R_[i] * (c.log_E - grid_.log_node(i));
    }
    [[nodiscard]] double log_stopping(const Cursor& c) const noexcept {
        const std::size_t i = c.interval;
        return log_S_[i] + slope_S_[i] * (c.log_E - grid_.log_node(i));
    }
    /// Nuclear optical depth at cursor `c` whose range is `range_g_cm2` (the caller has it):
    /// linear in the range on each interval, d Lambda / dR being the interval's mean removal
    /// cross section. A constant cross section is thus reproduced exactly, and the optical
    /// depth across a thin layer keeps second-order accuracy (linear in ln E it would not: the
    /// slope of a piecewise-linear interpolant is only first-order).
    [[nodiscard]] double optical_depth(const Cursor& c, double range_g_cm2) const noexcept {
        if (optical_depth_.empty()) {
            return 0.0;
        }
        const std::size_t i = c.interval;
        return optical_depth_[i] + slope_tau_[i] * (range_g_cm2 - R_nodes_[i]);
    }
    /// Stopping power at grid node i, MeV cm2/g (no interpolation).
    [[nodiscard]] double stopping_at_node(std::size_t i) const { return S_nodes_.at(i); }
    /// CSDA range at grid node i, g/cm2 (no interpolation).
    [[nodiscard]] double range_at_node(std::size_t i) const { return R_nodes_.at(i); }
    /// Energy per nucleon of grid node i, MeV/n.
    [[nodiscard]] double energy_at_node(std::size_t i) const { return E_nodes_.at(i); }
    /// ln of the largest range on the table.
    [[nodiscard]] double log_max_range() const noexcept { return log_R_.back(); }

    /// Nodes, for tests and for the transport code: ln R at node i.
    [[nodiscard]] const std::vector<double>& log_range_nodes() const noexcept { return log_R_; }
    [[nodiscard]] const std::vector<double>& log_stopping_nodes() const noexcept { return log_S_; }

    /// The nuclear optical depth slot, Lambda(E) = integral Sigma(E)/S(E) dE on the same nodes,
    /// empty until the nuclear-attenuation code fills it with with_optical_depth().
    [[nodiscard]] const std::vector<double>& optical_depth_nodes() const noexcept {
        return optical_depth_;
    }
    [[nodiscard]] bool has_optical_depth() const noexcept { return !optical_depth_.empty(); }
    /// A copy of this table with the optical-depth slot filled (one value per node).
    [[nodiscard]] RangeTable with_optical_depth(std::vector<double> optical_depth_nodes) const;
    /// Nuclear optical depth Lambda(E), linear in the range between nodes; 0 when the slot is
    /// empty.
    /// Survival while slowing from E0 to E is exp(-(Lambda(E0) - Lambda(E))).
    [[nodiscard]] double optical_depth(double energy_MeV_per_n) const;

  private:
    RangeTable(std::string id, const Particle& particle, EnergyGridSpec grid,
               const std::function<double(double)>& stopping_MeV_cm2_g, double range_at_min_g_cm2);

    /// exp of the node values `log_values` with interval slopes `slopes`, linear in ln E.
    [[nodiscard]] double log_interpolate(const std::vector<double>& log_values,
                                         const std::vector<double>& slopes, double E) const;
    /// Fills the per-interval slopes and the linear node values from the ln nodes.
    void derive_from_nodes();
    [[noreturn]] static void throw_energy_outside();

    Particle particle_;
    std::string material_id_;
    LogGrid grid_;
    std::vector<double> log_S_;
    std::vector<double> log_R_;
    std::vector<double> optical_depth_;
    // Derived from the nodes by derive_from_nodes():
    double log_E_top_ = 0.0;        // ln of the last node
    std::vector<double> slope_S_;   // d ln S / d ln E per interval
    std::vector<double> slope_R_;   // d ln R / d ln E per interval
    std::vector<double> inverse_R_; // d ln E / d ln R per interval
    std::vector<double> slope_tau_; // d Lambda / dR per interval (empty without Lambda)
    std::vector<double> R_nodes_;   // R at the nodes, g/cm2
    std::vector<double> S_nodes_;   // S at the nodes, MeV cm2/g
    std::vector<double> E_nodes_;   // E at the nodes, MeV/n
};

/// Range of the low-energy form from zero energy up to `energy_MeV_per_n`, g/cm2: integral of
/// A dE/S(E) with the low-energy fit's own behaviour near zero energy (a power law there).
[[nodiscard]] double low_energy_range_g_cm2(const Material& material, const Particle& particle,
                                            double energy_MeV_per_n);

} // namespace crewdose::exposure
