#pragma once
// Interval search and interpolation kernels shared by every table in exposure/.
#include <cstddef>
#include <span>

namespace crewdose::exposure {

/// Index i of the interval [x[i], x[i+1]] that holds `value`, for strictly increasing `x` with at
/// least two nodes. Values below x[0] give 0 and values above the last node give size-2 (clamped),
/// so callers decide their own out-of-range policy and the result is always a valid interval.
[[nodiscard]] std::size_t interval_index(std::span<const double> x, double value);

/// Linear interpolation between (x0, y0) and (x1, y1) at x.
[[nodiscard]] constexpr double lerp_at(double x0, double y0, double x1, double y1, double x) {
    return y0 + (y1 - y0) * (x - x0) / (x1 - x0);
}

/// A grid uniform in ln(x): x_i = x_min * exp(i * step), i = 0..count-1. Interval lookup is a
/// division, not a search, which keeps range-table lookups well under 30 ns.
class LogGrid {
  public:
    /// `count` >= 2 nodes from `x_min` to `x_max` (both > 0, x_max > x_min).
    LogGrid(double x_min, double x_max, std::size_t count);

    [[nodiscard]] std::size_t size() const noexcept { return count_; }
    [[nodiscard]] double front() const noexcept { return x_min_; }
    [[nodiscard]] double back() const noexcept { return x_max_; }
    /// ln(x_min).
    [[nodiscard]] double log_front() const noexcept { return log_min_; }
    /// Step in ln(x) between neighbouring nodes.
    [[nodiscard]] double log_step() const noexcept { return log_step_; }
    /// Node i in ln(x).
    [[nodiscard]] double log_node(std::size_t i) const noexcept {
        return log_min_ + static_cast<double>(i) * log_step_;
    }
    /// Interval holding ln(x) = log_x, clamped to [0, size-2] like interval_index().
    [[nodiscard]] std::size_t interval_of_log(double log_x) const noexcept {
        const double u = (log_x - log_min_) * inverse_step_;
        if (!(u > 0.0)) {
            return 0;
        }
        const auto last = count_ - 2;
        if (u >= static_cast<double>(last)) {
            return last;
        }
        return static_cast<std::size_t>(u);
    }

  private:
    double x_min_;
    double x_max_;
    std::size_t count_;
    double log_min_;
    double log_step_;
    double inverse_step_;
};

} // namespace crewdose::exposure
