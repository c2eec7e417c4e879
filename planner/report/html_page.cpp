#include "planner/report/html_page.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/svg_plot.hpp"

#include <fmt/format.h>

namespace crewdose::planner {
namespace {

// `text` for the inside of <pre>: the markup characters as entities, line breaks kept (svg's
// xml_escape turns every control character, the line break included, into a space).
std::string escape_lines(const std::string& text) {
    std::string out;
    std::size_t from = 0;
    while (from <= text.size()) {
        const auto nl = text.find('\n', from);
        out +=
            html_escape(text.substr(from, nl == std::string::npos ? std::string::npos : nl - from));
        if (nl == std::string::npos) {
            break;
        }
        out += '\n';
        from = nl + 1;
    }
    return out;
}

// Print and screen alike: black on white, the status in words (the colour only repeats them),
// tables that do not split a row over pages, the chart scaled to the page width.
constexpr const char* kStyle = R"(
body { font-family: "DejaVu Sans", Arial, sans-serif; color: #000; background: #fff;
       max-width: 62rem; margin: 1.5rem auto; padding: 0 1rem; line-height: 1.35; }
h1 { font-size: 1.5rem; margin-bottom: 0.2rem; }
h2 { font-size: 1.2rem; margin-top: 1.8rem; border-bottom: 1px solid #888; }
.meta { color: #333; margin-top: 0; }
.cautions { border: 2px solid #000; padding: 0.5rem 0.8rem; margin: 1rem 0; }
.verdict { font-size: 1.15rem; font-weight: bold; }
table { border-collapse: collapse; margin: 0.5rem 0; }
th, td { border: 1px solid #999; padding: 0.2rem 0.5rem; text-align: left; }
td.num { text-align: right; font-variant-numeric: tabular-nums; }
tr { page-break-inside: avoid; }
.exceeded { font-weight: bold; background: #f6d5d5; }
.near { font-weight: bold; background: #f7edc8; }
.within { background: #e1f0e1; }
.chart svg { width: 100%; height: auto; }
pre { font-size: 0.8rem; white-space: pre-wrap; border-top: 1px solid #888; padding-top: 0.5rem; }
footer { margin-top: 2rem; font-size: 0.85rem; color: #333; }
@media print { .chart { page-break-before: always; } }
)";

} // namespace

std::string html_escape(const std::string& text) {
    return svg::xml_escape(text);
}

std::string html_verdict(const VerdictTable& table) {
    std::string head;
    for (const auto& c : table.columns) {
        head += fmt::format("<th>{}</th>", html_escape(c));
    }
    std::string rows;
    for (const auto& row : table.rows) {
        rows += "<tr>";
        for (const auto& cell : row) {
            std::string cls = cell.number ? "num" : "";
            if (!cell.status.empty()) {
                cls += (cls.empty() ? "" : " ") + cell.status;
            }
            rows += cls.empty() ? "<td>" : fmt::format("<td class=\"{}\">", html_escape(cls));
            rows += html_escape(cell.text) + "</td>";
        }
        rows += "</tr>\n";
    }
    std::string notes;
    for (const auto& n : table.notes) {
        notes += fmt::format("<p>{}</p>\n", html_escape(n));
    }
    return fmt::format("<p class=\"verdict\">{}</p>\n<table>\n<tr>{}</tr>\n{}</table>\n{}{}",
                       html_escape(table.headline), head, rows, notes,
                       table.note.empty() ? ""
                                          : fmt::format("<p>{}</p>\n", html_escape(table.note)));
}

std::string html_chart(std::string svg) {
    if (svg.rfind("<?xml", 0) == 0) {
        svg.erase(0, svg.find('\n') + 1); // the declaration has no place inside a page
    }
    return "<div class=\"chart\">\n" + svg + "</div>\n";
}

std::string format_html_page(const HtmlPage& page) {
    std::string sections;
    for (const auto& s : page.sections) {
        sections += fmt::format("<h2>{}</h2>\n{}", html_escape(s.heading), s.body_html);
    }
    std::string foot;
    for (const auto& [label, value] : page.about) {
        foot += fmt::format("<tr><th>{}</th><td>{}</td></tr>\n", html_escape(label),
                            html_escape(value));
    }
    const std::string cautions = html_escape(caution_text()); // its line breaks become spaces
    return fmt::format("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n"
                       "<title>{0}</title>\n<style>{1}</style>\n</head>\n<body>\n<h1>{0}</h1>\n"
                       "<p class=\"meta\">{2}</p>\n"
                       "<div class=\"cautions\">{3}</div>\n"
                       "{4}"
                       "<h2>The whole report</h2>\n<pre>{5}</pre>\n"
                       "<footer>\n<table>\n{6}</table>\n</footer>\n</body>\n</html>\n",
                       html_escape(page.title), kStyle, html_escape(page.meta), cautions, sections,
                       escape_lines(page.report_text), foot);
}

} // namespace crewdose::planner
