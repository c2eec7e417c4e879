// The design-curve charts of gcr and depth (--chart): a curve per quantity of the report, its
// points at the rows' own numbers in the report's units, the axes with their units, the legend,
// the run's conditions and the cautions, and a dose that was not computed drawn as a gap
// labelled so, never as a point. The rows are written by hand: the charts only read them.
#include "svg_check.hpp"

#include "planner/report/depth_chart.hpp"
#include "planner/report/gcr_chart.hpp"
#include "planner/report/gcr_report.hpp"
#include "planner/scenario/spectrum_spec.hpp"

#include "exposure/material_library.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <limits>
#include <set>

using namespace crewdose;
using namespace crewdose::planner;

namespace {

const double kNaN = std::numeric_limits<double>::quiet_NaN();
const double kInf = std::numeric_limits<double>::infinity();

const exposure::Material& material(const char* id) {
    const exposure::Material* m = exposure::find_builtin_material(id);
    REQUIRE(m != nullptr);
    return *m;
}

const TissueDepth kBfo{5.0, "BFO (5 cm of tissue)"};

// The texts of one class, in document order.
std::vector<std::string> texts_of(const std::vector<svg_check::Element>& elements,
                                  const std::string& cls) {
    std::vector<std::string> out;
    for (const auto& e : elements) {
        if (e.name == "text" && e.attributes.count("class") && e.attributes.at("class") == cls) {
            out.push_back(e.text);
        }
    }
    return out;
}

// The lines of one class read in order as one text, each run of spaces (a wrapped line's
// indent) as one space.
std::string joined(const std::vector<svg_check::Element>& elements, const std::string& cls) {
    std::string text;
    for (const auto& line : texts_of(elements, cls)) {
        for (const char c : " " + line) {
            if (c != ' ' || (!text.empty() && text.back() != ' ')) {
                text += c;
            }
        }
    }
    return text;
}

bool has(const std::vector<std::string>& texts, const std::string& s) {
    return std::find(texts.begin(), texts.end(), s) != texts.end();
}

std::set<std::string> labels(const svg_check::Chart& c) {
    std::set<std::string> out;
    for (const auto& [label, d] : c.paths) {
        out.insert(label);
    }
    return out;
}

// The dash pattern of each series path of the document, per chart in order ("" for solid).
std::vector<std::vector<std::string>> dashes(const std::vector<svg_check::Element>& elements) {
    std::vector<std::vector<std::string>> out;
    for (const auto& e : elements) {
        const auto cls = e.attributes.find("class");
        if (cls == e.attributes.end()) {
            continue;
        }
        if (e.name == "g" && cls->second == "chart") {
            out.emplace_back();
        } else if (e.name == "path" && cls->second == "series") {
            REQUIRE(!out.empty());
            const auto d = e.attributes.find("stroke-dasharray");
            out.back().push_back(d == e.attributes.end() ? "" : d->second);
        }
    }
    return out;
}

// A curve's points read back through the chart's ticks, as (x, y) in the axes' units.
std::vector<std::vector<std::pair<double, double>>> values(const svg_check::Chart& c,
                                                           const std::string& label) {
    REQUIRE(c.paths.count(label) == 1);
    auto stretches = svg_check::path_points(c.paths.at(label));
    for (auto& stretch : stretches) {
        for (auto& [x, y] : stretch) {
            x = c.x.value_at(x);
            y = c.y.value_at(y);
        }
    }
    return stretches;
}

// Rows of a gcr run written by hand, deliberately out of order of thickness (20, 0, 5 g/cm2,
// as --depths 20,0,5 gives them). Per day, in Gy and Sv: the whole field's dose equivalent
// 1.5, 1.3 and 1.1 mSv at 0, 5, 20 g/cm2; without reactions 1.6, 1.45, 1.3; the primaries
// 1.2, 1.0, 0.7; absorbed 0.5, 0.48, 0.45 mGy; RBE-weighted 0.8, 0.75, 0.7 mGy-Eq.
std::vector<GcrDepthRow> hand_gcr_rows() {
    const auto row = [](double g, double a, double h, double rbe, double h_none, double h_prim) {
        GcrDepthRow r;
        r.shield_g_cm2 = g;
        r.per_day = {1e-3 * a, 1e-3 * h, 1e-3 * rbe};
        r.per_day_without_reactions = {1e-3 * a, 1e-3 * h_none, 1e-3 * rbe};
        r.per_day_primaries = {1e-3 * a, 1e-3 * h_prim, 1e-3 * rbe};
        return r;
    };
    return {row(20.0, 0.45, 1.1, 0.7, 1.3, 0.7), row(0.0, 0.5, 1.5, 0.8, 1.6, 1.2),
            row(5.0, 0.48, 1.3, 0.75, 1.45, 1.0)};
}

std::string gcr_doc(const std::vector<GcrDepthRow>& rows, bool per_year = false) {
    return format_gcr_chart(400.0, material("polyethylene"), kBfo, rows, per_year, GcrSiteSpec{},
                            material("soft-tissue"));
}

} // namespace

TEST_CASE("gcr chart: a curve per quantity at the rows' numbers, the axes with units, the "
          "legend, the conditions and the cautions",
          "[svg][gcr]") {
    const auto rows = hand_gcr_rows();
    const std::string doc = gcr_doc(rows);
    CHECK(gcr_doc(rows) == doc); // deterministic
    const auto elements = svg_check::parse(doc);
    const auto charts = svg_check::charts(elements);
    REQUIRE(charts.size() == 2);
    const auto& eq = charts[0];
    const auto& ab = charts[1];

    // One curve per quantity the report prints, each named in the legend.
    CHECK(labels(eq) ==
          std::set<std::string>{"whole field", "no nuclear reaction", "primaries + fragments"});
    CHECK(labels(ab) == std::set<std::string>{"absorbed (mGy/d)", "RBE-weighted (mGy-Eq/d)"});
    const auto legend = texts_of(elements, "legend");
    CHECK(legend.size() == 5);
    for (const auto& c : charts) {
        for (const auto& label : labels(c)) {
            CHECK(has(legend, label));
        }
    }
    // The axes' titles with their units.
    const auto axes = texts_of(elements, "axis-title");
    CHECK(has(axes, "dose equivalent (mSv/d)"));
    CHECK(has(axes, "dose (mGy/d or mGy-Eq/d)"));
    CHECK(std::count(axes.begin(), axes.end(), "shield areal density (g/cm2 of polyethylene)") ==
          2);
    // Told apart without colour: each curve of a chart has its own dash pattern.
    for (const auto& chart_dashes : dashes(elements)) {
        CHECK(std::set<std::string>(chart_dashes.begin(), chart_dashes.end()).size() ==
              chart_dashes.size());
    }
    // The run's conditions and the cautions.
    const std::string conditions = joined(elements, "subtitle");
    for (const char* part : {"phi = 400 MV", "shield polyethylene", "BFO (5 cm of tissue)",
                             "scored in soft-tissue", "in deep space", "Rates per day."}) {
        INFO(part);
        CHECK(conditions.find(part) != std::string::npos);
    }
    CHECK(joined(elements, "note")
              .find("Cautions: crewdose is a planning tool. Any limit it shows is a planning "
                    "value; the "
                    "limits that apply to a crew come from the responsible agency. These results "
                    "support, and never replace, review by licensed radiation-protection staff.") !=
          std::string::npos);

    // The points: in order of thickness, each the row's own number in mSv (mGy, mGy-Eq) per
    // day, read back through the ticks (by construction of the rows above).
    const double tol_x = 2 * 0.01 * eq.x.per_pixel();
    const auto expect = [&](const svg_check::Chart& c, const std::string& label,
                            const std::vector<double>& want) {
        INFO(label);
        const auto stretches = values(c, label);
        REQUIRE(stretches.size() == 1);
        REQUIRE(stretches[0].size() == 3);
        const double tol_y = 2 * 0.01 * c.y.per_pixel();
        const double xs[] = {0.0, 5.0, 20.0};
        for (std::size_t k = 0; k < 3; ++k) {
            CHECK(stretches[0][k].first == Approx(xs[k]).margin(tol_x));
            CHECK(stretches[0][k].second == Approx(want[k]).margin(tol_y));
        }
    };
    expect(eq, "whole field", {1.5, 1.3, 1.1});
    expect(eq, "no nuclear reaction", {1.6, 1.45, 1.3});
    expect(eq, "primaries + fragments", {1.2, 1.0, 0.7});
    expect(ab, "absorbed (mGy/d)", {0.5, 0.48, 0.45});
    expect(ab, "RBE-weighted (mGy-Eq/d)", {0.8, 0.75, 0.7});
    // Every value was computed: nothing is marked otherwise.
    CHECK(!has(eq.texts, "not computed"));
    CHECK(!has(ab.texts, "not computed"));

    // Per year: the same rows times 365.25 (the report's scale), and the units say so.
    const std::string year = gcr_doc(rows, true);
    const auto year_elements = svg_check::parse(year);
    const auto year_charts = svg_check::charts(year_elements);
    REQUIRE(year_charts.size() == 2);
    CHECK(has(texts_of(year_elements, "axis-title"), "dose equivalent (mSv/yr)"));
    CHECK(labels(year_charts[1]) ==
          std::set<std::string>{"absorbed (mGy/yr)", "RBE-weighted (mGy-Eq/yr)"});
    const auto whole_year = values(year_charts[0], "whole field");
    REQUIRE(whole_year.size() == 1);
    REQUIRE(whole_year[0].size() == 3);
    CHECK(whole_year[0][0].second ==
          Approx(kDaysPerYear * 1.5).margin(2 * 0.01 * year_charts[0].y.per_pixel()));
    CHECK(joined(year_elements, "subtitle").find("Rates per year of 365.25 days.") !=
          std::string::npos);
}

TEST_CASE("gcr chart: a dose that was not computed is a gap labelled so, never a point",
          "[svg][gcr]") {
    auto rows = hand_gcr_rows();
    // Row 2 is at 5 g/cm2, row 0 at 20 g/cm2 (by construction of hand_gcr_rows()).
    rows[2].per_day.dose_equivalent_Sv = kNaN;
    rows[0].per_day_without_reactions.dose_equivalent_Sv = kInf;
    rows[2].per_day.absorbed_Gy = -1e-3;
    const std::string doc = gcr_doc(rows);
    const auto elements = svg_check::parse(doc);
    const auto charts = svg_check::charts(elements);
    REQUIRE(charts.size() == 2);
    const auto& eq = charts[0];
    const auto& ab = charts[1];
    const double tol_x = 2 * 0.01 * eq.x.per_pixel();
    // The whole field breaks at 5 g/cm2: two lone points, at 0 and 20.
    const auto whole = values(eq, "whole field");
    REQUIRE(whole.size() == 2);
    REQUIRE(whole[0].size() == 1);
    REQUIRE(whole[1].size() == 1);
    CHECK(whole[0][0].first == Approx(0.0).margin(tol_x));
    CHECK(whole[1][0].first == Approx(20.0).margin(tol_x));
    // Without reactions: the infinite value at 20 g/cm2 is left off the end.
    const auto none = values(eq, "no nuclear reaction");
    REQUIRE(none.size() == 1);
    CHECK(none[0].size() == 2);
    CHECK(none[0].back().first == Approx(5.0).margin(tol_x));
    // A negative absorbed dose is not a dose: the same gap in the second chart.
    const auto absorbed = values(ab, "absorbed (mGy/d)");
    REQUIRE(absorbed.size() == 2);
    for (const auto& stretch : absorbed) {
        for (const auto& [x, y] : stretch) {
            CHECK(std::abs(x - 5.0) > tol_x);
            CHECK(y >= 0.0);
        }
    }
    // The curves that were computed are whole.
    CHECK(values(eq, "primaries + fragments").size() == 1);
    CHECK(values(ab, "RBE-weighted (mGy-Eq/d)").size() == 1);
    // Each gap is outlined, labelled "not computed" and named in a note.
    CHECK(has(eq.texts, "not computed"));
    CHECK(has(ab.texts, "not computed"));
    std::size_t outlines = 0;
    for (const auto& e : elements) {
        if (e.name == "rect" && e.attributes.count("class") &&
            e.attributes.at("class") == "not-computed") {
            ++outlines;
        }
    }
    CHECK(outlines == 3);
    CHECK(doc.find("whole field: 1 of 3 values not computed") != std::string::npos);
    CHECK(doc.find("no nuclear reaction: 1 of 3 values not computed") != std::string::npos);
    CHECK(doc.find("absorbed (mGy/d): 1 of 3 values not computed") != std::string::npos);
    // No tick or point was made from a value that is not a number.
    for (const auto& c : charts) {
        for (const auto& [px, v] : c.y.ticks) {
            CHECK(std::isfinite(v));
        }
    }
}

namespace {

// Rows of a depth run written by hand, out of order of thickness (10, 1 g/cm2). In Gy (Sv,
// Gy-Eq): at 1 g/cm2 the whole field is higher than the primaries without reactions, at 10
// the other way round, so that "for limits" follows each in turn (by construction of
// BracketedDose::for_limits, the higher of the two).
std::vector<DepthRow> hand_depth_rows() {
    DepthRow thin;
    thin.shield_g_cm2 = 1.0;
    thin.dose.with_removal = {0.200, 0.300, 0.250};
    thin.dose.without_removal = {0.190, 0.280, 0.240};
    thin.primaries = {0.180, 0.270, 0.230};
    DepthRow thick;
    thick.shield_g_cm2 = 10.0;
    thick.dose.with_removal = {0.040, 0.060, 0.050};
    thick.dose.without_removal = {0.045, 0.070, 0.055};
    thick.primaries = {0.030, 0.050, 0.040};
    return {thick, thin};
}

const char* kBand = "band:J0=1e10,gamma_a=1.1,gamma_b=3.5,R0_GV=0.25";

std::string depth_doc(const std::vector<DepthRow>& rows) {
    return format_depth_chart(parse_spectrum(kBand, "test"), material("aluminium"), kBfo, rows,
                              material("soft-tissue"));
}

} // namespace

TEST_CASE("depth chart: the report's doses as curves, the axes with units, the legend, the "
          "spectrum and the cautions",
          "[svg][depth]") {
    const auto rows = hand_depth_rows();
    const std::string doc = depth_doc(rows);
    CHECK(depth_doc(rows) == doc); // deterministic
    const auto elements = svg_check::parse(doc);
    const auto charts = svg_check::charts(elements);
    REQUIRE(charts.size() == 2);
    const auto& ab = charts[0];
    const auto& weighted = charts[1];
    CHECK(labels(ab) == std::set<std::string>{"for limits", "whole field", "primaries only"});
    CHECK(labels(weighted) ==
          std::set<std::string>{"dose equivalent (mSv)", "RBE-weighted (mGy-Eq)"});
    const auto legend = texts_of(elements, "legend");
    CHECK(legend.size() == 5);
    for (const auto& c : charts) {
        for (const auto& label : labels(c)) {
            CHECK(has(legend, label));
        }
    }
    const auto axes = texts_of(elements, "axis-title");
    CHECK(has(axes, "absorbed dose (mGy)"));
    CHECK(has(axes, "dose (mSv or mGy-Eq)"));
    CHECK(std::count(axes.begin(), axes.end(), "shield areal density (g/cm2 of aluminium)") == 2);
    for (const auto& chart_dashes : dashes(elements)) {
        CHECK(std::set<std::string>(chart_dashes.begin(), chart_dashes.end()).size() ==
              chart_dashes.size());
    }
    const std::string conditions = joined(elements, "subtitle");
    for (const std::string& part :
         {std::string("shield aluminium"), std::string("BFO (5 cm of tissue)"),
          std::string("scored in soft-tissue")}) {
        INFO(part);
        CHECK(conditions.find(part) != std::string::npos);
    }
    // The spectrum is named as the report names it (as XML: "J(>10 MeV)" is "J(&gt;10 MeV)").
    CHECK(conditions.find(
              svg::xml_escape("spectrum: " + describe_spectrum(parse_spectrum(kBand, "test")))) !=
          std::string::npos);
    CHECK(joined(elements, "note")
              .find("These results support, and never replace, review by "
                    "licensed radiation-protection staff.") != std::string::npos);
    CHECK(has(ab.texts, "Linear scale: the doses behind the thickest shields lie close to zero "
                        "here; read them in the text report."));

    // The points, in order of thickness, in mGy (mSv, mGy-Eq): by construction of the rows.
    const auto expect = [&](const svg_check::Chart& c, const std::string& label, double at_1,
                            double at_10) {
        INFO(label);
        const auto stretches = values(c, label);
        REQUIRE(stretches.size() == 1);
        REQUIRE(stretches[0].size() == 2);
        const double tol_x = 2 * 0.01 * c.x.per_pixel();
        const double tol_y = 2 * 0.01 * c.y.per_pixel();
        CHECK(stretches[0][0].first == Approx(1.0).margin(tol_x));
        CHECK(stretches[0][1].first == Approx(10.0).margin(tol_x));
        CHECK(stretches[0][0].second == Approx(at_1).margin(tol_y));
        CHECK(stretches[0][1].second == Approx(at_10).margin(tol_y));
    };
    expect(ab, "for limits", 200.0, 45.0);
    expect(ab, "whole field", 200.0, 40.0);
    expect(ab, "primaries only", 180.0, 30.0);
    expect(weighted, "dose equivalent (mSv)", 300.0, 70.0);
    expect(weighted, "RBE-weighted (mGy-Eq)", 250.0, 55.0);
    CHECK(!has(ab.texts, "not computed"));
    CHECK(!has(weighted.texts, "not computed"));
}

TEST_CASE("depth chart: a dose that was not computed is a gap labelled so, never a point",
          "[svg][depth]") {
    auto rows = hand_depth_rows();
    DepthRow middle = rows[1];
    middle.shield_g_cm2 = 5.0;
    middle.primaries.absorbed_Gy = kNaN;
    middle.dose.with_removal.absorbed_Gy = kInf; // and so the value for limits too
    rows.push_back(middle);
    const std::string doc = depth_doc(rows);
    const auto elements = svg_check::parse(doc);
    const auto charts = svg_check::charts(elements);
    REQUIRE(charts.size() == 2);
    const auto& ab = charts[0];
    const double tol_x = 2 * 0.01 * ab.x.per_pixel();
    for (const char* label : {"for limits", "whole field", "primaries only"}) {
        INFO(label);
        const auto stretches = values(ab, label);
        REQUIRE(stretches.size() == 2);
        for (const auto& stretch : stretches) {
            REQUIRE(stretch.size() == 1);
            CHECK(std::abs(stretch[0].first - 5.0) > tol_x);
        }
    }
    CHECK(has(ab.texts, "not computed"));
    CHECK(doc.find("primaries only: 1 of 3 values not computed") != std::string::npos);
    // The gap's outline spans the thickness that was not computed.
    std::size_t outlines = 0;
    for (const auto& e : elements) {
        if (e.name == "rect" && e.attributes.count("class") &&
            e.attributes.at("class") == "not-computed") {
            const double x0 = ab.x.value_at(std::stod(e.attributes.at("x")));
            const double x1 = ab.x.value_at(std::stod(e.attributes.at("x")) +
                                            std::stod(e.attributes.at("width")));
            CHECK(x0 < 5.0);
            CHECK(x1 > 5.0);
            ++outlines;
        }
    }
    CHECK(outlines == 3);
    // The second chart's doses were all computed: whole.
    CHECK(values(charts[1], "dose equivalent (mSv)").size() == 1);
    CHECK(!has(charts[1].texts, "not computed"));
}

TEST_CASE("gcr rows: the mean quality factor and the share no charged particle carries", "[gcr]") {
    // By construction: mean Q = H / D (ICRP Publication 60's definition of the mean quality
    // factor); the uncharged share is 1 minus the charge groups' shares, never below zero.
    GcrDepthRow r;
    CHECK(r.mean_quality_factor() == 0.0); // no dose: no mean Q, never a NaN
    r.per_day.absorbed_Gy = 2e-4;
    r.per_day.dose_equivalent_Sv = 8e-4;
    CHECK(r.mean_quality_factor() == Approx(4.0).epsilon(1e-15));
    r.equivalent_share = {0.3, 0.25, 0.15, 0.05, 0.05};
    CHECK(r.uncharged_equivalent_share() == Approx(0.2).epsilon(1e-12));
    r.equivalent_share = {0.6, 0.3, 0.15, 0.05, 0.05}; // rounding can sum past 1
    CHECK(r.uncharged_equivalent_share() == 0.0);
}
