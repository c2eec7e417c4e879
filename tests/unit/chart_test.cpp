// The charts of check and shelter (--chart): a panel per crew member, the limit lines and the
// cautions, every curve from the ledger's or the sizing's own numbers, and a dose that was not
// computed drawn as such, never as a value and never within a limit.
#include "fixture.hpp"
#include "svg_check.hpp"

#include "planner/analyses/shelter.hpp"
#include "planner/report/check_chart.hpp"
#include "planner/report/number_format.hpp"
#include "planner/report/shelter_chart.hpp"
#include "planner/study/ledger.hpp"
#include "planner/study/study.hpp"

#include <catch2/catch.hpp>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

using namespace crewdose;
using namespace crewdose::planner;

namespace {

const double kNaN = std::numeric_limits<double>::quiet_NaN();
const double kInf = std::numeric_limits<double>::infinity();

} // namespace

namespace {

// The organ a series label names: "30-day lens dose", "career effective dose" -> "lens",
// "effective" (organ_label's spelling: "BFO" for the bfo).
std::string organ_of_label(const std::string& label) {
    const std::size_t first = label.find(' ') + 1;
    return label.substr(first, label.rfind(" dose") - first);
}

struct HandCheck {
    Study study;
    LedgerResult ledger;
    HandCheck()
        : study(parse_scenario(read_fixture("ledger-hand.toml"), "hand.toml")),
          ledger(build_ledger(study)) {}
};

} // namespace

TEST_CASE("check chart: a panel per crew member, the limits, the cautions, the ledger's numbers",
          "[svg][check]") {
    const HandCheck hand;
    const std::string doc = format_check_chart(hand.study, hand.ledger);
    const auto elements = svg_check::parse(doc);
    CHECK(format_check_chart(hand.study, hand.ledger) == doc); // deterministic
    // The cautions, visible: the lines of the boxed note, read in order, say them whole.
    std::string note;
    for (const auto& e : elements) {
        if (e.name == "text" && e.attributes.count("class") && e.attributes.at("class") == "note") {
            note += (note.empty() ? "" : " ") + e.text;
        }
    }
    CHECK(note.find("Any limit it shows is a planning value; the limits that apply to a crew "
                    "come from the responsible agency. These results support, and never "
                    "replace, review by licensed radiation-protection staff.") !=
          std::string::npos);
    // One panel per crew member of the ledger, headed by its id.
    std::size_t panels = 0;
    for (const auto& e : elements) {
        if (e.name == "g" && e.attributes.count("class") && e.attributes.at("class") == "panel") {
            REQUIRE(panels < hand.ledger.crew.size());
            CHECK(e.attributes.at("data-heading").find(hand.ledger.crew[panels].crew) !=
                  std::string::npos);
            ++panels;
        }
    }
    CHECK(panels == hand.ledger.crew.size());
    const auto& crew = hand.ledger.crew.at(0);
    const auto charts = svg_check::charts(elements);
    REQUIRE(charts.size() == 2);
    // The event marked, the EVA shaded in its labelled row.
    CHECK(doc.find("SPE spe: flare seen") != std::string::npos);
    CHECK(doc.find("class=\"lane\"") != std::string::npos);
    CHECK(doc.find(">EVA</text>") != std::string::npos);

    // Coordinates: the last point of the career curve is the ledger's career dose (by
    // construction: the ledger's own number), read back through the chart's y ticks.
    const auto& career = charts[1];
    REQUIRE(career.paths.size() == 1);
    const std::string career_organ = organ_of_label(career.paths.begin()->first);
    REQUIRE(career.paths.begin()->first == "career " + career_organ + " dose");
    const auto stretches = svg_check::path_points(career.paths.begin()->second);
    REQUIRE(stretches.size() == 1);
    const double tol = 2 * 0.01 * career.y.per_pixel();
    // The ledger's career dose of the organ the chart names.
    double ledger_career = kNaN;
    for (const auto& o : crew.organs) {
        if (organ_label(o.organ) == career_organ) {
            ledger_career = o.career_mGyEq;
        }
    }
    REQUIRE(std::isfinite(ledger_career));
    CHECK(career.y.value_at(stretches[0].back().second) == Approx(ledger_career).margin(tol));
    // The first point, at the mission start, holds the prior total: by construction of the
    // fixture, 7 mGy-Eq for the BFO (its prior_totals) and nothing for any other organ.
    CHECK(career.y.value_at(stretches[0].front().second) ==
          Approx(career_organ == "BFO" ? 7.0 : 0.0).margin(tol));
    // The rolling curve's highest point is the ledger's highest 30-day dose (its window end
    // is one of the times drawn), and no point is above it.
    const auto& rolling = charts[0];
    REQUIRE(rolling.paths.size() == 1);
    const std::string rolling_organ = organ_of_label(rolling.paths.begin()->first);
    REQUIRE(rolling.paths.begin()->first == "30-day " + rolling_organ + " dose");
    double ledger_max = kNaN;
    for (const auto& o : crew.organs) {
        if (organ_label(o.organ) == rolling_organ) {
            ledger_max = o.max_30d.dose_mGyEq;
        }
    }
    REQUIRE(std::isfinite(ledger_max));
    double highest = -kInf;
    const auto rolling_points = svg_check::path_points(rolling.paths.begin()->second);
    REQUIRE(rolling_points.size() == 1);
    for (const auto& [x, y] : rolling_points[0]) {
        highest = std::max(highest, rolling.y.value_at(y));
    }
    CHECK(highest == Approx(ledger_max).margin(2 * 0.01 * rolling.y.per_pixel()));
    // The limit lines with their values (by construction: the scenario's planning limits of
    // the organs drawn), each in its chart.
    std::size_t limits_found = 0;
    for (const auto& c : crew.checks) {
        const bool drawn =
            (c.limit.window == "30-day" && organ_label(c.limit.organ) == rolling_organ) ||
            (c.limit.window == "career" && organ_label(c.limit.organ) == career_organ);
        if (!drawn) {
            continue;
        }
        const std::string label =
            fmt::format("{} planning limit {} {}", c.limit.window, significant(c.limit.value, 3),
                        c.limit.organ == "effective" ? "mSv" : "mGy-Eq");
        const auto& texts = (c.limit.window == "30-day" ? rolling : career).texts;
        CHECK(std::find(texts.begin(), texts.end(), label) != texts.end());
        ++limits_found;
    }
    CHECK(limits_found == 2);
    // By construction of the fixture both locations use the quick body model (the default):
    // the heart and brain are not evaluated and the effective dose is an upper bound; the
    // charts say so as the text report does.
    REQUIRE(crew.not_evaluated.count("heart") == 1);
    REQUIRE(crew.estimated.count("effective") == 1);
    CHECK(doc.find("Not evaluated for this crew member, so not drawn: brain, heart") !=
          std::string::npos);
    // (The career chart draws the effective dose: in free space its upper bound is thousands
    // of mSv against 600, the highest share of the career limits; lens and skin have 4000 and
    // 6000 mGy-Eq.)
    REQUIRE(career_organ == "effective");
    CHECK(doc.find("The effective dose is an upper bound where the quick body model stands "
                   "(free, free-too).") != std::string::npos);
}

TEST_CASE("check chart: a dose not computed in the ledger is drawn as not computed, never "
          "within",
          "[svg][check]") {
    HandCheck hand;
    auto& crew = hand.ledger.crew.at(0);
    // Every piece of every organ from the EVA on is not a number: the curves must stop there.
    for (auto& [key, pieces] : hand.ledger.pieces) {
        for (auto& p : pieces) {
            if (p.activity.find("eva") != std::string::npos) {
                p.dose.rbe_weighted_GyEq = kNaN;
            }
        }
    }
    for (auto& c : crew.checks) {
        c.dose = kNaN;
        c.exceeded = true;
    }
    for (auto& o : crew.organs) {
        o.career_mGyEq = kNaN;
        o.max_30d.dose_mGyEq = kNaN;
    }
    const std::string doc = format_check_chart(hand.study, hand.ledger);
    const auto charts = svg_check::charts(svg_check::parse(doc));
    REQUIRE(charts.size() == 2);
    for (const auto& chart : charts) {
        CHECK(std::find(chart.texts.begin(), chart.texts.end(), "not computed") !=
              chart.texts.end());
        REQUIRE(chart.paths.size() == 1);
        // By construction of the fixture the EVA starts on day 9 + 5/24 (2032-01-10T05:00:00Z);
        // no point from it on is drawn.
        const double eva_day = 9.0 + 5.0 / 24.0;
        for (const auto& stretch : svg_check::path_points(chart.paths.begin()->second)) {
            for (const auto& point : stretch) {
                CHECK(chart.x.value_at(point.first) < eva_day - 1e-3);
            }
        }
    }
    // The heading never calls a dose that was not computed within a limit.
    CHECK(doc.find("within") == std::string::npos);
    CHECK(doc.find("EXCEEDED") != std::string::npos);
    CHECK(doc.find("(the ledger&apos;s): not computed.") != std::string::npos);
}

TEST_CASE("shelter chart: a curve per material through the sizing's table, the target, the "
          "answers",
          "[svg][shelter]") {
    // A sizing result written by hand (no physics: the chart only reads it) at a location of
    // the hand fixture. By construction: the BFO target 40 mGy-Eq, the crew's other 30-day BFO
    // dose 10; water's table 50, 30 and 20 mGy-Eq of event dose at 0, 5 and 10 g/cm2 with its
    // answer at 7.5; polyethylene's table with a point not computed at 5 g/cm2.
    const Study study(parse_scenario(read_fixture("ledger-hand.toml"), "hand.toml"));
    ShelterReport rep;
    rep.request.event_id = "spe";
    rep.request.location_id = "free";
    rep.target_mGyEq = {{"bfo", 40.0}, {"lens", 1000.0}};
    rep.other_30d_mGyEq = {{"bfo", 10.0}, {"lens", 12.0}};
    ShelterAnswer water;
    water.material = "water";
    water.achievable = true;
    water.areal_density_g_cm2 = 7.5;
    water.thickness_cm = 7.5;
    water.binding_organ = "bfo";
    for (const auto& [g, d] : {std::pair{0.0, 50.0}, {5.0, 30.0}, {10.0, 20.0}}) {
        water.curve.push_back({g, {{"bfo", d}, {"lens", 2 * d}}});
    }
    ShelterAnswer poly = water;
    poly.material = "polyethylene";
    poly.areal_density_g_cm2 = 7.0;
    poly.curve[1].event_mGyEq["bfo"] = kNaN;
    rep.answers = {water, poly};

    const std::string doc = format_shelter_chart(study, rep);
    CHECK(format_shelter_chart(study, rep) == doc); // deterministic
    const auto charts = svg_check::charts(svg_check::parse(doc));
    // One chart: the BFO's, whose target sets both answers; the lens sets none.
    REQUIRE(charts.size() == 1);
    const auto& c = charts[0];
    CHECK(std::find(c.texts.begin(), c.texts.end(), "target 40.0 mGy-Eq") != c.texts.end());
    CHECK(doc.find(">crew&apos;s other 30-day dose 10.0 mGy-Eq (in every point)</text>") !=
          std::string::npos);
    CHECK(std::find(c.texts.begin(), c.texts.end(), "water: 7.50 g/cm2") != c.texts.end());
    CHECK(std::find(c.texts.begin(), c.texts.end(), "polyethylene: 7.00 g/cm2") != c.texts.end());
    CHECK(doc.find("Cautions: crewdose is a planning tool.") != std::string::npos);
    // Each point is the event's dose plus the other 30-day dose (by construction: 30 + 10 at
    // 5 g/cm2), where the axes' ticks put it.
    const auto water_points = svg_check::path_points(c.paths.at("water"));
    REQUIRE(water_points.size() == 1);
    REQUIRE(water_points[0].size() == 3);
    const double tol_y = 2 * 0.01 * c.y.per_pixel();
    const double tol_x = 2 * 0.01 * c.x.per_pixel();
    CHECK(c.x.value_at(water_points[0][1].first) == Approx(5.0).margin(tol_x));
    CHECK(c.y.value_at(water_points[0][1].second) == Approx(40.0).margin(tol_y));
    CHECK(c.y.value_at(water_points[0][2].second) == Approx(30.0).margin(tol_y));
    // The point not computed is not drawn: the polyethylene line breaks into two lone points,
    // and the stretch says "not computed".
    const auto poly_points = svg_check::path_points(c.paths.at("polyethylene"));
    REQUIRE(poly_points.size() == 2);
    CHECK(poly_points[0].size() == 1);
    CHECK(poly_points[1].size() == 1);
    CHECK(c.x.value_at(poly_points[1][0].first) == Approx(10.0).margin(tol_x));
    CHECK(std::find(c.texts.begin(), c.texts.end(), "not computed") != c.texts.end());
}
