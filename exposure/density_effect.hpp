#pragma once

namespace crewdose::exposure {

/// Sternheimer's parameterisation of the density-effect correction delta(X), X = log10(beta
/// gamma) (Sternheimer, Berger & Seltzer 1984, Atomic Data and Nuclear Data Tables 30, 261):
///   delta = 2 ln10 X - c_bar + a (x1 - X)^m   for x0 <= X < x1
///   delta = 2 ln10 X - c_bar                  for X >= x1
///   delta = delta0 10^(2 (X - x0))            for X < x0 (conductors; 0 for insulators)
struct SternheimerParameters {
    double c_bar;  ///< -C in the tables (positive number)
    double x0;     ///< lower X of the middle branch
    double x1;     ///< upper X of the middle branch
    double a;      ///< coefficient of the middle branch
    double m;      ///< exponent of the middle branch
    double delta0; ///< value at x0 for conductors, 0 otherwise

    /// delta(X) at X = log10(beta gamma).
    [[nodiscard]] double delta(double x) const noexcept;
};

/// Parameters from the general recipe of Sternheimer & Peierls 1971 (Phys. Rev. B 3, 3681),
/// for a material without a tabulated set: from its mean excitation energy I (eV), its plasma
/// energy (eV) and its phase. m = 3 and delta0 = 0 in that recipe.
[[nodiscard]] SternheimerParameters sternheimer_peierls(double mean_excitation_eV,
                                                        double plasma_energy_eV, bool gas);

} // namespace crewdose::exposure
