#pragma once
// What the TOML parser is allowed to see. toml++ 3.3 (Debian 12) reaches undefined behaviour on
// some malformed input: its test for non-ASCII whitespace hits __builtin_unreachable for code
// points such as U+03EB met outside a string. Every scenario text passes check_toml_text()
// first, which refuses those inputs with a clear message; toml++ itself is compiled into
// crewdose (header-only, planner/toml.hpp) so that the sanitizer build and the fuzzer
// (tests/fuzz/) see its code too.
#include <string_view>

namespace crewdose::planner {

/// InputError at `file`:line (field "syntax") unless `text` is valid UTF-8 without control
/// characters other than tab, line feed and carriage return, with non-ASCII characters only
/// inside comments and quoted strings (TOML 1.0 allows them nowhere else). One refusal is
/// stricter than TOML: a non-ASCII character may not be the first character after a
/// line-ending backslash in a multi-line string.
void check_toml_text(std::string_view text, std::string_view file);

} // namespace crewdose::planner
