#pragma once
// Dose quantities from the fluence and energy of particles arriving at a point
// (DESIGN.md physics item 4).
#include "particle.hpp"
#include "range_table.hpp"

#include <cmath>

namespace crewdose::exposure {

/// RBE values by particle type for RBE-weighted dose (Gy-Eq). Defaults: NCRP Report 132
/// (2000), protons above 2 MeV 1.5 and heavy ions 2.5 (from memory). NCRP 132 gives no value
/// for protons below 2 MeV; crewdose uses 1.5 for them unless told otherwise.
struct RbeModel {
    double proton_above_2MeV = 1.5;
    double proton_below_2MeV = 1.5;
    double heavy_ion = 2.5; ///< alpha particles and heavier
};

/// Absorbed dose (Gy), dose equivalent (Sv, ICRP 60 Q(L)) and RBE-weighted dose (Gy-Eq).
struct DoseQuantities {
    double absorbed_Gy = 0.0;
    double dose_equivalent_Sv = 0.0;
    double rbe_weighted_GyEq = 0.0;

    DoseQuantities& operator+=(const DoseQuantities& o) {
        absorbed_Gy += o.absorbed_Gy;
        dose_equivalent_Sv += o.dose_equivalent_Sv;
        rbe_weighted_GyEq += o.rbe_weighted_GyEq;
        return *this;
    }
    [[nodiscard]] DoseQuantities scaled(double f) const {
        return {absorbed_Gy * f, dose_equivalent_Sv * f, rbe_weighted_GyEq * f};
    }
    /// True when every quantity is a finite number >= 0: a dose that was computed.
    [[nodiscard]] bool physical() const {
        return std::isfinite(absorbed_Gy) && std::isfinite(dose_equivalent_Sv) &&
               std::isfinite(rbe_weighted_GyEq) && absorbed_Gy >= 0.0 &&
               dose_equivalent_Sv >= 0.0 && rbe_weighted_GyEq >= 0.0;
    }
};

/// Where the dose is scored: the medium's range table (its stopping power converts fluence to
/// dose) and liquid water's table for the same particle (LET in water sets Q(L)).
struct DoseMedium {
    const RangeTable* medium = nullptr;
    const RangeTable* water = nullptr;
};

/// Dose quantities per unit fluence (1 particle/cm2) of `particle` arriving at energy
/// `energy_MeV_per_n`: D = 1.602e-10 S (Gy per cm^-2 with S in MeV cm2/g), H = Q(L) D,
/// D_RBE = RBE D. Units: Gy cm2, Sv cm2, Gy-Eq cm2.
[[nodiscard]] DoseQuantities dose_per_fluence(const DoseMedium& medium, const Particle& particle,
                                              double energy_MeV_per_n, const RbeModel& rbe);

/// dose_per_fluence() at grid node `node` of the medium's and water's tables (which share the
/// grid), avoiding the interpolation.
[[nodiscard]] DoseQuantities dose_per_fluence_at_node(const DoseMedium& medium,
                                                      const Particle& particle, std::size_t node,
                                                      const RbeModel& rbe);

/// The two answers of the removal bracket, and the one a limit check uses.
struct BracketedDose {
    DoseQuantities with_removal;
    DoseQuantities without_removal;
    /// Share of the (limit-check) absorbed dose that comes from incident energies outside the
    /// spectrum's fit range, 0..1.
    double extrapolated_share = 0.0;

    /// The higher of the two, quantity by quantity: nuclear removal is not conservative until
    /// secondary nucleons are modelled, so limits are always checked against this.
    [[nodiscard]] DoseQuantities for_limits() const;
};

} // namespace crewdose::exposure
