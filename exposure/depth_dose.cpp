#include "depth_dose.hpp"

#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {

BracketedDose depth_dose(TableLibrary& tables, const DepthDoseSetup& setup,
                         const ProtonSpectrum& spectrum, double shield_g_cm2) {
    const double one[] = {shield_g_cm2};
    return depth_dose_curve(tables, setup, spectrum, one).front();
}

std::vector<BracketedDose> depth_dose_curve(TableLibrary& tables, const DepthDoseSetup& setup,
                                            const ProtonSpectrum& spectrum,
                                            std::span<const double> shields_g_cm2) {
    const Particle& p = proton();
    const RangeTable& shield = tables.table(*setup.shield, p);
    const RangeTable& tissue = tables.table(*setup.tissue, p);
    const RangeTable& water = tables.table(*setup.water, p);
    const RangeTable& medium = setup.detector ? tables.table(*setup.detector, p) : tissue;
    const NodeDoses doses = node_doses(DoseMedium{&medium, &water}, p, setup.rbe);
    std::vector<double> nodes(tissue.grid().size());
    for (std::size_t j = 0; j < nodes.size(); ++j) {
        nodes[j] = tissue.energy_at_node(j);
    }
    const NodeFluences fluences = node_fluences(spectrum, nodes);
    std::vector<BracketedDose> out;
    out.reserve(shields_g_cm2.size());
    for (const double t : shields_g_cm2) {
        const LayerPath path{{&shield, t}, {&tissue, setup.tissue_depth_g_cm2}};
        out.push_back(fold(path_response(path, doses), fluences));
    }
    return out;
}

DepthDoseTable::DepthDoseTable(TableLibrary& tables, const DepthDoseSetup& setup,
                               const ProtonSpectrum& spectrum, std::size_t nodes_per_decade) {
    if (nodes_per_decade == 0) {
        throw std::logic_error("DepthDoseTable: need at least one node per decade");
    }
    t_.push_back(0.0);
    const std::size_t count = 5 * nodes_per_decade + 1; // 0.01 .. 1000 g/cm2
    for (std::size_t i = 0; i < count; ++i) {
        t_.push_back(
            0.01 * std::pow(10.0, static_cast<double>(i) / static_cast<double>(nodes_per_decade)));
    }
    for (const BracketedDose& d : depth_dose_curve(tables, setup, spectrum, t_)) {
        dose_.push_back(d.for_limits());
    }
}

DoseQuantities DepthDoseTable::at(double t) const {
    if (!(t >= 0.0 && t <= t_.back() * (1.0 + 1e-12))) {
        throw std::out_of_range("DepthDoseTable: shield thickness outside 0..1000 g/cm2");
    }
    if (t <= t_[1]) {
        const double u = t / t_[1];
        auto mix = [u](double a, double b) {
            return a + (b - a) * u;
        };
        return {mix(dose_[0].absorbed_Gy, dose_[1].absorbed_Gy),
                mix(dose_[0].dose_equivalent_Sv, dose_[1].dose_equivalent_Sv),
                mix(dose_[0].rbe_weighted_GyEq, dose_[1].rbe_weighted_GyEq)};
    }
    std::size_t i = 1;
    while (i + 2 < t_.size() && t > t_[i + 1]) {
        ++i;
    }
    const double u = std::log(t / t_[i]) / std::log(t_[i + 1] / t_[i]);
    auto mix = [u](double a, double b) {
        if (a <= 0.0 || b <= 0.0) {
            return a + (b - a) * u; // a dose of zero cannot be interpolated in ln D
        }
        return std::exp(std::log(a) + (std::log(b) - std::log(a)) * u);
    };
    return {mix(dose_[i].absorbed_Gy, dose_[i + 1].absorbed_Gy),
            mix(dose_[i].dose_equivalent_Sv, dose_[i + 1].dose_equivalent_Sv),
            mix(dose_[i].rbe_weighted_GyEq, dose_[i + 1].rbe_weighted_GyEq)};
}

} // namespace crewdose::exposure
