#include "planner/report/compare_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/document_writer.hpp"
#include "planner/report/number_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

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

report::Document comparison_document(const PlanComparison& cmp, const Scenario& a,
                                     const Scenario& b) {
    using report::Field;
    using report::Value;
    report::Document doc;
    doc.group({"plan_a",
               {{"scenario", a.file}, {"mission", a.mission.name}, {"exceeded", cmp.a_exceeded}}});
    doc.group({"plan_b",
               {{"scenario", b.file}, {"mission", b.mission.name}, {"exceeded", cmp.b_exceeded}}});
    doc.group(
        {"",
         {{"only_in_a", report::List{cmp.only_in_a}}, {"only_in_b", report::List{cmp.only_in_b}}}});

    doc.text("crewdose compare: plan A against plan B");
    doc.text("  A: {} ({})", {Field{"mission", a.mission.name}, Field{"scenario", a.file}});
    doc.text("  B: {} ({})", {Field{"mission", b.mission.name}, Field{"scenario", b.file}});
    doc.blank();
    const auto verdict = [&](const char* plan, bool exceeded, std::size_t near) {
        if (exceeded) {
            doc.text(fmt::format("Verdict {}: A PLANNING LIMIT IS EXCEEDED.", plan));
        } else if (near == 0) {
            doc.text(fmt::format("Verdict {}: every evaluated planning limit is met.", plan));
        } else {
            doc.text(
                fmt::format("Verdict {}: every evaluated planning limit is met; {{}} limit{{}} "
                            "near.",
                            plan),
                {Field{"near", static_cast<std::int64_t>(near)},
                 Field{"plural", std::string(near == 1 ? "" : "s")}});
        }
    };
    verdict("A", cmp.a_exceeded, near_count(cmp, false));
    verdict("B", cmp.b_exceeded, near_count(cmp, true));
    doc.blank();
    doc.keyed_text("cautions", caution_text());
    doc.blank();

    // One table for every format: text a row per crew member and limit (a row whose status
    // changes marked "*"), JSON and CSV the same rows at full precision.
    report::Table t;
    t.key = "rows";
    t.is_csv = true;
    t.indent = "";
    const auto word = [](std::string key, std::string header, int width, bool text, bool json,
                         bool csv) {
        auto c = report::text_column(std::move(key), std::move(header));
        c.min_width = width;
        c.gap = 1;
        return c.shown_in(text, json, csv);
    };
    const auto number = [](std::string key, std::string header, int width, bool text, bool json,
                           bool csv) {
        auto c = report::number_column(std::move(key), std::move(header), {}, width, 1.0, 3);
        c.gap = 1;
        return c.shown_in(text, json, csv);
    };
    auto marker = word("changed", "", 1, true, false, false);
    marker.gap = 0;
    auto text_dose_b = number("text_dose_b", "B", 8, true, false, false);
    auto text_change = number("text_change", "B - A", 9, true, false, false);
    text_change.absent = "-";
    auto share = number("change_share", "%", 6, true, false, false);
    share.rounding = report::Rounding::signed_whole;
    share.scale = 100.0;
    share.absent = "-";
    // The limit; plan A's and plan B's in two columns when a limit differs between the plans.
    const bool limits_differ =
        std::any_of(cmp.rows.begin(), cmp.rows.end(),
                    [](const LimitChange& r) { return r.limit_a != r.limit_b; });
    auto limit_a = number("text_limit_a", "limit A", 6, limits_differ, false, false);
    auto limit_b =
        number("text_limit_b", limits_differ ? "limit B" : "limit", 6, true, false, false);
    auto statuses = word("statuses", "status A -> B", 0, true, false, false);
    statuses.gap = 2;
    t.columns = {marker,
                 word("crew", "crew", 12, true, true, true),
                 word("limit", "limit", 17, true, false, false),
                 word("organ", "", 0, false, true, true),
                 word("window", "", 0, false, true, true),
                 word("unit", "unit", 6, true, true, true),
                 number("text_dose_a", "A", 8, true, false, false),
                 text_dose_b,
                 text_change,
                 share,
                 limit_a,
                 limit_b,
                 statuses,
                 word("name", "", 0, false, true, false),
                 number("limit_a", "", 0, false, true, true),
                 number("dose_a", "", 0, false, true, true),
                 word("status_a", "", 0, false, true, true),
                 number("limit_b", "", 0, false, true, true),
                 number("dose_b", "", 0, false, true, true),
                 word("status_b", "", 0, false, true, true),
                 number("change", "", 0, false, true, true)};
    std::size_t changed = 0;
    for (const auto& r : cmp.rows) {
        const bool both = computed(r.dose_a) && computed(r.dose_b);
        const bool status_changed = r.status_a != r.status_b;
        changed += status_changed ? 1U : 0U;
        // Text: a dose that was not computed reads so. JSON and CSV: such a dose reaches the
        // writer as NaN, which it refuses (the report stops, exit 3), never a number.
        const auto shown_dose = [](double d) {
            return computed(d) ? Value(d) : Value();
        };
        const auto full_dose = [](double d) {
            return computed(d) ? d : std::numeric_limits<double>::quiet_NaN();
        };
        const double relative = r.relative_change();
        t.rows.push_back({std::string(status_changed ? "*" : ""),
                          r.crew,
                          organ_label(r.organ) + " " + r.window,
                          r.organ,
                          r.window,
                          std::string(unit_of(r.organ)),
                          shown_dose(r.dose_a),
                          shown_dose(r.dose_b),
                          both ? Value(r.change()) : Value(),
                          std::isfinite(relative) ? Value(relative) : Value(),
                          r.limit_a,
                          r.limit_b,
                          to_string(r.status_a) + " -> " + to_string(r.status_b),
                          r.name,
                          r.limit_a,
                          full_dose(r.dose_a),
                          to_string(r.status_a),
                          r.limit_b,
                          full_dose(r.dose_b),
                          to_string(r.status_b),
                          r.change()});
    }
    doc.table(std::move(t));
    doc.text("  A, B: the dose the check compares with the limit in each plan (the highest window "
             "for 30-day and annual limits); %: the change relative to A; *: the status changes "
             "({} row{}).",
             {Field{"changed", static_cast<std::int64_t>(changed)},
              Field{"plural", std::string(changed == 1 ? "" : "s")}},
             100, "    ");
    if (!cmp.only_in_a.empty()) {
        doc.text("  Only in A: {}", {Field{"only_in_a", report::List{cmp.only_in_a}}}, 100, "    ");
    }
    if (!cmp.only_in_b.empty()) {
        doc.text("  Only in B: {}", {Field{"only_in_b", report::List{cmp.only_in_b}}}, 100, "    ");
    }
    return doc;
}

std::string format_comparison(const PlanComparison& cmp, const Scenario& a, const Scenario& b,
                              OutputFormat format) {
    return report::write(comparison_document(cmp, a, b), format);
}

} // namespace crewdose::planner
