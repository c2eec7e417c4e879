#pragma once
// The named test scenarios of tests/fixtures/scenarios/ (README.md there says what each is).
#include <fstream>
#include <initializer_list>
#include <sstream>
#include <stdexcept>
#include <string>
#include <utility>

/// The text of tests/fixtures/scenarios/`name`; std::runtime_error naming the path if it cannot
/// be read.
inline std::string read_fixture(const std::string& name) {
    const std::string path = std::string(CREWDOSE_SOURCE_DIR) + "/tests/fixtures/scenarios/" + name;
    std::ifstream in(path, std::ios::binary);
    if (!in) {
        throw std::runtime_error("test fixture " + path + " cannot be read");
    }
    std::ostringstream text;
    text << in.rdbuf();
    return text.str();
}

/// A template fixture (`*.toml.in`) with each @TOKEN@ replaced; std::logic_error if a token is
/// missing, so a fixture and its test cannot drift apart silently.
inline std::string fill(std::string text,
                        std::initializer_list<std::pair<std::string, std::string>> values) {
    for (const auto& [token, value] : values) {
        const auto at = text.find(token);
        if (at == std::string::npos) {
            throw std::logic_error("test fixture: no " + token + " to fill");
        }
        text.replace(at, token.size(), value);
    }
    return text;
}
