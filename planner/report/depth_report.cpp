#include "planner/report/depth_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/number_format.hpp"
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/number_parse.hpp"
#include "planner/scenario/scenario.hpp"
#include "planner/scenario/spectrum_spec.hpp"
#include "planner/study/location_response.hpp"
#include "planner/study/result_guard.hpp"
#include "planner/study/study.hpp"

#include "exposure/depth_dose.hpp"
#include "exposure/material_library.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>

namespace crewdose::planner {
namespace {

const char* kDepthModelText =
    "Model: the event's protons by straight-ahead CSDA transport through the shield and the "
    "tissue, exact per energy, with nuclear removal; their secondaries (neutrons, protons, "
    "deuterons, tritons, helions and alphas of nucleon reactions, from ENDF/B-VIII.1 to 150 "
    "MeV and a fit to measured neutron spectra above; target fragments and slow light ions "
    "deposited where they are made; recoil protons of neutrons scattered by hydrogen) from "
    "a straight-ahead march of the whole field, as its "
    "ratio to the march of the primaries alone. Dose equivalent with ICRP 60 Q(L); "
    "RBE-weighted dose with NCRP 132 values. The first three columns are the higher of the "
    "whole field's dose and the primaries' without any removal (the model is not yet "
    "validated well enough to drop that bracket); 'absorbed, primaries' is the primaries "
    "alone with removal, for comparison. Not modelled: pions and the electromagnetic cascade, "
    "neutrons emitted backwards.";

} // namespace

nlohmann::json dose_si_json(const exposure::DoseQuantities& d) {
    return {{"absorbed_Gy", d.absorbed_Gy},
            {"dose_equivalent_Sv", d.dose_equivalent_Sv},
            {"rbe_weighted_GyEq", d.rbe_weighted_GyEq}};
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
    out += wrap("spectrum: " + describe_spectrum(spectrum), 100, "  ");
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
