// The look-up commands that need no scenario: range, materials, events, depth and gcr.
#include "planner/cli/command.hpp"
#include "planner/cli/run_cache.hpp"
#include "planner/report/depth_chart.hpp"
#include "planner/report/depth_report.hpp"
#include "planner/report/events_report.hpp"
#include "planner/report/gcr_chart.hpp"
#include "planner/report/gcr_report.hpp"
#include "planner/report/physics_report.hpp"
#include "planner/scenario/scenario.hpp"
#include "planner/scenario/spectrum_spec.hpp"

#include "exposure/range_table.hpp"

#include <fmt/format.h>

#include <memory>
#include <string>
#include <vector>

namespace crewdose::cli {
namespace {

// The uniform-shield and detector options that depth and gcr share.
struct ShieldOptions {
    std::string shield = "aluminium";
    std::string tissue_depth = "bfo";
    std::string detector = "soft-tissue";
};

void add_shield_options(CLI::App* sub, ShieldOptions& s, std::string& depth_list) {
    auto& shield = s.shield;
    auto& tissue_depth = s.tissue_depth;
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
}

void add_detector_option(CLI::App* sub, ShieldOptions& s) {
    auto& detector = s.detector;
    sub->add_option("--detector", detector,
                    "material the dose is scored in (after the shield and the tissue "
                    "depth): soft-tissue for the body, or a detector's material such as "
                    "silicon or water to compare with a measurement (see 'crewdose "
                    "materials')")
        ->capture_default_str();
}

// --out and --chart of depth and gcr, refused before the run when they cannot be written or
// name one file (these commands read no file, so there is no input to clash with).
void refuse_bad_outputs(const std::string& out_path, const std::string& chart_path) {
    const std::vector<planner::NamedFile> outputs{{"--out", out_path}, {"--chart", chart_path}};
    planner::refuse_unwritable_outputs(outputs);
    planner::refuse_clashing_outputs({}, outputs);
}

// The chart (when asked for) and then the report, each written whole; both were prepared
// before either is written.
void write_outputs(const std::string& report, const std::string& out_path, const std::string& chart,
                   const std::string& chart_path) {
    if (!chart_path.empty()) {
        planner::write_file_atomically(chart_path, chart, "--chart");
    }
    write_report(report, out_path);
}

} // namespace

Command add_range_command(CLI::App& app) {
    struct Options {
        std::string format = "text";
        std::string material = "water";
        std::string particle = "proton";
        std::string energies = "1,10,100,1000";
    };
    auto o = std::make_shared<Options>();
    const exposure::EnergyGridSpec grid{};
    CLI::App* const sub = [&] {
        auto& format = o->format;
        auto& material = o->material;
        auto& particle = o->particle;
        auto& energies = o->energies;
        auto* range = app.add_subcommand(
            "range", "Stopping power, LET and CSDA range of a particle in a material.\n"
                     "Example: crewdose range --material aluminium --particle proton "
                     "--energy 1,10,100,1000");
        range
            ->add_option("--material,-m", material,
                         "built-in material id (see 'crewdose materials')")
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

        return range;
    }();
    return {
        sub, [o, grid] {
            auto& format = o->format;
            auto& material = o->material;
            auto& particle = o->particle;
            auto& energies = o->energies;
            const auto fmt_choice = planner::parse_output_format(format);

            const auto& mat = planner::material_by_id(material);
            const auto part = planner::particle_by_name_or_throw(particle);
            const auto list = planner::parse_energy_list(energies, "--energy", grid.min_MeV_per_n,
                                                         grid.max_MeV_per_n);
            write_stdout(stamped(planner::format_range_report(
                                     mat, part, planner::range_rows(mat, part, list), fmt_choice),
                                 fmt_choice, run_stamp(nullptr)));
            return 0;
        }};
}

Command add_materials_command(CLI::App& app) {
    auto format = std::make_shared<std::string>("text");
    auto* materials =
        app.add_subcommand("materials", "List the built-in materials: id, density, mean "
                                        "excitation energy I and composition by mass.");
    materials->add_option("--format,-f", *format, "text, json (with sources) or csv")
        ->capture_default_str();

    return {materials, [format] {
                const auto fmt_choice = planner::parse_output_format(*format);
                write_stdout(stamped(planner::format_materials_report(fmt_choice), fmt_choice,
                                     run_stamp(nullptr)));
                return 0;
            }};
}

Command add_events_command(CLI::App& app) {
    auto format = std::make_shared<std::string>("text");
    auto* events = app.add_subcommand(
        "events", "List the library of reference solar particle events (published fits of "
                  "statistical design events, and of historical events as sources allow): their "
                  "integral fluences, sources and known gaps. A scenario names one with "
                  "spectrum = \"library:ID\", optionally scaled (\"library:ID,scale=0.5\").");
    events->add_option("--format,-f", *format, "text, json or csv")->capture_default_str();
    return {events, [format] {
                const auto fmt_choice = planner::parse_output_format(*format);
                write_stdout(stamped(planner::format_events_report(fmt_choice), fmt_choice,
                                     run_stamp(nullptr)));
                return 0;
            }};
}

Command add_depth_command(CLI::App& app) {
    struct Options {
        std::string format = "text";
        std::string spectrum;
        std::string depths = "0.5,1,2,5,10,20,50";
        std::string out_path;
        std::string chart_path;
        ShieldOptions s;
        bool no_cache = false;
    };
    auto o = std::make_shared<Options>();
    CLI::App* const sub = [&] {
        auto& format = o->format;
        auto& spectrum = o->spectrum;
        auto& depths = o->depths;
        auto* depth = app.add_subcommand(
            "depth",
            "Dose of an SPE spectrum at a tissue depth behind a uniform shield (the dose at "
            "the centre of a spherical shell), per shield areal density.\n"
            "Example: crewdose depth --spectrum "
            "\"band:J0=1e10,gamma_a=1.1,gamma_b=3.5,R0_GV=0.25\" --material aluminium "
            "--depths 0.5,1,2,5,10,20,50 --tissue-depth bfo --chart depth.svg\n\n" +
                planner::spectrum_help());
        depth->add_option("--spectrum,-s", spectrum, "the SPE proton spectrum (see above)")
            ->required();
        add_shield_options(depth, o->s, depths);
        add_detector_option(depth, o->s);
        depth->add_option("--format,-f", format, "text (3 significant figures), json or csv")
            ->capture_default_str();
        depth->add_option("--out,-o", o->out_path, kOutHelp);
        depth->add_option(
            "--chart", o->chart_path,
            "also draw the design curve to this SVG file, a point per row of the report against "
            "the shield's areal density (g/cm2): the absorbed dose for limits, of the whole "
            "field and of the primaries alone (mGy), and the dose equivalent (mSv) and "
            "RBE-weighted dose (mGy-Eq) for limits; the spectrum, shield and depth on top with "
            "the cautions, a dose that was not computed drawn as a gap labelled so, never as a "
            "value (written only when the run completes)");
        add_no_cache_flag(depth, o->no_cache);
        return depth;
    }();
    return {sub, [o] {
                auto& format = o->format;
                auto& spectrum = o->spectrum;
                auto& depths = o->depths;
                const auto& [shield, tissue_depth, detector] = o->s;
                const auto fmt_choice = planner::parse_output_format(format);
                // A path that cannot be written fails now, before the computation.
                refuse_bad_outputs(o->out_path, o->chart_path);

                const auto spec = planner::parse_spectrum(spectrum, "--spectrum");
                const auto& mat = planner::material_by_id(shield);
                const auto tissue = planner::parse_tissue_depth(tissue_depth, "--tissue-depth");
                const auto list = planner::parse_depth_list(depths, "--depths");
                const auto& medium = planner::material_by_id(detector, "--detector");
                // One set of rows for the report and the chart: the same numbers in both.
                const auto cache = open_run_cache(o->no_cache);
                const auto rows = planner::depth_rows(spec, mat, tissue, list, medium, cache.get());
                const std::string report = stamped(
                    planner::format_depth_report(spec, mat, tissue, rows, fmt_choice, medium),
                    fmt_choice, run_stamp(nullptr));
                const std::string chart =
                    o->chart_path.empty()
                        ? ""
                        : planner::format_depth_chart(spec, mat, tissue, rows, medium);
                write_outputs(report, o->out_path, chart, o->chart_path);
                return 0;
            }};
}

Command add_gcr_command(CLI::App& app) {
    struct Options {
        std::string format = "text";
        std::string gcr_phi = "400";
        std::string gcr_depths = "0,1,2,5,10,20,50,100";
        bool per_year = false;
        std::string gcr_site = "deep-space";
        std::string gcr_pressure = "750";
        CLI::Option* pressure_option = nullptr; ///< to tell a given pressure from the default
        std::string out_path;
        std::string chart_path;
        ShieldOptions s;
        bool no_cache = false;
    };
    auto o = std::make_shared<Options>();
    CLI::App* const sub = [&] {
        auto& format = o->format;
        auto& gcr_phi = o->gcr_phi;
        auto& gcr_depths = o->gcr_depths;
        auto& per_year = o->per_year;
        auto& gcr_site = o->gcr_site;
        auto& gcr_pressure = o->gcr_pressure;
        auto* gcr = app.add_subcommand(
            "gcr",
            "Galactic cosmic-ray (GCR) dose rate at a tissue depth behind a uniform shield (the "
            "dose at the centre of a spherical shell, in deep space or, with --site, on the "
            "Moon or Mars), per shield areal density: absorbed dose, dose equivalent, "
            "RBE-weighted dose and the mean quality factor of the whole field (the nuclei with "
            "nuclear removal and projectile fragments, and the secondaries of nucleon "
            "reactions: neutrons, protons, light ions, target fragments), the dose equivalent "
            "without any reaction (for each quantity the higher of the two is what 'check' "
            "uses for limits while the model is not validated) and of the primaries alone, "
            "and the shares of the dose equivalent by charge and by source.\n"
            "Example: crewdose gcr --phi 400 --material polyethylene --depths 0,5,10,20,50 "
            "--tissue-depth bfo --per-year --chart gcr.svg");
        gcr->add_option(
               "--phi,-p", gcr_phi,
               "modulation potential in MV (not GV), 100 to 3000, for the Burger et al. 2000 "
               "interstellar spectrum (about 300 to 400 near solar minimum, 1000 or more near "
               "maximum; a phi derived with another spectrum is not interchangeable)")
            ->capture_default_str();
        add_shield_options(gcr, o->s, gcr_depths);
        gcr->add_flag("--per-year", per_year, "rates per year of 365.25 days instead of per day");
        gcr->add_option("--site", gcr_site,
                        "deep-space (the shield all round, no ground), moon (the ground blocks the "
                        "lower half "
                        "of the sky) or mars (ground, and the atmosphere's slant column above the "
                        "shield); on a surface the mean over 256 directions")
            ->capture_default_str();
        o->pressure_option =
            gcr->add_option("--surface-pressure-Pa", gcr_pressure,
                            fmt::format("with --site mars only: surface pressure, {:g} to {:g} "
                                        "Pa (about 600 at the mean datum, 750 to 900 in "
                                        "low-lying sites such as Gale crater)",
                                        planner::kMinSurfacePressure_Pa,
                                        planner::kMaxSurfacePressure_Pa))
                ->capture_default_str();
        add_detector_option(gcr, o->s);
        gcr->add_option("--format,-f", format, "text (3 significant figures), json or csv")
            ->capture_default_str();
        gcr->add_option("--out,-o", o->out_path, kOutHelp);
        gcr->add_option(
            "--chart", o->chart_path,
            "also draw the design curve to this SVG file, a point per row of the report against "
            "the shield's areal density (g/cm2): the dose equivalent rate (mSv per day, or per "
            "year with --per-year) of the whole field, without any nuclear reaction and of the "
            "primaries and fragments alone, and the whole field's absorbed (mGy) and "
            "RBE-weighted (mGy-Eq) dose rates; phi, shield, depth and site on top with the "
            "cautions, a dose that was not computed drawn as a gap labelled so, never as a value "
            "(written only when the run completes)");
        add_no_cache_flag(gcr, o->no_cache);
        return gcr;
    }();
    return {sub, [o] {
                auto& format = o->format;
                auto& gcr_phi = o->gcr_phi;
                auto& gcr_depths = o->gcr_depths;
                auto& per_year = o->per_year;
                auto& gcr_site = o->gcr_site;
                auto& gcr_pressure = o->gcr_pressure;
                const auto& [shield, tissue_depth, detector] = o->s;
                const auto fmt_choice = planner::parse_output_format(format);
                // A path that cannot be written fails now, before the computation.
                refuse_bad_outputs(o->out_path, o->chart_path);

                const double phi = planner::parse_phi(gcr_phi, "--phi");
                const auto& mat = planner::material_by_id(shield);
                const auto tissue = planner::parse_tissue_depth(tissue_depth, "--tissue-depth");
                const auto list = planner::parse_depth_list(gcr_depths, "--depths");
                planner::GcrSiteSpec site;
                site.kind = planner::parse_site(gcr_site, "--site");
                // Elsewhere there is no atmosphere: a pressure given would be ignored.
                if (o->pressure_option->count() > 0 && site.kind != planner::GcrSite::mars) {
                    throw InputError({"command line", 0}, "--surface-pressure-Pa",
                                     fmt::format("applies only with --site mars (the Martian "
                                                 "atmosphere); the site here is '{}', which has "
                                                 "no atmosphere: leave it out or give --site mars",
                                                 gcr_site));
                }
                site.surface_pressure_Pa =
                    planner::parse_surface_pressure(gcr_pressure, "--surface-pressure-Pa");
                const auto& medium = planner::material_by_id(detector, "--detector");
                // One set of rows for the report and the chart: the same numbers in both.
                const auto cache = open_run_cache(o->no_cache);
                const auto rows =
                    planner::gcr_depth_rows(phi, mat, tissue, list, site, medium, cache.get());
                const std::string report =
                    stamped(planner::format_gcr_depth_report(phi, mat, tissue, rows, fmt_choice,
                                                             per_year, site, medium),
                            fmt_choice, run_stamp(nullptr));
                const std::string chart =
                    o->chart_path.empty()
                        ? ""
                        : planner::format_gcr_chart(phi, mat, tissue, rows, per_year, site, medium);
                write_outputs(report, o->out_path, chart, o->chart_path);
                return 0;
            }};
}

} // namespace crewdose::cli
