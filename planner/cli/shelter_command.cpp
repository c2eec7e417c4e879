// The shelter command: the least areal density that keeps a design event within the targets.
#include "planner/cli/atomic_file.hpp"
#include "planner/cli/command.hpp"
#include "planner/cli/progress.hpp"
#include "planner/cli/run_cache.hpp"
#include "planner/cli/run_steps.hpp"
#include "planner/report/shelter_chart.hpp"
#include "planner/report/shelter_html.hpp"
#include "planner/report/shelter_report.hpp"
#include "planner/study/study.hpp"

#include <filesystem>
#include <memory>
#include <string>
#include <vector>

namespace crewdose::cli {

Command add_shelter_command(CLI::App& app) {
    struct Options {
        std::string format = "text";
        std::string scenario_path;
        std::string location_id;
        std::string event_id;
        std::vector<std::string> shelter_materials;
        std::vector<std::string> shelter_targets;
        std::string shelter_layer;
        double shelter_max = 200.0;
        std::string out_path;
        std::string chart_path;
        std::string html_path;
        bool quiet = false;
        bool no_cache = false;
    };
    auto o = std::make_shared<Options>();
    CLI::App* const sub = [&] {
        auto& format = o->format;
        auto& scenario_path = o->scenario_path;
        auto& location_id = o->location_id;
        auto& event_id = o->event_id;
        auto& shelter_materials = o->shelter_materials;
        auto& shelter_targets = o->shelter_targets;
        auto& shelter_layer = o->shelter_layer;
        auto& shelter_max = o->shelter_max;
        auto* shelter = app.add_subcommand(
            "shelter",
            "Size a storm shelter: the least areal density of each material that keeps the design "
            "event, received whole in the shelter, plus the crew's highest other 30-day dose "
            "within "
            "every target (default: the 30-day planning limits; uncertainty factor and the "
            "reactions "
            "bracket applied; the location's body model: at a phantom location the heart and brain "
            "limits are targets too). Without --layer a uniform shell "
            "is added around the dose point; with --layer SOLID:LAYER the material is added "
            "directly "
            "inside that layer of the solid and the added mass is given for its real geometry. "
            "Prints the answer per material and a dose-thickness table around it; a target that no "
            "thickness up to --max-g-cm2 meets is reported as not achievable, and one that the "
            "crew's other 30-day dose alone already reaches is said so (no shelter can meet it; "
            "exit 1).\nExample: crewdose "
            "shelter scenarios/lunar-demo.toml --event design-spe --location storm-shelter "
            "--material water --material polyethylene --target bfo=150 --chart shelter.svg");
        shelter->add_option("scenario", scenario_path, "scenario file (TOML)")->required();
        shelter->add_option("--event,-e", event_id, "the design event (an event id)")->required();
        shelter->add_option("--location,-l", location_id, "the shelter's location id")->required();
        shelter->add_option("--material,-m", shelter_materials,
                            "material to add (repeat for several; default water)");
        shelter->add_option("--target,-t", shelter_targets,
                            "ORGAN=VALUE in mGy-Eq, e.g. bfo=250mGyEq (repeat; any organ with a "
                            "30-day limit that the location's body model gives: bfo, lens, skin, "
                            "and heart and brain with the phantom; others keep their 30-day "
                            "planning limit)");
        shelter->add_option("--layer", shelter_layer,
                            "SOLID:LAYER, the wall layer to back with the material (LAYER: its "
                            "number, 1 = outermost, or its material)");
        shelter->add_option("--max-g-cm2", shelter_max, "largest areal density to try")
            ->capture_default_str();
        shelter
            ->add_option("--format,-f", format,
                         "text, json or csv. CSV columns: material, areal_density_g_cm2, organ, "
                         "event_mGyEq, other_30d_mGyEq, target_mGyEq, row, achievable, "
                         "added_mass_kg; first a row = answer line per material (the least "
                         "added areal density, empty when none is found; the binding organ and "
                         "its event dose there; achievable yes, no or impossible; the added mass "
                         "with --layer), then row = curve lines (the dose-thickness table, "
                         "achievable and added_mass_kg empty)")
            ->capture_default_str();
        shelter->add_option("--out,-o", o->out_path, kOutHelp);
        shelter->add_option("--chart", o->chart_path,
                            "also draw a chart to this SVG file: per material, the event's dose "
                            "in the shelter plus the crew's other 30-day dose against the added "
                            "areal density, with the target line and each material's answer "
                            "marked; the cautions on top (written only when the sizing "
                            "completes)");
        shelter->add_option("--html", o->html_path,
                            "also write the sizing as one HTML file: the answer table, the "
                            "cautions, the chart of --chart and the whole text report, "
                            "self-contained (opens without a network, prints as shown; written "
                            "when the sizing completes, a target not met included)");
        add_quiet_flag(shelter, o->quiet);
        add_no_cache_flag(shelter, o->no_cache);
        return shelter;
    }();
    return {sub, [o] {
                auto& format = o->format;
                auto& scenario_path = o->scenario_path;
                auto& location_id = o->location_id;
                auto& event_id = o->event_id;
                auto& shelter_materials = o->shelter_materials;
                auto& shelter_targets = o->shelter_targets;
                auto& shelter_layer = o->shelter_layer;
                auto& shelter_max = o->shelter_max;
                const auto fmt_choice = planner::parse_output_format(format);
                auto sc = load_for_outputs(
                    scenario_path,
                    {{"--out", o->out_path}, {"--chart", o->chart_path}, {"--html", o->html_path}});
                ProgressLine progress(o->quiet);
                const auto cache = open_run_cache(o->no_cache);
                const planner::Study study = compute_study(std::move(sc), progress, cache.get());
                planner::ShelterRequest request;
                request.event_id = event_id;
                request.location_id = location_id;
                if (!shelter_materials.empty()) {
                    request.materials = shelter_materials;
                }
                for (const auto& t : shelter_targets) {
                    planner::parse_shelter_target(t, request.targets);
                }
                if (!shelter_layer.empty()) {
                    planner::parse_shelter_layer(study, shelter_layer, request);
                }
                request.max_g_cm2 = shelter_max;
                progress.stage("sizing the shelter");
                const auto report =
                    planner::size_shelter(study, request, [&](double f) { progress.update(f); });
                progress.finish();
                const RunStamp stamp = run_stamp(&study.scenario());
                // Every file is prepared before any is written.
                const std::string text = stamped(
                    planner::format_shelter_report(study, report, fmt_choice), fmt_choice, stamp);
                const std::string chart =
                    o->chart_path.empty() ? "" : planner::format_shelter_chart(study, report);
                const std::string html =
                    o->html_path.empty()
                        ? ""
                        : planner::format_shelter_html(study, report, html_about(stamp));
                write_outputs({{"--chart", o->chart_path, chart}, {"--html", o->html_path, html}},
                              text, o->out_path);
                for (const auto& a : report.answers) {
                    if (!a.achievable) {
                        return 1;
                    }
                }
                return 0;
            }};
}

} // namespace crewdose::cli
