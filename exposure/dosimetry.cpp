#include "dosimetry.hpp"

#include "quality_factor.hpp"
#include "units.hpp"

#include <algorithm>

namespace crewdose::exposure {

namespace {

DoseQuantities from_stopping(const Particle& particle, double E, double S_medium, double S_water,
                             const RbeModel& rbe) {
    const double D = kGy_per_MeV_per_g * S_medium;
    // LET in water, keV/um: S [MeV cm2/g] x 1 g/cm3 x 0.1.
    const double let_water = 0.1 * S_water;
    double factor = rbe.heavy_ion;
    if (particle.Z == 1) {
        factor = E > 2.0 ? rbe.proton_above_2MeV : rbe.proton_below_2MeV;
    }
    return {D, D * quality_factor_icrp60(let_water), D * factor};
}

} // namespace

DoseQuantities dose_per_fluence(const DoseMedium& medium, const Particle& particle, double E,
                                const RbeModel& rbe) {
    return from_stopping(particle, E, medium.medium->stopping_MeV_cm2_g(E),
                         medium.water->stopping_MeV_cm2_g(E), rbe);
}

DoseQuantities dose_per_fluence_at_node(const DoseMedium& medium, const Particle& particle,
                                        std::size_t node, const RbeModel& rbe) {
    const double E = medium.medium->energy_at_node(node);
    return from_stopping(particle, E, medium.medium->stopping_at_node(node),
                         medium.water->stopping_at_node(node), rbe);
}

DoseQuantities BracketedDose::for_limits() const {
    return {std::max(with_removal.absorbed_Gy, without_removal.absorbed_Gy),
            std::max(with_removal.dose_equivalent_Sv, without_removal.dose_equivalent_Sv),
            std::max(with_removal.rbe_weighted_GyEq, without_removal.rbe_weighted_GyEq)};
}

} // namespace crewdose::exposure
