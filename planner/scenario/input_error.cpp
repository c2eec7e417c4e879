#include "planner/scenario/input_error.hpp"

#include <fmt/format.h>

namespace crewdose {
namespace {

std::string compose(const SourceLocation& where, const std::string& field,
                    const std::string& problem) {
    // fmt rather than operator+: GCC 12 at -O3 reports a false -Wrestrict inside the
    // std::string concatenation.
    if (where.line > 0) {
        return fmt::format("{}:{}: {}: {}", where.file, where.line, field, problem);
    }
    return fmt::format("{}: {}: {}", where.file, field, problem);
}

} // namespace

InputError::InputError(SourceLocation where, std::string field, std::string problem)
    : std::runtime_error(compose(where, field, problem)), where_(std::move(where)),
      field_(std::move(field)), problem_(std::move(problem)) {}

} // namespace crewdose
