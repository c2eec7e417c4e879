#pragma once
// Event-integrated solar-particle-event proton fluence spectra. Fluences are omnidirectional,
// protons/cm2; energies are proton kinetic energies in MeV; rigidities in GV.
#include <variant>
#include <vector>

namespace crewdose::exposure {

/// Band function in rigidity (Band et al. 1993, ApJ 413, 281; applied to SPE integral fluences
/// in rigidity by Tylka & Dietrich 2009, from memory):
///   J(>R) = J0 R^-gamma_a exp(-R / R0)                                  for R <= (gb - ga) R0
///   J(>R) = J0 R^-gamma_b [(gb - ga) R0]^(gb - ga) exp(ga - gb)          above.
struct BandRigidity {
    double J0_per_cm2; ///< normalisation, protons/cm2 (times GV^gamma_a)
    double gamma_a;    ///< low-rigidity index
    double gamma_b;    ///< high-rigidity index, > gamma_a
    double R0_GV;      ///< e-folding rigidity, GV, > 0
};

/// Band function DIFFERENTIAL in rigidity, as the SAPPHIRE design events are given (Jiggens et
/// al. 2018, J. Space Weather Space Clim. 8, A31; the form read in the public transcription
/// named in planner/scenario/event_library.cpp):
///   dJ/dR = C R^-gamma_a exp(-R / R0)                                   for R <= (gb - ga) R0
///   dJ/dR = C R^-gamma_b [(gb - ga) R0]^(gb - ga) exp(ga - gb)           above,
/// R in GV. J(>R) is its integral from R upwards: closed form above the break, numerical
/// (Gauss-Legendre in ln R) below it.
struct BandDifferentialRigidity {
    double C_per_cm2_GV; ///< normalisation, protons / (cm2 GV) (times GV^gamma_a)
    double gamma_a;      ///< low-rigidity index, 0 to 20
    double gamma_b;      ///< high-rigidity index, > gamma_a and > 1 (finite J(>R))
    double R0_GV;        ///< e-folding rigidity, GV
};

/// Weibull in energy (Xapsos et al. 2000, from memory): J(>E) = J0 exp(-k E^alpha), E in MeV.
struct WeibullEnergy {
    double J0_per_cm2;
    double k;     ///< MeV^-alpha, > 0
    double alpha; ///< > 0
};

/// Exponential in rigidity (Freier & Webber 1963): J(>R) = J0 exp(-R / R0).
struct ExponentialRigidity {
    double J0_per_cm2;
    double R0_GV; ///< > 0
};

/// Exponential in energy: J(>E) = J0 exp(-E / E0).
struct ExponentialEnergy {
    double J0_per_cm2;
    double E0_MeV; ///< > 0
};

/// Power law in energy: J(>E) = J0 (E / E_ref)^-gamma.
struct PowerLawEnergy {
    double J0_per_cm2; ///< J(>E_ref)
    double gamma;      ///< > 0
    double E_ref_MeV;  ///< > 0
};

/// Tabulated integral fluence J(>E), interpolated linearly in log-log space; strictly
/// decreasing, energies strictly increasing, at least two nodes. Outside the table the end
/// segments' power laws are extended (extrapolation, reported as such by the dose code).
struct TabulatedIntegral {
    std::vector<double> energy_MeV;
    std::vector<double> J_per_cm2;
};

using SpectrumForm =
    std::variant<BandRigidity, BandDifferentialRigidity, WeibullEnergy, ExponentialRigidity,
                 ExponentialEnergy, PowerLawEnergy, TabulatedIntegral>;

/// Energy range over which a fit was made, MeV; outside it a spectrum is extrapolation.
struct FitRange {
    double min_MeV;
    double max_MeV;
};

/// A validated SPE proton spectrum: one published form, a fit range and a scale factor.
class ProtonSpectrum {
  public:
    /// Validates every parameter against its plausible range and the spectrum's values on the
    /// transport grid (0.01 MeV to 100 GeV); ParameterError names the first problem.
    ProtonSpectrum(SpectrumForm form, FitRange fit_range);

    /// Integral fluence above E, protons/cm2.
    [[nodiscard]] double integral_fluence_per_cm2(double energy_MeV) const;
    /// Differential fluence at E, protons / (cm2 MeV): -dJ/dE.
    [[nodiscard]] double differential_fluence_per_cm2_MeV(double energy_MeV) const;
    [[nodiscard]] const FitRange& fit_range() const noexcept { return fit_range_; }
    [[nodiscard]] const SpectrumForm& form() const noexcept { return form_; }
    [[nodiscard]] double scale() const noexcept { return scale_; }

    /// The same shape scaled so that J(> energy_MeV) = fluence_per_cm2 ("this event's shape,
    /// but with F protons/cm2 above E MeV").
    [[nodiscard]] ProtonSpectrum scaled_to(double fluence_per_cm2, double energy_MeV) const;

    /// Largest integral fluence above 10 MeV a spectrum may have, protons/cm2: about a
    /// thousand times the largest events on record (about 1e10 above 10 MeV, from memory).
    static constexpr double kMaxFluenceAbove10MeV_per_cm2 = 1.0e13;

  private:
    /// ParameterError unless J(>E) and -dJ/dE are finite and non-negative on the whole
    /// transport grid, the fit range holds some fluence, and J(>10 MeV) is plausible.
    void check_values() const;

    SpectrumForm form_;
    FitRange fit_range_;
    double scale_ = 1.0;
};

/// Omnidirectional fluence from an isotropic fluence per steradian: times 4 pi.
[[nodiscard]] double omnidirectional_from_per_sr(double fluence_per_cm2_sr);

} // namespace crewdose::exposure
