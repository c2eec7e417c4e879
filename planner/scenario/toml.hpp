#pragma once
// The one way crewdose includes toml++: compiled into crewdose (header-only) instead of linked
// from Debian's shared library, so that the sanitizer build and the fuzzer (tests/fuzz/) see
// the parser's code. Text reaches toml::parse only after check_toml_text() (toml_text.hpp).
//
// toml++ 3.3 asserts internal preconditions that some malformed inputs break (for example
// "[(" or "t=2032-03-01T:"). In a debug build they abort; in a release build they become
// "assume" hints, which clang turns into undefined behaviour; Debian's library (g++, release)
// simply skips them and reports a parse error. crewdose skips them in every build, so each
// build behaves as Debian's library does, while the sanitizers still check every memory
// access and every other undefined behaviour of the parser.
#ifndef TOML_HEADER_ONLY
#define TOML_HEADER_ONLY 1
#endif
#define TOML_ENABLE_FORMATTERS 0
#include <toml++/impl/preprocessor.h>
#undef TOML_ASSERT
#define TOML_ASSERT(expr) static_cast<void>(0)
#undef TOML_ASSERT_ASSUME
#define TOML_ASSERT_ASSUME(expr) static_cast<void>(0)
#include <toml++/toml.h>
