#include "planner/report/storm_html.hpp"

#include "planner/report/storm_chart.hpp"
#include "planner/report/storm_report.hpp"
#include "planner/scenario/time_format.hpp"

#include <fmt/format.h>

namespace crewdose::planner {

std::string format_storm_whatif_html(const StormContext& ctx, const StormWhatIf& w,
                                     double near_share, const HtmlAbout& about) {
    const Scenario& sc = ctx.study().scenario();
    HtmlPage page;
    page.title = fmt::format("crewdose storm: event {} with t0 at {}", w.event_id,
                             format_time(w.times.onset));
    page.meta = fmt::format("scenario {}; mission {}", sc.file, sc.mission.name);
    page.sections = {{"Verdict", html_verdict(storm_whatif_verdict(ctx, w, near_share))}};
    page.report_text = format_storm_whatif(ctx, w, OutputFormat::text, near_share);
    page.about = about;
    return format_html_page(page);
}

std::string format_storm_sweep_html(const StormContext& ctx, const StormSweep& s, double near_share,
                                    const HtmlAbout& about) {
    const Scenario& sc = ctx.study().scenario();
    HtmlPage page;
    page.title = fmt::format("crewdose storm sweep: event {}", s.event_id);
    page.meta = fmt::format("scenario {}; mission {}; t0 from {} to {}", sc.file, sc.mission.name,
                            format_time(s.from), format_time(s.to));
    page.sections = {{"Verdict", html_verdict(storm_sweep_verdict(ctx, s, near_share))},
                     {"The highest share of a 30-day limit against the onset",
                      html_chart(format_storm_chart(ctx, s))}};
    page.report_text = format_storm_sweep(ctx, s, OutputFormat::text, near_share);
    page.about = about;
    return format_html_page(page);
}

} // namespace crewdose::planner
