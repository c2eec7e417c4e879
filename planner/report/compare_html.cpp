#include "planner/report/compare_html.hpp"

#include "planner/report/compare_report.hpp"

#include <fmt/format.h>

namespace crewdose::planner {

std::string format_comparison_html(const PlanComparison& cmp, const Scenario& a, const Scenario& b,
                                   const HtmlAbout& about) {
    HtmlPage page;
    page.title = "crewdose compare: plan A against plan B";
    page.meta =
        fmt::format("A: {} ({}); B: {} ({})", a.mission.name, a.file, b.mission.name, b.file);
    page.sections = {{"Verdict", html_verdict(comparison_verdict(cmp))}};
    page.report_text = format_comparison(cmp, a, b, OutputFormat::text);
    page.about = about;
    return format_html_page(page);
}

} // namespace crewdose::planner
