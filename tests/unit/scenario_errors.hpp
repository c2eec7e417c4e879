#pragma once
// Editing a test scenario's text and reading the loader's message: shared by the loader's tests
// (scenario_test, routine_test).
#include "planner/scenario/scenario.hpp"

#include <catch2/catch.hpp>

#include <string>

/// `s` with the first `from` replaced by `to`; the test fails if `from` is not in `s`.
inline std::string replace(std::string s, const std::string& from, const std::string& to) {
    const auto at = s.find(from);
    REQUIRE(at != std::string::npos);
    return s.replace(at, from.size(), to);
}

/// The same for the last `from`.
inline std::string replace_last(std::string s, const std::string& from, const std::string& to) {
    const auto at = s.rfind(from);
    REQUIRE(at != std::string::npos);
    return s.replace(at, from.size(), to);
}

/// The loader's message for `text` read as "plan.toml", or "no error".
inline std::string error_of(const std::string& text) {
    try {
        (void)crewdose::planner::parse_scenario(text, "plan.toml");
    } catch (const crewdose::InputError& e) {
        return e.what();
    }
    return "no error";
}

/// Checks that loading `text` fails with a message containing `must_say`.
inline void expect(const std::string& text, const std::string& must_say) {
    const std::string e = error_of(text);
    INFO(e);
    CHECK(e.find(must_say) != std::string::npos);
}
