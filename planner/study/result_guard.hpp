#pragma once
// The last line of defence before anything is printed, written or decides an exit code: every
// dose, rate, margin and areal density a result carries is a finite number (doses also >= 0).
// Input that would lead elsewhere is refused earlier, by the loader and the Study, as an
// InputError naming it; a ResultFault here is crewdose's own fault. The CLI turns it into
// exit code 3 and writes nothing.
#include "exposure/dosimetry.hpp"

#include <nlohmann/json_fwd.hpp>

#include <stdexcept>
#include <string>
#include <string_view>

namespace crewdose::planner {

/// A result that was not computed: NaN, infinite, or a negative dose.
class ResultFault : public std::logic_error {
  public:
    explicit ResultFault(const std::string& what) : std::logic_error(what) {}
};

/// `value` when it is finite, else ResultFault naming `what`.
double require_finite(double value, std::string_view what);
/// `value` when it is finite and >= 0, else ResultFault naming `what`.
double require_dose(double value, std::string_view what);
/// Every quantity finite and >= 0, else ResultFault naming `what`.
const exposure::DoseQuantities& require_dose(const exposure::DoseQuantities& dose,
                                             std::string_view what);

/// `j` written with two-space indent and a final newline, after checking that every number in
/// it is finite (nlohmann would write NaN as null); ResultFault names the first bad key path.
[[nodiscard]] std::string dump_checked(const nlohmann::json& j);

} // namespace crewdose::planner
