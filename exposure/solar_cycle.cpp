#include "exposure/solar_cycle.hpp"

#include <algorithm>
#include <stdexcept>

namespace crewdose::exposure {

namespace {
// Months since the record's first month (negative before it).
long offset_of(const RecordedPhiSeries& s, int year, int month) {
    if (month < 1 || month > 12) {
        throw std::invalid_argument("recorded_cycle_phi_MV: month must be 1 to 12");
    }
    return (static_cast<long>(year) - s.first_year) * 12 + (month - s.first_month);
}
} // namespace

bool phi_recorded(int year, int month) {
    const auto s = recorded_phi_series();
    const long k = offset_of(s, year, month);
    return k >= 0 && k < static_cast<long>(s.monthly_MV.size());
}

double recorded_cycle_phi_MV(int year, int month) {
    const auto s = recorded_phi_series();
    long k = offset_of(s, year, month);
    if (k >= 0 && k < static_cast<long>(s.monthly_MV.size())) {
        return s.monthly_MV[static_cast<std::size_t>(k)];
    }
    // The same phase inside the first whole cycle of the record, and the lowest phi within
    // kPhaseSpreadMonths of it (the phase wraps around the cycle).
    auto phase = [](long i) {
        i %= kSolarCycleMonths;
        return i < 0 ? i + kSolarCycleMonths : i;
    };
    double lowest = s.monthly_MV[static_cast<std::size_t>(phase(k))];
    for (long d = -kPhaseSpreadMonths; d <= kPhaseSpreadMonths; ++d) {
        lowest = std::min(lowest, s.monthly_MV[static_cast<std::size_t>(phase(k + d))]);
    }
    return lowest;
}

} // namespace crewdose::exposure
