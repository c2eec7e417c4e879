// crewdose command line: parses arguments and calls the planner library; no physics here.
#include "planner/analyses/shelter.hpp"
#include "planner/analyses/storm.hpp"
#include "planner/cli/atomic_file.hpp"
#include "planner/report/check_report.hpp"
#include "planner/report/depth_report.hpp"
#include "planner/report/gcr_report.hpp"
#include "planner/report/output_format.hpp"
#include "planner/report/physics_report.hpp"
#include "planner/report/shelter_report.hpp"
#include "planner/report/shielding_report.hpp"
#include "planner/report/storm_report.hpp"
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/spectrum_spec.hpp"
#include "planner/scenario/time_format.hpp"
#include "planner/study/result_guard.hpp"

#include "exposure/parameter_error.hpp"
#include "exposure/range_table.hpp"

#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <exception>
#include <filesystem>
#include <optional>
#include <string>
#include <unistd.h>

namespace {

constexpr int kExitBadInput = 2;
/// A result that could not be computed or an unexpected error: a defect of crewdose, never an
/// abort, and nothing written.
constexpr int kExitInternalFault = 3;

void write_stdout(const std::string& text) {
    std::fwrite(text.data(), 1, text.size(), stdout);
}

} // namespace

int main(int argc, char** argv) {
    using namespace crewdose;
    CLI::App app{"crewdose: radiation dose planning for crewed lunar, Mars and deep-space "
                 "missions.\n\nResults support, and never replace, review by licensed "
                 "radiation-protection staff.\nExit codes: 0 success; 1 a planning limit or "
                 "target not met (check, storm, shelter); 2 bad input or usage; 3 internal "
                 "fault (a result that could not be computed: nothing is written).",
                 "crewdose"};
    app.require_subcommand(1);
    app.set_version_flag("--version", "crewdose 0.1.0");

    std::string format = "text";
    std::string material = "water";
    std::string particle = "proton";
    std::string energies = "1,10,100,1000";

    const exposure::EnergyGridSpec grid{};
    auto* range = app.add_subcommand(
        "range", "Stopping power, LET and CSDA range of a particle in a material.\n"
                 "Example: crewdose range --material aluminium --particle proton "
                 "--energy 1,10,100,1000");
    range->add_option("--material,-m", material, "built-in material id (see 'crewdose materials')")
        ->capture_default_str();
    range
        ->add_option("--particle,-p", particle,
                     "proton, alpha, or a bare nucleus up to nickel by name or symbol "
                     "(carbon, C, iron, Fe)")
        ->capture_default_str();
    range
        ->add_option("--energy,-e", energies,
                     fmt::format("kinetic energies per nucleon in MeV/n, comma-separated, "
                                 "{} to {}",
                                 grid.min_MeV_per_n, grid.max_MeV_per_n))
        ->capture_default_str();
    range
        ->add_option("--format,-f", format,
                     "text (4 significant figures), json (full "
                     "precision) or csv")
        ->capture_default_str();

    auto* materials =
        app.add_subcommand("materials", "List the built-in materials: id, density, mean "
                                        "excitation energy I and composition by mass.");
    materials->add_option("--format,-f", format, "text, json (with sources) or csv")
        ->capture_default_str();

    std::string spectrum;
    std::string depths = "0.5,1,2,5,10,20,50";
    std::string tissue_depth = "bfo";
    std::string shield = "aluminium";
    auto* depth = app.add_subcommand(
        "depth", "Dose of an SPE spectrum at a tissue depth behind a uniform shield (the dose at "
                 "the centre of a spherical shell), per shield areal density.\n"
                 "Example: crewdose depth --spectrum "
                 "\"band:J0=1e10,gamma_a=1.1,gamma_b=3.5,R0_GV=0.25\" --material aluminium "
                 "--depths 0.5,1,2,5,10,20,50 --tissue-depth bfo\n\n" +
                     planner::spectrum_help());
    depth->add_option("--spectrum,-s", spectrum, "the SPE proton spectrum (see above)")->required();
    // The uniform-shield options that depth and gcr share.
    auto add_shield_options = [&](CLI::App* sub, std::string& depth_list) {
        sub->add_option("--material,-m", shield, "shield material id (see 'crewdose materials')")
            ->capture_default_str();
        sub->add_option("--depths,-d", depth_list,
                        "shield areal densities in g/cm2, comma-separated, 0 to 1000")
            ->capture_default_str();
        sub->add_option("--tissue-depth,-t", tissue_depth,
                        "where the dose is scored: skin (0.07 mm), lens (3 mm), bfo (5 cm) or a "
                        "number of g/cm2 of tissue; the named depths are the quick screening "
                        "model")
            ->capture_default_str();
    };
    std::string detector = "soft-tissue";
    auto add_detector_option = [&](CLI::App* sub) {
        sub->add_option("--detector", detector,
                        "material the dose is scored in (after the shield and the tissue "
                        "depth): soft-tissue for the body, or a detector's material such as "
                        "silicon or water to compare with a measurement (see 'crewdose "
                        "materials')")
            ->capture_default_str();
    };
    add_shield_options(depth, depths);
    add_detector_option(depth);
    depth->add_option("--format,-f", format, "text (3 significant figures), json or csv")
        ->capture_default_str();

    std::string gcr_phi = "400";
    std::string gcr_depths = "0,1,2,5,10,20,50,100";
    bool per_year = false;
    std::string gcr_site = "free-space";
    std::string gcr_pressure = "750";
    auto* gcr = app.add_subcommand(
        "gcr", "Galactic cosmic-ray (GCR) dose rate at a tissue depth behind a uniform shield (the "
               "dose at the centre of a spherical shell, in free space or, with --site, on the "
               "Moon or Mars), per shield areal density: absorbed dose, dose equivalent, "
               "RBE-weighted dose and the mean quality factor of the whole field (the nuclei with "
               "nuclear removal and projectile fragments, and the secondaries of nucleon "
               "reactions: neutrons, protons, light ions, target fragments), the dose equivalent "
               "without any reaction (for each quantity the higher of the two is what 'check' "
               "uses for limits while the model is not validated) and of the primaries alone, "
               "and the shares of the dose equivalent by charge and by source.\n"
               "Example: crewdose gcr --phi 400 --material polyethylene --depths 0,5,10,20,50 "
               "--tissue-depth bfo --per-year");
    gcr->add_option("--phi,-p", gcr_phi,
                    "modulation potential in MV, 0 to 3000, for the Burger et al. 2000 "
                    "interstellar spectrum (about 400 near solar minimum, 1000 or more near "
                    "maximum; a phi derived with another spectrum is not interchangeable)")
        ->capture_default_str();
    add_shield_options(gcr, gcr_depths);
    gcr->add_flag("--per-year", per_year, "rates per year of 365.25 days instead of per day");
    gcr->add_option("--site", gcr_site,
                    "free-space (the shield all round), moon (the ground blocks the lower half "
                    "of the sky) or mars (ground, and the atmosphere's slant column above the "
                    "shield); on a surface the mean over 256 directions")
        ->capture_default_str();
    gcr->add_option("--surface-pressure-Pa", gcr_pressure,
                    "Mars only: surface pressure, 100 to 2000 Pa (about 600 at the mean datum, "
                    "750 to 900 in low-lying sites such as Gale crater)")
        ->capture_default_str();
    add_detector_option(gcr);
    gcr->add_option("--format,-f", format, "text (3 significant figures), json or csv")
        ->capture_default_str();

    std::string scenario_path;
    std::string out_path;
    std::string series_path;
    bool allow_gaps = false;
    auto* check = app.add_subcommand(
        "check", "Check every crew member's doses along the scenario's timeline against the "
                 "30-day, annual and career planning limits; report margins and where they are "
                 "smallest. Doses are SPE plus the galactic cosmic-ray (GCR) background, "
                 "shown apart.\nBody: each location's body = \"phantom\" (the stylised adult "
                 "phantom: BFO as the active marrow, heart, brain, lens, skin and the ICRP 103 "
                 "effective dose, each organ shielded by the body as placed: posture standing "
                 "or lying, heading_deg) or \"quick\" (default; skin, lens and BFO at 0.07 mm, "
                 "3 mm and 5 cm of tissue in every direction, a conservative screen without "
                 "heart, brain or effective dose).\nGCR: set the modulation potential with "
                 "mission.gcr_phi_MV "
                 "(and [[mission.gcr_modulation]] for later changes); about 400 MV near solar "
                 "minimum, 1000 MV or more near maximum, for the Burger et al. 2000 interstellar "
                 "spectrum the model uses: a phi derived with another spectrum is not "
                 "interchangeable. Without a value the solar-minimum example (400 MV) is used.\n"
                 "Example: crewdose check scenarios/lunar-demo.toml\nExit 0: all "
                 "evaluated limits met; 1: a limit exceeded; 2: bad input; 3: internal fault.");
    check->add_option("scenario", scenario_path, "scenario file (TOML; see scenarios/README.md)")
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
    check->add_flag("--allow-gaps", allow_gaps,
                    "accept gaps in a crew member's timeline; each gap is charged at the "
                    "location of the activity before it and listed in the report");
    auto* validate = app.add_subcommand(
        "validate", "Parse and check a scenario file, without computing any dose, and list what "
                    "it defines. It accepts exactly the files 'check' accepts: every section, "
                    "key and reference, the solids against overlaps, each dose point against "
                    "the walls, shielding tables read, and each crew member's timeline covering "
                    "the mission (gaps refused unless --allow-gaps, as in 'check').\nExit 0: "
                    "valid; 2: not valid (the message names the file, line and key).");
    validate->add_option("scenario", scenario_path, "scenario file (TOML)")->required();
    validate->add_flag("--allow-gaps", allow_gaps,
                       "accept gaps in a crew member's timeline, as 'check --allow-gaps' does");

    std::string location_id;
    std::string event_id;
    auto* shielding = app.add_subcommand(
        "shielding", "What a location's shielding looks like: the areal-density distribution "
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

    std::vector<std::string> shelter_materials;
    std::vector<std::string> shelter_targets;
    std::string shelter_layer;
    double shelter_max = 200.0;
    auto* shelter = app.add_subcommand(
        "shelter",
        "Size a storm shelter: the least areal density of each material that keeps the design "
        "event, received whole in the shelter, plus the crew's highest other 30-day dose within "
        "every target (default: the 30-day planning limits; uncertainty factor and the removal "
        "bracket applied; the location's body model: at a phantom location the heart and brain "
        "limits are targets too). Without --layer a uniform shell "
        "is added around the dose point; with --layer SOLID:LAYER the material is added directly "
        "inside that layer of the solid and the added mass is given for its real geometry. "
        "Prints the answer per material and a dose-thickness table around it; a target that no "
        "thickness up to --max-g-cm2 meets is reported as not achievable.\nExample: crewdose "
        "shelter scenarios/lunar-demo.toml --event design-spe --location storm-shelter "
        "--material water --material polyethylene --target bfo=150");
    shelter->add_option("scenario", scenario_path, "scenario file (TOML)")->required();
    shelter->add_option("--event,-e", event_id, "the design event (an event id)")->required();
    shelter->add_option("--location,-l", location_id, "the shelter's location id")->required();
    shelter->add_option("--material,-m", shelter_materials,
                        "material to add (repeat for several; default water)");
    shelter->add_option("--target,-t", shelter_targets,
                        "ORGAN=VALUE in mGy-Eq, e.g. bfo=250mGyEq (repeat; organs bfo, lens, "
                        "skin; others keep their 30-day planning limit)");
    shelter->add_option("--layer", shelter_layer,
                        "SOLID:LAYER, the wall layer to back with the material (LAYER: its "
                        "number, 1 = outermost, or its material)");
    shelter->add_option("--max-g-cm2", shelter_max, "largest areal density to try")
        ->capture_default_str();
    shelter->add_option("--format,-f", format, "text, json or csv")->capture_default_str();

    std::string storm_onset;
    bool storm_sweep = false;
    std::string storm_step = "10min";
    std::string storm_from;
    std::string storm_to;
    bool no_response = false;
    auto* storm = app.add_subcommand(
        "storm",
        "What if a solar particle event starts at a given moment? t0 is when the flare is seen "
        "at the site (its light has arrived); protons of each energy then arrive scatter-free "
        "along the field line, L/v(E) - r/c later: the earliest possible arrival (an event with "
        "a fixed arrival_delay_h in the scenario arrives at once). The crew respond by the "
        "scenario's [storm_response] policy (warning delay, return from EVA, move to the "
        "shelter, all-clear). Per crew member and organ: the event's dose with and without the "
        "response, what the response saved, and the 30-day margin. Organs: BFO, lens and skin; "
        "heart and brain too for a crew member whose every possible place (timeline, shelter, "
        "refuges) uses the phantom body model.\n"
        "--onset T: one what-if. --sweep: t0 swept over the timeline every --step (default "
        "10min, --from/--to default the mission), plus the onsets where the policy changes; per "
        "crew member the worst onset, per EVA a go/no-go, and a text profile.\n"
        "Example: crewdose storm scenarios/lunar-demo.toml --event design-spe --sweep\n"
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

    try {
        app.parse(argc, argv);
    } catch (const CLI::CallForHelp& e) {
        return app.exit(e);
    } catch (const CLI::CallForAllHelp& e) {
        return app.exit(e);
    } catch (const CLI::CallForVersion& e) {
        return app.exit(e);
    } catch (const CLI::ParseError& e) {
        std::fprintf(stderr, "crewdose: %s\nRun 'crewdose --help' for the commands.\n", e.what());
        return kExitBadInput;
    }

    try {
        const auto fmt_choice = planner::parse_output_format(format);
        if (range->parsed()) {
            const auto& mat = planner::material_by_id(material);
            const auto part = planner::particle_by_name_or_throw(particle);
            const auto list = planner::parse_energy_list(energies, "--energy", grid.min_MeV_per_n,
                                                         grid.max_MeV_per_n);
            write_stdout(planner::format_range_report(
                mat, part, planner::range_rows(mat, part, list), fmt_choice));
        } else if (depth->parsed()) {
            const auto spec = planner::parse_spectrum(spectrum, "--spectrum");
            const auto& mat = planner::material_by_id(shield);
            const auto tissue = planner::parse_tissue_depth(tissue_depth, "--tissue-depth");
            const auto list = planner::parse_depth_list(depths, "--depths");
            const auto& medium = planner::material_by_id(detector, "--detector");
            write_stdout(planner::format_depth_report(
                spec, mat, tissue, planner::depth_rows(spec, mat, tissue, list, medium), fmt_choice,
                medium));
        } else if (gcr->parsed()) {
            const double phi = planner::parse_phi(gcr_phi, "--phi");
            const auto& mat = planner::material_by_id(shield);
            const auto tissue = planner::parse_tissue_depth(tissue_depth, "--tissue-depth");
            const auto list = planner::parse_depth_list(gcr_depths, "--depths");
            planner::GcrSiteSpec site;
            site.kind = planner::parse_site(gcr_site, "--site");
            site.surface_pressure_Pa =
                planner::parse_surface_pressure(gcr_pressure, "--surface-pressure-Pa");
            const auto& medium = planner::material_by_id(detector, "--detector");
            write_stdout(planner::format_gcr_depth_report(
                phi, mat, tissue, planner::gcr_depth_rows(phi, mat, tissue, list, site, medium),
                fmt_choice, per_year, site, medium));
        } else if (shielding->parsed()) {
            // One location's view computes that location alone.
            const planner::Study study(planner::load_scenario(scenario_path), location_id);
            write_stdout(planner::format_shielding_report(
                study, location_id,
                event_id.empty() ? std::nullopt : std::optional<std::string>(event_id),
                fmt_choice));
        } else if (shelter->parsed()) {
            const planner::Study study(planner::load_scenario(scenario_path));
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
            const auto report = planner::size_shelter(study, request);
            write_stdout(planner::format_shelter_report(study, report, fmt_choice));
            for (const auto& a : report.answers) {
                if (!a.achievable) {
                    return 1;
                }
            }
        } else if (storm->parsed()) {
            if (storm_onset.empty() && !storm_sweep) {
                throw InputError({"command line", 0}, "storm",
                                 "give --onset TIME for one what-if or --sweep");
            }
            const planner::Study study(planner::load_scenario(scenario_path));
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
                write_stdout(planner::format_storm_whatif(context, w, fmt_choice));
                return w.any_exceeded() ? 1 : 0;
            }
            const auto step = planner::parse_duration(storm_step, "--step");
            const auto from = mission_time(storm_from, "--from", mission.start);
            const auto to = mission_time(storm_to, "--to", mission.end);
            if (!(to > from)) {
                throw InputError({"command line", 0}, "--to", "must be after --from");
            }
            const bool tty = isatty(fileno(stderr)) != 0;
            const auto started = std::chrono::steady_clock::now();
            bool shown = false;
            auto progress = [&](double f) {
                if (tty && std::chrono::steady_clock::now() - started > std::chrono::seconds(1)) {
                    std::fprintf(stderr, "\rsweeping onsets: %3.0f %%", 100.0 * f);
                    shown = true;
                }
            };
            const auto sweep = planner::sweep_storm(context, from, to, step, progress);
            if (shown) {
                std::fprintf(stderr, "\r%30s\r", "");
            }
            write_stdout(planner::format_storm_sweep(context, sweep, fmt_choice));
            return sweep.any_exceeded() ? 1 : 0;
        } else if (validate->parsed()) {
            const auto sc = planner::load_scenario(scenario_path);
            if (!allow_gaps) {
                planner::refuse_timeline_gaps(sc);
            }
            write_stdout(planner::format_validation(sc));
        } else if (check->parsed()) {
            auto sc = planner::load_scenario(scenario_path);
            if (!allow_gaps) {
                planner::refuse_timeline_gaps(sc);
            }
            const planner::Study study(std::move(sc));
            std::vector<planner::NamedFile> inputs{{"scenario", scenario_path}};
            for (const auto& loc : study.scenario().locations) {
                if (loc.shielding_table_file) {
                    inputs.push_back(
                        {"shielding table", (std::filesystem::path(scenario_path).parent_path() /
                                             *loc.shielding_table_file)
                                                .string()});
                }
            }
            planner::refuse_clashing_outputs(inputs,
                                             {{"--out", out_path}, {"--series", series_path}});
            planner::LedgerOptions options;
            options.allow_gaps = allow_gaps;
            const auto ledger = planner::build_ledger(study, options);
            const bool colour = out_path.empty() && fmt_choice == planner::OutputFormat::text &&
                                isatty(fileno(stdout)) != 0 && std::getenv("NO_COLOR") == nullptr;
            const std::string report =
                planner::format_check_report(study, ledger, fmt_choice, colour);
            // Both files are prepared before either is written, so bad input writes nothing.
            const std::string series =
                series_path.empty() ? "" : planner::format_series(study, ledger);
            if (!series_path.empty()) {
                planner::write_file_atomically(series_path, series, "--series");
            }
            if (out_path.empty()) {
                write_stdout(report);
            } else {
                planner::write_file_atomically(out_path, report, "--out");
            }
            return ledger.any_exceeded ? 1 : 0;
        } else if (materials->parsed()) {
            write_stdout(planner::format_materials_report(fmt_choice));
        }
    } catch (const InputError& e) {
        std::fprintf(stderr, "crewdose: %s\n", e.what());
        return kExitBadInput;
    } catch (const exposure::ParameterError& e) {
        std::fprintf(stderr, "crewdose: %s\n", e.what());
        return kExitBadInput;
    } catch (const planner::ResultFault& e) {
        std::fprintf(stderr,
                     "crewdose: internal fault: %s. No result was written; this is a defect of "
                     "crewdose, please report it with the input.\n",
                     e.what());
        return kExitInternalFault;
    } catch (const std::exception& e) {
        std::fprintf(stderr,
                     "crewdose: internal fault: %s. No result was written; this is a defect of "
                     "crewdose, please report it with the input.\n",
                     e.what());
        return kExitInternalFault;
    } catch (...) {
        std::fprintf(stderr, "crewdose: internal fault of unknown kind. No result was written; "
                             "this is a defect of crewdose, please report it with the input.\n");
        return kExitInternalFault;
    }
    return 0;
}
