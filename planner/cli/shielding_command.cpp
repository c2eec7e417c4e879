// The shielding command: what one location's shielding looks like.
#include "planner/cli/command.hpp"
#include "planner/cli/progress.hpp"
#include "planner/cli/run_cache.hpp"
#include "planner/cli/run_steps.hpp"
#include "planner/report/shielding_report.hpp"
#include "planner/study/study.hpp"

#include <optional>

#include <memory>
#include <string>
#include <vector>

namespace crewdose::cli {

Command add_shielding_command(CLI::App& app) {
    struct Options {
        std::string format = "text";
        std::string scenario_path;
        std::string location_id;
        std::string event_id;
        std::string out_path;
        bool quiet = false;
        bool no_cache = false;
    };
    auto o = std::make_shared<Options>();
    CLI::App* const sub = [&] {
        auto& format = o->format;
        auto& scenario_path = o->scenario_path;
        auto& location_id = o->location_id;
        auto& event_id = o->event_id;
        auto* shielding = app.add_subcommand(
            "shielding",
            "What a location's shielding looks like: the areal-density distribution "
            "over directions, the sky blocked by the ground, per organ for the body "
            "model with its GCR dose rate (with / without nuclear reactions), and with "
            "--event the organ doses of that event there.\nExample: "
            "crewdose shielding scenarios/lunar-demo.toml --location storm-shelter "
            "--event design-spe");
        shielding->add_option("scenario", scenario_path, "scenario file (TOML)")->required();
        shielding->add_option("--location,-l", location_id, "location id")->required();
        shielding->add_option("--event,-e", event_id, "event id: also show its organ doses there");
        shielding
            ->add_option("--format,-f", format,
                         "text, json or csv (one row per organ; the location's figures on every "
                         "row)")
            ->capture_default_str();
        shielding->add_option("--out,-o", o->out_path, kOutHelp);
        add_quiet_flag(shielding, o->quiet);
        add_no_cache_flag(shielding, o->no_cache);
        return shielding;
    }();
    return {sub, [o] {
                auto& format = o->format;
                auto& scenario_path = o->scenario_path;
                auto& location_id = o->location_id;
                auto& event_id = o->event_id;
                const auto fmt_choice = planner::parse_output_format(format);

                auto sc = load_for_outputs(scenario_path, {{"--out", o->out_path}});
                ProgressLine progress(o->quiet);
                // One location's view computes that location alone.
                const auto cache = open_run_cache(o->no_cache);
                const planner::Study study =
                    compute_study(std::move(sc), progress, cache.get(), location_id,
                                  "computing the location's doses");
                progress.finish();
                write_report(stamped(planner::format_shielding_report(
                                         study, location_id,
                                         event_id.empty() ? std::nullopt
                                                          : std::optional<std::string>(event_id),
                                         fmt_choice),
                                     fmt_choice, run_stamp(&study.scenario())),
                             o->out_path);
                return 0;
            }};
}

} // namespace crewdose::cli
