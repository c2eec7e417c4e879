#pragma once
// Physical constants and unit conversions used across exposure/.
// Source: CODATA 2018 recommended values (NIST SP 961) unless a line says otherwise.

namespace crewdose::exposure {

/// Electron rest energy, MeV (CODATA 2018).
inline constexpr double kElectronMass_MeV = 0.51099895000;
/// Proton rest energy, MeV (CODATA 2018).
inline constexpr double kProtonMass_MeV = 938.27208816;
/// Atomic mass unit energy equivalent, MeV (CODATA 2018).
inline constexpr double kAtomicMassUnit_MeV = 931.49410242;
/// Avogadro constant, 1/mol (SI exact since 2019).
inline constexpr double kAvogadro_per_mol = 6.02214076e23;
/// Fine-structure constant (CODATA 2018).
inline constexpr double kFineStructure = 7.2973525693e-3;
/// Classical electron radius, cm (CODATA 2018).
inline constexpr double kElectronRadius_cm = 2.8179403262e-13;
/// Bethe constant K = 4 pi N_A r_e^2 m_e c^2, MeV cm2/mol (evaluates to 0.307075, PDG Review
/// "Passage of particles through matter", Table 34.1).
inline constexpr double kBetheK_MeV_cm2_per_mol = 4.0 * 3.14159265358979323846 * kAvogadro_per_mol *
                                                  kElectronRadius_cm * kElectronRadius_cm *
                                                  kElectronMass_MeV;
/// One MeV in joules (SI exact elementary charge).
inline constexpr double kJoule_per_MeV = 1.602176634e-13;
/// Absorbed dose in Gy from (MeV per gram): 1 MeV/g = 1.602176634e-13 J / 1e-3 kg.
inline constexpr double kGy_per_MeV_per_g = kJoule_per_MeV * 1.0e3;
/// Plasma-energy constant: hbar*omega_p = 28.816 eV * sqrt(rho[g/cm3] * <Z/A>) (Sternheimer,
/// Berger & Seltzer 1984, eq. 4; PDG Table 34.1).
inline constexpr double kPlasmaEnergy_eV = 28.816;
/// Pi.
inline constexpr double kPi = 3.14159265358979323846;

} // namespace crewdose::exposure
