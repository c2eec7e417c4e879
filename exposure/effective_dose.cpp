#include "effective_dose.hpp"

#include <array>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace crewdose::exposure {
namespace {

constexpr std::array kWeights{
    TissueWeight{"red-marrow", 0.12}, TissueWeight{"colon", 0.12},
    TissueWeight{"lung", 0.12},       TissueWeight{"stomach", 0.12},
    TissueWeight{"breast", 0.12},     TissueWeight{"remainder", 0.12},
    TissueWeight{"gonads", 0.08},     TissueWeight{"bladder", 0.04},
    TissueWeight{"oesophagus", 0.04}, TissueWeight{"liver", 0.04},
    TissueWeight{"thyroid", 0.04},    TissueWeight{"bone-surface", 0.01},
    TissueWeight{"brain", 0.01},      TissueWeight{"salivary-glands", 0.01},
    TissueWeight{"skin", 0.01},
};

constexpr std::array<std::string_view, 14> kRemainder{
    "adrenals",        "extrathoracic", "gall-bladder", "heart",    "kidneys",
    "lymph-nodes",     "muscle",        "oral-mucosa",  "pancreas", "prostate",
    "small-intestine", "spleen",        "thymus",       "uterus"};

} // namespace

std::span<const TissueWeight> icrp103_tissue_weights() {
    return kWeights;
}
std::span<const std::string_view> icrp103_remainder_tissues() {
    return kRemainder;
}

double effective_dose_Sv(const std::map<std::string, double>& H) {
    double remainder_sum = 0.0;
    int remainder_count = 0;
    for (const auto& r : kRemainder) {
        if (const auto it = H.find(std::string(r)); it != H.end()) {
            remainder_sum += it->second;
            ++remainder_count;
        }
    }
    double E = 0.0;
    for (const auto& w : kWeights) {
        if (w.tissue == "remainder") {
            if (remainder_count == 0) {
                throw std::invalid_argument("effective dose: no remainder tissue given");
            }
            E += w.w_T * remainder_sum / remainder_count;
            continue;
        }
        const auto it = H.find(std::string(w.tissue));
        if (it == H.end()) {
            throw std::invalid_argument("effective dose: no dose equivalent for " +
                                        std::string(w.tissue));
        }
        E += w.w_T * it->second;
    }
    return E;
}

EffectiveDoseBound effective_dose_upper_bound(const DoseQuantities& skin,
                                              const DoseQuantities& lens,
                                              const DoseQuantities& bfo) {
    auto finite = [](const DoseQuantities& d) {
        return std::isfinite(d.absorbed_Gy) && std::isfinite(d.dose_equivalent_Sv) &&
               std::isfinite(d.rbe_weighted_GyEq);
    };
    if (!finite(skin) || !finite(lens) || !finite(bfo)) {
        const double nan = std::numeric_limits<double>::quiet_NaN();
        return {{nan, nan, nan}, DeeperOrgan::bfo};
    }
    double w_skin = 0.0;
    for (const auto& t : kWeights) {
        if (t.tissue == "skin") {
            w_skin = t.w_T;
        }
    }
    const bool lens_deeper = lens.dose_equivalent_Sv > bfo.dose_equivalent_Sv;
    const DoseQuantities& under = lens_deeper ? lens : bfo;
    return {{w_skin * skin.absorbed_Gy + (1.0 - w_skin) * under.absorbed_Gy,
             w_skin * skin.dose_equivalent_Sv + (1.0 - w_skin) * under.dose_equivalent_Sv,
             w_skin * skin.rbe_weighted_GyEq + (1.0 - w_skin) * under.rbe_weighted_GyEq},
            lens_deeper ? DeeperOrgan::lens : DeeperOrgan::bfo};
}

} // namespace crewdose::exposure
