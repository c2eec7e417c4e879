// The SVG writer: well-formed, deterministic, every value where its axis puts it, and a value
// that was not computed never drawn as one.
#include "svg_check.hpp"

#include "planner/report/svg_plot.hpp"

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

std::size_t count(const std::string& text, const std::string& what) {
    std::size_t n = 0;
    for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) {
        ++n;
    }
    return n;
}

svg::Figure one_chart(svg::Series s) {
    svg::Figure f;
    f.title = "test";
    f.boxed_note = "a note";
    svg::Chart c;
    c.title = "chart";
    c.x.title = "x (d)";
    c.y.title = "y (mGy-Eq)";
    c.y.from_zero = true;
    c.series.push_back(std::move(s));
    c.levels.push_back({40.0, "limit 40 mGy-Eq"});
    f.panels.push_back({"panel", {c}});
    return f;
}

} // namespace

TEST_CASE("svg: ticks at round values that cover the range", "[svg]") {
    // By construction of the 1-2-5 rule: 243 / 6 ticks = 40.5 rounds up to a step of 50, and the
    // axis widens to the ticks around 0 and 243.
    const auto t = svg::choose_ticks(0.0, 243.0, false, 6);
    CHECK(t.step == 50.0);
    CHECK(t.lo == 0.0);
    CHECK(t.hi == 250.0);
    CHECK(t.values == std::vector<double>{0, 50, 100, 150, 200, 250});
    CHECK(t.decimals == 0);
    // An exact axis keeps its ends; the ticks lie inside: 37.5 / 8 = 4.7 rounds up to 5.
    const auto e = svg::choose_ticks(0.0, 37.5, true, 8);
    CHECK(e.lo == 0.0);
    CHECK(e.hi == 37.5);
    CHECK(e.values == std::vector<double>{0, 5, 10, 15, 20, 25, 30, 35});
    // Small steps get the decimals that tell them apart (0.0123 / 6 = 0.00205 -> 0.005), and a
    // tick a rounding error away from zero prints as 0, never -0.
    const auto s = svg::choose_ticks(0.0, 0.0123, false, 6);
    CHECK(s.step == Approx(0.005).epsilon(1e-12));
    CHECK(s.decimals == 3);
    CHECK(svg::tick_label(0.1 + 0.2, 1) == "0.3");
    CHECK(svg::tick_label(-1e-17, 2) == "0.00");
    // A range of one value still gets an axis.
    const auto flat = svg::choose_ticks(5.0, 5.0, false, 6);
    CHECK(flat.hi > flat.lo);
}

TEST_CASE("svg: text is escaped, and the document is well-formed", "[svg]") {
    CHECK(svg::xml_escape("a<b & \"c\" 'd'>\x01") ==
          "a&lt;b &amp; &quot;c&quot; &apos;d&apos;&gt; ");
    svg::Series s;
    s.label = "R&D <crew> \"one\"";
    s.x = {0, 1, 2};
    s.y = {1, 2, 3};
    auto f = one_chart(s);
    f.title = "plan <A> & 'B'";
    const std::string doc = svg::render_svg(f);
    const auto elements = svg_check::parse(doc); // throws when not well-formed
    CHECK(elements.front().name == "svg");
    CHECK(doc.find("plan &lt;A&gt; &amp; &apos;B&apos;") != std::string::npos);
    CHECK(doc.find("R&amp;D &lt;crew&gt; &quot;one&quot;") != std::string::npos);
    // The checker itself refuses what is not well-formed.
    CHECK_THROWS(svg_check::parse("<svg><g></svg></g>"));
    CHECK_THROWS(svg_check::parse("<svg><text>a & b</text></svg>"));
    CHECK_THROWS(svg_check::parse("<svg a=\"1\" a=\"2\"/>"));
    CHECK_THROWS(svg_check::parse("<svg><g>"));
    // Nothing that changes from run to run: the same figure gives the same bytes.
    CHECK(svg::render_svg(f) == doc);
}

TEST_CASE("svg: a plotted point lies where the axis's tick labels put its value", "[svg]") {
    svg::Series s;
    s.label = "dose";
    s.x = {0, 10, 20, 30};
    s.y = {0.0, 3.7, 12.25, 31.4};
    const std::string doc = svg::render_svg(one_chart(s));
    const auto charts = svg_check::charts(svg_check::parse(doc));
    REQUIRE(charts.size() == 1);
    const auto stretches = svg_check::path_points(charts[0].paths.at("dose"));
    REQUIRE(stretches.size() == 1);
    REQUIRE(stretches[0].size() == 4);
    // By construction: each value as given, read back through the y ticks, to the writer's
    // rounding of coordinates (0.01 px, with a factor two for the two ends).
    const auto& axis = charts[0].y;
    for (std::size_t i = 0; i < 4; ++i) {
        CHECK(axis.value_at(stretches[0][i].second) ==
              Approx(s.y[i]).margin(2 * 0.01 * axis.per_pixel()));
    }
    // The limit line's value is part of the axis and its label is drawn.
    CHECK(doc.find("limit 40 mGy-Eq") != std::string::npos);
    CHECK(axis.ticks.back().second >= 40.0);
}

TEST_CASE("svg: a value that was not computed is never drawn as a value", "[svg]") {
    svg::Series s;
    s.label = "dose";
    s.x = {0, 1, 2, 3, 4, 5, 6};
    s.y = {0.0, 1.0, kNaN, 3.0, kInf, -1.0, 5.0};
    const std::string doc = svg::render_svg(one_chart(s));
    const auto charts = svg_check::charts(svg_check::parse(doc));
    REQUIRE(charts.size() == 1);
    const auto stretches = svg_check::path_points(charts[0].paths.at("dose"));
    // By construction: NaN, infinity and a negative dose break the line; what is left is the
    // points 0-1, 3 and 6, in three stretches, and no other point.
    REQUIRE(stretches.size() == 3);
    CHECK(stretches[0].size() == 2);
    CHECK(stretches[1].size() == 1);
    CHECK(stretches[2].size() == 1);
    const auto& axis = charts[0].y;
    const double tol = 2 * 0.01 * axis.per_pixel();
    CHECK(axis.value_at(stretches[1][0].second) == Approx(3.0).margin(tol));
    CHECK(axis.value_at(stretches[2][0].second) == Approx(5.0).margin(tol));
    // A lone point has no line, so it gets a dot, at the point itself (by construction: the
    // path's own coordinates).
    CHECK(count(doc, "<circle ") == 2);
    for (const auto& lone : {stretches[1][0], stretches[2][0]}) {
        CHECK(doc.find(fmt::format(R"(<circle cx="{:.2f}" cy="{:.2f}")", lone.first,
                                   lone.second)) != std::string::npos);
    }
    // Two stretches not computed (2, and 4-5), each labelled; the chart's note counts them.
    CHECK(count(doc, ">not computed</text>") == 2);
    CHECK(doc.find("dose: 3 of 7 values not computed") != std::string::npos);
    // Nothing at all computed: no path, the stretch labelled, the axis still drawn.
    s.y = {kNaN, kNaN, kNaN, kNaN, kNaN, kNaN, kNaN};
    const std::string none = svg::render_svg(one_chart(s));
    CHECK(svg_check::charts(svg_check::parse(none))[0].paths.empty());
    CHECK(count(none, ">not computed</text>") == 1);
}

TEST_CASE("svg: the labels at the curves' ends stay apart and above the x axis's tick labels",
          "[svg]") {
    // Three curves ending at or near zero at the axis's right end, where the x tick label
    // stands: pushed apart, their labels would fall below the plot without the push back up.
    svg::Figure f = one_chart({"a", {0, 10}, {30.0, 0.0}, false});
    auto& c = f.panels[0].charts[0];
    c.series.push_back({"b", {0, 10}, {20.0, 0.1}, false});
    c.series.push_back({"c", {0, 10}, {10.0, 0.2}, false});
    const auto elements = svg_check::parse(svg::render_svg(f));
    double plot_bottom = kNaN;
    std::vector<double> label_y;
    for (const auto& e : elements) {
        const auto cls = e.attributes.find("class");
        if (cls == e.attributes.end()) {
            continue;
        }
        if (e.name == "rect" && cls->second == "frame") {
            plot_bottom = std::stod(e.attributes.at("y")) + std::stod(e.attributes.at("height"));
        }
        if (e.name == "text" && cls->second == "series-label") {
            label_y.push_back(std::stod(e.attributes.at("y")));
        }
    }
    REQUIRE(std::isfinite(plot_bottom));
    REQUIRE(label_y.size() == 3);
    std::sort(label_y.begin(), label_y.end());
    for (std::size_t k = 0; k < 3; ++k) {
        CHECK(label_y[k] <= plot_bottom + 0.005);
        if (k > 0) {
            CHECK(label_y[k] - label_y[k - 1] >= 13.0 - 0.01);
        }
    }
}

TEST_CASE("svg: a kind of band with no stretch has no row when the chart hides empty kinds",
          "[svg]") {
    // By construction: kinds a, b, c with stretches of a and c only. Hidden empty kinds: rows
    // and legend entries for a and c alone, c keeping its own (third) pattern. Shown: all three.
    for (const bool hide : {true, false}) {
        svg::Series s;
        s.label = "s";
        s.x = {0.0, 10.0};
        s.y = {1.0, 2.0};
        auto f = one_chart(s);
        auto& c = f.panels[0].charts[0];
        c.band_kinds = {"kind-a", "kind-b", "kind-c"};
        c.bands = {{1.0, 2.0, 0}, {5.0, 6.0, 2}};
        c.hide_empty_band_kinds = hide;
        const std::string doc = svg::render_svg(f);
        CHECK(count(doc, ">kind-a</text>") == 1);
        CHECK(count(doc, ">kind-c</text>") == 1);
        CHECK(count(doc, ">kind-b</text>") == (hide ? 0U : 1U));
        CHECK(count(doc, ">shaded: kind-b</text>") == (hide ? 0U : 1U));
        CHECK(count(doc, ">shaded: kind-c</text>") == 1);
        // The stretch of kind c is filled with the third pattern in the plot and its row.
        CHECK(count(doc, "-band-2)") >= 2);
    }
}
