#pragma once
// What lies around a site beyond its habitat scene: the ground below the horizon (and a
// terrain mask above it), and a planetary atmosphere along slant paths.
#include "vector.hpp"

#include <optional>
#include <utility>
#include <vector>

namespace crewdose::habitats {

/// Local frame of every site: x east, y north, z up (metres). Azimuth is the compass bearing
/// of a direction, clockwise from north, in degrees; elevation is above the horizontal plane.
[[nodiscard]] double azimuth_deg(Vector3 direction);
[[nodiscard]] double elevation_deg(Vector3 direction);

/// Horizon elevation by azimuth (a crater rim, a cliff): points (azimuth_deg, elevation_deg),
/// interpolated linearly around the circle. Empty: a flat horizon at 0 degrees.
class TerrainMask {
  public:
    TerrainMask() = default;
    /// Azimuths in [0, 360) strictly increasing, elevations in [0, 90); std::invalid_argument
    /// otherwise (the planner reports it with the file and line).
    explicit TerrainMask(std::vector<std::pair<double, double>> points);
    [[nodiscard]] double horizon_elevation_deg(double azimuth) const;

  private:
    std::vector<std::pair<double, double>> points_;
};

/// A spherical planet's exponential atmosphere: density rho0 exp(-h / H). The vertical column
/// from the surface is rho0 H, which equals surface pressure over surface gravity.
struct Atmosphere {
    double vertical_column_g_cm2; ///< P / g at the site
    double scale_height_km;       ///< H
    double planet_radius_km;      ///< R
};

/// The Martian atmosphere at a site of surface pressure `surface_pressure_Pa`: vertical column
/// P / g with g = 3.71 m/s2 (ESA Mars facts; 10 kg/m2 = 1 g/cm2) and the Mars mean radius
/// 3389.5 km (NASA NSSDC fact sheet).
[[nodiscard]] Atmosphere mars_atmosphere(double surface_pressure_Pa, double scale_height_km);

/// The column of atmosphere, g/cm2, from the surface out along a direction at `zenith_deg`
/// (0 = straight up, 90 = horizontal): integral of rho along the straight slant path through
/// the spherical shell (Simpson's rule out to 40 scale heights of altitude). Finite at the
/// horizon (the Chapman grazing value, about sigma sqrt(pi R / 2 H)).
[[nodiscard]] double slant_column_g_cm2(const Atmosphere& atmosphere, double zenith_deg);

/// The ground and sky of a site.
struct Surroundings {
    bool ground = false; ///< a planetary surface blocks directions below the horizon
    TerrainMask mask;    ///< raised horizon, if any
    std::optional<Atmosphere> atmosphere;

    /// True when the direction ends in the ground or the terrain (fully shielded).
    [[nodiscard]] bool blocked(Vector3 direction) const;
};

} // namespace crewdose::habitats
