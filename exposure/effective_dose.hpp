#pragma once
// Effective dose from organ dose equivalents with the ICRP Publication 103 (2007) tissue
// weighting factors (Q(L) from ICRP 60 for the organ dose equivalents: the convention in space).
#include "dosimetry.hpp"

#include <map>
#include <span>
#include <string>
#include <string_view>

namespace crewdose::exposure {

/// One tissue of the ICRP 103 table.
struct TissueWeight {
    std::string_view tissue; ///< crewdose's organ id
    double w_T;
};

/// ICRP Publication 103 tissue weighting factors (Table 3 of the publication, as quoted by
/// Dentomaxillofac. Radiol. 2013, 42, 20130265, Table 4). They sum to 1. "remainder" applies
/// to the arithmetic mean of the remainder tissues' dose equivalents.
[[nodiscard]] std::span<const TissueWeight> icrp103_tissue_weights();

/// The ICRP 103 remainder tissues (13 per sex; prostate for men, uterus/cervix for women).
[[nodiscard]] std::span<const std::string_view> icrp103_remainder_tissues();

/// Effective dose, Sv: sum_T w_T H_T over the ICRP 103 tissues, with the remainder's H the mean
/// over whichever remainder tissues are given. Throws std::invalid_argument naming a weighted
/// tissue that is missing from `organ_dose_equivalent_Sv`.
[[nodiscard]] double
effective_dose_Sv(const std::map<std::string, double>& organ_dose_equivalent_Sv);

/// The deeper of the two dose points that bound the effective dose in the quick model.
enum class DeeperOrgan { lens, bfo };

/// An upper bound of the effective dose from a quick screening model's three dose points:
/// w_skin H_skin + (1 - w_skin) max(H_lens, H_BFO), w_skin = 0.01 the ICRP 103 skin weight, the
/// deeper point chosen on the dose equivalent and every quantity taken from it alike. The
/// effective dose is sum_T w_T H_T with weights summing to 1; every other weighted tissue lies
/// deeper than the lens (3 mm), where an SPE's dose is lower, and the GCR dose equivalent
/// varies little with depth (the planner's ledger test checks the bound against the phantom's
/// effective dose at every location of both demos). A dose with any quantity that is not a
/// finite number gives a bound of NaN in every quantity: a dose that was not computed.
struct EffectiveDoseBound {
    DoseQuantities dose;
    DeeperOrgan deeper = DeeperOrgan::bfo;
};
[[nodiscard]] EffectiveDoseBound effective_dose_upper_bound(const DoseQuantities& skin,
                                                            const DoseQuantities& lens,
                                                            const DoseQuantities& bfo);

} // namespace crewdose::exposure
