#include "planner/report/depth_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/document_writer.hpp"
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

report::Object dose_si_object(const exposure::DoseQuantities& d) {
    return {{{"absorbed_Gy", d.absorbed_Gy},
             {"dose_equivalent_Sv", d.dose_equivalent_Sv},
             {"rbe_weighted_GyEq", d.rbe_weighted_GyEq}}};
}

report::Document depth_document(const exposure::ProtonSpectrum& spectrum,
                                const exposure::Material& shield, const TissueDepth& tissue,
                                const std::vector<DepthRow>& rows,
                                const exposure::Material& detector) {
    using report::Field;
    report::Document doc;
    doc.group(
        {"",
         {{"shield_material", shield.id()},
          {"tissue_depth_g_cm2", tissue.g_cm2},
          {"tissue", std::string("soft-tissue")},
          {"detector", detector.id()},
          {"spectrum", describe_spectrum(spectrum)},
          {"geometry",
           std::string("shell-equivalent: every direction sees the shield, then the tissue")}}});
    doc.text("SPE dose behind {} ({}) at {}, scored in {}",
             {Field{"shield", shield.id()}, Field{"name", shield.name()},
              Field{"tissue", tissue.label}, Field{"detector", detector.id()}});
    doc.text("spectrum: {}", {Field{"spectrum", describe_spectrum(spectrum)}}, 100, "  ");
    doc.text("geometry: shell-equivalent (the event's full omnidirectional fluence through the "
             "same\nthickness in every direction: the dose at the centre of a spherical shell)");
    doc.blank();

    report::Table t;
    t.key = "rows";
    t.is_csv = true;
    // Text and CSV show these (JSON: the dose objects below, in SI units).
    auto col = [](std::string key, std::string header, std::string unit, int width, double scale) {
        return report::number_column(std::move(key), std::move(header), std::move(unit), width,
                                     scale, 3)
            .shown_in(true, false, true);
    };
    auto json_only = [](std::string key) {
        return report::text_column(std::move(key)).shown_in(false, true, false);
    };
    auto shield_col = col("shield_g_cm2", "shield", "g/cm2", 8, 1.0);
    shield_col.rounding = report::Rounding::general;
    shield_col.digits = 4;
    shield_col.in_json = true;
    auto share = col("extrapolated_share", "", "", 0, 1.0);
    share.in_text = false;
    share.in_json = true;
    share.csv_digits = 6;
    auto share_text = col("extrapolated_percent", "share from", "extrapolated", 12, 100.0);
    share_text.rounding = report::Rounding::fixed;
    share_text.digits = 1;
    share_text.text_suffix = "%";
    share_text.in_csv = false;
    t.columns = {shield_col,
                 col("absorbed_mGy", "absorbed", "mGy", 12, 1e3),
                 col("dose_equivalent_mSv", "dose equiv.", "mSv", 12, 1e3),
                 col("rbe_weighted_mGyEq", "RBE-weighted", "mGy-Eq", 12, 1e3),
                 col("absorbed_with_reactions_mGy", "absorbed with", "reactions, mGy", 14, 1e3),
                 col("absorbed_primaries_only_mGy", "absorbed,", "primaries mGy", 14, 1e3),
                 share_text,
                 share,
                 json_only("for_limits"),
                 json_only("with_reactions"),
                 json_only("without_reactions"),
                 json_only("primaries_with_reactions")};
    for (const auto& r : rows) {
        const auto d = r.dose.for_limits();
        t.rows.push_back({r.shield_g_cm2, d.absorbed_Gy, d.dose_equivalent_Sv, d.rbe_weighted_GyEq,
                          r.dose.with_removal.absorbed_Gy, r.primaries.absorbed_Gy,
                          r.dose.extrapolated_share, r.dose.extrapolated_share, dose_si_object(d),
                          dose_si_object(r.dose.with_removal),
                          dose_si_object(r.dose.without_removal), dose_si_object(r.primaries)});
    }
    doc.table(std::move(t));
    doc.blank();
    doc.keyed_text("model", kDepthModelText, 92);
    doc.text("Tissue: ICRU four-component soft tissue. 'share from extrapolated' is the part of "
             "the\nabsorbed dose from incident energies outside the spectrum's fit range.");
    doc.blank();
    doc.keyed_text("cautions", caution_text());
    return doc;
}

std::string format_depth_report(const exposure::ProtonSpectrum& spectrum,
                                const exposure::Material& shield, const TissueDepth& tissue,
                                const std::vector<DepthRow>& rows, OutputFormat format,
                                const exposure::Material& detector) {
    return report::write(depth_document(spectrum, shield, tissue, rows, detector), format);
}

} // namespace crewdose::planner
