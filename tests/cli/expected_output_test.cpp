// Expected-output (golden) tests: every case of tests/expected/cases.tsv runs the crewdose
// binary from the source root and compares its exit code and output with tests/expected/NAME.
//
// The expected files are regression files: crewdose's own output when they were written by
// scripts/update-expected.sh, not external reference values. They show any change of the output
// of a command; whether the change is right is for the author to explain in the commit.
//
// Comparison: the exit code exactly; .txt, .csv and .svg line by line, exactly (text shows 3 or 4
// significant figures and CSV 10, so compiler flags and thread counts do not change them in
// practice); .json parsed and compared structurally (same keys, same array lengths, equal
// strings and booleans, numbers within the tolerance below; key order is not compared).
// Normalised: nothing (no output holds an absolute path). The time of run that JSON and CSV
// outputs carry is fixed by running with SOURCE_DATE_EPOCH=0, as scripts/update-expected.sh
// does; they also carry the project version, which a release changes with the files. A
// replacement added to normalise() must be added to scripts/update-expected.sh too.
#include "shell_run.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <set>
#include <sstream>
#include <stdexcept>
#include <string>
#include <sys/wait.h>
#include <unistd.h>
#include <utility>
#include <vector>

namespace {

namespace fs = std::filesystem;

// JSON numbers carry full precision (17 significant digits), and the last few digits depend on
// the order of floating-point sums, which may differ between compilers, optimisation flags and
// the number of threads a run splits its work over. A relative 1e-9 is far below any change
// of the model yet well above such rounding (1e-16 per operation); near zero an absolute 1e-12
// (in the output's own unit) stands in for it.
constexpr double kRelativeTolerance = 1e-9;
constexpr double kAbsoluteTolerance = 1e-12;
constexpr const char* kToleranceText = "relative 1e-9, absolute 1e-12";

constexpr const char* kRegenerate =
    "If the change is intended: bash scripts/update-expected.sh (from the source root, with the "
    "binary's path if not build/planner/crewdose), then read 'git diff tests/expected' and "
    "explain every change in the commit.";

// An argument of the manifest replaced by a scratch file whose content is the case's output.
constexpr const char* kOutputFileToken = "@OUT@";

const fs::path kSourceDir = CREWDOSE_SOURCE_DIR;
const fs::path kExpectedDir = kSourceDir / "tests" / "expected";

struct Case {
    std::string name; // file name in tests/expected/, ending in .txt, .json, .csv or .svg
    int exit_code = 0;
    std::vector<std::string> args;
    std::string args_text; // as in the manifest, for messages
};

std::string read_file(const fs::path& path) {
    std::ifstream in(path, std::ios::binary);
    if (!in) {
        throw std::runtime_error("cannot read " + path.string());
    }
    std::ostringstream ss;
    ss << in.rdbuf();
    return ss.str();
}

// Replaces what varies from run to run by a placeholder: nothing at present (see the top).
std::string normalise(std::string text) {
    return text;
}

std::string shell_quote(const std::string& s) {
    std::string quoted = "'";
    for (char c : s) {
        quoted += c == '\'' ? std::string("'\\''") : std::string(1, c);
    }
    return quoted + "'";
}

// A scratch folder removed when the case ends.
class ScratchDir {
  public:
    ScratchDir() {
        std::string tmpl = (fs::temp_directory_path() / "crewdose-expected-XXXXXX").string();
        if (mkdtemp(tmpl.data()) == nullptr) {
            throw std::runtime_error("mkdtemp failed for " + tmpl);
        }
        path_ = tmpl;
    }
    ScratchDir(const ScratchDir&) = delete;
    ScratchDir& operator=(const ScratchDir&) = delete;
    ~ScratchDir() {
        std::error_code ec;
        fs::remove_all(path_, ec);
    }
    const fs::path& path() const { return path_; }

  private:
    fs::path path_;
};

struct Run {
    int exit_code = -1;
    std::string out; // standard output, or the @OUT@ file's content
    std::string err;
};

// Runs the binary with the case's arguments, in the source root (the scenarios are named by
// relative paths, as in scripts/update-expected.sh).
Run run(const Case& c) {
    const ScratchDir scratch;
    const fs::path out_file = scratch.path() / "out";
    const fs::path err_file = scratch.path() / "stderr";
    bool output_is_file = false;
    std::string cmd = "cd " + shell_quote(kSourceDir.string()) + " && SOURCE_DATE_EPOCH=0 " +
                      shell_quote(CREWDOSE_BINARY);
    for (const std::string& arg : c.args) {
        if (arg == kOutputFileToken) {
            output_is_file = true;
            cmd += " " + shell_quote(out_file.string());
        } else {
            cmd += " " + shell_quote(arg);
        }
    }
    cmd += " 2>" + shell_quote(err_file.string());
    const ShellResult shell = run_shell(cmd);
    Run r;
    r.out = shell.out;
    r.exit_code = shell.exit_code;
    if (fs::exists(err_file)) {
        r.err = read_file(err_file);
    }
    if (output_is_file) {
        r.out = fs::exists(out_file) ? read_file(out_file) : std::string("(no output file)");
    }
    r.out = normalise(r.out);
    return r;
}

std::vector<std::string> split_lines(const std::string& text) {
    std::vector<std::string> lines;
    std::size_t begin = 0;
    while (begin < text.size()) {
        const std::size_t end = text.find('\n', begin);
        if (end == std::string::npos) {
            lines.push_back(text.substr(begin));
            break;
        }
        lines.push_back(text.substr(begin, end - begin));
        begin = end + 1;
    }
    return lines;
}

// The first difference of two texts, line by line; empty when they are equal.
std::string text_difference(const std::string& expected, const std::string& actual) {
    if (expected == actual) {
        return {};
    }
    const auto e = split_lines(expected);
    const auto a = split_lines(actual);
    for (std::size_t i = 0; i < std::min(e.size(), a.size()); ++i) {
        if (e[i] != a[i]) {
            return "first difference at line " + std::to_string(i + 1) + ":\n  expected: " + e[i] +
                   "\n  actual:   " + a[i];
        }
    }
    if (e.size() != a.size()) {
        const bool more = a.size() > e.size();
        const auto& longer = more ? a : e;
        return "the first " + std::to_string(std::min(e.size(), a.size())) +
               " lines agree; expected " + std::to_string(e.size()) + " lines, got " +
               std::to_string(a.size()) + "; " + (more ? "extra" : "missing") + " line " +
               std::to_string(std::min(e.size(), a.size()) + 1) + ": " +
               longer[std::min(e.size(), a.size())];
    }
    return "the lines agree but the line endings or the final newline differ";
}

bool numbers_agree(double expected, double actual) {
    const double scale = std::max(std::abs(expected), std::abs(actual));
    return std::abs(expected - actual) <= std::max(kRelativeTolerance * scale, kAbsoluteTolerance);
}

// Collects up to `limit` differences of two JSON documents, each with its JSON pointer.
void json_differences(const nlohmann::json& e, const nlohmann::json& a, const std::string& where,
                      std::vector<std::string>& found, std::size_t limit) {
    if (found.size() >= limit) {
        return;
    }
    const std::string at = where.empty() ? std::string("/") : where;
    if (e.is_number() && a.is_number()) {
        if (!numbers_agree(e.get<double>(), a.get<double>())) {
            found.push_back(at + ": expected " + e.dump() + ", got " + a.dump());
        }
        return;
    }
    if (e.type() != a.type()) {
        found.push_back(at + ": expected " + std::string(e.type_name()) + " " + e.dump() +
                        ", got " + std::string(a.type_name()) + " " + a.dump());
        return;
    }
    if (e.is_object()) {
        for (const auto& item : e.items()) {
            if (!a.contains(item.key())) {
                found.push_back(where + "/" + item.key() + ": missing");
            }
        }
        for (const auto& item : a.items()) {
            if (!e.contains(item.key())) {
                found.push_back(where + "/" + item.key() + ": not expected");
            }
        }
        for (const auto& item : e.items()) {
            if (a.contains(item.key())) {
                json_differences(item.value(), a.at(item.key()), where + "/" + item.key(), found,
                                 limit);
            }
        }
    } else if (e.is_array()) {
        if (e.size() != a.size()) {
            found.push_back(at + ": expected " + std::to_string(e.size()) + " elements, got " +
                            std::to_string(a.size()));
            return;
        }
        for (std::size_t i = 0; i < e.size(); ++i) {
            json_differences(e[i], a[i], where + "/" + std::to_string(i), found, limit);
        }
    } else if (e != a) {
        found.push_back(at + ": expected " + e.dump() + ", got " + a.dump());
    }
}

std::string json_difference(const std::string& expected, const std::string& actual) {
    nlohmann::json e;
    nlohmann::json a;
    try {
        e = nlohmann::json::parse(expected);
    } catch (const nlohmann::json::exception& ex) {
        return std::string("the expected file is not valid JSON: ") + ex.what();
    }
    try {
        a = nlohmann::json::parse(actual);
    } catch (const nlohmann::json::exception& ex) {
        return std::string("the output is not valid JSON: ") + ex.what() + "\n" +
               actual.substr(0, 2000);
    }
    std::vector<std::string> found;
    constexpr std::size_t kShown = 10;
    json_differences(e, a, "", found, kShown);
    std::string message;
    for (const auto& f : found) {
        message += (message.empty() ? "" : "\n") + std::string("  ") + f;
    }
    return found.empty()
               ? std::string{}
               : "JSON differs (first " + std::to_string(found.size()) +
                     " differences; numbers within " + kToleranceText + " agree):\n" + message;
}

bool ends_with(const std::string& s, const std::string& suffix) {
    return s.size() >= suffix.size() &&
           s.compare(s.size() - suffix.size(), suffix.size(), suffix) == 0;
}

void check_case(const Case& c) {
    const Run r = run(c);
    INFO("case " << c.name << ": crewdose " << c.args_text << "\n(run in " << kSourceDir.string()
                 << ")");
    {
        INFO("stderr: " << (r.err.empty() ? std::string("(empty)") : r.err) << "\n" << kRegenerate);
        CHECK(r.exit_code == c.exit_code);
    }
    const fs::path expected_path = kExpectedDir / c.name;
    INFO("expected file " << expected_path.string() << ". " << kRegenerate);
    REQUIRE(fs::exists(expected_path));
    const std::string expected = read_file(expected_path);
    const std::string difference = ends_with(c.name, ".json") ? json_difference(expected, r.out)
                                                              : text_difference(expected, r.out);
    if (!difference.empty()) {
        FAIL_CHECK("the output differs from tests/expected/" << c.name << ":\n" << difference);
    }
}

// One Catch test case per manifest line, so ctest runs and names them one by one. Catch2 v2
// has no public way to make test cases from data at run time; this uses its registration
// interface (ITestInvoker, AutoReg), as its own TEST_CASE macro does.
class CaseInvoker : public Catch::ITestInvoker {
  public:
    explicit CaseInvoker(Case c) : case_(std::move(c)) {}
    void invoke() const override { check_case(case_); }

  private:
    Case case_;
};

// A manifest that cannot be read still gives a test, and it fails.
class FailingInvoker : public Catch::ITestInvoker {
  public:
    explicit FailingInvoker(std::string message) : message_(std::move(message)) {}
    void invoke() const override { FAIL(message_); }

  private:
    std::string message_;
};

std::vector<Case> read_manifest() {
    const fs::path path = kExpectedDir / "cases.tsv";
    std::istringstream in(read_file(path));
    std::vector<Case> cases;
    std::string line;
    int number = 0;
    while (std::getline(in, line)) {
        ++number;
        if (line.empty() || line[0] == '#') {
            continue;
        }
        const auto bad = [&](const std::string& why) {
            return std::runtime_error(path.string() + ":" + std::to_string(number) + ": " + why);
        };
        const std::size_t tab1 = line.find('\t');
        const std::size_t tab2 = tab1 == std::string::npos ? tab1 : line.find('\t', tab1 + 1);
        if (tab2 == std::string::npos) {
            throw bad("expected name<TAB>exit code<TAB>arguments");
        }
        Case c;
        c.name = line.substr(0, tab1);
        const std::string code = line.substr(tab1 + 1, tab2 - tab1 - 1);
        if (code.empty() || code.find_first_not_of("0123456789") != std::string::npos) {
            throw bad("exit code '" + code + "' is not a number");
        }
        c.exit_code = std::stoi(code);
        c.args_text = line.substr(tab2 + 1);
        std::istringstream words(c.args_text);
        for (std::string w; words >> w;) {
            c.args.push_back(w);
        }
        if (c.name.find_first_not_of("abcdefghijklmnopqrstuvwxyz0123456789-.") !=
                std::string::npos ||
            !(ends_with(c.name, ".txt") || ends_with(c.name, ".json") ||
              ends_with(c.name, ".csv") || ends_with(c.name, ".svg"))) {
            throw bad("case name '" + c.name +
                      "': lower-case, digits, '-', then .txt/.json/.csv/.svg");
        }
        cases.push_back(std::move(c));
    }
    if (cases.empty()) {
        throw std::runtime_error(path.string() + " lists no case");
    }
    return cases;
}

const struct RegisterCases {
    RegisterCases() {
        try {
            for (Case& c : read_manifest()) {
                const std::string name = c.name;
                const Catch::AutoReg reg(new CaseInvoker(std::move(c)), CATCH_INTERNAL_LINEINFO,
                                         Catch::StringRef(),
                                         Catch::NameAndTags{name, "[expected]"});
            }
        } catch (const std::exception& e) {
            const Catch::AutoReg reg(new FailingInvoker(std::string(e.what()) + ". " + kRegenerate),
                                     CATCH_INTERNAL_LINEINFO, Catch::StringRef(),
                                     Catch::NameAndTags{"manifest", "[expected]"});
        }
    }
} kRegisterCases;

} // namespace

// A file left in tests/expected/ by a case taken off the list would never be compared again.
TEST_CASE("manifest lists every expected file", "[expected]") {
    std::set<std::string> listed;
    for (const Case& c : read_manifest()) {
        CHECK(listed.insert(c.name).second); // each name once
    }
    for (const auto& entry : fs::directory_iterator(kExpectedDir)) {
        const std::string name = entry.path().filename().string();
        if (name != "cases.tsv") {
            INFO(name << " is in tests/expected/ but not in cases.tsv. " << kRegenerate);
            CHECK(listed.count(name) == 1);
        }
    }
}

// The comparisons themselves must be able to fail.
TEST_CASE("expected-output comparisons catch differences", "[expected]") {
    CHECK(text_difference("a\nb\n", "a\nb\n").empty());
    CHECK(text_difference("a\nb\n", "a\nc\n").find("line 2") != std::string::npos);
    CHECK_FALSE(text_difference("a\nb\n", "a\nb\nc\n").empty());
    CHECK_FALSE(text_difference("a\nb\n", "a\nb").empty());
    CHECK(json_difference(R"({"x": [1.0, "s"]})", R"({"x": [1.0000000000001, "s"]})").empty());
    CHECK(json_difference(R"({"x": 0.0})", R"({"x": 1e-13})").empty());
    CHECK_FALSE(json_difference(R"({"x": 1.0})", R"({"x": 1.00000001})").empty());
    CHECK_FALSE(json_difference(R"({"x": 0.0})", R"({"x": 1e-11})").empty());
    CHECK_FALSE(json_difference(R"({"x": [1, 2]})", R"({"x": [1]})").empty());
    CHECK_FALSE(json_difference(R"({"x": 1})", R"({"y": 1})").empty());
    CHECK_FALSE(json_difference(R"({"x": "a"})", R"({"x": "b"})").empty());
    CHECK_FALSE(json_difference(R"({"x": true})", R"({"x": 1})").empty());
    CHECK_FALSE(json_difference(R"({"x": 1})", "not json").empty());
}

TEST_CASE("the README's example verdict is the lunar demo's expected output", "[expected]") {
    // By construction: the block between the README's verdict-example markers must appear, line
    // for line, in tests/expected/check-lunar.txt, so the README shows what the tool prints.
    const std::string readme = read_file(kSourceDir / "README.md");
    const std::string begin = "<!-- verdict-example:";
    const auto b = readme.find(begin);
    REQUIRE(b != std::string::npos);
    const auto open = readme.find("```text\n", b);
    const auto close = readme.find("```\n", open + 8);
    REQUIRE(open != std::string::npos);
    REQUIRE(close != std::string::npos);
    const std::string block = readme.substr(open + 8, close - open - 8);
    REQUIRE(block.find("Verdict:") == 0);
    const std::string expected = read_file(kExpectedDir / "check-lunar.txt");
    INFO("README block:\n" << block << "\n" << kRegenerate
                           << " and copy the verdict block into the README");
    CHECK(expected.find(block) != std::string::npos);
}
