#pragma once
// When solar energetic particles reach a site: scatter-free travel along the interplanetary
// magnetic field line, the earliest possible arrival.
namespace crewdose::exposure {

/// Speed of light times one astronomical unit: light travel time over 1 AU, s (IAU 2012 au =
/// 149597870700 m exactly, c = 299792458 m/s exactly).
inline constexpr double kLightSeconds_per_AU = 149597870700.0 / 299792458.0;

/// Length of the Parker (1958) spiral field line from the Sun to heliocentric distance r, AU:
/// L = (a/2) [theta sqrt(1 + theta^2) + asinh(theta)], theta = r / a, a = V / Omega, for a
/// solar wind speed V (km/s) and the sidereal solar rotation rate Omega = 2 pi / 25.38 days.
/// About 1.2 AU at 1 AU for V = 350 km/s (common practice quotes 1.2 AU).
[[nodiscard]] double parker_spiral_length_AU(double r_AU, double wind_km_s = 350.0);

/// Delay after the flare is seen at the site (its light has arrived) until particles of kinetic
/// energy per nucleon E arrive scatter-free along a field line of length `path_AU` from the
/// Sun to a site at `sun_distance_AU`: L / (beta c) - r / c, hours. `mass_per_nucleon_MeV`
/// defaults to the proton's.
[[nodiscard]] double scatter_free_delay_h(double energy_MeV_per_n, double path_AU,
                                          double sun_distance_AU,
                                          double mass_per_nucleon_MeV = 938.27208816);

} // namespace crewdose::exposure
