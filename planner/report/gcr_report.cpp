#include "planner/report/gcr_report.hpp"

#include "planner/report/cautions.hpp"
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

nlohmann::json dose_json(const exposure::DoseQuantities& d, double scale) {
    return {{"absorbed_mGy", 1e3 * scale * d.absorbed_Gy},
            {"dose_equivalent_mSv", 1e3 * scale * d.dose_equivalent_Sv},
            {"rbe_weighted_mGyEq", 1e3 * scale * d.rbe_weighted_GyEq}};
}

double mean_q(const exposure::DoseQuantities& d) {
    return d.absorbed_Gy > 0.0 ? d.dose_equivalent_Sv / d.absorbed_Gy : 0.0;
}

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

std::string format_gcr_depth_report(double phi_MV, const exposure::Material& shield,
                                    const TissueDepth& tissue, const std::vector<GcrDepthRow>& rows,
                                    OutputFormat format, bool per_year, const GcrSiteSpec& site,
                                    const exposure::Material& detector) {
    const double scale = per_year ? kDaysPerYear : 1.0;
    const std::string per = per_year ? "year" : "day";
    if (format == OutputFormat::json) {
        nlohmann::json j;
        j["phi_MV"] = phi_MV;
        j["shield_material"] = shield.id();
        j["tissue_depth_g_cm2"] = tissue.g_cm2;
        j["tissue"] = "soft-tissue";
        j["detector"] = detector.id();
        j["per"] = per;
        j["site"] = site.kind == GcrSite::deep_space ? "deep-space"
                    : site.kind == GcrSite::moon     ? "moon"
                                                     : "mars";
        if (site.kind == GcrSite::mars) {
            j["surface_pressure_Pa"] = site.surface_pressure_Pa;
        }
        j["geometry"] = "shell-equivalent: every open direction sees the shield, then the "
                        "tissue; " +
                        site_text(site);
        j["model"] = kModelText;
        j["rows"] = nlohmann::json::array();
        for (const auto& r : rows) {
            nlohmann::json row{
                {"shield_g_cm2", r.shield_g_cm2},
                {"dose", dose_json(r.per_day, scale)},
                {"dose_without_reactions", dose_json(r.per_day_without_reactions, scale)},
                {"dose_primaries_only", dose_json(r.per_day_primaries, scale)},
                {"mean_quality_factor", mean_q(r.per_day)},
                {"absorbed_share", nlohmann::json::object()},
                {"dose_equivalent_share", nlohmann::json::object()},
                {"absorbed_share_by_source", nlohmann::json::object()},
                {"dose_equivalent_share_by_source", nlohmann::json::object()}};
            for (std::size_t g = 0; g < kChargeGroups.size(); ++g) {
                const std::string label(kChargeGroups[g].label);
                row["absorbed_share"][label] = r.absorbed_share[g];
                row["dose_equivalent_share"][label] = r.equivalent_share[g];
            }
            for (std::size_t k = 0; k < kDoseSources.size(); ++k) {
                const std::string label(kDoseSources[k]);
                row["absorbed_share_by_source"][label] = r.source_absorbed_share[k];
                row["dose_equivalent_share_by_source"][label] = r.source_equivalent_share[k];
            }
            j["rows"].push_back(row);
        }
        j["cautions"] = caution_text();
        return dump_checked(j);
    }
    if (format == OutputFormat::csv) {
        std::string out =
            fmt::format("shield_g_cm2,absorbed_mGy_per_{0},dose_equivalent_mSv_per_{0},"
                        "rbe_weighted_mGyEq_per_{0},mean_quality_factor,"
                        "dose_equivalent_without_reactions_mSv_per_{0},"
                        "dose_equivalent_primaries_only_mSv_per_{0}",
                        per);
        for (const auto& g : kChargeGroups) {
            out += fmt::format(",equivalent_share_{}", g.label);
        }
        for (const auto& k : kDoseSources) {
            std::string label(k);
            std::replace(label.begin(), label.end(), ' ', '_');
            out += fmt::format(",equivalent_share_{}", label);
        }
        out += "\n";
        for (const auto& r : rows) {
            out += fmt::format("{:.10g},{:.10g},{:.10g},{:.10g},{:.6g}", r.shield_g_cm2,
                               1e3 * scale * r.per_day.absorbed_Gy,
                               1e3 * scale * r.per_day.dose_equivalent_Sv,
                               1e3 * scale * r.per_day.rbe_weighted_GyEq, mean_q(r.per_day));
            out += fmt::format(",{:.10g},{:.10g}",
                               1e3 * scale * r.per_day_without_reactions.dose_equivalent_Sv,
                               1e3 * scale * r.per_day_primaries.dose_equivalent_Sv);
            for (const double v : r.equivalent_share) {
                out += fmt::format(",{:.6g}", v);
            }
            for (const double v : r.source_equivalent_share) {
                out += fmt::format(",{:.6g}", v);
            }
            out += "\n";
        }
        return out;
    }
    std::string out =
        wrap(fmt::format("GCR dose rate behind {} ({}) at {}, phi = {:g} MV{}", shield.id(),
                         shield.name(), tissue.label, phi_MV,
                         detector.id() == "soft-tissue" ? std::string()
                                                        : ", scored in " + detector.id()),
             100, "  ");
    out += wrap("geometry: shell-equivalent (the isotropic field through the same thickness in "
                "every open direction: the dose at the centre of a spherical shell), " +
                    site_text(site),
                92) +
           "\n";
    const char* unit = per == "day" ? "d" : "yr";
    out += fmt::format("  {:>8}  {:>10}  {:>11}  {:>12}  {:>5}  {:>10}  {:>10}\n", "shield",
                       "absorbed", "dose equiv.", "RBE-weighted", "mean", "dose eq.", "dose eq.");
    out += fmt::format("  {:>8}  {:>10}  {:>11}  {:>12}  {:>5}  {:>10}  {:>10}\n", "g/cm2",
                       fmt::format("mGy/{}", unit), fmt::format("mSv/{}", unit),
                       fmt::format("mGy-Eq/{}", unit), "Q", "no react.", "prim.");
    for (const auto& r : rows) {
        out += fmt::format(
            "  {:>8.4g}  {:>10}  {:>11}  {:>12}  {:>5.2f}  {:>10}  {:>10}\n", r.shield_g_cm2,
            significant(1e3 * scale * r.per_day.absorbed_Gy, 3),
            significant(1e3 * scale * r.per_day.dose_equivalent_Sv, 3),
            significant(1e3 * scale * r.per_day.rbe_weighted_GyEq, 3), mean_q(r.per_day),
            significant(1e3 * scale * r.per_day_without_reactions.dose_equivalent_Sv, 3),
            significant(1e3 * scale * r.per_day_primaries.dose_equivalent_Sv, 3));
    }
    out += "\nShare of the dose equivalent, %, by charge (primaries, fragments and secondaries "
           "together)\nand by source:\n";
    std::string head = fmt::format("  {:>6}", "g/cm2");
    for (const auto& g : kChargeGroups) {
        head += fmt::format(" {:>7}", g.label);
    }
    head += fmt::format(" {:>7} |", "rest");
    // Each source's column as wide as its heading's first word (at least "100.0"), so that
    // the table, the rest column included, stays within 100 columns.
    std::array<std::size_t, kDoseSources.size()> width{};
    for (std::size_t k = 0; k < kDoseSources.size(); ++k) {
        const std::string_view word = kDoseSources[k].substr(0, kDoseSources[k].find(' '));
        width[k] = std::max<std::size_t>(word.size(), 5);
        head += fmt::format(" {:>{}}", word, width[k]);
    }
    out += head + "\n";
    for (const auto& r : rows) {
        std::string line = fmt::format("  {:>6.4g}", r.shield_g_cm2);
        double charged = 0.0;
        for (const double v : r.equivalent_share) {
            line += fmt::format(" {:>7.1f}", 100.0 * v);
            charged += v;
        }
        // The rest is what no charged particle crossing the point carries: the energy that
        // reactions deposit there (neutron reactions, target fragments). It is never below
        // zero; a rounding error of the sum is not shown as -0.0.
        line += fmt::format(" {:>7.1f} |", 100.0 * std::max(0.0, 1.0 - charged));
        for (std::size_t k = 0; k < kDoseSources.size(); ++k) {
            line += fmt::format(" {:>{}.1f}", 100.0 * r.source_equivalent_share[k], width[k]);
        }
        out += line + "\n";
    }
    out += wrap("  (charge: the particles of each charge crossing the point; rest: the energy "
                "reactions deposit at the point, no charged particle crossing it; sources: "
                "primaries and their fragments; secondary protons; light ions d, t, He-3 and "
                "secondary alphas; energy deposited by neutron reactions; target fragments and "
                "slow light ions of proton reactions)",
                100, "   ");
    out += "\n" + wrap(kModelText, 92) + "\n";
    out += caution_text();
    return out;
}

} // namespace crewdose::planner
