// The verdict first in the storm, shelter and compare reports, and their HTML pages (--html):
// well-formed, self-contained, the verdict or answer as a table with a row per crew member or
// material, the chart inline where the command has one, and a dose that was not computed never
// read as within.
#include "fixture.hpp"
#include "shelter_hut.hpp"
#include "svg_check.hpp"

#include "planner/analyses/compare.hpp"
#include "planner/analyses/shelter.hpp"
#include "planner/analyses/storm.hpp"
#include "planner/report/compare_html.hpp"
#include "planner/report/compare_report.hpp"
#include "planner/report/number_format.hpp"
#include "planner/report/shelter_html.hpp"
#include "planner/report/shelter_report.hpp"
#include "planner/report/storm_html.hpp"
#include "planner/report/storm_report.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/study/result_guard.hpp"

#include <catch2/catch.hpp>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>
#include <string>

using namespace crewdose;
using namespace crewdose::planner;

namespace {

const HtmlAbout kAbout{{"tool", "crewdose test"}, {"run at", "<now & then>"}};
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

std::size_t count(const std::string& text, const std::string& what) {
    std::size_t n = 0;
    for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) {
        ++n;
    }
    return n;
}

// The page is well-formed XML after its doctype, fetches nothing, carries the cautions and the
// run's description; returns its elements.
std::vector<svg_check::Element> check_page(const std::string& page) {
    REQUIRE(page.rfind("<!DOCTYPE html>\n", 0) == 0);
    const auto elements = svg_check::parse(page.substr(page.find('\n') + 1));
    for (const char* fetch : {"src=", "<link", "<script", "@import", "href=\"http"}) {
        INFO(fetch);
        CHECK(page.find(fetch) == std::string::npos);
    }
    for (auto at = page.find("url("); at != std::string::npos; at = page.find("url(", at + 1)) {
        CHECK(page.compare(at, 5, "url(#") == 0); // a chart's own patterns only
    }
    CHECK(page.find("planning value") != std::string::npos);
    CHECK(page.find("responsible agency") != std::string::npos);
    CHECK(page.find("licensed radiation-protection staff") != std::string::npos);
    CHECK(page.find("&lt;now &amp; then&gt;") != std::string::npos);
    return elements;
}

std::size_t svgs(const std::vector<svg_check::Element>& elements) {
    return static_cast<std::size_t>(std::count_if(elements.begin(), elements.end(),
                                                  [](const auto& e) { return e.name == "svg"; }));
}

// The text of every <td> of the verdict table's rows (the first <table> of the page), row by
// row.
std::vector<std::vector<std::string>> table_rows(const std::vector<svg_check::Element>& elements) {
    std::vector<std::vector<std::string>> rows;
    bool in_first = false;
    bool seen_table = false;
    for (const auto& e : elements) {
        if (e.name == "table") {
            if (seen_table) {
                break;
            }
            seen_table = true;
            in_first = true;
        } else if (in_first && e.name == "tr") {
            rows.emplace_back();
        } else if (in_first && e.name == "td" && !rows.empty()) {
            rows.back().push_back(e.text);
        }
    }
    return rows;
}

// Deep space: a thin cabin and a shelter, one crew member on a spacewalk on day 2 (the storm
// unit tests' fixture).
std::string storm_plan() {
    return fill(read_fixture("storm-deep-space.toml.in"),
                {{"@TIMELINE@", read_fixture("storm-timeline.toml")},
                 {"@POLICY@", read_fixture("storm-policy.toml")}});
}

bool every_line_within(const std::string& text, std::size_t width) {
    std::istringstream in(text);
    std::string line;
    while (std::getline(in, line)) {
        if (line.size() > width) {
            return false;
        }
    }
    return true;
}

} // namespace

TEST_CASE("storm: the text opens with the verdict, before the cautions", "[storm][html]") {
    const Study study(parse_scenario(storm_plan(), "storm.toml"));
    const StormContext ctx(study, "spe", true);
    const auto w = ctx.at(parse_command_time("2032-01-03T09:30:00Z", "x"));
    const std::string text = format_storm_whatif(ctx, w, OutputFormat::text);
    INFO(text.substr(0, 1200));
    const auto verdict = text.find("Verdict: ");
    REQUIRE(verdict != std::string::npos);
    CHECK(verdict < text.find("Cautions: "));
    CHECK(text.find("Cautions: ") < text.find("t0 is when the flare"));
    // Three title lines (title, scenario, blank) before it.
    CHECK(std::count(text.begin(), text.begin() + static_cast<long>(verdict), '\n') == 3);
    const VerdictTable t = storm_whatif_verdict(ctx, w, 0.9);
    REQUIRE(t.rows.size() == w.crew.size());
    CHECK(t.columns.back() == "without response");
    // The row's numbers are the what-if's: the organ with the highest share of its limit.
    const StormCrew& c = w.crew.at(0);
    const auto worst = std::max_element(
        c.organs.begin(), c.organs.end(),
        [](const StormOrgan& x, const StormOrgan& y) { return x.ratio() < y.ratio(); });
    CHECK(t.rows[0][1].text == organ_label(worst->organ));
    CHECK(t.rows[0][2].text == significant(worst->with_response_mGyEq + worst->other_30d_mGyEq, 3) +
                                   " / " + significant(worst->limit_30d_mGyEq, 3) + " mGy-Eq");
    CHECK(t.rows[0][4].text == (c.exceeded() ? "EXCEEDED" : "within"));
    CHECK(every_line_within(format_verdict_text(t), 100));
    // Near: from the share given. Just below this crew member's share: near; just above: within.
    if (!c.exceeded()) {
        const double share = c.worst_ratio();
        CHECK(storm_whatif_verdict(ctx, w, 0.99 * share).rows[0][4].text == "near");
        CHECK(storm_whatif_verdict(ctx, w, 0.99 * share).headline.find("near a limit") !=
              std::string::npos);
        CHECK(storm_whatif_verdict(ctx, w, std::min(1.0, 1.01 * share)).rows[0][4].text ==
              (1.01 * share <= 1.0 ? "within" : "near"));
    }
    // Without a response the column "without response" would repeat the dose: left out.
    const StormContext none(study, "spe", false);
    const VerdictTable tn = storm_whatif_verdict(none, none.at(w.times.onset), 0.9);
    CHECK(std::find(tn.columns.begin(), tn.columns.end(), "without response") == tn.columns.end());
    CHECK(tn.headline.find("no response") != std::string::npos);
}

TEST_CASE("storm: a dose that was not computed reads so in the verdict, never within",
          "[storm][html]") {
    const Study study(parse_scenario(storm_plan(), "storm.toml"));
    const StormContext ctx(study, "spe", true);
    auto w = ctx.at(parse_command_time("2032-01-03T09:30:00Z", "x"));
    for (const double bad : {kNaN, std::numeric_limits<double>::infinity(), -1.0}) {
        INFO(bad);
        StormWhatIf broken = w;
        broken.crew.at(0).organs.at(0).with_response_mGyEq = bad;
        const VerdictTable t = storm_whatif_verdict(ctx, broken, 0.9);
        const auto& row = t.rows.at(0);
        CHECK(row[1].text == organ_label(broken.crew[0].organs[0].organ)); // it binds
        CHECK(row[2].text.find("not computed") != std::string::npos);
        CHECK(row[4].text == "EXCEEDED");
        CHECK(row[4].status == "exceeded");
        CHECK(t.headline.find("EXCEEDED") != std::string::npos);
        const std::string html = html_verdict(t);
        const std::string first_row =
            html.substr(html.find("<tr><td>"),
                        html.find("</tr>\n", html.find("<tr><td>")) - html.find("<tr><td>"));
        CHECK(first_row.find("not computed") != std::string::npos);
        CHECK(first_row.find("within") == std::string::npos);
        // The whole page is refused, as every report is: the text report prints no NaN.
        if (std::isnan(bad)) {
            CHECK_THROWS_AS(format_storm_whatif_html(ctx, broken, 0.9, kAbout), ResultFault);
        }
    }
}

TEST_CASE("storm html: the what-if and the sweep as pages, the sweep with its chart",
          "[storm][html]") {
    const Study study(parse_scenario(storm_plan(), "storm.toml"));
    const StormContext ctx(study, "spe", true);
    const auto w = ctx.at(parse_command_time("2032-01-03T09:30:00Z", "x"));
    const std::string page = format_storm_whatif_html(ctx, w, 0.9, kAbout);
    CHECK(format_storm_whatif_html(ctx, w, 0.9, kAbout) == page); // deterministic
    const auto elements = check_page(page);
    CHECK(svgs(elements) == 0); // a what-if has no chart
    const auto rows = table_rows(elements);
    REQUIRE(rows.size() == w.crew.size() + 1); // the heading row has <th> only
    CHECK(rows.at(1).at(0) == w.crew[0].name);
    CHECK(page.find("Verdict: every evaluated 30-day planning limit is met in this what-if") <
          page.find("<pre>"));

    const Time from = parse_command_time("2032-01-03T06:00:00Z", "x");
    const auto s =
        sweep_storm(ctx, from, from + boost::posix_time::hours(12), boost::posix_time::minutes(30));
    const std::string sweep_page = format_storm_sweep_html(ctx, s, 0.9, kAbout);
    const auto se = check_page(sweep_page);
    CHECK(svgs(se) == 1);
    const auto sweep_rows = table_rows(se);
    REQUIRE(sweep_rows.size() == s.worst.size() + 1);
    // The worst onset as printed, and it reads back as --onset reads it.
    const VerdictTable t = storm_sweep_verdict(ctx, s, 0.9);
    const auto col = std::find(t.columns.begin(), t.columns.end(), "worst t0") - t.columns.begin();
    REQUIRE(static_cast<std::size_t>(col) < t.columns.size());
    const std::string onset = sweep_rows.at(1).at(static_cast<std::size_t>(col));
    CHECK(onset.rfind(format_time(s.worst.at(0).first).substr(0, 19), 0) == 0);
    CHECK(parse_command_time(onset, "--onset") == s.worst.at(0).first);
    // The verdict, then the chart, then the whole report.
    CHECK(sweep_page.find("Verdict: ") < sweep_page.find("<svg"));
    CHECK(sweep_page.find("<svg") < sweep_page.find("<pre>"));
    CHECK(format_storm_sweep(ctx, s, OutputFormat::text).find("Verdict: ") <
          format_storm_sweep(ctx, s, OutputFormat::text).find("Cautions: "));
}

namespace {

// Targets so high that the bare hut meets them.
ShelterRequest generous_request() {
    ShelterRequest r = hut_request({"water"}, 1e6);
    r.targets["lens"] = 1e6; // organs not named keep their 30-day planning limits
    r.targets["skin"] = 1e6;
    return r;
}

std::string hut() {
    return hut_plan();
}

} // namespace

TEST_CASE("shelter: the answer first, in the text, the CSV and the page", "[shelter][html]") {
    const Study study(parse_scenario(hut(), "hut.toml"));
    // A target the bare hut misses: the answer is a thickness of each material.
    const ShelterReport bare = size_shelter(study, generous_request());
    const double other = bare.other_30d_mGyEq.at("bfo");
    const double event = bare.answers.at(0).curve.at(0).event_mGyEq.at("bfo");
    ShelterRequest half = generous_request();
    half.materials = {"water", "polyethylene"};
    half.targets["bfo"] = other + 0.5 * event;
    const ShelterReport rep = size_shelter(study, half);
    REQUIRE(rep.answers.size() == 2);
    REQUIRE(rep.answers[0].achievable);
    REQUIRE_FALSE(rep.answers[0].none_needed);
    const VerdictTable t = shelter_answer(rep);
    CHECK(t.headline.rfind("Answer: add at least ", 0) == 0);
    REQUIRE(t.rows.size() == 2);
    CHECK(t.rows[0][0].text == "water");
    CHECK(t.rows[0][1].text == significant(rep.answers[0].areal_density_g_cm2, 3) + " g/cm2");
    CHECK(t.rows[0].back().text ==
          "needs " + significant(rep.answers[0].areal_density_g_cm2, 3) + " g/cm2");
    CHECK(t.rows[0].back().status == "within");

    const std::string text = format_shelter_report(study, rep, OutputFormat::text);
    CHECK(text.find("Answer: ") < text.find("Cautions: "));
    CHECK(every_line_within(format_verdict_text(t), 100));

    // The CSV: one header, an answer row per material before the curve.
    const std::string csv = format_shelter_report(study, rep, OutputFormat::csv);
    CHECK(count(csv, "material,") == 1);
    CHECK(csv.rfind("material,areal_density_g_cm2,organ,event_mGyEq,other_30d_mGyEq,"
                    "target_mGyEq,row,achievable,added_mass_kg\n",
                    0) == 0);
    CHECK(count(csv, ",answer,") == 2);
    CHECK(rep.answers[0].binding_organ == "bfo");
    CHECK(csv.find(fmt::format("water,{:.10g},bfo,", rep.answers[0].areal_density_g_cm2)) <
          csv.find(",curve,"));
    CHECK(csv.find(",answer,yes,") != std::string::npos);

    const std::string page = format_shelter_html(study, rep, kAbout);
    const auto elements = check_page(page);
    CHECK(svgs(elements) == 1);
    const auto rows = table_rows(elements);
    REQUIRE(rows.size() == 3);
    CHECK(rows[1][0] == "water");
    CHECK(rows[2][0] == "polyethylene");
    CHECK(page.find("Answer: ") < page.find("<svg"));
    CHECK(page.find("<svg") < page.find("<pre>"));

    // Out of reach, and impossible: said so, in the table and the CSV.
    ShelterRequest r = hut_request({"water"}, other + 1e-6);
    r.max_g_cm2 = 20.0;
    const VerdictTable no = shelter_answer(size_shelter(study, r));
    CHECK(no.rows[0].back().text == "NOT ACHIEVABLE within 20.0 g/cm2");
    CHECK(no.rows[0].back().status == "exceeded");
    CHECK(no.headline.find("NOT ACHIEVABLE") != std::string::npos);
    const ShelterReport low = size_shelter(study, hut_request({"water"}, 1e-3));
    const VerdictTable impossible = shelter_answer(low);
    CHECK(impossible.rows[0].back().text.rfind("IMPOSSIBLE", 0) == 0);
    CHECK(impossible.headline.find("NO SHELTER CAN MEET THE BFO TARGET") != std::string::npos);
    CHECK(format_shelter_report(study, low, OutputFormat::csv).find(",answer,impossible,") !=
          std::string::npos);
    // Met as built.
    const VerdictTable met = shelter_answer(bare);
    CHECK(met.rows[0].back().text == "met as built");
    CHECK(met.rows[0][1].text == "0 g/cm2");
}

TEST_CASE("shelter: a dose that was not computed reads so in the answer, never met",
          "[shelter][html]") {
    const Study study(parse_scenario(hut(), "hut.toml"));
    const ShelterReport bare = size_shelter(study, generous_request());
    REQUIRE(bare.answers.at(0).none_needed);
    for (const double bad : {kNaN, -1.0}) {
        INFO(bad);
        ShelterReport broken = bare;
        // Any organ's dose at the answer (here at 0 g/cm2), the binding one's or another's.
        const std::string organ = bad < 0.0 ? "bfo" : bare.answers[0].binding_organ;
        broken.answers[0].curve.at(0).event_mGyEq.at(organ) = bad;
        const VerdictTable t = shelter_answer(broken);
        CHECK((organ != bare.answers[0].binding_organ ||
               t.rows[0][3].text.find("not computed") != std::string::npos));
        CHECK(t.rows[0].back().text == "not computed");
        CHECK(t.rows[0].back().status == "exceeded");
        CHECK(t.headline.find("not computed") != std::string::npos);
        // The row (the note below the table may use the word "within" in its own sense).
        std::string html = html_verdict(t);
        html = html.substr(html.find("<tr><td>"));
        html = html.substr(0, html.find("</table>"));
        CHECK(html.find("not computed") != std::string::npos);
        CHECK(html.find("within") == std::string::npos);
        CHECK(html.find("met as built") == std::string::npos);
        // The report refuses it in every format: nothing not computed is printed as a number
        // (a dose on the curve is one the report prints).
        CHECK_THROWS_AS(format_shelter_report(study, broken, OutputFormat::csv), ResultFault);
        CHECK_THROWS_AS(format_shelter_report(study, broken, OutputFormat::text), ResultFault);
        CHECK_THROWS_AS(format_shelter_report(study, broken, OutputFormat::json), ResultFault);
    }
}

TEST_CASE("compare html: both verdicts and every compared limit, a dose not computed so",
          "[compare][html]") {
    const Study study(parse_scenario(read_fixture("ledger-hand.toml"), "hand.toml"));
    const LedgerResult a = build_ledger(study);
    LedgerResult b = a;
    b.crew.front().checks.front().dose = kNaN;
    b.crew.front().checks.front().exceeded = true;
    b.any_exceeded = true;
    const PlanComparison cmp = compare_plans(a, b, 0.9);
    const std::string page =
        format_comparison_html(cmp, study.scenario(), study.scenario(), kAbout);
    const auto elements = check_page(page);
    CHECK(svgs(elements) == 0);
    const auto rows = table_rows(elements);
    REQUIRE(rows.size() == cmp.rows.size() + 1);
    const auto& first = rows.at(1);
    REQUIRE(first.size() == 8);
    CHECK(first[3] ==
          "not computed " + std::string(cmp.rows[0].organ == "effective" ? "mSv" : "mGy-Eq"));
    CHECK(first[7] == "EXCEEDED");
    CHECK(page.find("Verdict A: ") < page.find("<pre>"));
    CHECK(page.find("Verdict B: A PLANNING LIMIT IS EXCEEDED") != std::string::npos);
}
