// The storm command: one what-if of an event's onset, or a sweep of onsets.
#include "planner/cli/command.hpp"
#include "planner/cli/progress.hpp"
#include "planner/cli/run_cache.hpp"
#include "planner/cli/run_steps.hpp"
#include "planner/report/storm_chart.hpp"
#include "planner/report/storm_html.hpp"
#include "planner/report/storm_report.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/study/study.hpp"

#include <memory>
#include <string>
#include <vector>

namespace crewdose::cli {

Command add_storm_command(CLI::App& app) {
    struct Options {
        std::string format = "text";
        std::string scenario_path;
        std::string event_id;
        std::string storm_onset;
        bool storm_sweep = false;
        std::string storm_step = "10min";
        std::string storm_from;
        std::string storm_to;
        bool no_response = false;
        std::string out_path;
        std::string chart_path;
        std::string html_path;
        bool quiet = false;
        bool no_cache = false;
        double near_percent = 100.0 * planner::kDefaultNearShare;
    };
    auto o = std::make_shared<Options>();
    CLI::App* const sub = [&] {
        auto& format = o->format;
        auto& scenario_path = o->scenario_path;
        auto& event_id = o->event_id;
        auto& storm_onset = o->storm_onset;
        auto& storm_sweep = o->storm_sweep;
        auto& storm_step = o->storm_step;
        auto& storm_from = o->storm_from;
        auto& storm_to = o->storm_to;
        auto& no_response = o->no_response;
        auto* storm = app.add_subcommand(
            "storm",
            "What if a solar particle event starts at a given moment? t0 is when the flare is seen "
            "at the site (its light has arrived); protons of each energy then arrive scatter-free "
            "along the field line, L/v(E) - r/c later: the earliest possible arrival (an event "
            "with "
            "a fixed arrival_delay_h in the scenario arrives at once). The crew respond by the "
            "scenario's [storm_response] policy (warning delay, return from EVA, move to the "
            "shelter, all-clear). Per crew member and organ: the event's dose with and without the "
            "response, what the response saved, and the 30-day margin. Organs: BFO, lens and skin; "
            "heart and brain too for a crew member whose every possible place (timeline, shelter, "
            "refuges) uses the phantom body model.\n"
            "--onset T: one what-if. --sweep: t0 swept over the timeline every --step (default "
            "10min, --from/--to default the mission), plus the onsets where the policy changes; "
            "per "
            "crew member the worst onset, per EVA a go/no-go, and a text profile; --chart FILE.svg "
            "draws that profile (needs --sweep).\n"
            "Example: crewdose storm scenarios/lunar-demo.toml --event design-spe --sweep --chart "
            "storm.svg\n"
            "Exit 0: every 30-day limit met; 1: some what-if breaks one; 2: bad input; 3: internal "
            "fault.");
        storm->add_option("scenario", scenario_path, "scenario file (TOML)")->required();
        storm->add_option("--event,-e", event_id, "the design event (an event id)")->required();
        auto* onset_opt = storm->add_option("--onset", storm_onset,
                                            "t0 of one what-if, RFC 3339 (2032-03-11T10:30:00Z)");
        auto* sweep_opt = storm->add_flag("--sweep", storm_sweep, "sweep t0 over the timeline");
        onset_opt->excludes(sweep_opt);
        storm->add_option("--step", storm_step, "sweep step: 10min, 1min, 30s, 2h ...")
            ->capture_default_str()
            ->needs(sweep_opt);
        storm->add_option("--from", storm_from, "first t0 of the sweep (default: mission start)")
            ->needs(sweep_opt);
        storm->add_option("--to", storm_to, "last t0 of the sweep (default: mission end)")
            ->needs(sweep_opt);
        storm->add_flag("--no-response", no_response,
                        "the crew keep to the planned timeline (for comparison)");
        storm->add_option("--format,-f", format, "text, json or csv")->capture_default_str();
        storm->add_option("--out,-o", o->out_path, kOutHelp);
        storm
            ->add_option("--chart", o->chart_path,
                         "also draw the sweep to this SVG file (needs --sweep): per bin of "
                         "onset t0 (6 hours, longer for sweeps over 30 days: at most 120 bins), "
                         "the highest share of a 30-day limit over the crew, the 100 % "
                         "line, the EVAs and rover drives (go and no-go), the no-go onsets and "
                         "the worst onset; written when the run completes, a limit exceeded "
                         "included")
            ->needs(sweep_opt);
        storm->add_option("--html", o->html_path,
                          "also write the report as one HTML file: the verdict table, the "
                          "cautions, for a sweep the chart of --chart, and the whole text report, "
                          "self-contained (opens without a network, prints as shown; written when "
                          "the run completes, a limit exceeded included)");
        storm
            ->add_option("--near", o->near_percent,
                         "a 30-day dose at this percentage of its limit or more is flagged "
                         "'near' in the verdict (1 to 100)")
            ->capture_default_str();
        add_quiet_flag(storm, o->quiet);
        add_no_cache_flag(storm, o->no_cache);
        return storm;
    }();
    return {sub, [o] {
                auto& format = o->format;
                auto& scenario_path = o->scenario_path;
                auto& event_id = o->event_id;
                auto& storm_onset = o->storm_onset;
                auto& storm_sweep = o->storm_sweep;
                auto& storm_step = o->storm_step;
                auto& storm_from = o->storm_from;
                auto& storm_to = o->storm_to;
                auto& no_response = o->no_response;
                const auto fmt_choice = planner::parse_output_format(format);
                const double near_share = near_share_of(o->near_percent);

                if (storm_onset.empty() && !storm_sweep) {
                    throw InputError({"command line", 0}, "storm",
                                     "give --onset TIME for one what-if or --sweep");
                }
                auto sc = load_for_outputs(
                    scenario_path,
                    {{"--out", o->out_path}, {"--chart", o->chart_path}, {"--html", o->html_path}});
                ProgressLine progress(o->quiet);
                const auto cache = open_run_cache(o->no_cache);
                const planner::Study study = compute_study(std::move(sc), progress, cache.get());
                progress.finish();
                const planner::StormContext context(study, event_id, !no_response);
                const auto& mission = study.scenario().mission;
                // A time option inside the mission, or its default.
                auto mission_time = [&](const std::string& text, const char* option,
                                        planner::Time fallback) {
                    if (text.empty()) {
                        return fallback;
                    }
                    const auto t = planner::parse_command_time(text, option);
                    if (t < mission.start || t > mission.end) {
                        throw InputError({"command line", 0}, option,
                                         "lies outside the mission (" +
                                             planner::format_time(mission.start) + " to " +
                                             planner::format_time(mission.end) + ")");
                    }
                    return t;
                };
                if (!storm_onset.empty()) {
                    const auto w = context.at(mission_time(storm_onset, "--onset", mission.start));
                    const RunStamp stamp = run_stamp(&study.scenario());
                    // Every file is prepared before any is written.
                    const std::string text = stamped(
                        planner::format_storm_whatif(context, w, fmt_choice, near_share,
                                                     colour_wanted(o->out_path, fmt_choice)),
                        fmt_choice, stamp);
                    const std::string html = o->html_path.empty()
                                                 ? ""
                                                 : planner::format_storm_whatif_html(
                                                       context, w, near_share, html_about(stamp));
                    write_outputs({{"--html", o->html_path, html}}, text, o->out_path);
                    return w.any_exceeded() ? 1 : 0;
                }
                const auto step = planner::parse_duration(storm_step, "--step");
                const auto from = mission_time(storm_from, "--from", mission.start);
                const auto to = mission_time(storm_to, "--to", mission.end);
                if (!(to > from)) {
                    throw InputError({"command line", 0}, "--to", "must be after --from");
                }
                progress.stage("sweeping onsets");
                const auto sweep = planner::sweep_storm(context, from, to, step,
                                                        [&](double f) { progress.update(f); });
                progress.finish();
                const RunStamp stamp = run_stamp(&study.scenario());
                // Every file is prepared before any is written.
                const std::string text =
                    stamped(planner::format_storm_sweep(context, sweep, fmt_choice, near_share,
                                                        colour_wanted(o->out_path, fmt_choice)),
                            fmt_choice, stamp);
                const std::string chart =
                    o->chart_path.empty() ? "" : planner::format_storm_chart(context, sweep);
                const std::string html = o->html_path.empty()
                                             ? ""
                                             : planner::format_storm_sweep_html(
                                                   context, sweep, near_share, html_about(stamp));
                write_outputs({{"--chart", o->chart_path, chart}, {"--html", o->html_path, html}},
                              text, o->out_path);
                return sweep.any_exceeded() ? 1 : 0;
            }};
}

} // namespace crewdose::cli
