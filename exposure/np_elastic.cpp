#include "np_elastic.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace crewdose::exposure {

double np_elastic_cross_section_mb(double E) {
    if (!std::isfinite(E) || E < 0.0) {
        throw std::invalid_argument("np_elastic_cross_section_mb: energy must be finite and >= 0");
    }
    const auto* first = detail::kNpElasticTable;
    const auto* last = first + detail::kNpElasticTableSize;
    if (E <= first->energy_MeV) {
        return first->sigma_mb;
    }
    if (E > (last - 1)->energy_MeV) {
        return 0.0;
    }
    const auto* hi = std::lower_bound(
        first, last, E, [](const detail::NpElasticPoint& p, double e) { return p.energy_MeV < e; });
    const auto* lo = hi - 1;
    const double t = (E - lo->energy_MeV) / (hi->energy_MeV - lo->energy_MeV);
    return lo->sigma_mb + t * (hi->sigma_mb - lo->sigma_mb);
}

double np_elastic_top_MeV() {
    return detail::kNpElasticTable[detail::kNpElasticTableSize - 1].energy_MeV;
}

double np_elastic_largest_a1() {
    return detail::kNpElasticLargestA1;
}

} // namespace crewdose::exposure
