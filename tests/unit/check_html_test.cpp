// The check as one HTML file (--html): well-formed, self-contained, the verdict first with the
// ledger's own numbers, the chart inline, and a dose that was not computed never within.
#include "fixture.hpp"
#include "svg_check.hpp"

#include "planner/report/check_html.hpp"
#include "planner/study/ledger.hpp"
#include "planner/study/result_guard.hpp"
#include "planner/study/study.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <limits>
#include <string>

using namespace crewdose;
using namespace crewdose::planner;

namespace {

struct HandCheck {
    Study study;
    LedgerResult ledger;
    HandCheck()
        : study(parse_scenario(read_fixture("ledger-hand.toml"), "hand.toml")),
          ledger(build_ledger(study)) {}
};

const std::vector<std::pair<std::string, std::string>> kAbout{{"tool", "crewdose test"},
                                                              {"run at", "<now & then>"}};

std::size_t count(const std::string& text, const std::string& what) {
    std::size_t n = 0;
    for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) {
        ++n;
    }
    return n;
}

} // namespace

TEST_CASE("check html: well-formed, self-contained, the verdict and the chart", "[html][check]") {
    const HandCheck hand;
    const std::string page = format_check_html(hand.study, hand.ledger, 0.9, kAbout);
    CHECK(format_check_html(hand.study, hand.ledger, 0.9, kAbout) == page); // deterministic
    REQUIRE(page.rfind("<!DOCTYPE html>\n", 0) == 0);
    // Well-formed XML after the doctype: every element closed, attributes quoted, entities
    // valid (the checker the SVG tests use).
    const auto elements = svg_check::parse(page.substr(page.find('\n') + 1));
    CHECK(std::count_if(elements.begin(), elements.end(),
                        [](const auto& e) { return e.name == "svg"; }) == 1);
    // Self-contained: nothing is fetched (the SVG namespace is a name, not a fetch).
    for (const char* fetch : {"src=", "<link", "<script", "@import", "href=\"http"}) {
        INFO(fetch);
        CHECK(page.find(fetch) == std::string::npos);
    }
    for (auto at = page.find("url("); at != std::string::npos; at = page.find("url(", at + 1)) {
        CHECK(page.compare(at, 5, "url(#") == 0); // the chart's own patterns only
    }
    // The verdict first, then the chart, then the whole text report.
    const auto verdict = page.find("Verdict: ");
    const auto chart = page.find("<svg");
    const auto whole = page.find("<pre>");
    CHECK(verdict < chart);
    CHECK(chart < whole);
    // A row per crew member with the status in words.
    for (const auto& c : hand.ledger.crew) {
        INFO(c.name);
        CHECK(page.find("<tr><td>" + c.name + "</td>") != std::string::npos);
    }
    CHECK(count(page, "class=\"within\">within<") + count(page, "class=\"near\">near<") +
              count(page, "class=\"exceeded\">EXCEEDED<") ==
          hand.ledger.crew.size());
    // The cautions and the run's description, escaped.
    CHECK(page.find("planning value") != std::string::npos);
    CHECK(page.find("responsible agency") != std::string::npos);
    CHECK(page.find("&lt;now &amp; then&gt;") != std::string::npos);
}

TEST_CASE("check html: a dose that was not computed makes no page", "[html][check]") {
    // A result that was not computed never reads as within a limit: like every report, the page
    // is refused (the command line turns the fault into exit 3 and writes nothing).
    HandCheck hand;
    for (auto& c : hand.ledger.crew.at(0).checks) {
        c.dose = std::numeric_limits<double>::quiet_NaN();
        c.exceeded = true;
    }
    CHECK_THROWS_AS(format_check_html(hand.study, hand.ledger, 0.9, kAbout), ResultFault);
}
