#pragma once
#include <stdexcept>
#include <string>

namespace crewdose {

/// Where the user wrote something: a file and line, or the command line (line 0).
struct SourceLocation {
    std::string file; ///< file name as given, or "command line"
    int line = 0;     ///< 1-based line; 0 when there is no line
};

/// Bad input that the user must fix. what() reads "file:line: field: problem; allowed".
/// Only main() turns it into a message and exit code 2.
class InputError : public std::runtime_error {
  public:
    InputError(SourceLocation where, std::string field, std::string problem);

    [[nodiscard]] const SourceLocation& where() const noexcept { return where_; }
    [[nodiscard]] const std::string& field() const noexcept { return field_; }
    [[nodiscard]] const std::string& problem() const noexcept { return problem_; }

  private:
    SourceLocation where_;
    std::string field_;
    std::string problem_;
};

} // namespace crewdose
