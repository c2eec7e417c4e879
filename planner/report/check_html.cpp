#include "planner/report/check_html.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/check_chart.hpp"
#include "planner/report/check_report.hpp"
#include "planner/report/number_format.hpp"
#include "planner/report/svg_plot.hpp"
#include "planner/scenario/time_format.hpp"

#include <fmt/format.h>

#include <cmath>

namespace crewdose::planner {
namespace {

using svg::xml_escape;

// `text` for the inside of <pre>: the markup characters as entities, line breaks kept (svg's
// xml_escape turns every control character, the line break included, into a space).
std::string escape_lines(const std::string& text) {
    std::string out;
    std::size_t from = 0;
    while (from <= text.size()) {
        const auto nl = text.find('\n', from);
        out +=
            xml_escape(text.substr(from, nl == std::string::npos ? std::string::npos : nl - from));
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

std::string verdict_html(const LedgerResult& ledger, double near_share) {
    std::size_t exceeded = 0;
    std::size_t near = 0;
    std::string rows;
    for (const auto& c : ledger.crew) {
        const LimitCheck* b = binding_check(c);
        if (!b) {
            rows += fmt::format("<tr><td>{}</td><td colspan=\"6\">no limit evaluated</td></tr>\n",
                                xml_escape(c.name));
            continue;
        }
        const LimitStatus st = status_of(*b, near_share);
        exceeded += st == LimitStatus::exceeded ? 1U : 0U;
        near += st == LimitStatus::near ? 1U : 0U;
        const std::string word = st == LimitStatus::exceeded ? "EXCEEDED" : to_string(st);
        const std::string css = st == LimitStatus::exceeded ? "exceeded"
                                : st == LimitStatus::near   ? "near"
                                                            : "within";
        const std::string budget = budget_left_text(c, st);
        const char* unit = b->limit.organ == "effective" ? "mSv" : "mGy-Eq";
        // A dose that was not computed reads so (status_of has made it EXCEEDED).
        const bool computed = std::isfinite(b->dose) && b->dose >= 0.0;
        const std::string dose =
            computed ? fmt::format("{} {}", significant(b->dose, 3), unit) : "not computed";
        const std::string used =
            computed ? fmt::format("{:.0f} %", 100.0 * b->dose / b->limit.value) : "-";
        rows += fmt::format("<tr><td>{}</td><td>{} {}</td><td class=\"num\">{}</td><td "
                            "class=\"num\">{} {}</td><td class=\"num\">{}</td><td "
                            "class=\"{}\">{}</td><td>{}</td></tr>\n",
                            xml_escape(c.name), xml_escape(organ_label(b->limit.organ)),
                            xml_escape(b->limit.window), dose, significant(b->limit.value, 3), unit,
                            used, css, word, xml_escape(budget));
    }
    std::string head;
    if (exceeded > 0) {
        head = fmt::format("Verdict: A PLANNING LIMIT IS EXCEEDED for {} of {} crew member{}.",
                           exceeded, ledger.crew.size(), ledger.crew.size() == 1 ? "" : "s");
    } else if (near > 0) {
        head = fmt::format("Verdict: every evaluated planning limit is met; {} crew member{} near "
                           "a limit.",
                           near, near == 1 ? "" : "s");
    } else {
        head = "Verdict: every evaluated planning limit is met.";
    }
    return fmt::format(
        "<p class=\"verdict\">{}</p>\n<table>\n<tr><th>crew member</th><th>binding limit</th>"
        "<th>dose</th><th>planning limit</th><th>used</th><th>status</th><th>budget left</th>"
        "</tr>\n{}</table>\n<p>Binding: the limit with the highest share used. Near: {:.0f} % of "
        "its limit or more. Budget left: days more of this timeline's activity mix at its GCR "
        "rate, with no further events.</p>\n",
        head, rows, 100.0 * near_share);
}

} // namespace

std::string format_check_html(const Study& study, const LedgerResult& ledger, double near_share,
                              const std::vector<std::pair<std::string, std::string>>& about) {
    const Scenario& sc = study.scenario();
    const std::string title = "crewdose check: " + sc.mission.name;
    std::string svg = format_check_chart(study, ledger, near_share);
    if (svg.rfind("<?xml", 0) == 0) {
        svg.erase(0, svg.find('\n') + 1); // the declaration has no place inside a page
    }
    const std::string cautions = xml_escape(caution_text()); // its line breaks become spaces
    std::string foot;
    for (const auto& [label, value] : about) {
        foot +=
            fmt::format("<tr><th>{}</th><td>{}</td></tr>\n", xml_escape(label), xml_escape(value));
    }
    const std::string text =
        format_check_report(study, ledger, OutputFormat::text, false, near_share);
    return fmt::format("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n"
                       "<title>{0}</title>\n<style>{1}</style>\n</head>\n<body>\n<h1>{0}</h1>\n"
                       "<p class=\"meta\">scenario {2}; mission {3} to {4}</p>\n"
                       "<div class=\"cautions\">{5}</div>\n"
                       "<h2>Verdict</h2>\n{6}"
                       "<h2>Doses along the timeline</h2>\n<div class=\"chart\">\n{7}</div>\n"
                       "<h2>The whole report</h2>\n<pre>{8}</pre>\n"
                       "<footer>\n<table>\n{9}</table>\n</footer>\n</body>\n</html>\n",
                       xml_escape(title), kStyle, xml_escape(sc.file),
                       format_time(sc.mission.start), format_time(sc.mission.end), cautions,
                       verdict_html(ledger, near_share), svg, escape_lines(text), foot);
}

} // namespace crewdose::planner
