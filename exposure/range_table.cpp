#include "range_table.hpp"

#include "stopping.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>

namespace crewdose::exposure {

double low_energy_range_g_cm2(const Material& material, const Particle& particle,
                              double energy_MeV_per_n) {
    if (particle.Z >= 3) {
        // The effective-charge scaling is meant for fast ions; below the grid a heavy ion's
        // electronic stopping is taken proportional to its velocity (Lindhard & Scharff 1961),
        // S = c sqrt(E), whose range from zero is 2 A E / S(E).
        return 2.0 * particle.A * energy_MeV_per_n /
               low_energy_stopping_MeV_cm2_g(material, particle, energy_MeV_per_n);
    }
    // Integral of A E/S(E) d(ln E) from E_top * 1e-6 to E_top by Simpson's rule in ln E, plus the
    // part below, where the fit is a power law S = c E^p (p from the fit's own slope there):
    // integral_0^E0 A dE / (c E^p) = A E0 / ((1-p) S(E0)).
    const double top = energy_MeV_per_n;
    const double bottom = top * 1e-6;
    constexpr int kIntervals = 240; // even
    const double h = std::log(top / bottom) / kIntervals;
    const double A = particle.A;
    auto integrand = [&](double lnE) {
        const double E = std::exp(lnE);
        return A * E / low_energy_stopping_MeV_cm2_g(material, particle, E);
    };
    const double ln_bottom = std::log(bottom);
    double sum = integrand(ln_bottom) + integrand(std::log(top));
    for (int i = 1; i < kIntervals; ++i) {
        sum += (i % 2 == 1 ? 4.0 : 2.0) * integrand(ln_bottom + i * h);
    }
    const double body = sum * h / 3.0;
    const double s0 = low_energy_stopping_MeV_cm2_g(material, particle, bottom);
    const double s1 = low_energy_stopping_MeV_cm2_g(material, particle, bottom * 1.01);
    const double p = std::log(s1 / s0) / std::log(1.01);
    if (!(p < 1.0)) {
        throw std::logic_error("low_energy_range: stopping does not fall towards zero energy");
    }
    return body + A * bottom / ((1.0 - p) * s0);
}

namespace {

std::size_t node_count(const EnergyGridSpec& spec) {
    return static_cast<std::size_t>(
               std::lround(std::log10(spec.max_MeV_per_n / spec.min_MeV_per_n) *
                           static_cast<double>(spec.nodes_per_decade))) +
           1;
}

} // namespace

RangeTable::RangeTable(const Material& material, const Particle& particle, EnergyGridSpec spec)
    : RangeTable(
          material.id(), particle, spec,
          [&](double E) { return electronic_stopping_MeV_cm2_g(material, particle, E); },
          low_energy_range_g_cm2(material, particle, spec.min_MeV_per_n)) {}

RangeTable RangeTable::from_stopping_law(std::string id, const Particle& particle,
                                         const std::function<double(double)>& stopping,
                                         double range_at_min_g_cm2, EnergyGridSpec grid) {
    return RangeTable(std::move(id), particle, grid, stopping, range_at_min_g_cm2);
}

RangeTable::RangeTable(std::string id, const Particle& particle, EnergyGridSpec spec,
                       const std::function<double(double)>& stopping, double range_at_min)
    : particle_(particle), material_id_(std::move(id)),
      grid_(spec.min_MeV_per_n, spec.max_MeV_per_n, node_count(spec)) {
    if (!(range_at_min > 0.0)) {
        throw std::logic_error("RangeTable: the range at the lowest energy must be > 0");
    }
    const std::size_t n = grid_.size();
    log_S_.resize(n);
    log_R_.resize(n);
    // Stopping at the nodes and at the midpoints; Simpson's rule in ln E on each interval for
    // R = integral A E / S(E) d(ln E).
    const double A = particle.A;
    double S_prev = stopping(grid_.front());
    log_S_[0] = std::log(S_prev);
    double R = range_at_min;
    log_R_[0] = std::log(R);
    const double h = grid_.log_step();
    for (std::size_t i = 1; i < n; ++i) {
        const double ln_a = grid_.log_node(i - 1);
        const double E_a = std::exp(ln_a);
        const double E_m = std::exp(ln_a + 0.5 * h);
        const double E_b = std::exp(grid_.log_node(i));
        const double S_m = stopping(E_m);
        const double S_b = stopping(E_b);
        R += h / 6.0 * A * (E_a / S_prev + 4.0 * E_m / S_m + E_b / S_b);
        log_S_[i] = std::log(S_b);
        log_R_[i] = std::log(R);
        S_prev = S_b;
    }
    derive_from_nodes();
}

void RangeTable::derive_from_nodes() {
    const std::size_t n = grid_.size();
    const double h = grid_.log_step();
    log_E_top_ = grid_.log_node(n - 1);
    slope_S_.resize(n - 1);
    slope_R_.resize(n - 1);
    inverse_R_.resize(n - 1);
    for (std::size_t i = 0; i + 1 < n; ++i) {
        slope_S_[i] = (log_S_[i + 1] - log_S_[i]) / h;
        slope_R_[i] = (log_R_[i + 1] - log_R_[i]) / h;
        inverse_R_[i] = h / (log_R_[i + 1] - log_R_[i]);
    }
    R_nodes_.resize(n);
    for (std::size_t i = 0; i < n; ++i) {
        R_nodes_[i] = std::exp(log_R_[i]);
    }
    slope_tau_.clear();
    if (!optical_depth_.empty()) {
        slope_tau_.resize(n - 1);
        for (std::size_t i = 0; i + 1 < n; ++i) {
            slope_tau_[i] =
                (optical_depth_[i + 1] - optical_depth_[i]) / (R_nodes_[i + 1] - R_nodes_[i]);
        }
    }
    S_nodes_.resize(n);
    E_nodes_.resize(n);
    for (std::size_t i = 0; i < n; ++i) {
        S_nodes_[i] = std::exp(log_S_[i]);
        E_nodes_[i] = std::clamp(std::exp(grid_.log_node(i)), grid_.front(), grid_.back());
    }
}

void RangeTable::throw_energy_outside() {
    throw std::out_of_range("RangeTable: energy outside the table");
}

double RangeTable::log_interpolate(const std::vector<double>& log_values,
                                   const std::vector<double>& slopes, double E) const {
    if (!(E >= grid_.front() && E <= grid_.back())) {
        throw std::out_of_range("RangeTable: energy " + std::to_string(E) +
                                " MeV/n is outside the table");
    }
    const double x = std::log(E);
    const std::size_t i = grid_.interval_of_log(x);
    return std::exp(log_values[i] + slopes[i] * (x - grid_.log_node(i)));
}

double RangeTable::stopping_MeV_cm2_g(double E) const {
    return log_interpolate(log_S_, slope_S_, E);
}

double RangeTable::range_g_cm2(double E) const {
    return log_interpolate(log_R_, slope_R_, E);
}

double RangeTable::energy_MeV_per_n(double range) const {
    const double y = std::log(range);
    if (!(y >= log_R_.front() && y <= log_R_.back())) {
        throw std::out_of_range("RangeTable: range " + std::to_string(range) +
                                " g/cm2 is outside the table");
    }
    const std::size_t i = interval_index(log_R_, y);
    // Clamped so that rounding at the table's ends never leaves the table.
    return std::clamp(std::exp(grid_.log_node(i) + inverse_R_[i] * (y - log_R_[i])), grid_.front(),
                      grid_.back());
}

RangeTable::Cursor RangeTable::cursor_at_log_range(double y) const {
    if (!(y >= log_R_.front() && y <= log_R_.back())) {
        throw std::out_of_range("RangeTable: range outside the table");
    }
    const std::size_t i = interval_index(log_R_, y);
    return {grid_.log_node(i) + inverse_R_[i] * (y - log_R_[i]), i};
}

RangeTable::Cursor RangeTable::cursor_at_log_range(double y, std::size_t& hint) const {
    if (!(y >= log_R_.front() && y <= log_R_.back())) {
        throw std::out_of_range("RangeTable: range outside the table");
    }
    const std::size_t last = log_R_.size() - 2;
    std::size_t i = std::min(hint, last);
    // The interval holding y, as interval_index() defines it: log_R_[i] <= y < log_R_[i+1],
    // with the ends clamped to the first and last interval.
    constexpr int kMaxWalk = 8;
    int steps = 0;
    while (i < last && y >= log_R_[i + 1] && steps < kMaxWalk) {
        ++i;
        ++steps;
    }
    while (i > 0 && y < log_R_[i] && steps < kMaxWalk) {
        --i;
        ++steps;
    }
    const bool found = (i == last || y < log_R_[i + 1]) && (i == 0 || y >= log_R_[i]);
    if (!found) {
        i = interval_index(log_R_, y);
    }
    hint = i;
    return {grid_.log_node(i) + inverse_R_[i] * (y - log_R_[i]), i};
}

double RangeTable::min_range_g_cm2() const noexcept {
    return std::exp(log_R_.front());
}
double RangeTable::max_range_g_cm2() const noexcept {
    return std::exp(log_R_.back());
}

double RangeTable::optical_depth(double E) const {
    if (optical_depth_.empty()) {
        return 0.0;
    }
    if (!(E >= grid_.front() && E <= grid_.back())) {
        throw std::out_of_range("RangeTable: energy " + std::to_string(E) +
                                " MeV/n is outside the table");
    }
    const Cursor c = cursor_at_log_energy(std::log(E));
    return optical_depth(c, std::exp(log_range(c)));
}

RangeTable RangeTable::with_optical_depth(std::vector<double> optical_depth_nodes) const {
    if (optical_depth_nodes.size() != grid_.size()) {
        throw std::logic_error("RangeTable::with_optical_depth: one value per node is needed");
    }
    RangeTable copy = *this;
    copy.optical_depth_ = std::move(optical_depth_nodes);
    copy.derive_from_nodes();
    return copy;
}

} // namespace crewdose::exposure
