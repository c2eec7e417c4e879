#include "planner/report/compare_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/number_format.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>

namespace crewdose::planner {
namespace {

const char* unit_of(const std::string& organ) {
    return organ == "effective" ? "mSv" : "mGy-Eq";
}

bool computed(double dose) {
    return std::isfinite(dose) && dose >= 0.0;
}

std::string dose_text(double dose) {
    return computed(dose) ? significant(dose, 3) : "not computed";
}

std::string verdict_of(bool exceeded, std::size_t near) {
    if (exceeded) {
        return "A PLANNING LIMIT IS EXCEEDED";
    }
    return near > 0 ? fmt::format("every evaluated planning limit is met; {} limit{} near", near,
                                  near == 1 ? "" : "s")
                    : "every evaluated planning limit is met";
}

nlohmann::json plan_json(const Scenario& sc, bool exceeded) {
    return {{"scenario", sc.file}, {"mission", sc.mission.name}, {"exceeded", exceeded}};
}

std::string status_word(LimitStatus s) {
    return s == LimitStatus::exceeded ? "EXCEEDED" : to_string(s);
}

std::string status_class(LimitStatus s) {
    return s == LimitStatus::exceeded ? "exceeded" : to_string(s);
}

std::size_t near_count(const PlanComparison& cmp, bool in_b) {
    std::size_t n = 0;
    for (const auto& r : cmp.rows) {
        n += (in_b ? r.status_b : r.status_a) == LimitStatus::near ? 1U : 0U;
    }
    return n;
}

} // namespace

VerdictTable comparison_verdict(const PlanComparison& cmp) {
    VerdictTable t;
    t.headline = fmt::format("Verdict A: {}. Verdict B: {}.",
                             verdict_of(cmp.a_exceeded, near_count(cmp, false)),
                             verdict_of(cmp.b_exceeded, near_count(cmp, true)));
    t.columns = {"crew", "limit", "A", "B", "B - A", "planning limit", "status A", "status B"};
    for (const auto& r : cmp.rows) {
        const bool both = computed(r.dose_a) && computed(r.dose_b);
        const std::string limit = r.limit_a == r.limit_b
                                      ? significant(r.limit_b, 3)
                                      : significant(r.limit_a, 3) + "/" + significant(r.limit_b, 3);
        t.rows.push_back({{r.name},
                          {organ_label(r.organ) + " " + r.window},
                          {dose_text(r.dose_a) + " " + unit_of(r.organ), true},
                          {dose_text(r.dose_b) + " " + unit_of(r.organ), true},
                          {both ? significant(r.change(), 3) : "-", true},
                          {limit + " " + unit_of(r.organ), true},
                          {status_word(r.status_a), false, status_class(r.status_a)},
                          {status_word(r.status_b), false, status_class(r.status_b)}});
    }
    t.note = "A, B: the dose the check compares with the limit in each plan (the highest window "
             "for 30-day and annual limits).";
    return t;
}

std::string format_comparison(const PlanComparison& cmp, const Scenario& a, const Scenario& b,
                              OutputFormat format) {
    if (format == OutputFormat::json) {
        nlohmann::json j;
        j["plan_a"] = plan_json(a, cmp.a_exceeded);
        j["plan_b"] = plan_json(b, cmp.b_exceeded);
        j["rows"] = nlohmann::json::array();
        for (const auto& r : cmp.rows) {
            j["rows"].push_back({{"crew", r.crew},
                                 {"name", r.name},
                                 {"organ", r.organ},
                                 {"window", r.window},
                                 {"unit", unit_of(r.organ)},
                                 {"limit_a", r.limit_a},
                                 {"limit_b", r.limit_b},
                                 {"dose_a", r.dose_a},
                                 {"dose_b", r.dose_b},
                                 {"change", r.change()},
                                 {"status_a", to_string(r.status_a)},
                                 {"status_b", to_string(r.status_b)}});
        }
        j["only_in_a"] = cmp.only_in_a;
        j["only_in_b"] = cmp.only_in_b;
        j["cautions"] = caution_text();
        return dump_checked(j);
    }
    if (format == OutputFormat::csv) {
        std::string out =
            "crew,organ,window,unit,limit_a,dose_a,status_a,limit_b,dose_b,status_b,change\n";
        for (const auto& r : cmp.rows) {
            // Full precision as the other CSV outputs; a dose not computed stops the report.
            out += fmt::format("{},{},{},{},{:.10g},{:.10g},{},{:.10g},{:.10g},{},{:.10g}\n",
                               r.crew, r.organ, r.window, unit_of(r.organ), r.limit_a,
                               require_dose(r.dose_a, "a compared dose"), to_string(r.status_a),
                               r.limit_b, require_dose(r.dose_b, "a compared dose"),
                               to_string(r.status_b), r.change());
        }
        return out;
    }
    const std::size_t near_a = near_count(cmp, false);
    const std::size_t near_b = near_count(cmp, true);
    std::string out = fmt::format("crewdose compare: plan A against plan B\n"
                                  "  A: {} ({})\n  B: {} ({})\n\n",
                                  a.mission.name, a.file, b.mission.name, b.file);
    out += fmt::format("Verdict A: {}.\nVerdict B: {}.\n\n", verdict_of(cmp.a_exceeded, near_a),
                       verdict_of(cmp.b_exceeded, near_b));
    out += caution_text() + "\n";
    out += fmt::format("  {:<12} {:<17} {:<6} {:>8} {:>8} {:>9} {:>6} {:>6}  {}\n", "crew", "limit",
                       "unit", "A", "B", "B - A", "%", "limit", "status A -> B");
    std::size_t changed = 0;
    for (const auto& r : cmp.rows) {
        const bool both = computed(r.dose_a) && computed(r.dose_b);
        const std::string delta = both ? significant(r.change(), 3) : "-";
        const std::string share =
            both && r.dose_a > 0.0 ? signed_whole(100.0 * r.change() / r.dose_a) : "-";
        const bool status_changed = r.status_a != r.status_b;
        changed += status_changed ? 1U : 0U;
        const std::string limit = r.limit_a == r.limit_b
                                      ? significant(r.limit_b, 3)
                                      : significant(r.limit_a, 3) + "/" + significant(r.limit_b, 3);
        out +=
            fmt::format("{} {:<12} {:<17} {:<6} {:>8} {:>8} {:>9} {:>6} {:>6}  {} -> {}\n",
                        status_changed ? "*" : " ", r.crew, organ_label(r.organ) + " " + r.window,
                        unit_of(r.organ), dose_text(r.dose_a), dose_text(r.dose_b), delta, share,
                        limit, to_string(r.status_a), to_string(r.status_b));
    }
    out += wrap(fmt::format("  A, B: the dose the check compares with the limit in each plan (the "
                            "highest window for 30-day and annual limits); %: the change relative "
                            "to A; *: the status changes ({} row{}).",
                            changed, changed == 1 ? "" : "s"),
                100, "    ");
    if (!cmp.only_in_a.empty()) {
        out +=
            wrap("  Only in A: " + fmt::format("{}", fmt::join(cmp.only_in_a, ", ")), 100, "    ");
    }
    if (!cmp.only_in_b.empty()) {
        out +=
            wrap("  Only in B: " + fmt::format("{}", fmt::join(cmp.only_in_b, ", ")), 100, "    ");
    }
    return out;
}

} // namespace crewdose::planner
