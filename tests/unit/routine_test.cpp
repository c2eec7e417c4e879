// [[routine]]: a repeating block of activities expands at load to exactly the activities it
// stands for, and every fault names the rule's line, its key and the instance's date.
// Reference values: by construction. Every dose here is compared with the same plan written
// out activity by activity (no external source is needed: the rule only rewrites the input),
// and every date and line number follows from the fixture's text.
#include "fixture.hpp"
#include "planner/scenario/number_parse.hpp"
#include "planner/scenario/scenario.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/study/ledger.hpp"
#include "planner/study/study.hpp"
#include "scenario_errors.hpp"

#include <catch2/catch.hpp>
#include <fmt/format.h>

#include <algorithm>
#include <cstddef>
#include <set>
#include <string>

using namespace crewdose;
using namespace crewdose::planner;

namespace {

const std::string kPlan = read_fixture("routine-plan.toml.in");

// A two-day block (sleep, stay, EVA, stay; sleep, stay), five times from the mission start.
const std::string kRoutine = R"([[routine]]
crew = ["a", "b"]
from = 2032-01-01T00:00:00Z
every = "2d"

[[routine.activity]]
kind = "sleep"
location = "bunk"
for = "8h"

[[routine.activity]]
kind = "stay"
location = "cabin"
for = "2h"

[[routine.activity]]
kind = "eva"
location = "outside"
for = "5h"
return_min = 40

[[routine.activity]]
kind = "stay"
location = "cabin"
for = "9h"

[[routine.activity]]
kind = "sleep"
location = "bunk"
at = "1d"
for = "8h"

[[routine.activity]]
kind = "stay"
location = "cabin"
for = "16h"
)";

// The same five blocks written out by hand, one [[activity]] each.
std::string written_out(int first_block, int blocks) {
    struct Row {
        const char* kind;
        const char* location;
        int from_h;
        int to_h;
        const char* extra;
    };
    const Row rows[] = {{"sleep", "bunk", 0, 8, ""},
                        {"stay", "cabin", 8, 10, ""},
                        {"eva", "outside", 10, 15, "return_min = 40\n"},
                        {"stay", "cabin", 15, 24, ""},
                        {"sleep", "bunk", 24, 32, ""},
                        {"stay", "cabin", 32, 48, ""}};
    const auto at = [](int h) {
        return fmt::format("2032-01-{:02}T{:02}:00:00Z", 1 + h / 24, h % 24);
    };
    std::string out;
    for (int k = first_block; k < first_block + blocks; ++k) {
        for (const auto& r : rows) {
            out += fmt::format("[[activity]]\ncrew = [\"a\", \"b\"]\nkind = \"{}\"\nlocation = "
                               "\"{}\"\nstart = {}\nend = {}\n{}\n",
                               r.kind, r.location, at(48 * k + r.from_h), at(48 * k + r.to_h),
                               r.extra);
        }
    }
    return out;
}

std::string plan(const std::string& timeline) {
    return fill(kPlan, {{"@TIMELINE@", timeline}});
}

// The 1-based line of the first `needle` at or after the `nth` occurrence (1-based).
int line_of(const std::string& text, const std::string& needle, int nth = 1) {
    std::size_t at = std::string::npos;
    for (int i = 0; i < nth; ++i) {
        at = text.find(needle, at == std::string::npos ? 0 : at + 1);
        REQUIRE(at != std::string::npos);
    }
    return 1 + static_cast<int>(
                   std::count(text.begin(), text.begin() + static_cast<std::ptrdiff_t>(at), '\n'));
}

bool same_activity(const ActivitySpec& x, const ActivitySpec& y) {
    return x.crew == y.crew && x.kind == y.kind && x.location == y.location && x.start == y.start &&
           x.end == y.end && x.return_min == y.return_min && x.refuge == y.refuge &&
           x.distance_km == y.distance_km;
}

} // namespace

TEST_CASE("durations are a number and a unit, in whole seconds", "[routine]") {
    CHECK(parse_duration_s("2d") == 172800);
    CHECK(parse_duration_s("1.5h") == 5400);
    CHECK(parse_duration_s("90min") == 5400);
    CHECK(parse_duration_s("30s") == 30);
    CHECK(parse_duration_s("0h") == 0);
    for (const char* bad : {"", "d", "2", "2 d", "2days", "-1d", "0.5s", "nanh", "infh", "1e9d"}) {
        INFO(bad);
        CHECK_FALSE(parse_duration_s(bad).has_value());
    }
}

TEST_CASE("a repeated block expands to exactly the activities written out, with the same doses",
          "[routine]") {
    const std::string with_rule = plan(kRoutine);
    const Scenario rule = parse_scenario(with_rule, "plan.toml");
    const Scenario plain = parse_scenario(plan(written_out(0, 5)), "plan.toml");
    REQUIRE(rule.activities.size() == 30);
    REQUIRE(plain.activities.size() == 30);
    for (std::size_t i = 0; i < plain.activities.size(); ++i) {
        INFO(i);
        CHECK(same_activity(rule.activities[i], plain.activities[i]));
    }
    // Each expanded activity keeps the line of its [[routine.activity]] entry.
    CHECK(rule.activities[2].where.line == line_of(with_rule, "kind = \"eva\"") - 1);
    CHECK(rule.activities[8].where.line == rule.activities[2].where.line);
    CHECK(rule.activities[0].where.file == "plan.toml");

    const LedgerResult a = build_ledger(Study(rule));
    const LedgerResult b = build_ledger(Study(plain));
    REQUIRE(a.crew.size() == b.crew.size());
    bool event_dose = false;
    for (std::size_t c = 0; c < a.crew.size(); ++c) {
        REQUIRE(a.crew[c].organs.size() == b.crew[c].organs.size());
        for (std::size_t o = 0; o < a.crew[c].organs.size(); ++o) {
            const auto& x = a.crew[c].organs[o];
            const auto& y = b.crew[c].organs[o];
            INFO(a.crew[c].crew << " " << x.organ);
            CHECK(x.mission_mGyEq == Approx(y.mission_mGyEq).epsilon(1e-12));
            CHECK(x.career_mGyEq == Approx(y.career_mGyEq).epsilon(1e-12));
            CHECK(x.max_30d.dose_mGyEq == Approx(y.max_30d.dose_mGyEq).epsilon(1e-12));
            CHECK(x.gcr.mGyEq == Approx(y.gcr.mGyEq).epsilon(1e-12));
            CHECK(x.spe.mGyEq == Approx(y.spe.mGyEq).epsilon(1e-12));
            event_dose = event_dose || x.spe.mGyEq > 0.0;
        }
    }
    CHECK(event_dose); // the event meets the EVA of day 5: the comparison sees its dose
}

TEST_CASE("each instance of a routine's activity is named by the rule's line and its date",
          "[routine]") {
    // Found in code review: the check's contributors named every instance of a routine's
    // activity by the same line, so two instances could not be told apart. By construction:
    // the EVA of the instance of 2032-01-05 meets the event; every contributor's name is its
    // own.
    const std::string with_rule = plan(kRoutine);
    const LedgerResult ledger = build_ledger(Study(parse_scenario(with_rule, "plan.toml")));
    const int eva = line_of(with_rule, "kind = \"eva\"") - 1;
    for (const auto& c : ledger.crew) {
        INFO(c.crew);
        std::set<std::string> names;
        for (const auto& [name, dose] : c.contributors) {
            INFO(name);
            CHECK(names.insert(name).second);
        }
        CHECK(names.count(fmt::format("SPE spe during eva at outside (line {}, instance of "
                                      "2032-01-05T00:00:00Z)",
                                      eva)) == 1);
        CHECK(names.count(fmt::format("GCR during eva at outside (line {}, instance of "
                                      "2032-01-01T00:00:00Z)",
                                      eva)) == 1);
    }
    // An [[activity]] entry keeps its line alone.
    const LedgerResult plain =
        build_ledger(Study(parse_scenario(plan(written_out(0, 5)), "plan.toml")));
    for (const auto& [name, dose] : plain.crew.at(0).contributors) {
        CHECK(name.find("instance") == std::string::npos);
    }
}

TEST_CASE("except leaves instances out, until ends a routine part way through its block",
          "[routine]") {
    // Blocks 1 and 3 are left out and written out instead; the routine stops at day 9's end of
    // the EVA (until), the rest written out.
    const std::string rule = replace(kRoutine, "every = \"2d\"",
                                     "every = \"2d\"\nexcept = [2032-01-03T00:00:00Z, "
                                     "2032-01-07T00:00:00Z]\nuntil = 2032-01-09T15:00:00Z");
    const std::string tail = R"([[activity]]
crew = ["a", "b"]
kind = "stay"
location = "cabin"
start = 2032-01-09T15:00:00Z
end = 2032-01-11T00:00:00Z
)";
    const Scenario s =
        parse_scenario(plan(written_out(1, 1) + written_out(3, 1) + tail + rule), "plan.toml");
    // 12 written out, 1 tail, the routine: blocks 0 and 2 (6 each) and 3 of block 4.
    CHECK(s.activities.size() == 12 + 1 + 15);
    CHECK(timeline_gaps(s).empty());
}

TEST_CASE("a routine's faults name the file, the rule's line and key, and the instance",
          "[routine]") {
    const std::string base = plan(kRoutine);
    const int rule = line_of(base, "\n[[routine]]") + 1;
    const int every = line_of(base, "every =");
    const std::string at_rule = fmt::format("plan.toml:{}: ", rule);

    SECTION("the period") {
        expect(replace(base, "every = \"2d\"", "every = \"2 days\""),
               fmt::format("plan.toml:{}: routine.every: '2 days': write the period as a number "
                           "and a unit (s, min, h or d)",
                           every));
        expect(replace(base, "every = \"2d\"", "every = \"0d\""), "from 1min to 366d");
        expect(replace(base, "every = \"2d\"", "every = \"400d\""), "from 1min to 366d");
        expect(replace(base, "every = \"2d\"", "every = 2"), "routine.every: must be a string");
    }
    SECTION("until before from") {
        expect(replace(base, "every = \"2d\"", "every = \"2d\"\nuntil = 2032-01-01T00:00:00Z"),
               fmt::format("plan.toml:{}: routine.until: the routine would end (until = "
                           "2032-01-01T00:00:00Z) before it starts (from = 2032-01-01T00:00:00Z)",
                           every + 1));
    }
    SECTION("instances that would overlap the next one") {
        const std::string text = replace(base, "for = \"16h\"", "for = \"20h\"");
        expect(text, fmt::format("plan.toml:{}: routine.activity.for: the activity ends 52h after "
                                 "the start of its instance, after the period every = 2d: the "
                                 "instance of 2032-01-01T00:00:00Z would still run when the next "
                                 "starts at 2032-01-03T00:00:00Z",
                                 line_of(text, "for = \"20h\"")));
    }
    SECTION("an instance outside the mission") {
        expect(replace(base, "from = 2032-01-01T00:00:00Z", "from = 2031-12-30T00:00:00Z"),
               fmt::format("plan.toml:{}: routine.from: the instance of 2031-12-30T00:00:00Z lies "
                           "outside the mission",
                           rule + 2));
        // An until after the mission's end: the last instance does not fit.
        expect(replace(replace(base, "from = 2032-01-01T00:00:00Z", "from = 2032-01-02T00:00:00Z"),
                       "every = \"2d\"", "every = \"2d\"\nuntil = 2032-01-12T00:00:00Z"),
               fmt::format("plan.toml:{}: routine.until: the instance of 2032-01-10T00:00:00Z lies "
                           "outside the mission: its activity at line",
                           every + 1));
    }
    SECTION("an activity of an instance that runs past until") {
        const std::string text =
            replace(base, "every = \"2d\"", "every = \"2d\"\nuntil = 2032-01-09T12:00:00Z");
        expect(text,
               fmt::format("plan.toml:{}: routine.until: the instance of 2032-01-09T00:00:00Z: "
                           "its activity at line {} runs from 2032-01-09T10:00:00Z to "
                           "2032-01-09T15:00:00Z, past until",
                           every + 1, line_of(text, "kind = \"eva\"") - 1));
    }
    SECTION("one instance overlapping a one-off activity") {
        const std::string text = base + R"(
[[activity]]
crew = "b"
kind = "shelter"
location = "cabin"
start = 2032-01-05T12:00:00Z
end = 2032-01-05T13:00:00Z
)";
        // The one-off activity starts inside the instance's EVA: the error is the one-off's,
        // and names the EVA by its rule's line and its instance.
        expect(text,
               fmt::format("plan.toml:{}: activity.start: crew member 'b' is already busy "
                           "until 2032-01-05T15:00:00Z (the activity at line {} in the instance "
                           "of 2032-01-05T00:00:00Z of the routine at line {}, from "
                           "2032-01-05T10:00:00Z) when this one starts at 2032-01-05T12:00:00Z",
                           line_of(text, "kind = \"shelter\"") - 2,
                           line_of(text, "kind = \"eva\"") - 1, rule));
    }
    SECTION("one instance starting inside a one-off activity") {
        // Found in code review: the instance's error named activity.start, a key the routine
        // does not have. A one-off shelter stay written before the routine starts with the EVA
        // of the instance of the 5th (10:00) and runs to 10:30: the EVA is the activity that
        // starts while crew member b is busy, and the error names the rule's key and line and
        // the instance.
        const std::string text = plan(R"([[activity]]
crew = "b"
kind = "shelter"
location = "cabin"
start = 2032-01-05T10:00:00Z
end = 2032-01-05T10:30:00Z

)" + kRoutine);
        expect(text,
               fmt::format("plan.toml:{}: routine.activity.at: crew member 'b' is already busy "
                           "until 2032-01-05T10:30:00Z (the activity at line {}, from "
                           "2032-01-05T10:00:00Z) when this one starts at 2032-01-05T10:00:00Z; "
                           "activities of one crew member must not overlap (the instance of "
                           "2032-01-05T00:00:00Z of the routine at line {})",
                           line_of(text, "kind = \"eva\"") - 1,
                           line_of(text, "kind = \"shelter\"") - 2,
                           line_of(text, "\n[[routine]]") + 1));
    }
    SECTION("the activities themselves, checked as [[activity]] entries are, per instance") {
        const std::string text = replace(base, "location = \"outside\"", "location = \"moon\"");
        expect(text, fmt::format("plan.toml:{}: routine.activity.location: unknown location "
                                 "'moon'; allowed: ",
                                 line_of(text, "kind = \"eva\"") - 1));
        expect(
            text,
            fmt::format(" (the instance of 2032-01-01T00:00:00Z of the routine at line {})", rule));
        expect(replace(base, "return_min = 40", "return_min = 4000"),
               "routine.activity.return_min: 4000 is outside the allowed range 0 to 2880 minutes "
               "(the instance of 2032-01-01T00:00:00Z");
        expect(replace(base, "for = \"5h\"", "for = \"5h\"\nstart = 2032-01-01T10:00:00Z"),
               "routine.activity.start: unknown key; allowed here: at, crew, distance_km, for, "
               "kind, location, refuge, return_min");
        expect(replace(base, "crew = [\"a\", \"b\"]\n", ""),
               "routine.activity.crew: is required here: give crew on the [[routine]]");
        expect(replace(base, "crew = [\"a\", \"b\"]", "crew = [\"a\", \"z\"]"),
               "routine.activity.crew: unknown crew member 'z' (the instance of");
        expect(replace(base, "for = \"8h\"", "at = \"2d\"\nfor = \"8h\""),
               "routine.activity.at: '2d': write the start within the period (less than every)");
    }
    SECTION("except names instances") {
        expect(
            replace(base, "every = \"2d\"", "every = \"2d\"\nexcept = [2032-01-04T00:00:00Z]"),
            fmt::format("plan.toml:{}: routine.except: 2032-01-04T00:00:00Z is not the start of an "
                        "instance; instances start at from = 2032-01-01T00:00:00Z and every 2d "
                        "after it, the last at 2032-01-09T00:00:00Z",
                        every + 1));
        expect(replace(base, "every = \"2d\"",
                       "every = \"2d\"\nexcept = [2032-01-03T00:00:00Z, 2032-01-03T00:00:00Z]"),
               "routine.except: lists 2032-01-03T00:00:00Z twice");
        expect(replace(base, "every = \"2d\"", "every = \"2d\"\nexcept = [\"2032-01-03\"]"),
               "routine.except: must hold RFC 3339 date-times");
    }
    SECTION("no activities, and absurd counts") {
        expect(plan("[[routine]]\ncrew = \"a\"\nfrom = 2032-01-01T00:00:00Z\nevery = \"1d\"\n"),
               "routine.activity: the routine has no activities");
        const std::string many =
            replace(plan("[[routine]]\ncrew = \"a\"\nfrom = 2032-01-01T00:00:00Z\nevery = "
                         "\"1min\"\n[[routine.activity]]\nkind = \"stay\"\nlocation = "
                         "\"cabin\"\nfor = \"1min\"\n"),
                    "end = 2032-01-11T00:00:00Z", "end = 2232-01-11T00:00:00Z");
        expect(many, "routine.every: the routine would expand to 105203520 activities (105203520 "
                     "instances); all routines together may expand to at most 100000 activities");
    }
}
