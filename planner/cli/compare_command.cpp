// The compare command: two plans' planning limits side by side.
#include "planner/analyses/compare.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/progress.hpp"
#include "planner/report/compare_html.hpp"
#include "planner/report/compare_report.hpp"
#include "planner/study/study.hpp"

#include <fmt/format.h>

#include <memory>
#include <string>
#include <vector>

namespace crewdose::cli {

Command add_compare_command(CLI::App& app) {
    struct Options {
        std::string format = "text";
        std::string plan_a;
        std::string plan_b;
        std::string out_path;
        std::string html_path;
        double near_percent = 100.0 * planner::kDefaultNearShare;
        bool quiet = false;
    };
    auto o = std::make_shared<Options>();
    auto* sub = app.add_subcommand(
        "compare",
        "Check two plans and show them side by side: for each crew member and planning limit "
        "both doses, the change (B - A) and where each stands, rows whose status changes "
        "marked; then what only one plan checks. For the planner's question 'what does "
        "moving this EVA, or a thicker shelter, change?': copy the scenario, change it, compare."
        "\nExample: crewdose compare scenarios/lunar-demo.toml my-variant.toml\nExit 0: both "
        "plans within every evaluated planning limit; 1: either exceeds one; 2: bad input.");
    sub->add_option("plan_a", o->plan_a, "the first scenario file (A)")->required();
    sub->add_option("plan_b", o->plan_b, "the second scenario file (B)")->required();
    sub->add_option("--format,-f", o->format, "text, json or csv")->capture_default_str();
    sub->add_option("--out,-o", o->out_path, kOutHelp);
    sub->add_option("--near", o->near_percent,
                    "a dose at this percentage of its limit or more is 'near' (1 to 100)")
        ->capture_default_str();
    sub->add_option("--html", o->html_path,
                    "also write the comparison as one HTML file: both verdicts and every compared "
                    "limit as a table, the cautions and the whole text report, self-contained "
                    "(opens without a network, prints as shown; written when the run completes)");
    add_quiet_flag(sub, o->quiet);
    return {sub, [o] {
                const auto fmt_choice = planner::parse_output_format(o->format);
                const double near_share = near_share_of(o->near_percent);
                const std::vector<planner::NamedFile> outputs{{"--out", o->out_path},
                                                              {"--html", o->html_path}};
                planner::refuse_unwritable_outputs(outputs);
                auto sa = planner::load_scenario(o->plan_a);
                auto sb = planner::load_scenario(o->plan_b);
                planner::refuse_timeline_gaps(sa);
                planner::refuse_timeline_gaps(sb);
                auto inputs = scenario_inputs(sa, o->plan_a);
                for (auto& f : scenario_inputs(sb, o->plan_b)) {
                    inputs.push_back(std::move(f));
                }
                planner::refuse_clashing_outputs(inputs, outputs);
                ProgressLine progress(o->quiet);
                progress.stage("computing plan A");
                const planner::Study a(std::move(sa), {}, [&](double f) { progress.update(f); });
                const auto ledger_a = planner::build_ledger(a);
                progress.stage("computing plan B");
                const planner::Study b(std::move(sb), {}, [&](double f) { progress.update(f); });
                const auto ledger_b = planner::build_ledger(b);
                progress.finish();
                const auto cmp = planner::compare_plans(ledger_a, ledger_b, near_share);
                const RunStamp stamp = run_stamp(&a.scenario(), &b.scenario());
                // Every file is prepared before any is written.
                const std::string text =
                    stamped(planner::format_comparison(cmp, a.scenario(), b.scenario(), fmt_choice),
                            fmt_choice, stamp);
                const std::string html =
                    o->html_path.empty() ? ""
                                         : planner::format_comparison_html(
                                               cmp, a.scenario(), b.scenario(), html_about(stamp));
                if (!o->html_path.empty()) {
                    planner::write_file_atomically(o->html_path, html, "--html");
                }
                write_report(text, o->out_path);
                return cmp.a_exceeded || cmp.b_exceeded ? 1 : 0;
            }};
}

} // namespace crewdose::cli
