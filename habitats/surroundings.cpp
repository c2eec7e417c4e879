#include "surroundings.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace crewdose::habitats {
namespace {
constexpr double kPi = 3.14159265358979323846;
constexpr double kDeg = kPi / 180.0;
} // namespace

double azimuth_deg(Vector3 d) {
    double a = std::atan2(d.x, d.y) / kDeg;
    return a < 0.0 ? a + 360.0 : a;
}

double elevation_deg(Vector3 d) {
    return std::asin(std::clamp(d.z / length(d), -1.0, 1.0)) / kDeg;
}

TerrainMask::TerrainMask(std::vector<std::pair<double, double>> points)
    : points_(std::move(points)) {
    for (std::size_t i = 0; i < points_.size(); ++i) {
        const auto [az, el] = points_[i];
        if (!(az >= 0.0 && az < 360.0) || !(el >= 0.0 && el < 90.0) ||
            (i > 0 && !(az > points_[i - 1].first))) {
            throw std::invalid_argument("terrain mask: azimuths must increase within [0, 360) "
                                        "and elevations lie in [0, 90) degrees");
        }
    }
}

double TerrainMask::horizon_elevation_deg(double az) const {
    if (points_.empty()) {
        return 0.0;
    }
    if (points_.size() == 1) {
        return points_[0].second;
    }
    // Find the neighbours around the circle.
    for (std::size_t i = 0; i + 1 < points_.size(); ++i) {
        if (az >= points_[i].first && az <= points_[i + 1].first) {
            const double u = (az - points_[i].first) / (points_[i + 1].first - points_[i].first);
            return points_[i].second + u * (points_[i + 1].second - points_[i].second);
        }
    }
    // Across north: from the last point to the first plus 360.
    const auto& last = points_.back();
    const auto& first = points_.front();
    const double span = first.first + 360.0 - last.first;
    const double a = az >= last.first ? az - last.first : az + 360.0 - last.first;
    return last.second + a / span * (first.second - last.second);
}

Atmosphere mars_atmosphere(double surface_pressure_Pa, double scale_height_km) {
    return Atmosphere{surface_pressure_Pa / 3.71 / 10.0, scale_height_km, 3389.5};
}

double slant_column_g_cm2(const Atmosphere& atm, double zenith_deg) {
    const double R = atm.planet_radius_km;
    const double H = atm.scale_height_km;
    const double mu = std::cos(zenith_deg * kDeg);
    // Out to altitude 40 H: r(s)^2 = R^2 + s^2 + 2 R s mu.
    const double top = 40.0 * H;
    const double s_max = -R * mu + std::sqrt(R * R * mu * mu + top * (2.0 * R + top));
    // Substitution s = s_max x^2 concentrates points near the surface, where the density is.
    const int n = 4000;
    double sum = 0.0;
    for (int i = 0; i <= n; ++i) {
        const double x = static_cast<double>(i) / n;
        const double s = s_max * x * x;
        const double r = std::sqrt(R * R + s * s + 2.0 * R * s * mu);
        const double f = std::exp(-(r - R) / H) * 2.0 * s_max * x;
        const double w = (i == 0 || i == n) ? 1.0 : (i % 2 == 1 ? 4.0 : 2.0);
        sum += w * f;
    }
    const double integral_km = sum / (3.0 * n); // integral of exp(-h/H) ds, km
    return atm.vertical_column_g_cm2 * integral_km / H;
}

bool Surroundings::blocked(Vector3 d) const {
    if (!ground) {
        return false;
    }
    return elevation_deg(d) < mask.horizon_elevation_deg(azimuth_deg(d));
}

} // namespace crewdose::habitats
