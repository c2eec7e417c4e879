// The check command: every crew member's doses along the timeline against the limits.
#include "planner/cli/atomic_file.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/progress.hpp"
#include "planner/cli/run_cache.hpp"
#include "planner/cli/run_steps.hpp"
#include "planner/report/check_chart.hpp"
#include "planner/report/check_html.hpp"
#include "planner/report/check_report.hpp"
#include "planner/study/ledger.hpp"

#include <fmt/format.h>

#include <filesystem>

#include <memory>
#include <string>
#include <vector>

namespace crewdose::cli {

Command add_check_command(CLI::App& app) {
    struct Options {
        std::string format = "text";
        std::string scenario_path;
        std::string out_path;
        std::string series_path;
        std::string chart_path;
        std::string html_path;
        bool allow_gaps = false;
        bool quiet = false;
        bool no_cache = false;
        double near_percent = 100.0 * planner::kDefaultNearShare;
    };
    auto o = std::make_shared<Options>();
    CLI::App* const sub = [&] {
        auto& format = o->format;
        auto& scenario_path = o->scenario_path;
        auto& out_path = o->out_path;
        auto& series_path = o->series_path;
        auto& allow_gaps = o->allow_gaps;
        auto* check = app.add_subcommand(
            "check",
            "Check every crew member's doses along the scenario's timeline against the "
            "30-day, annual and career planning limits; report margins and where they are "
            "smallest. Doses are SPE plus the galactic cosmic-ray (GCR) background, "
            "shown apart. Events are charged on the timeline as planned, with no storm "
            "response ('crewdose storm' applies the scenario's response policy).\nBody: each "
            "location's body = \"phantom\" (default; the stylised adult "
            "phantom: BFO as the active marrow, heart, brain, lens, skin and the ICRP 103 "
            "effective dose, each organ shielded by the body as placed: posture standing "
            "or lying, heading_deg) or \"quick\" (skin, lens and BFO at 0.07 mm, "
            "3 mm and 5 cm of tissue in every direction, a conservative screen without "
            "heart, brain or effective dose).\nGCR: set the modulation potential with "
            "mission.gcr_phi_MV "
            "(and [[mission.gcr_modulation]] for later changes); about 300 to 400 MV near "
            "solar minimum, 1000 MV or more near maximum, for the Burger et al. 2000 interstellar "
            "spectrum the model uses: a phi derived with another spectrum is not "
            "interchangeable. Without a value phi comes by month from the last recorded solar "
            "cycle (Usoskin et al. 2017, 2014-2025; outside it the lowest value within a year "
            "of the same phase), a planning estimate the report states.\n"
            "Example: crewdose check scenarios/lunar-demo.toml --chart doses.svg\nExit 0: all "
            "evaluated limits met; 1: a limit exceeded; 2: bad input; 3: internal fault.");
        check
            ->add_option("scenario", scenario_path, "scenario file (TOML; see scenarios/README.md)")
            ->required();
        check->add_option("--format,-f", format, "text, json (full precision) or csv")
            ->capture_default_str();
        check->add_option("--out,-o", out_path,
                          "write the report to this file (atomically) "
                          "instead of standard output");
        check->add_option(
            "--series", series_path,
            "also write cumulative dose and dose rate against time per crew member "
            "and organ to this CSV file (a unit column: mGy-Eq, or mSv for the effective dose)");
        check->add_option(
            "--chart", o->chart_path,
            "also draw a chart to this SVG file: per crew member, the dose in the 30 days up to "
            "each day and the career dose along the timeline, each for the organ whose limit of "
            "that window has the highest share used, against its planning limit line; EVAs, "
            "rover drives and shelter stays hatched, events marked; the cautions on top, and a "
            "dose that was not computed drawn as a gap labelled so, never as a value (written "
            "only when the check completes)");
        check->add_option(
            "--html", o->html_path,
            "also write the check as one HTML file: the verdict table, the cautions, the chart "
            "of --chart and the whole text report, self-contained (opens without a network, "
            "prints as shown; written only when the check completes)");
        check
            ->add_option("--near", o->near_percent,
                         "a dose at this percentage of its limit or more is flagged 'near' in the "
                         "verdict (1 to 100)")
            ->capture_default_str();
        check->add_flag("--allow-gaps", allow_gaps,
                        "accept gaps in a crew member's timeline; each gap is charged at the "
                        "location of the activity before it and listed in the report");
        add_quiet_flag(check, o->quiet);
        add_no_cache_flag(check, o->no_cache);
        return check;
    }();
    return {
        sub, [o] {
            auto& format = o->format;
            auto& scenario_path = o->scenario_path;
            auto& out_path = o->out_path;
            auto& series_path = o->series_path;
            auto& allow_gaps = o->allow_gaps;
            const auto fmt_choice = planner::parse_output_format(format);
            const double near_share = near_share_of(o->near_percent);

            auto sc = load_for_outputs(scenario_path,
                                       {{"--out", out_path},
                                        {"--series", series_path},
                                        {"--chart", o->chart_path},
                                        {"--html", o->html_path}},
                                       !allow_gaps);
            ProgressLine progress(o->quiet);
            const auto cache = open_run_cache(o->no_cache);
            const planner::Study study = compute_study(std::move(sc), progress, cache.get());
            progress.finish();
            planner::LedgerOptions options;
            options.allow_gaps = allow_gaps;
            const auto ledger = planner::build_ledger(study, options);
            const bool colour = colour_wanted(out_path, fmt_choice);
            const RunStamp stamp = run_stamp(&study.scenario());
            const std::string report =
                stamped(planner::format_check_report(study, ledger, fmt_choice, colour, near_share),
                        fmt_choice, stamp);
            // Every file is prepared before any is written, so bad input writes nothing.
            const std::string series = series_path.empty()
                                           ? ""
                                           : stamped(planner::format_series(study, ledger),
                                                     planner::OutputFormat::csv, stamp);
            const std::string chart =
                o->chart_path.empty() ? "" : planner::format_check_chart(study, ledger, near_share);
            const std::string html =
                o->html_path.empty()
                    ? ""
                    : planner::format_check_html(study, ledger, near_share, html_about(stamp));
            write_outputs({{"--series", series_path, series},
                           {"--html", o->html_path, html},
                           {"--chart", o->chart_path, chart}},
                          report, out_path);
            return ledger.any_exceeded ? 1 : 0;
        }};
}

} // namespace crewdose::cli
