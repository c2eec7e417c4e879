// The compare command: two plans' planning limits side by side.
#include "planner/analyses/compare.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/progress.hpp"
#include "planner/cli/run_cache.hpp"
#include "planner/cli/run_steps.hpp"
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
        bool no_cache = false;
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
    add_no_cache_flag(sub, o->no_cache);
    return {sub, [o] {
                const auto fmt_choice = planner::parse_output_format(o->format);
                const double near_share = near_share_of(o->near_percent);
                const std::vector<planner::NamedFile> outputs{{"--out", o->out_path},
                                                              {"--html", o->html_path}};
                // Both plans read (and checked against the outputs) before either is computed.
                auto sa = load_for_outputs(o->plan_a, outputs, true);
                auto sb = load_for_outputs(o->plan_b, outputs, true);
                ProgressLine progress(o->quiet);
                const auto cache = open_run_cache(o->no_cache);
                const planner::Study a =
                    compute_study(std::move(sa), progress, cache.get(), {}, "computing plan A");
                const auto ledger_a = planner::build_ledger(a);
                const planner::Study b =
                    compute_study(std::move(sb), progress, cache.get(), {}, "computing plan B");
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
                write_outputs({{"--html", o->html_path, html}}, text, o->out_path);
                return cmp.a_exceeded || cmp.b_exceeded ? 1 : 0;
            }};
}

} // namespace crewdose::cli
