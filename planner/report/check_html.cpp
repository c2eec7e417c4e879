#include "planner/report/check_html.hpp"

#include "planner/report/check_chart.hpp"
#include "planner/report/check_report.hpp"
#include "planner/report/html_page.hpp"
#include "planner/scenario/time_format.hpp"

#include <fmt/format.h>

namespace crewdose::planner {

std::string format_check_html(const Study& study, const LedgerResult& ledger, double near_share,
                              const HtmlAbout& about) {
    const Scenario& sc = study.scenario();
    HtmlPage page;
    page.title = "crewdose check: " + sc.mission.name;
    page.meta = fmt::format("scenario {}; mission {} to {}", sc.file, format_time(sc.mission.start),
                            format_time(sc.mission.end));
    page.sections = {
        {"Verdict", html_verdict(check_verdict(ledger, near_share))},
        {"Doses along the timeline", html_chart(format_check_chart(study, ledger, near_share))}};
    page.report_text = format_check_report(study, ledger, OutputFormat::text, false, near_share);
    page.about = about;
    return format_html_page(page);
}

} // namespace crewdose::planner
