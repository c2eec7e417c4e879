#pragma once
// Published low-energy electronic stopping fits: the Andersen-Ziegler form for protons and the
// Ziegler form for helium ions, with the coefficient sets of ICRU Report 49 (1993), which takes
// them from H. H. Andersen & J. F. Ziegler, "Hydrogen Stopping Powers and Ranges in All
// Elements" (1977) and J. F. Ziegler, "Helium Stopping Powers and Ranges in All Elements"
// (1977), with some rows refitted by ICRU 49.
#include <optional>

namespace crewdose::exposure {

/// Proton fit, ICRU Report 49 eqs. 3.1-3.2. T is the kinetic energy per atomic mass unit in keV
/// (keV/u), S the stopping cross section in eV per 1e15 atoms (or molecules) per cm2:
///   S = A1 sqrt(T)                         for T < 10 keV/u
///   S = S_low S_high / (S_low + S_high),   S_low = A2 T^0.45,  S_high = (A3/T) ln(1 + A4/T + A5 T)
struct ProtonFit {
    double a1, a2, a3, a4, a5;
    /// Stopping cross section, eV/(1e15 atoms/cm2), at T in keV/u (T > 0).
    [[nodiscard]] double cross_section(double T_keV_per_u) const noexcept;
};

/// Helium-ion fit (Ziegler 1977 form used by ICRU Report 49). T is the helium kinetic energy in
/// MeV, S the stopping cross section in eV per 1e15 atoms (or molecules) per cm2:
///   S = S_low S_high / (S_low + S_high),   S_low = A1 (1000 T)^A2,  S_high = (A3/T) ln(1 + A4/T +
///   A5 T)
struct HeliumFit {
    double a1, a2, a3, a4, a5;
    /// Stopping cross section, eV/(1e15 atoms/cm2), at helium kinetic energy T in MeV (T > 0).
    [[nodiscard]] double cross_section(double T_MeV) const noexcept;
};

/// A fit for a compound as a whole (ICRU 49 gives these for water, polyethylene and a few other
/// compounds): cross sections per formula unit of mass `formula_mass_g_mol`.
struct CompoundLowEnergyFit {
    std::optional<ProtonFit> proton;
    std::optional<HeliumFit> helium;
    double formula_mass_g_mol = 0.0; ///< mass of one formula unit (H2O: 18.0153), g/mol
};

/// ICRU 49 proton fit of element Z, if crewdose carries one.
[[nodiscard]] std::optional<ProtonFit> proton_fit_for_element(int Z);
/// ICRU 49 helium fit of element Z, if crewdose carries one.
[[nodiscard]] std::optional<HeliumFit> helium_fit_for_element(int Z);

/// Mass stopping power, MeV cm2/g, from a cross section in eV/(1e15 atoms/cm2) of a target of
/// molar mass `molar_mass_g_mol`: S * 1e-15 cm2 * 1e-6 MeV/eV * N_A / M.
[[nodiscard]] double cross_section_to_mass_stopping(double cross_section_eV_1e15,
                                                    double molar_mass_g_mol) noexcept;

} // namespace crewdose::exposure
