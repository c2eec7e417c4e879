#pragma once

namespace crewdose::exposure {

/// Quality factor Q(L) of ICRP Publication 60 (1991), L = unrestricted LET in water, keV/um:
///   Q = 1 for L < 10;  Q = 0.32 L - 2.2 for 10 <= L <= 100;  Q = 300 / sqrt(L) for L > 100.
[[nodiscard]] double quality_factor_icrp60(double let_water_keV_um);

} // namespace crewdose::exposure
