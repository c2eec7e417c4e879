#include "input_error.hpp"

namespace crewdose {
namespace {

std::string compose(const SourceLocation& where, const std::string& field,
                    const std::string& problem) {
    std::string out = where.file;
    if (where.line > 0) {
        out += ":" + std::to_string(where.line);
    }
    out += ": " + field + ": " + problem;
    return out;
}

} // namespace

InputError::InputError(SourceLocation where, std::string field, std::string problem)
    : std::runtime_error(compose(where, field, problem)), where_(std::move(where)),
      field_(std::move(field)), problem_(std::move(problem)) {}

} // namespace crewdose
