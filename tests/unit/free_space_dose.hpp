#pragma once
// A test reference shared by the GCR tests: the free-space GCR absorbed dose as a direct
// integral, without the response or march machinery.
#include "exposure/gcr.hpp"
#include "exposure/table_library.hpp"
#include "exposure/units.hpp"

#include <cmath>

namespace crewdose::test {

/// D = sum over the included nuclei of the integral of phi(E) S(E) dE in `medium`, per day,
/// Simpson's rule in ln E with 4000 intervals from `min_MeV_per_n` to 99 GeV/n.
inline double free_space_dose_Gy_per_day(exposure::TableLibrary& tables,
                                         const exposure::Material& medium, double phi_MV,
                                         double min_MeV_per_n) {
    using namespace crewdose::exposure;
    double D = 0.0;
    for (const auto& p : particles()) {
        if (!gcr_nucleus_included(p.Z)) {
            continue;
        }
        const RangeTable& t = tables.table(medium, p);
        const int n = 4000;
        const double a = std::log(min_MeV_per_n);
        const double b = std::log(0.99e5);
        const double h = (b - a) / n;
        double sum = 0.0;
        for (int i = 0; i <= n; ++i) {
            const double E = std::exp(a + i * h);
            const double w = (i == 0 || i == n) ? 1.0 : (i % 2 ? 4.0 : 2.0);
            sum += w * E * gcr_omnidirectional_per_cm2_day_MeV_n(p, E, phi_MV) * kGy_per_MeV_per_g *
                   t.stopping_MeV_cm2_g(E);
        }
        D += sum * h / 3.0;
    }
    return D;
}

} // namespace crewdose::test
