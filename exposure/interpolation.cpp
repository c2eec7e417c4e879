#include "interpolation.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {

std::size_t interval_index(std::span<const double> x, double value) {
    if (x.size() < 2) {
        throw std::logic_error("interval_index: a table needs at least two nodes");
    }
    if (!(value > x.front())) { // also catches NaN: the caller's policy decides what NaN means
        return 0;
    }
    if (value >= x.back()) {
        return x.size() - 2;
    }
    const auto it = std::upper_bound(x.begin(), x.end(), value);
    return static_cast<std::size_t>(it - x.begin()) - 1;
}

LogGrid::LogGrid(double x_min, double x_max, std::size_t count)
    : x_min_(x_min), x_max_(x_max), count_(count), log_min_(0.0), log_step_(0.0),
      inverse_step_(0.0) {
    if (!(x_min > 0.0) || !(x_max > x_min) || count < 2) {
        throw std::logic_error("LogGrid: need 0 < x_min < x_max and at least two nodes");
    }
    log_min_ = std::log(x_min);
    log_step_ = (std::log(x_max) - log_min_) / static_cast<double>(count - 1);
    inverse_step_ = 1.0 / log_step_;
}

} // namespace crewdose::exposure
