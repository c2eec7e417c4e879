#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>

namespace crewdose::planner {
namespace {

void check_numbers(const nlohmann::json& j, const std::string& path) {
    if (j.is_number_float()) {
        if (!std::isfinite(j.get<double>())) {
            throw ResultFault(
                fmt::format("{} is not a finite number", path.empty() ? "a value" : path));
        }
    } else if (j.is_object()) {
        for (const auto& [key, value] : j.items()) {
            check_numbers(value, path + "/" + key);
        }
    } else if (j.is_array()) {
        for (std::size_t i = 0; i < j.size(); ++i) {
            check_numbers(j[i], path + "/" + std::to_string(i));
        }
    }
}

} // namespace

double require_finite(double value, std::string_view what) {
    if (!std::isfinite(value)) {
        throw ResultFault(fmt::format("{} is {} instead of a finite number", what, value));
    }
    return value;
}

double require_dose(double value, std::string_view what) {
    if (!std::isfinite(value) || value < 0.0) {
        throw ResultFault(fmt::format("{} is {} instead of a finite dose >= 0", what, value));
    }
    return value;
}

const exposure::DoseQuantities& require_dose(const exposure::DoseQuantities& dose,
                                             std::string_view what) {
    if (!dose.physical()) {
        throw ResultFault(fmt::format("{} is not a finite dose >= 0 (absorbed {}, dose equivalent "
                                      "{}, RBE-weighted {})",
                                      what, dose.absorbed_Gy, dose.dose_equivalent_Sv,
                                      dose.rbe_weighted_GyEq));
    }
    return dose;
}

std::string dump_checked(const nlohmann::json& j) {
    check_numbers(j, "");
    return j.dump(2) + "\n";
}

} // namespace crewdose::planner
