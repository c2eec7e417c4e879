// Every time crewdose prints can be pasted back into a time option (--onset, --from, --to):
// the expected outputs of tests/expected hold every command's output in every format on both
// demos, so each date-time found in them must be RFC 3339 with seconds and UTC
// (2032-03-11T07:50:00Z, RFC 3339 section 5.6) and must read back to itself.
#include "planner/analyses/storm.hpp"
#include "planner/scenario/time_format.hpp"

#include <catch2/catch.hpp>

#include <cctype>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

using namespace crewdose::planner;

namespace {

bool digits(const std::string& s, std::size_t at, std::size_t n) {
    for (std::size_t k = 0; k < n; ++k) {
        if (at + k >= s.size() || std::isdigit(static_cast<unsigned char>(s[at + k])) == 0) {
            return false;
        }
    }
    return true;
}

// Anything at `i` that starts like a date and a time ("2032-03-11T07:50", a space for the T
// too), however it goes on: digits, colons and dots, then one letter or sign; empty if none.
std::string time_at(const std::string& s, std::size_t i) {
    if (!(digits(s, i, 4) && s[i + 4] == '-' && digits(s, i + 5, 2) && s[i + 7] == '-' &&
          digits(s, i + 8, 2) && (s[i + 10] == 'T' || s[i + 10] == ' ') && digits(s, i + 11, 2) &&
          i + 13 < s.size() && s[i + 13] == ':')) {
        return {};
    }
    std::size_t j = i + 14;
    while (j < s.size() &&
           (std::isdigit(static_cast<unsigned char>(s[j])) != 0 || s[j] == ':' || s[j] == '.')) {
        ++j;
    }
    if (j < s.size() &&
        (std::isalpha(static_cast<unsigned char>(s[j])) != 0 || s[j] == '+' || s[j] == '-')) {
        ++j;
    }
    return s.substr(i, j - i);
}

// 2032-03-11T07:50:00Z exactly.
bool is_rfc3339_utc(const std::string& t) {
    return t.size() == 20 && digits(t, 0, 4) && t[4] == '-' && digits(t, 5, 2) && t[7] == '-' &&
           digits(t, 8, 2) && t[10] == 'T' && digits(t, 11, 2) && t[13] == ':' &&
           digits(t, 14, 2) && t[16] == ':' && digits(t, 17, 2) && t[19] == 'Z';
}

} // namespace

TEST_CASE("every time in the expected outputs is RFC 3339 and reads back", "[time][report]") {
    const std::filesystem::path dir = std::filesystem::path(CREWDOSE_SOURCE_DIR) / "tests/expected";
    // (A hand-written scanner: GCC 12's std::regex trips -Wmaybe-uninitialized under the
    // sanitizer build.)
    std::size_t files = 0;
    std::size_t times = 0;
    for (const auto& entry : std::filesystem::directory_iterator(dir)) {
        if (entry.path().extension() == ".tsv") {
            continue; // the case list: command lines, not output
        }
        std::ifstream in(entry.path());
        std::stringstream text;
        text << in.rdbuf();
        const std::string s = text.str();
        ++files;
        for (std::size_t i = 0; i + 14 <= s.size(); ++i) {
            const std::string t = time_at(s, i);
            if (t.empty()) {
                continue;
            }
            INFO(entry.path().filename().string() << ": " << t);
            REQUIRE(is_rfc3339_utc(t));
            CHECK(format_time(parse_command_time(t, "--onset")) == t);
            ++times;
            i += t.size() - 1;
        }
    }
    CHECK(files >= 30);  // every command and format (the case list)
    CHECK(times >= 100); // the demos' timelines, sweeps and events
}
