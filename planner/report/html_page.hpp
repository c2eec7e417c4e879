#pragma once
// The frame every HTML report shares (check, storm, shelter, compare --html): one
// self-contained file, no script, no style sheet, font or image from elsewhere, so that it
// opens without a network and prints as it shows. The title, a line under it, the cautions,
// the report's own sections (the verdict or answer first), the whole text report, and at the
// foot where the report came from. The markup is also well-formed XML (every element closed,
// attributes quoted), which the tests read back.
#include "planner/report/verdict_table.hpp"

#include <string>
#include <utility>
#include <vector>

namespace crewdose::planner {

/// What the caller knows of the run (tool version, scenario digest, run time), shown at the
/// foot as label and value.
using HtmlAbout = std::vector<std::pair<std::string, std::string>>;

/// One section of a page: a heading and its body, already markup.
struct HtmlSection {
    std::string heading;
    std::string body_html;
};

struct HtmlPage {
    std::string title; ///< plain text
    std::string meta;  ///< plain text, the line under the title
    std::vector<HtmlSection> sections;
    std::string report_text; ///< the whole text report, shown as it prints
    HtmlAbout about;
};

/// The page, from "<!DOCTYPE html>" to "</html>".
[[nodiscard]] std::string format_html_page(const HtmlPage& page);

/// `text` with the markup characters as entities (every control character, the line break
/// included, becomes a space).
[[nodiscard]] std::string html_escape(const std::string& text);

/// The verdict as markup: the headline, the table (a status cell carries its status as its
/// class), the notes, the note.
[[nodiscard]] std::string html_verdict(const VerdictTable& table);

/// An SVG chart to put inside a page: its XML declaration removed, in a <div class="chart">.
[[nodiscard]] std::string html_chart(std::string svg);

} // namespace crewdose::planner
