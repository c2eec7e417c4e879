#include "dosimetry.hpp"

#include "quality_factor.hpp"
#include "units.hpp"

#include <algorithm>

namespace crewdose::exposure {

DoseQuantities dose_per_fluence(const DoseMedium& medium, const Particle& particle, double E,
                                const RbeModel& rbe) {
    const double D = kGy_per_MeV_per_g * medium.medium->stopping_MeV_cm2_g(E);
    // LET in water, keV/um: S [MeV cm2/g] x 1 g/cm3 x 0.1.
    const double let_water = 0.1 * medium.water->stopping_MeV_cm2_g(E);
    double factor = rbe.heavy_ion;
    if (particle.Z == 1) {
        factor = E > 2.0 ? rbe.proton_above_2MeV : rbe.proton_below_2MeV;
    }
    return {D, D * quality_factor_icrp60(let_water), D * factor};
}

DoseQuantities BracketedDose::for_limits() const {
    return {std::max(with_removal.absorbed_Gy, without_removal.absorbed_Gy),
            std::max(with_removal.dose_equivalent_Sv, without_removal.dose_equivalent_Sv),
            std::max(with_removal.rbe_weighted_GyEq, without_removal.rbe_weighted_GyEq)};
}

} // namespace crewdose::exposure
