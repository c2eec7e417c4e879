#include "planner/report/shelter_html.hpp"

#include "planner/report/shelter_chart.hpp"
#include "planner/report/shelter_report.hpp"

#include <fmt/format.h>

namespace crewdose::planner {

std::string format_shelter_html(const Study& study, const ShelterReport& rep,
                                const HtmlAbout& about) {
    const Scenario& sc = study.scenario();
    HtmlPage page;
    page.title = fmt::format("crewdose shelter: event {} at location {}", rep.request.event_id,
                             rep.request.location_id);
    page.meta = fmt::format("scenario {}; mission {}", sc.file, sc.mission.name);
    page.sections = {
        {"Answer", html_verdict(shelter_answer(rep))},
        {"Dose against added areal density", html_chart(format_shelter_chart(study, rep))}};
    page.report_text = format_shelter_report(study, rep, OutputFormat::text);
    page.about = about;
    return format_html_page(page);
}

} // namespace crewdose::planner
