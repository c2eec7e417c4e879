#pragma once
// Effective dose from organ dose equivalents with the ICRP Publication 103 (2007) tissue
// weighting factors (Q(L) from ICRP 60 for the organ dose equivalents: the convention in space).
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

} // namespace crewdose::exposure
