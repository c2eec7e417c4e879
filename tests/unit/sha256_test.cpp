// SHA-256 of the scenario text (planner/scenario/sha256): the digest every JSON and CSV output
// carries, so a report can be matched to the exact file it came from.
#include "planner/scenario/sha256.hpp"

#include <catch2/catch.hpp>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <initializer_list>
#include <string>
#include <unistd.h>

using crewdose::planner::sha256_hex;

namespace {

// coreutils' sha256sum of `bytes` (an independent implementation), via a scratch file.
std::string sha256sum_of(const std::string& bytes) {
    namespace fs = std::filesystem;
    const fs::path file =
        fs::temp_directory_path() / ("crewdose-sha256-" + std::to_string(::getpid()));
    {
        std::ofstream out(file, std::ios::binary);
        out << bytes;
    }
    FILE* pipe = popen(("sha256sum '" + file.string() + "'").c_str(), "r");
    REQUIRE(pipe != nullptr);
    std::array<char, 65> hex{};
    const std::size_t n = std::fread(hex.data(), 1, 64, pipe);
    pclose(pipe);
    fs::remove(file);
    REQUIRE(n == 64);
    return std::string(hex.data(), 64);
}

} // namespace

TEST_CASE("SHA-256 against the standard's examples", "[provenance]") {
    // Source: NIST FIPS 180-2 (2002), Appendix B.1 and B.2 (one- and two-block messages), and
    // the digest of the empty message (common practice: the value every SHA-256 tool prints for
    // an empty file). Quoted from memory; the next test checks the same function against
    // coreutils.
    CHECK(sha256_hex("abc") == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    CHECK(sha256_hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq") ==
          "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
    CHECK(sha256_hex("") == "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

TEST_CASE("SHA-256 agrees with coreutils' sha256sum at every padding edge", "[provenance]") {
    // Reference: GNU coreutils sha256sum on the same bytes. Lengths around the 56-byte padding
    // limit and the 64-byte block, and a long multi-block text with every byte value.
    std::string all;
    for (int i = 0; i < 3000; ++i) {
        all += static_cast<char>(i % 256);
    }
    for (const std::size_t len :
         std::initializer_list<std::size_t>{1, 55, 56, 57, 63, 64, 65, 119, 120, 128, 3000}) {
        const std::string bytes = all.substr(0, len);
        INFO(len << " bytes");
        CHECK(sha256_hex(bytes) == sha256sum_of(bytes));
    }
}
