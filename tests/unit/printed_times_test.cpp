// Every time crewdose prints can be pasted back into a time option (--onset, --from, --to):
// the expected outputs of tests/expected hold every command's output in every format on both
// demos, so each date-time found in them must be RFC 3339 with seconds and UTC
// (2032-03-11T07:50:00Z, RFC 3339 section 5.6) and must read back to itself.
#include "planner/analyses/storm.hpp"
#include "planner/scenario/time_format.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <regex>
#include <sstream>
#include <string>

using namespace crewdose::planner;

TEST_CASE("every time in the expected outputs is RFC 3339 and reads back", "[time][report]") {
    const std::filesystem::path dir = std::filesystem::path(CREWDOSE_SOURCE_DIR) / "tests/expected";
    // Anything that starts like a date and a time, however it goes on.
    const std::regex looks_like_time(R"(\d{4}-\d{2}-\d{2}[T ]\d{2}:[0-9:.]*[A-Za-z+-]?)");
    const std::regex rfc3339(R"(\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z)");
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
        for (auto it = std::sregex_iterator(s.begin(), s.end(), looks_like_time);
             it != std::sregex_iterator(); ++it) {
            const std::string t = it->str();
            INFO(entry.path().filename().string() << ": " << t);
            REQUIRE(std::regex_match(t, rfc3339));
            CHECK(format_time(parse_command_time(t, "--onset")) == t);
            ++times;
        }
    }
    CHECK(files >= 30);  // every command and format (the case list)
    CHECK(times >= 100); // the demos' timelines, sweeps and events
}
