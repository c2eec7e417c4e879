#include "planner/cli/provenance.hpp"

#include "planner/report/cautions.hpp"
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/study/result_guard.hpp"

#include <boost/date_time/posix_time/posix_time.hpp>
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cstdlib>
#include <stdexcept>
#include <string_view>

#ifndef CREWDOSE_VERSION
#error "CREWDOSE_VERSION must be defined by the build (the CMake project version)"
#endif

namespace crewdose::cli {

std::string tool_version() {
    return CREWDOSE_VERSION;
}

RunStamp run_stamp(const planner::Scenario* scenario, const planner::Scenario* second) {
    namespace pt = boost::posix_time;
    RunStamp s;
    s.version = tool_version();
    if (scenario) {
        s.scenario = scenario->file;
        s.scenario_sha256 = scenario->file_sha256;
    }
    if (second) {
        s.scenario_b = second->file;
        s.scenario_b_sha256 = second->file_sha256;
    }
    pt::ptime now = pt::second_clock::universal_time();
    if (const char* epoch = std::getenv("SOURCE_DATE_EPOCH")) {
        const std::string_view text(epoch);
        long long seconds = 0;
        bool ok = !text.empty() && text.size() <= 12;
        for (const char c : text) {
            ok = ok && c >= '0' && c <= '9';
            seconds = ok ? seconds * 10 + (c - '0') : 0;
        }
        if (!ok) {
            throw InputError({"environment", 0}, "SOURCE_DATE_EPOCH",
                             fmt::format("'{}' is not a whole number of seconds since "
                                         "1970-01-01T00:00:00Z; unset it to stamp "
                                         "outputs with the time of the run",
                                         text));
        }
        now = pt::ptime(boost::gregorian::date(1970, 1, 1)) + pt::seconds(seconds);
    }
    s.run_at = planner::format_time(now);
    return s;
}

std::string stamped(const std::string& output, planner::OutputFormat format,
                    const RunStamp& stamp) {
    if (format == planner::OutputFormat::json) {
        nlohmann::json j = nlohmann::json::parse(output);
        if (!j.is_object()) {
            throw std::logic_error("stamped: a JSON report must be an object");
        }
        nlohmann::json p{
            {"tool", "crewdose"}, {"version", stamp.version}, {"run_at", stamp.run_at}};
        if (!stamp.scenario.empty()) {
            p["scenario"] = stamp.scenario;
            p["scenario_sha256"] = stamp.scenario_sha256;
        }
        if (!stamp.scenario_b.empty()) {
            p["scenario_b"] = stamp.scenario_b;
            p["scenario_b_sha256"] = stamp.scenario_b_sha256;
        }
        j["provenance"] = p;
        return planner::dump_checked(j);
    }
    if (format == planner::OutputFormat::csv) {
        std::string line = fmt::format("# crewdose {}; run at {}", stamp.version, stamp.run_at);
        if (!stamp.scenario.empty()) {
            line += fmt::format("; scenario {} (sha256 {})", stamp.scenario, stamp.scenario_sha256);
        }
        if (!stamp.scenario_b.empty()) {
            line += fmt::format("; scenario B {} (sha256 {})", stamp.scenario_b,
                                stamp.scenario_b_sha256);
        }
        // The cautions travel with the numbers: a CSV opened alone in a spreadsheet still says
        // that its limits are planning values.
        std::string cautions = planner::caution_text();
        std::replace(cautions.begin(), cautions.end(), '\n', ' ');
        return line + "\n# " + cautions + "\n" + output;
    }
    return output;
}

std::vector<std::pair<std::string, std::string>> html_about(const RunStamp& stamp) {
    std::vector<std::pair<std::string, std::string>> about{{"tool", "crewdose " + stamp.version}};
    const bool two = !stamp.scenario_b.empty();
    about.emplace_back(two ? "plan A" : "scenario", stamp.scenario);
    about.emplace_back(two ? "plan A SHA-256" : "scenario SHA-256", stamp.scenario_sha256);
    if (two) {
        about.emplace_back("plan B", stamp.scenario_b);
        about.emplace_back("plan B SHA-256", stamp.scenario_b_sha256);
    }
    about.emplace_back("run at", stamp.run_at);
    return about;
}

} // namespace crewdose::cli
