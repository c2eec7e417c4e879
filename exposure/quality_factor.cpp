#include "quality_factor.hpp"

#include <cmath>

namespace crewdose::exposure {

double quality_factor_icrp60(double L) {
    if (L < 10.0) {
        return 1.0;
    }
    if (L <= 100.0) {
        return 0.32 * L - 2.2;
    }
    return 300.0 / std::sqrt(L);
}

} // namespace crewdose::exposure
