#pragma once
// Shell-equivalent depth-dose: the dose behind a uniform shield of one material at a tissue
// depth, for one spectrum (DESIGN.md item 5: each direction sees the full omnidirectional
// fluence through the same thickness, so this is the dose at the centre of a spherical shell).
#include "response.hpp"
#include "table_library.hpp"

#include <span>
#include <vector>

namespace crewdose::exposure {

/// The set-up of a depth-dose calculation.
struct DepthDoseSetup {
    const Material* shield = nullptr; ///< shield material
    const Material* tissue = nullptr; ///< tissue over the dose point, and the dose medium
    const Material* water = nullptr;  ///< liquid water, for LET in Q(L)
    double tissue_depth_g_cm2 = 0.0;  ///< tissue in front of the dose point, >= 0
    RbeModel rbe{};
    /// Where the dose is scored instead of the tissue (a detector: silicon, water), if set.
    const Material* detector = nullptr;
};

/// The dose behind `shield_g_cm2` of shield, exact (response of the two-layer path folded with
/// the spectrum's node fluences).
[[nodiscard]] BracketedDose depth_dose(TableLibrary& tables, const DepthDoseSetup& setup,
                                       const ProtonSpectrum& spectrum, double shield_g_cm2);

/// depth_dose() at each of `shields_g_cm2`, with the spectrum's node fluences and the node
/// doses computed once for the whole curve; identical results.
[[nodiscard]] std::vector<BracketedDose> depth_dose_curve(TableLibrary& tables,
                                                          const DepthDoseSetup& setup,
                                                          const ProtonSpectrum& spectrum,
                                                          std::span<const double> shields_g_cm2);

/// A depth-dose table: exact doses at nodes log-spaced in shield areal density from 0.01 to
/// 1000 g/cm2 (plus 0), interpolated linearly in (ln t, ln D); below 0.01 g/cm2 linearly in t.
class DepthDoseTable {
  public:
    /// `nodes_per_decade` >= 1; the default meets 0.5 % between nodes for the spectra tested.
    DepthDoseTable(TableLibrary& tables, const DepthDoseSetup& setup,
                   const ProtonSpectrum& spectrum, std::size_t nodes_per_decade = 10);

    /// Interpolated dose at `shield_g_cm2` in [0, 1000]; the limit-check value of the bracket
    /// for each quantity.
    [[nodiscard]] DoseQuantities at(double shield_g_cm2) const;
    [[nodiscard]] const std::vector<double>& nodes_g_cm2() const noexcept { return t_; }

  private:
    std::vector<double> t_;
    std::vector<DoseQuantities> dose_;
};

} // namespace crewdose::exposure
