#include "planner/report/check_html.hpp"

#include "planner/report/check_chart.hpp"
#include "planner/report/check_report.hpp"
#include "planner/report/html_page.hpp"
#include "planner/report/number_format.hpp"
#include "planner/scenario/time_format.hpp"

#include <fmt/format.h>

#include <cmath>

namespace crewdose::planner {
namespace {

VerdictTable check_verdict(const LedgerResult& ledger, double near_share) {
    VerdictTable t;
    t.columns = {"crew member", "binding limit", "dose",       "planning limit",
                 "used",        "status",        "budget left"};
    std::size_t exceeded = 0;
    std::size_t near = 0;
    for (const auto& c : ledger.crew) {
        for (const std::string& note : check_verdict_notes(c)) {
            t.notes.push_back(note);
        }
        const LimitCheck* b = binding_check(c);
        if (!b) {
            t.rows.push_back({{c.name}, {"no limit evaluated"}, {"-"}, {"-"}, {"-"}, {"-"}, {"-"}});
            continue;
        }
        const LimitStatus st = status_of(*b, near_share);
        exceeded += st == LimitStatus::exceeded ? 1U : 0U;
        near += st == LimitStatus::near ? 1U : 0U;
        const std::string word = st == LimitStatus::exceeded ? "EXCEEDED" : to_string(st);
        const char* unit = b->limit.organ == "effective" ? "mSv" : "mGy-Eq";
        // A dose that was not computed reads so (status_of has made it EXCEEDED).
        const bool computed = std::isfinite(b->dose) && b->dose >= 0.0;
        const std::string dose =
            computed ? fmt::format("{} {}", significant(b->dose, 3), unit) : "not computed";
        const std::string used =
            computed ? fmt::format("{:.0f} %", 100.0 * b->dose / b->limit.value) : "-";
        t.rows.push_back({{c.name},
                          {organ_label(b->limit.organ) + " " + b->limit.window},
                          {dose, true},
                          {fmt::format("{} {}", significant(b->limit.value, 3), unit), true},
                          {used, true},
                          {word, false, st == LimitStatus::exceeded ? "exceeded" : to_string(st)},
                          {budget_left_text(c, st)}});
    }
    if (exceeded > 0) {
        t.headline =
            fmt::format("Verdict: A PLANNING LIMIT IS EXCEEDED for {} of {} crew member{}.",
                        exceeded, ledger.crew.size(), ledger.crew.size() == 1 ? "" : "s");
    } else if (near > 0) {
        t.headline = fmt::format("Verdict: every evaluated planning limit is met; {} crew "
                                 "member{} near a limit.",
                                 near, near == 1 ? "" : "s");
    } else {
        t.headline = "Verdict: every evaluated planning limit is met.";
    }
    t.note = fmt::format("Binding: the limit with the highest share used. Near: {:.0f} % of its "
                         "limit or more. Budget left: days more of this timeline's activity mix "
                         "at its GCR rate, with no further events.",
                         100.0 * near_share);
    return t;
}

} // namespace

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
