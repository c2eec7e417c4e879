#include "depth_report.hpp"

#include "cautions.hpp"
#include "input_error.hpp"
#include "location_response.hpp"
#include "number_format.hpp"
#include "number_parse.hpp"
#include "result_guard.hpp"
#include "scenario.hpp"
#include "spectrum_spec.hpp"
#include "study.hpp"

#include "exposure/depth_dose.hpp"
#include "exposure/material_library.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>

namespace crewdose::planner {
namespace {

const SourceLocation kCommandLine{"command line", 0};

const char* kDepthModelText =
    "Model: the event's protons by straight-ahead CSDA transport through the shield and the "
    "tissue, exact per energy, with nuclear removal; their secondaries (neutrons, protons, "
    "deuterons, tritons, helions and alphas of nucleon reactions, from ENDF/B-VIII.1 to 150 "
    "MeV and a fit to measured neutron spectra above; target fragments and slow light ions "
    "deposited where they are made) from a straight-ahead march of the whole field, as its "
    "ratio to the march of the primaries alone. Dose equivalent with ICRP 60 Q(L); "
    "RBE-weighted dose with NCRP 132 values. The first three columns are the higher of the "
    "whole field's dose and the primaries' without any removal (the model is not yet "
    "validated well enough to drop that bracket); 'absorbed, primaries' is the primaries "
    "alone with removal, for comparison. Not modelled: pions and the electromagnetic cascade, "
    "elastic scattering of neutrons on hydrogen, neutrons emitted backwards.";

} // namespace

nlohmann::json dose_si_json(const exposure::DoseQuantities& d) {
    return {{"absorbed_Gy", d.absorbed_Gy},
            {"dose_equivalent_Sv", d.dose_equivalent_Sv},
            {"rbe_weighted_GyEq", d.rbe_weighted_GyEq}};
}

TissueDepth parse_tissue_depth(std::string_view text, std::string_view field) {
    // The quick body model's named depths (skin 0.07 mm, eye lens 3 mm, BFO 5 cm of
    // unit-density tissue).
    for (const auto& o : quick_body_model()) {
        if (text == o.name) {
            const double mm = 10.0 * o.depth_g_cm2;
            return {o.depth_g_cm2, fmt::format("{} ({} of tissue)",
                                               o.name == "lens" ? "eye lens" : organ_label(o.name),
                                               mm >= 10.0 ? fmt::format("{:g} cm", mm / 10.0)
                                                          : fmt::format("{:g} mm", mm))};
        }
    }
    const auto parsed = parse_finite(text);
    const double v = parsed.value_or(-1.0);
    if (!parsed || v < 0.0 || v > 100.0) {
        throw InputError(kCommandLine, std::string(field),
                         fmt::format("'{}' is not a tissue depth; allowed: skin, lens, bfo or a "
                                     "number of g/cm2 from 0 to 100",
                                     text));
    }
    return {v, fmt::format("{:g} g/cm2 of tissue", v)};
}

std::vector<double> parse_depth_list(std::string_view text, std::string_view field) {
    std::vector<double> out;
    for (const auto item : split_commas(text)) {
        const auto v = parse_finite(item);
        if (!v || *v < 0.0 || *v > 1000.0) {
            throw InputError(kCommandLine, std::string(field),
                             fmt::format("'{}' is not a shield areal density; allowed: numbers "
                                         "from 0 to 1000 g/cm2 separated by commas",
                                         item));
        }
        out.push_back(*v);
    }
    return out;
}

std::vector<DepthRow> depth_rows(const exposure::ProtonSpectrum& spectrum,
                                 const exposure::Material& shield, const TissueDepth& tissue,
                                 const std::vector<double>& depths_g_cm2,
                                 const exposure::Material& detector) {
    exposure::TableLibrary tables;
    const exposure::Material& soft = *exposure::find_builtin_material("soft-tissue");
    const exposure::Material& water = *exposure::find_builtin_material("water");
    exposure::DepthDoseSetup setup{&shield, &soft, &water, tissue.g_cm2, exposure::RbeModel{}};
    setup.detector = &detector;
    const auto doses = exposure::depth_dose_curve(tables, setup, spectrum, depths_g_cm2);
    // The secondaries: the march of the event's protons with and without them (the march's
    // own default step), their ratio applied to the exact primaries with removal.
    exposure::TableLibrary march_tables(gcr_grid());
    exposure::MarchOptions whole_options;
    whole_options.secondaries = true;
    exposure::FragmentTransport whole(march_tables, whole_options);
    exposure::FragmentTransport primaries(march_tables, exposure::MarchOptions{});
    exposure::IonField incident = whole.empty_field();
    for (std::size_t m = 0; m < whole.energies().size(); ++m) {
        const double E = whole.energies()[m];
        incident.psi[0][m] = E * spectrum.differential_fluence_per_cm2_MeV(E);
    }
    std::vector<DepthRow> rows;
    for (std::size_t i = 0; i < depths_g_cm2.size(); ++i) {
        const std::string what = fmt::format("the dose behind {} g/cm2", depths_g_cm2[i]);
        DepthRow row{depths_g_cm2[i], doses[i], doses[i].with_removal};
        exposure::IonField a = incident;
        exposure::IonField b = incident;
        for (auto* f : {&a, &b}) {
            auto& march = f == &a ? whole : primaries;
            march.cross(*f, shield, depths_g_cm2[i]);
            march.cross(*f, soft, tissue.g_cm2);
        }
        row.dose.with_removal = apply_secondary_factor(
            row.dose.with_removal,
            secondary_factor(whole.dose(a, detector, water), primaries.dose(b, detector, water)));
        require_dose(row.dose.with_removal, what);
        require_dose(row.dose.without_removal, what);
        rows.push_back(row);
    }
    return rows;
}

std::string format_depth_report(const exposure::ProtonSpectrum& spectrum,
                                const exposure::Material& shield, const TissueDepth& tissue,
                                const std::vector<DepthRow>& rows, OutputFormat format,
                                const exposure::Material& detector) {
    if (format == OutputFormat::json) {
        nlohmann::json j;
        j["shield_material"] = shield.id();
        j["tissue_depth_g_cm2"] = tissue.g_cm2;
        j["tissue"] = "soft-tissue";
        j["detector"] = detector.id();
        j["spectrum"] = describe_spectrum(spectrum);
        j["geometry"] = "shell-equivalent: every direction sees the shield, then the tissue";
        j["rows"] = nlohmann::json::array();
        for (const auto& r : rows) {
            j["rows"].push_back({{"shield_g_cm2", r.shield_g_cm2},
                                 {"for_limits", dose_si_json(r.dose.for_limits())},
                                 {"with_reactions", dose_si_json(r.dose.with_removal)},
                                 {"without_reactions", dose_si_json(r.dose.without_removal)},
                                 {"primaries_with_reactions", dose_si_json(r.primaries)},
                                 {"extrapolated_share", r.dose.extrapolated_share}});
        }
        j["model"] = kDepthModelText;
        j["cautions"] = caution_text();
        return dump_checked(j);
    }
    if (format == OutputFormat::csv) {
        std::string out = "shield_g_cm2,absorbed_mGy,dose_equivalent_mSv,rbe_weighted_mGyEq,"
                          "absorbed_with_reactions_mGy,absorbed_primaries_only_mGy,"
                          "extrapolated_share\n";
        for (const auto& r : rows) {
            const auto d = r.dose.for_limits();
            out += fmt::format("{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.6g}\n",
                               r.shield_g_cm2, 1e3 * d.absorbed_Gy, 1e3 * d.dose_equivalent_Sv,
                               1e3 * d.rbe_weighted_GyEq, 1e3 * r.dose.with_removal.absorbed_Gy,
                               1e3 * r.primaries.absorbed_Gy, r.dose.extrapolated_share);
        }
        return out;
    }
    std::string out = fmt::format("SPE dose behind {} ({}) at {}, scored in {}\n", shield.id(),
                                  shield.name(), tissue.label, detector.id());
    out += fmt::format("spectrum: {}\n", describe_spectrum(spectrum));
    out += "geometry: shell-equivalent (the event's full omnidirectional fluence through the same\n"
           "thickness in every direction: the dose at the centre of a spherical shell)\n\n";
    out += fmt::format("  {:>8}  {:>12}  {:>12}  {:>12}  {:>14}  {:>14}  {:>12}\n", "shield",
                       "absorbed", "dose equiv.", "RBE-weighted", "absorbed with", "absorbed,",
                       "share from");
    out += fmt::format("  {:>8}  {:>12}  {:>12}  {:>12}  {:>14}  {:>14}  {:>12}\n", "g/cm2", "mGy",
                       "mSv", "mGy-Eq", "reactions, mGy", "primaries mGy", "extrapolated");
    for (const auto& r : rows) {
        const auto d = r.dose.for_limits();
        out += fmt::format(
            "  {:>8.4g}  {:>12}  {:>12}  {:>12}  {:>14}  {:>14}  {:>11.1f}%\n", r.shield_g_cm2,
            significant(1e3 * d.absorbed_Gy, 3), significant(1e3 * d.dose_equivalent_Sv, 3),
            significant(1e3 * d.rbe_weighted_GyEq, 3),
            significant(1e3 * r.dose.with_removal.absorbed_Gy, 3),
            significant(1e3 * r.primaries.absorbed_Gy, 3), 100.0 * r.dose.extrapolated_share);
    }
    out += "\n" + wrap(kDepthModelText, 92);
    out += "Tissue: ICRU four-component soft tissue. 'share from extrapolated' is the part of the\n"
           "absorbed dose from incident energies outside the spectrum's fit range.\n\n";
    out += caution_text();
    return out;
}

} // namespace crewdose::planner
