#include "planner/report/document.hpp"
#include "planner/report/document_writer.hpp"
#include "planner/report/events_report.hpp"
#include "planner/report/number_format.hpp"
#include "planner/report/physics_report.hpp"

#include "planner/analyses/physics_lookup.hpp"

#include "exposure/material_library.hpp"
#include "exposure/particle.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <cmath>
#include <limits>
#include <sstream>
#include <string>
#include <vector>

namespace report = crewdose::planner::report;

namespace {

// A dose table in Gy shown in mGy: the shape every dose report takes.
report::Document dose_document(report::Value dose) {
    report::Column who;
    who.key = "crew";
    who.header = "crew member";
    who.left = true;
    report::Column d;
    d.key = "dose_mGy";
    d.header = "dose";
    d.unit = "mGy";
    d.scale = 1e3;
    d.digits = 3;
    report::Table t;
    t.key = "doses";
    t.is_csv = true;
    t.columns = {who, d};
    t.rows = {{std::string("A, the commander"), 0.0123}, {std::string("B \"Bee\""), dose}};
    report::Document doc;
    doc.text("{} crew members", {report::Field{"count", std::int64_t{2}}});
    doc.table(std::move(t));
    return doc;
}

std::vector<std::string> lines_of(const std::string& text) {
    std::vector<std::string> out;
    std::istringstream in(text);
    for (std::string line; std::getline(in, line);) {
        out.push_back(line);
    }
    return out;
}

} // namespace

TEST_CASE("report model: every format shows the same scaled value", "[report]") {
    // By construction: 0.0123 Gy shown in mGy is 12.3 (3 significant figures in text).
    const auto doc = dose_document(0.0004567);
    const auto text = lines_of(report::write_text(doc));
    REQUIRE(text.size() == 5);
    CHECK(text[0] == "2 crew members");
    CHECK(text[1] == "  crew member        dose");
    CHECK(text[2] == "                      mGy");
    CHECK(text[3] == "  A, the commander   12.3");
    CHECK(text[4] == "  B \"Bee\"           0.457");
    const auto j = nlohmann::json::parse(report::write_json(doc));
    CHECK(j["doses"][0]["dose_mGy"].get<double>() == Approx(12.3).epsilon(1e-12));
    CHECK(j["doses"][1]["dose_mGy"].get<double>() == Approx(0.4567).epsilon(1e-12));
    CHECK(j["doses"][0]["crew"] == "A, the commander");
    const auto csv = lines_of(report::write_csv(doc));
    REQUIRE(csv.size() == 3);
    CHECK(csv[0] == "crew,dose_mGy");
    // Text with a comma, a quote or a space is quoted, quotes doubled (RFC 4180).
    CHECK(csv[1] == "\"A, the commander\",12.3");
    CHECK(csv[2] == "\"B \"\"Bee\"\"\",0.4567");
}

TEST_CASE("report model: a value that was not computed never reads as a number", "[report]") {
    // By construction: nothing prints as the column's absent text, JSON null, an empty cell.
    const auto doc = dose_document(std::monostate{});
    const auto text = report::write_text(doc);
    CHECK(text.find("not computed") != std::string::npos);
    const auto j = nlohmann::json::parse(report::write_json(doc));
    CHECK(j["doses"][1]["dose_mGy"].is_null());
    CHECK(lines_of(report::write_csv(doc))[2] == "\"B \"\"Bee\"\"\",");
    // A NaN, an infinity (or any non-finite number) is refused by every writer.
    for (const double bad :
         {std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::infinity()}) {
        const auto broken = dose_document(bad);
        CHECK_THROWS(report::write_text(broken));
        CHECK_THROWS(report::write_json(broken));
        CHECK_THROWS(report::write_csv(broken));
    }
}

TEST_CASE("report model: no negative zero, one CSV table", "[report]") {
    // By construction: -0.0 is shown as 0 in every format.
    const auto doc = dose_document(-0.0);
    CHECK(lines_of(report::write_text(doc))[4] == "  B \"Bee\"              0");
    CHECK(lines_of(report::write_csv(doc))[2] == "\"B \"\"Bee\"\"\",0");
    CHECK(report::write_json(doc).find("-0") == std::string::npos);
    auto two = dose_document(1.0);
    two.table(std::get<report::Table>(two.blocks.back()));
    CHECK_THROWS(report::write_csv(two));
    report::Document none;
    none.text("no table");
    CHECK_THROWS(report::write_csv(none));
}

TEST_CASE("range report: text, JSON and CSV carry the same numbers", "[report]") {
    using namespace crewdose;
    const auto& al = *exposure::find_builtin_material("aluminium");
    const auto proton = *exposure::particle_by_name("proton");
    const auto rows = planner::range_rows(al, proton, {1.0, 10.0, 100.0});
    const auto doc = planner::range_document(al, proton, rows);
    const auto j = nlohmann::json::parse(report::write_json(doc));
    const auto csv = lines_of(report::write_csv(doc));
    REQUIRE(j["rows"].size() == 3);
    REQUIRE(csv.size() == 4);
    for (std::size_t i = 0; i < 3; ++i) {
        const double S = j["rows"][i]["stopping_MeV_cm2_g"].get<double>();
        // Both are the model's value; CSV keeps 10 significant figures (by construction).
        CHECK(S == Approx(rows[i].stopping_MeV_cm2_g).epsilon(1e-15));
        const double S_csv = std::stod(csv[i + 1].substr(csv[i + 1].find(',') + 1));
        CHECK(S_csv == Approx(S).epsilon(1e-9));
    }
    // The text shows each stopping power to 4 significant figures (by construction).
    const auto text = report::write_text(doc);
    for (const auto& r : rows) {
        CHECK(text.find(planner::significant(r.stopping_MeV_cm2_g, 4)) != std::string::npos);
    }
}

TEST_CASE("events report: every library entry in every format", "[report]") {
    const auto doc = crewdose::planner::events_document();
    const auto j = nlohmann::json::parse(report::write_json(doc));
    const auto csv = lines_of(report::write_csv(doc));
    const auto text = report::write_text(doc);
    REQUIRE(!j["events"].empty());
    CHECK(csv.size() == j["events"].size() + 1);
    for (const auto& e : j["events"]) {
        const std::string id = e["id"].get<std::string>();
        CHECK(text.find("  " + id + " ") != std::string::npos);
        CHECK(e["use_as"] == "library:" + id);
        // A design event has a return period; the JSON omits the key where there is none.
        CHECK(e.contains("return_period_years") == (e["kind"] == "design"));
    }
    CHECK(!j["not_in_library"].empty());
}

TEST_CASE("report model: colour repeats a tone and never moves the text", "[report]") {
    // By construction: the same document with and without colour differs only by the ANSI
    // codes around the toned cells and arguments (red 31, yellow 33, green 32, reset 0:
    // ECMA-48, common practice on terminals).
    report::Document doc = dose_document(0.5);
    auto& table = std::get<report::Table>(doc.blocks.back());
    table.tones = {{report::Tone::plain, report::Tone::good},
                   {report::Tone::plain, report::Tone::alarm}};
    doc.text("Verdict: {0} for {1} of 2, a long sentence that wraps here at forty columns",
             {report::Field{"word", std::string("EXCEEDED"), 4, report::Rounding::general, 1.0,
                            report::Tone::alarm},
              report::Field{"n", std::int64_t{1}}},
             40, "  ");
    const std::string plain = report::write_text(doc);
    const std::string coloured = report::write_text(doc, true);
    CHECK(plain.find('\033') == std::string::npos);
    CHECK(report::write(doc, crewdose::planner::OutputFormat::text) == plain);
    CHECK(coloured.find("\033[31mEXCEEDED\033[0m for 1 of 2") != std::string::npos);
    CHECK(coloured.find("\033[32m") != std::string::npos);
    CHECK(coloured.find("\033[31m 500\033[0m") != std::string::npos);
    // Removing the codes gives the plain text back, line breaks included.
    std::string stripped;
    for (std::size_t i = 0; i < coloured.size(); ++i) {
        if (coloured[i] == '\033') {
            i = coloured.find('m', i);
            continue;
        }
        stripped += coloured[i];
    }
    CHECK(stripped == plain);
    // JSON and CSV carry no colour.
    CHECK(report::write(doc, crewdose::planner::OutputFormat::json, true).find('\033') ==
          std::string::npos);
    CHECK(report::write(doc, crewdose::planner::OutputFormat::csv, true).find('\033') ==
          std::string::npos);
}

TEST_CASE("report model: a tone row must match its table", "[report]") {
    report::Document doc = dose_document(0.5);
    std::get<report::Table>(doc.blocks.back()).tones = {{report::Tone::plain}};
    CHECK_THROWS_AS(report::write_text(doc, true), std::logic_error);
}

TEST_CASE("report model: a list of words in every format", "[report]") {
    // By construction: JSON an array of strings; text and CSV the words joined.
    report::Table t;
    t.key = "gaps";
    t.is_csv = true;
    t.columns = {report::text_column("where", "where")};
    t.rows = {{report::List{{"habitat", "rover"}, " "}}, {report::List{}}};
    report::Document doc;
    doc.table(t);
    CHECK(lines_of(report::write_text(doc))[1] == "  habitat rover");
    CHECK(lines_of(report::write_csv(doc))[1] == "\"habitat rover\"");
    const auto j = nlohmann::json::parse(report::write_json(doc));
    CHECK(j["gaps"][0]["where"] == nlohmann::json::array({"habitat", "rover"}));
    CHECK(j["gaps"][1]["where"] == nlohmann::json::array());
}

TEST_CASE("report model: a change as a signed whole number", "[report]") {
    // By construction (the rounding rule of signed_whole in number_format.hpp): a whole number
    // with its sign, 0 from either side, never "-0" or "+0"; scaled first (a share in %);
    // CSV and JSON keep the value itself.
    report::Table t;
    t.key = "rows";
    t.is_csv = true;
    auto c = report::number_column("change_share", "%", {}, 0, 100.0);
    c.rounding = report::Rounding::signed_whole;
    c.absent = "-";
    t.columns = {c};
    for (const double v : {0.03, -0.12, -0.002, 0.004, 0.0, -0.0, 0.125}) {
        t.rows.push_back({v});
    }
    t.rows.push_back({report::Value()});
    report::Document doc;
    doc.table(t);
    doc.text("{} and {}", {report::Field{"a", 2.6, 0, report::Rounding::signed_whole},
                           report::Field{"b", -0.4, 0, report::Rounding::signed_whole}});
    CHECK(lines_of(report::write_text(doc)) ==
          std::vector<std::string>{"    %", "   +3", "  -12", "    0", "    0", "    0", "    0",
                                   "  +13", "    -", "+3 and 0"});
    const auto csv = lines_of(report::write_csv(doc));
    REQUIRE(csv.size() == 9);
    CHECK(csv[1] == "3");
    CHECK(csv[2] == "-12");
    CHECK(csv[3] == "-0.2");
    CHECK(csv[6] == "0");
    CHECK(csv[8].empty());
    const auto j = nlohmann::json::parse(report::write_json(doc));
    CHECK(j["rows"][1]["change_share"].get<double>() == Approx(-12.0));
    CHECK(j["rows"][7]["change_share"].is_null());
}
