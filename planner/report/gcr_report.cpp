#include "planner/report/gcr_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/document_writer.hpp"
#include "planner/report/number_format.hpp"
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/number_parse.hpp"
#include "planner/study/location_response.hpp"
#include "planner/study/result_guard.hpp"
#include "planner/study/study.hpp"

#include "exposure/fragment_transport.hpp"
#include "exposure/gcr.hpp"
#include "exposure/material_library.hpp"
#include "habitats/direction_set.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <array>

namespace crewdose::planner {
namespace {

const char* kModelText =
    "Model: the GCR nuclei Z = 1-28 (Burger et al. 2000 interstellar spectrum for protons and "
    "helium, ISO 15390 spectral shapes for heavier nuclei, HEAO-3 abundances, force field) "
    "marched straight ahead through the shield and the tissue as a whole field: nuclear "
    "removal (Sihver et al. 1993), projectile fragmentation (EPAX 3.1 remnants; the charge "
    "they lack leaves as protons, the nucleons left as neutrons, at the same velocity), and the "
    "secondaries of nucleon reactions (neutrons, protons, deuterons, tritons, helions, alphas: "
    "ENDF/B-VIII.1 to 150 MeV, a fit to measured neutron spectra above; the target fragments "
    "and slow light ions deposited where they are made; the recoil protons of neutrons "
    "scattered by hydrogen). Not modelled: pions and the electromagnetic cascade, target "
    "fragments of nucleus-nucleus reactions, neutrons emitted backwards; against published in-situ "
    "measurements the model is still low (README). 'no react.' is the dose equivalent with no "
    "nuclear reaction at all (every nucleus keeps its charge): crewdose check uses the higher "
    "of the two for each quantity. 'prim.' is the primaries and their fragments alone. Dose "
    "equivalent with ICRP 60 Q(L); RBE-weighted dose with NCRP 132 values. Tissue: ICRU "
    "four-component soft tissue. phi belongs to the Burger et al. 2000 spectrum: about 300-400 MV "
    "near solar minimum, 1000 MV or more near maximum (planning examples).";

} // namespace

std::string site_text(const GcrSiteSpec& site) {
    switch (site.kind) {
    case GcrSite::moon:
        return fmt::format("on the lunar surface: the ground blocks the lower half of the sky "
                           "({} directions)",
                           site.directions);
    case GcrSite::mars:
        return fmt::format("on the Martian surface: the ground blocks the lower half of the sky, "
                           "the atmosphere ({:g} Pa, scale height {:g} km) lies along every "
                           "slant path above ({} directions)",
                           site.surface_pressure_Pa, site.scale_height_km, site.directions);
    case GcrSite::deep_space:
        break;
    }
    return "in deep space";
}

report::Document gcr_depth_document(double phi_MV, const exposure::Material& shield,
                                    const TissueDepth& tissue, const std::vector<GcrDepthRow>& rows,
                                    bool per_year, const GcrSiteSpec& site,
                                    const exposure::Material& detector) {
    using report::Field;
    const double days = per_year ? kDaysPerYear : 1.0;
    const std::string per = per_year ? "year" : "day";
    const std::string unit = per_year ? "yr" : "d";
    report::Document doc;
    std::vector<Field> top{{"phi_MV", phi_MV},
                           {"shield_material", shield.id()},
                           {"tissue_depth_g_cm2", tissue.g_cm2},
                           {"tissue", std::string("soft-tissue")},
                           {"detector", detector.id()},
                           {"per", per},
                           {"site", std::string(site.kind == GcrSite::deep_space ? "deep-space"
                                                : site.kind == GcrSite::moon     ? "moon"
                                                                                 : "mars")},
                           {"geometry", "shell-equivalent: every open direction sees the shield, "
                                        "then the tissue; " +
                                            site_text(site)}};
    if (site.kind == GcrSite::mars) {
        top.push_back({"surface_pressure_Pa", site.surface_pressure_Pa});
    }
    doc.group({"", std::move(top)});
    doc.text("GCR dose rate behind {} ({}) at {}, phi = {} MV{}",
             {Field{"shield", shield.id()}, Field{"name", shield.name()},
              Field{"tissue", tissue.label}, Field{"phi", phi_MV, 6},
              Field{"scored", detector.id() == "soft-tissue" ? std::string()
                                                             : ", scored in " + detector.id()}},
             100, "  ");
    doc.text("geometry: shell-equivalent (the isotropic field through the same thickness in "
             "every open direction: the dose at the centre of a spherical shell), " +
                 site_text(site),
             {}, 92);
    doc.blank();

    // The dose per day (or year) in mGy, mSv, mGy-Eq: the model's Gy per day times 1e3 days.
    const double to_milli = 1e3 * days;
    auto dose_object = [&](const exposure::DoseQuantities& d) {
        return report::Object{
            {{"absorbed_mGy", d.absorbed_Gy, 4, report::Rounding::general, to_milli},
             {"dose_equivalent_mSv", d.dose_equivalent_Sv, 4, report::Rounding::general, to_milli},
             {"rbe_weighted_mGyEq", d.rbe_weighted_GyEq, 4, report::Rounding::general, to_milli}}};
    };
    auto shares = [](const auto& labels, const auto& values) {
        report::Object o;
        for (std::size_t g = 0; g < values.size(); ++g) {
            o.fields.push_back({std::string(labels(g)), values[g]});
        }
        return o;
    };
    auto group_label = [](std::size_t g) {
        return kChargeGroups[g].label;
    };
    auto source_label = [](std::size_t k) {
        return kDoseSources[k];
    };
    auto csv_label = [](std::string_view k) {
        std::string label(k);
        std::replace(label.begin(), label.end(), ' ', '_');
        return label;
    };

    // Text and CSV show these (JSON: the dose and share objects below).
    auto col = [](std::string key, std::string header, std::string unit_line, int width,
                  double scale) {
        return report::number_column(std::move(key), std::move(header), std::move(unit_line), width,
                                     scale, 3)
            .shown_in(true, false, true);
    };
    auto json_only = [](std::string key) {
        return report::text_column(std::move(key)).shown_in(false, true, false);
    };
    report::Table t;
    t.key = "rows";
    t.is_csv = true;
    auto shield_col = col("shield_g_cm2", "shield", "g/cm2", 8, 1.0);
    shield_col.rounding = report::Rounding::general;
    shield_col.digits = 4;
    shield_col.in_json = true;
    auto q_col = col("mean_quality_factor", "mean", "Q", 5, 1.0);
    q_col.rounding = report::Rounding::fixed;
    q_col.digits = 2;
    q_col.csv_digits = 6;
    q_col.in_json = true;
    t.columns = {
        shield_col,
        col("absorbed_mGy_per_" + per, "absorbed", "mGy/" + unit, 10, to_milli),
        col("dose_equivalent_mSv_per_" + per, "dose equiv.", "mSv/" + unit, 11, to_milli),
        col("rbe_weighted_mGyEq_per_" + per, "RBE-weighted", "mGy-Eq/" + unit, 12, to_milli),
        q_col,
        col("dose_equivalent_without_reactions_mSv_per_" + per, "dose eq.", "no react.", 10,
            to_milli),
        col("dose_equivalent_primaries_only_mSv_per_" + per, "dose eq.", "prim.", 10, to_milli)};
    for (const auto& g : kChargeGroups) {
        auto c = col(fmt::format("equivalent_share_{}", g.label), "", "", 0, 1.0);
        c.in_text = false;
        c.csv_digits = 6;
        t.columns.push_back(c);
    }
    for (const auto& k : kDoseSources) {
        auto c = col(fmt::format("equivalent_share_{}", csv_label(k)), "", "", 0, 1.0);
        c.in_text = false;
        c.csv_digits = 6;
        t.columns.push_back(c);
    }
    for (const char* key :
         {"dose", "dose_without_reactions", "dose_primaries_only", "absorbed_share",
          "dose_equivalent_share", "absorbed_share_by_source", "dose_equivalent_share_by_source"}) {
        t.columns.push_back(json_only(key));
    }
    for (const auto& r : rows) {
        std::vector<report::Value> row{r.shield_g_cm2,
                                       r.per_day.absorbed_Gy,
                                       r.per_day.dose_equivalent_Sv,
                                       r.per_day.rbe_weighted_GyEq,
                                       r.mean_quality_factor(),
                                       r.per_day_without_reactions.dose_equivalent_Sv,
                                       r.per_day_primaries.dose_equivalent_Sv};
        row.insert(row.end(), r.equivalent_share.begin(), r.equivalent_share.end());
        row.insert(row.end(), r.source_equivalent_share.begin(), r.source_equivalent_share.end());
        row.emplace_back(dose_object(r.per_day));
        row.emplace_back(dose_object(r.per_day_without_reactions));
        row.emplace_back(dose_object(r.per_day_primaries));
        row.emplace_back(shares(group_label, r.absorbed_share));
        row.emplace_back(shares(group_label, r.equivalent_share));
        row.emplace_back(shares(source_label, r.source_absorbed_share));
        row.emplace_back(shares(source_label, r.source_equivalent_share));
        t.rows.push_back(std::move(row));
    }
    doc.table(std::move(t));
    doc.blank();

    // The shares in %, text only (JSON and CSV carry them as fractions above).
    report::Table s;
    s.key = "shares";
    s.title = "Share of the dose equivalent, %, by charge (primaries, fragments and secondaries "
              "together)\nand by source:";
    s.in_json = false;
    auto pct = [](std::string header, int width) {
        report::Column c;
        c.key = header;
        c.header = std::move(header);
        c.min_width = width;
        c.gap = 1;
        c.scale = 100.0;
        c.rounding = report::Rounding::fixed;
        c.digits = 1;
        return c;
    };
    auto depth_col = pct("g/cm2", 6);
    depth_col.scale = 1.0;
    depth_col.rounding = report::Rounding::general;
    depth_col.digits = 4;
    s.columns.push_back(depth_col);
    for (const auto& g : kChargeGroups) {
        s.columns.push_back(pct(std::string(g.label), 7));
    }
    s.columns.push_back(pct("rest", 7));
    report::Column bar;
    bar.key = "bar";
    bar.header = "|";
    bar.gap = 1;
    s.columns.push_back(bar);
    // Each source's column as wide as its heading's first word (at least "100.0"), so that
    // the table, the rest column included, stays within 100 columns.
    for (const auto& k : kDoseSources) {
        s.columns.push_back(pct(std::string(k.substr(0, k.find(' '))), 5));
    }
    for (const auto& r : rows) {
        std::vector<report::Value> row{r.shield_g_cm2};
        row.insert(row.end(), r.equivalent_share.begin(), r.equivalent_share.end());
        row.emplace_back(r.uncharged_equivalent_share());
        row.emplace_back(std::string("|"));
        row.insert(row.end(), r.source_equivalent_share.begin(), r.source_equivalent_share.end());
        s.rows.push_back(std::move(row));
    }
    doc.table(std::move(s));
    doc.text("  (charge: the particles of each charge crossing the point; rest: the energy "
             "reactions deposit at the point, no charged particle crossing it; sources: "
             "primaries and their fragments; secondary protons; light ions d, t, He-3 and "
             "secondary alphas; energy deposited by neutron reactions; target fragments and "
             "slow light ions of proton reactions)",
             {}, 100, "   ");
    doc.blank();
    doc.keyed_text("model", kModelText, 92);
    doc.blank();
    doc.keyed_text("cautions", caution_text());
    return doc;
}

std::string format_gcr_depth_report(double phi_MV, const exposure::Material& shield,
                                    const TissueDepth& tissue, const std::vector<GcrDepthRow>& rows,
                                    OutputFormat format, bool per_year, const GcrSiteSpec& site,
                                    const exposure::Material& detector) {
    return report::write(gcr_depth_document(phi_MV, shield, tissue, rows, per_year, site, detector),
                         format);
}

} // namespace crewdose::planner
