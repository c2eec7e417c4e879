#pragma once
// SHA-256 (NIST FIPS 180-4, "Secure Hash Standard", 2015, sections 4.1.2, 4.2.2, 5.1.1,
// 5.3.3 and 6.2): the digest outputs carry of the scenario they were computed from, so that a
// report can be matched to the exact file. Written here from the standard (a few dozen lines)
// rather than adding a cryptography library for one function; checked against the standard's
// example vectors and against coreutils' sha256sum (tests).
#include <string>
#include <string_view>

namespace crewdose::planner {

/// The SHA-256 digest of `bytes`, as 64 lower-case hexadecimal digits.
[[nodiscard]] std::string sha256_hex(std::string_view bytes);

} // namespace crewdose::planner
