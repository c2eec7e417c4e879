#pragma once
#include <stdexcept>
#include <string>

namespace crewdose::exposure {

/// A physics parameter supplied from outside (a composition, an energy, a spectrum parameter) is
/// outside what the model allows. Carries the parameter's name, so that the planner can attach
/// the file and line where the user wrote it. Broken internal invariants use std::logic_error.
class ParameterError : public std::invalid_argument {
  public:
    ParameterError(std::string field, const std::string& message)
        : std::invalid_argument(field + ": " + message), field_(std::move(field)),
          detail_(message) {}
    /// The parameter's name as the user spells it (for example "energy_MeV").
    [[nodiscard]] const std::string& field() const noexcept { return field_; }
    /// What is wrong and what is allowed, without the field name.
    [[nodiscard]] const std::string& detail() const noexcept { return detail_; }

  private:
    std::string field_;
    std::string detail_;
};

} // namespace crewdose::exposure
