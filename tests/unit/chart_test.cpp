// The charts of check, shelter and storm (--chart): a panel per crew member, the limit lines and
// the cautions, every curve from the ledger's, the sizing's or the sweep's own numbers, and a dose
// that was not computed drawn as such, never as a value and never within a limit.
#include "fixture.hpp"
#include "svg_check.hpp"

#include "planner/analyses/shelter.hpp"
#include "planner/report/check_chart.hpp"
#include "planner/report/number_format.hpp"
#include "planner/report/shelter_chart.hpp"
#include "planner/report/storm_chart.hpp"
#include "planner/report/storm_report.hpp"
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

namespace {

planner::Time at(const std::string& rfc3339) {
    return parse_command_time(rfc3339, "test");
}

// A storm sweep written by hand (no physics: the chart only reads it) over the hand fixture.
// By construction: t0 from 2032-01-01T00:00:00Z to 2032-01-03T00:00:00Z every 6 hours; eight
// 6-hour profile bins with the shares `ratios`; an EVA from 08:00 to 12:00 on day 0 that is a
// go (50 %) and one from 19:00 to 23:00 that is a no-go (130 %, worst at 20:00); crew member a's
// worst onset at 20:00, its BFO at (100 + 30) / 100 = 130 % of the limit.
StormSweep hand_sweep(const std::vector<double>& ratios) {
    StormSweep s;
    s.event_id = "spe";
    s.step = boost::posix_time::hours(6);
    s.from = at("2032-01-01T00:00:00Z");
    s.to = at("2032-01-03T00:00:00Z");
    s.onsets = 9;
    for (std::size_t k = 0; k < ratios.size(); ++k) {
        s.profile.emplace_back(s.from + boost::posix_time::hours(6 * static_cast<long>(k)),
                               ratios[k]);
    }
    StormSweep::Eva go;
    go.label = "eva at free-too (line 1)";
    go.start = at("2032-01-01T08:00:00Z");
    go.end = at("2032-01-01T12:00:00Z");
    go.worst_onset = go.start;
    go.crew = "a";
    go.organ = "bfo";
    go.ratio = 0.5;
    StormSweep::Eva no_go = go;
    no_go.label = "eva at free-too (line 2)";
    no_go.start = at("2032-01-01T19:00:00Z");
    no_go.end = at("2032-01-01T23:00:00Z");
    no_go.worst_onset = at("2032-01-01T20:00:00Z");
    no_go.ratio = 1.3;
    s.evas = {go, no_go};
    StormCrew crew;
    crew.crew = "a";
    crew.name = "Ada";
    crew.organs = {{"bfo", 150.0, 100.0, 30.0, 100.0}, {"lens", 150.0, 100.0, 30.0, 1000.0}};
    s.worst.emplace_back(at("2032-01-01T20:00:00Z"), crew);
    return s;
}

// The chart's rects of one class (band: in the plot; lane: the rows under it) with the band
// kind their fill names, as (x0, x1, kind) in pixels.
struct Rect {
    double x0 = 0.0;
    double x1 = 0.0;
    std::size_t kind = 0;
};
std::vector<Rect> rects(const std::vector<svg_check::Element>& elements, const std::string& cls) {
    std::vector<Rect> out;
    for (const auto& e : elements) {
        if (e.name != "rect" || !e.attributes.count("class") || e.attributes.at("class") != cls) {
            continue;
        }
        const std::string fill = e.attributes.at("fill");
        const std::string prefix = "url(#crewdose-storm-band-";
        REQUIRE(fill.rfind(prefix, 0) == 0);
        const double x = std::stod(e.attributes.at("x"));
        out.push_back({x, x + std::stod(e.attributes.at("width")),
                       static_cast<std::size_t>(std::stoul(fill.substr(prefix.size())))});
    }
    return out;
}

std::size_t kind(StormBand b) {
    return static_cast<std::size_t>(b);
}

} // namespace

TEST_CASE("storm chart: a step per profile bin at the sweep's share, the limit, the EVAs, the "
          "no-go onsets, the worst onset",
          "[svg][storm]") {
    const Study study(parse_scenario(read_fixture("ledger-hand.toml"), "hand.toml"));
    const StormContext ctx(study, "spe", false);
    const std::vector<double> ratios{0.2, 0.5, 0.95, 1.3, 0.8, 0.6, 0.4, 0.1};
    const StormSweep s = hand_sweep(ratios);
    const std::string doc = format_storm_chart(ctx, s);
    CHECK(format_storm_chart(ctx, s) == doc); // deterministic
    const auto elements = svg_check::parse(doc);
    const auto charts = svg_check::charts(elements);
    REQUIRE(charts.size() == 1);
    const auto& c = charts[0];
    // The cautions, visible: the lines of the boxed note, read in order, say them whole.
    std::string note;
    for (const auto& e : elements) {
        if (e.name == "text" && e.attributes.count("class") && e.attributes.at("class") == "note") {
            note += (note.empty() ? "" : " ") + e.text;
        }
    }
    CHECK(note.find("Cautions: crewdose is a planning tool. Any limit it shows is a planning "
                    "value; the limits that apply to a crew come from the responsible agency. "
                    "These results support, and never replace, review by licensed "
                    "radiation-protection staff.") != std::string::npos);
    CHECK(doc.find("A 30-DAY PLANNING LIMIT IS EXCEEDED at some onset.") != std::string::npos);
    CHECK(doc.find("day 0 = 2032-01-01T00:00:00Z") != std::string::npos);
    // The text profile: bars are 5 % a character up to 200 %; a longer one ends in '>' (a 409 %
    // share read the same as 198 % before). Here 130 % is 26 characters, no mark.
    {
        std::vector<double> high = ratios;
        high[3] = 4.09;
        const std::string text = format_storm_sweep(ctx, hand_sweep(high), OutputFormat::text);
        CHECK(text.find(" 409 % " + std::string(40, '#') + ">\n") != std::string::npos);
        const std::string plain = format_storm_sweep(ctx, s, OutputFormat::text);
        CHECK(plain.find(" 130 % " + std::string(26, '#') + "\n") != std::string::npos);
    }

    // The curve: per bin two points, at its start and its end (the next bin's start), both at
    // the bin's share; by construction: the sweep's own number, times 100, read back through
    // the chart's y ticks.
    REQUIRE(c.paths.count("highest share") == 1);
    const auto stretches = svg_check::path_points(c.paths.at("highest share"));
    REQUIRE(stretches.size() == 1);
    REQUIRE(stretches[0].size() == 2 * ratios.size());
    const double tol_x = 2 * 0.01 * c.x.per_pixel();
    const double tol_y = 2 * 0.01 * c.y.per_pixel();
    for (std::size_t k = 0; k < ratios.size(); ++k) {
        for (std::size_t end = 0; end < 2; ++end) {
            const auto& [px, py] = stretches[0][2 * k + end];
            CHECK(c.x.value_at(px) ==
                  Approx(static_cast<double>(k + end) * 0.25).margin(tol_x)); // 6 h = 0.25 d
            CHECK(c.y.value_at(py) == Approx(100.0 * ratios[k]).margin(tol_y));
        }
    }

    // The limit line at 100 %, labelled; no "near" line (the storm report has no such notion).
    std::size_t levels = 0;
    for (const auto& e : elements) {
        if (e.name == "line" && e.attributes.count("class") &&
            e.attributes.at("class") == "level") {
            CHECK(c.y.value_at(std::stod(e.attributes.at("y1"))) == Approx(100.0).margin(tol_y));
            ++levels;
        }
    }
    CHECK(levels == 1);
    CHECK(std::find(c.texts.begin(), c.texts.end(), "30-day planning limit (100 %)") !=
          c.texts.end());

    // The bands in the plot: the go EVA (08:00-12:00), the no-go EVA (19:00-23:00) and the one
    // bin at or above 100 % (18:00-24:00, 130 %), each in its kind's hatching.
    const auto bands = rects(elements, "band");
    REQUIRE(bands.size() == 3);
    const auto expect_band = [&](const Rect& r, double from_h, double to_h, StormBand k) {
        CHECK(r.kind == kind(k));
        CHECK(c.x.value_at(r.x0) == Approx(from_h / 24.0).margin(tol_x));
        CHECK(c.x.value_at(r.x1) == Approx(to_h / 24.0).margin(tol_x));
    };
    expect_band(bands[0], 8.0, 12.0, StormBand::eva_go);
    expect_band(bands[1], 19.0, 23.0, StormBand::eva_no_go);
    expect_band(bands[2], 18.0, 24.0, StormBand::no_go);
    // Each kind has its labelled row under the plot, so that no-go reads without colour.
    CHECK(rects(elements, "lane").size() == 3);
    for (const char* row : {"EVA/drive: go", "EVA/drive: NO-GO", "t0: NO-GO"}) {
        CHECK(std::find(c.texts.begin(), c.texts.end(), row) != c.texts.end());
    }
    CHECK(doc.find("NO-GO: onsets from 2032-01-01T18:00:00Z to 2032-01-02T00:00:00Z") !=
          std::string::npos);
    CHECK(doc.find("NO-GO: eva at free-too (line 2)") != std::string::npos);
    CHECK(doc.find("NO-GO: eva at free-too (line 1)") == std::string::npos);

    // The worst onset: a marker at 20:00 on day 0, labelled with its time and share.
    std::size_t markers = 0;
    for (const auto& e : elements) {
        if (e.name == "line" && e.attributes.count("class") &&
            e.attributes.at("class") == "marker") {
            CHECK(c.x.value_at(std::stod(e.attributes.at("x1"))) ==
                  Approx(20.0 / 24.0).margin(tol_x));
            ++markers;
        }
    }
    CHECK(markers == 1);
    CHECK(std::find(c.texts.begin(), c.texts.end(),
                    "worst t0 2032-01-01T20:00:00Z: 130 % (a, BFO)") != c.texts.end());
}

TEST_CASE("storm chart: a share not computed is never drawn and never within", "[svg][storm]") {
    const Study study(parse_scenario(read_fixture("ledger-hand.toml"), "hand.toml"));
    const StormContext ctx(study, "spe", false);
    // Bins 2, 4 and 6 not computed (not a number, infinite, negative); every computed one
    // below the limit, and the crew's worst what-if computed and within: only the bins that
    // were not computed can keep the chart from "met".
    const std::vector<double> ratios{0.2, 0.5, kNaN, 0.3, kInf, 0.6, -0.2, 0.1};
    StormSweep s = hand_sweep(ratios);
    s.evas.resize(1); // the go EVA only
    s.worst.front().second.organs = {{"bfo", 10.0, 10.0, 30.0, 100.0}};
    REQUIRE(!s.any_exceeded());
    const std::string doc = format_storm_chart(ctx, s);
    const auto elements = svg_check::parse(doc);
    const auto charts = svg_check::charts(elements);
    REQUIRE(charts.size() == 1);
    const auto& c = charts[0];
    CHECK(doc.find("is met") == std::string::npos);
    CHECK(doc.find("SOME ONSETS WERE NOT COMPUTED") != std::string::npos);
    CHECK(std::find(c.texts.begin(), c.texts.end(), "not computed") != c.texts.end());
    // The line breaks at each bin not computed: bins 0-1, 3, 5 and 7 are drawn, no point lies
    // inside a bin that was not computed.
    const auto stretches = svg_check::path_points(c.paths.at("highest share"));
    REQUIRE(stretches.size() == 4);
    CHECK(stretches[0].size() == 4);
    const double tol_x = 2 * 0.01 * c.x.per_pixel();
    for (const auto& stretch : stretches) {
        for (const auto& [px, py] : stretch) {
            const double day = c.x.value_at(px);
            for (const double bin_start : {0.5, 1.0, 1.5}) { // bins 2, 4 and 6, in days
                CHECK(!(day > bin_start + tol_x && day < bin_start + 0.25 - tol_x));
            }
        }
    }
    // Each bin not computed is hatched as no-go (never read as within), and named so.
    const auto bands = rects(elements, "band");
    std::vector<Rect> no_go;
    for (const auto& r : bands) {
        if (r.kind == kind(StormBand::no_go)) {
            no_go.push_back(r);
        }
    }
    REQUIRE(no_go.size() == 3);
    for (std::size_t j = 0; j < 3; ++j) {
        const double bin_start = 0.25 * static_cast<double>(2 + 2 * j);
        CHECK(c.x.value_at(no_go[j].x0) == Approx(bin_start).margin(tol_x));
        CHECK(c.x.value_at(no_go[j].x1) == Approx(bin_start + 0.25).margin(tol_x));
    }
    CHECK(doc.find("NO-GO: onsets from 2032-01-01T12:00:00Z to 2032-01-01T18:00:00Z") !=
          std::string::npos);
    // A worst what-if that is not a number: its marker says "not computed", never a share.
    s.worst.front().second.organs = {{"bfo", kNaN, kNaN, 30.0, 100.0}};
    const std::string nan_doc = format_storm_chart(ctx, s);
    CHECK(nan_doc.find("worst t0 2032-01-01T20:00:00Z: not computed (a, BFO)") !=
          std::string::npos);
    CHECK(nan_doc.find("A 30-DAY PLANNING LIMIT IS EXCEEDED") != std::string::npos);
}
