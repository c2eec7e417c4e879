#include "gcr_report.hpp"

#include "cautions.hpp"
#include "input_error.hpp"
#include "location_response.hpp"
#include "number_format.hpp"
#include "number_parse.hpp"
#include "result_guard.hpp"
#include "study.hpp"

#include "exposure/fragment_transport.hpp"
#include "exposure/gcr.hpp"
#include "exposure/material_library.hpp"
#include "habitats/direction_set.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

namespace crewdose::planner {
namespace {

const SourceLocation kCommandLine{"command line", 0};
constexpr double kDaysPerYear = 365.25;

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
    "marched straight ahead through the shield and the tissue with "
    "nuclear removal (Sihver et al. 1993) and projectile fragmentation (EPAX 3.1 remnants; the "
    "charge they lack leaves as protons at the same velocity). Not modelled: target fragments, "
    "secondary neutrons, the secondary nucleons of proton reactions; so behind thick shielding "
    "the dose with reactions is low, and behind thin shielding the mean quality factor is high "
    "near the skin. "
    "'no react.' is the dose equivalent with no nuclear reaction at all (every nucleus keeps "
    "its charge): the higher of the two is what crewdose check uses for limits. Dose "
    "equivalent with ICRP 60 Q(L); RBE-weighted dose with NCRP 132 values. Tissue: ICRU "
    "four-component soft tissue. phi belongs to the Burger et al. 2000 spectrum: about 400 MV "
    "near solar minimum, 1000 MV or more near maximum (planning examples).";

} // namespace

double parse_phi(std::string_view text, std::string_view field) {
    const auto v = parse_finite(text);
    if (!v || *v < 0.0 || *v > 3000.0) {
        throw InputError(kCommandLine, std::string(field),
                         fmt::format("'{}' is not a modulation potential; allowed: a number of "
                                     "MV from 0 to 3000 (about 400 near solar minimum, 1000 or "
                                     "more near maximum)",
                                     text));
    }
    return *v;
}

double parse_surface_pressure(std::string_view text, std::string_view field) {
    const auto v = parse_finite(text);
    if (!v || *v < 100.0 || *v > 2000.0) {
        throw InputError(kCommandLine, std::string(field),
                         fmt::format("'{}' is not a Martian surface pressure; allowed: a number "
                                     "of Pa from 100 to 2000",
                                     text));
    }
    return *v;
}

GcrSite parse_site(std::string_view text, std::string_view field) {
    if (text == "free-space") {
        return GcrSite::free_space;
    }
    if (text == "moon") {
        return GcrSite::moon;
    }
    if (text == "mars") {
        return GcrSite::mars;
    }
    throw InputError(kCommandLine, std::string(field),
                     fmt::format("'{}' is not a site; allowed: free-space, moon, mars", text));
}

std::vector<GcrDepthRow> gcr_depth_rows(double phi_MV, const exposure::Material& shield,
                                        const TissueDepth& tissue,
                                        const std::vector<double>& depths_g_cm2,
                                        const GcrSiteSpec& site) {
    exposure::TableLibrary tables(gcr_grid());
    exposure::FragmentTransport march(tables);
    exposure::MarchOptions none;
    none.removal = false;
    exposure::FragmentTransport unreacted(tables, none);
    const exposure::Material& soft = *exposure::find_builtin_material("soft-tissue");
    const exposure::Material& water = *exposure::find_builtin_material("water");
    // Free space: the shell is the same in every direction, one path is the whole answer. On a
    // surface: the ground blocks every direction below the horizon (zero in the equal-weight
    // mean over the direction set), and on Mars the atmosphere's slant column comes first.
    // The site is an empty location: external_path() gives each direction's atmosphere.
    std::vector<habitats::Vector3> directions{{0.0, 0.0, 1.0}};
    LocationGeometry where;
    if (site.kind != GcrSite::free_space) {
        directions = habitats::fibonacci_directions(site.directions);
        where.surroundings.ground = true;
        if (site.kind == GcrSite::mars) {
            where.surroundings.atmosphere =
                habitats::mars_atmosphere(site.surface_pressure_Pa, site.scale_height_km);
        }
    }
    const double weight = 1.0 / static_cast<double>(directions.size());
    std::vector<GcrDepthRow> rows(depths_g_cm2.size());
    std::vector<std::array<exposure::DoseQuantities, exposure::FragmentTransport::kMaxZ>> by(
        depths_g_cm2.size());
    const exposure::IonField free_space = exposure::gcr_free_space_field(march, phi_MV);
    for (const auto& d : directions) {
        if (where.surroundings.blocked(d)) {
            continue;
        }
        exposure::IonField above = free_space;
        exposure::IonField plain_above = free_space;
        for (const auto& seg : external_path(where, d)) {
            const exposure::Material& m = *exposure::find_builtin_material(seg.material_id);
            march.cross(above, m, seg.areal_density_g_cm2);
            unreacted.cross(plain_above, m, seg.areal_density_g_cm2);
        }
        // Each row from the top of the shield: a row's numbers do not depend on the others.
        for (std::size_t i = 0; i < depths_g_cm2.size(); ++i) {
            exposure::IonField behind = above;
            march.cross(behind, shield, depths_g_cm2[i]);
            march.cross(behind, soft, tissue.g_cm2);
            exposure::IonField plain_behind = plain_above;
            unreacted.cross(plain_behind, shield, depths_g_cm2[i]);
            unreacted.cross(plain_behind, soft, tissue.g_cm2);
            rows[i].per_day_without_reactions +=
                unreacted.dose(plain_behind, soft, water).scaled(weight);
            const auto nuclei = march.dose_by_nucleus(behind, soft, water);
            for (std::size_t z = 0; z < nuclei.size(); ++z) {
                by[i][z] += nuclei[z].scaled(weight);
            }
        }
    }
    for (std::size_t i = 0; i < depths_g_cm2.size(); ++i) {
        GcrDepthRow& r = rows[i];
        r.shield_g_cm2 = depths_g_cm2[i];
        for (const auto& d : by[i]) {
            r.per_day += d;
        }
        const std::string what = fmt::format("the GCR dose rate behind {} g/cm2", r.shield_g_cm2);
        require_dose(r.per_day, what);
        require_dose(r.per_day_without_reactions, what + " without reactions");
        for (std::size_t g = 0; g < kChargeGroups.size(); ++g) {
            double absorbed = 0.0;
            double equivalent = 0.0;
            for (int Z = kChargeGroups[g].z_min; Z <= kChargeGroups[g].z_max; ++Z) {
                absorbed += by[i][static_cast<std::size_t>(Z - 1)].absorbed_Gy;
                equivalent += by[i][static_cast<std::size_t>(Z - 1)].dose_equivalent_Sv;
            }
            r.absorbed_share[g] =
                r.per_day.absorbed_Gy > 0.0 ? absorbed / r.per_day.absorbed_Gy : 0.0;
            r.equivalent_share[g] = r.per_day.dose_equivalent_Sv > 0.0
                                        ? equivalent / r.per_day.dose_equivalent_Sv
                                        : 0.0;
        }
    }
    return rows;
}

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
    case GcrSite::free_space:
        break;
    }
    return "in free space";
}

std::string format_gcr_depth_report(double phi_MV, const exposure::Material& shield,
                                    const TissueDepth& tissue, const std::vector<GcrDepthRow>& rows,
                                    OutputFormat format, bool per_year, const GcrSiteSpec& site) {
    const double scale = per_year ? kDaysPerYear : 1.0;
    const std::string per = per_year ? "year" : "day";
    if (format == OutputFormat::json) {
        nlohmann::json j;
        j["phi_MV"] = phi_MV;
        j["shield_material"] = shield.id();
        j["tissue_depth_g_cm2"] = tissue.g_cm2;
        j["tissue"] = "soft-tissue";
        j["per"] = per;
        j["site"] = site.kind == GcrSite::free_space ? "free-space"
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
                {"mean_quality_factor", mean_q(r.per_day)},
                {"absorbed_share", nlohmann::json::object()},
                {"dose_equivalent_share", nlohmann::json::object()}};
            for (std::size_t g = 0; g < kChargeGroups.size(); ++g) {
                const std::string label(kChargeGroups[g].label);
                row["absorbed_share"][label] = r.absorbed_share[g];
                row["dose_equivalent_share"][label] = r.equivalent_share[g];
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
                        "dose_equivalent_without_reactions_mSv_per_{0}",
                        per);
        for (const auto& g : kChargeGroups) {
            out += fmt::format(",equivalent_share_{}", g.label);
        }
        out += "\n";
        for (const auto& r : rows) {
            out += fmt::format("{:.10g},{:.10g},{:.10g},{:.10g},{:.6g}", r.shield_g_cm2,
                               1e3 * scale * r.per_day.absorbed_Gy,
                               1e3 * scale * r.per_day.dose_equivalent_Sv,
                               1e3 * scale * r.per_day.rbe_weighted_GyEq, mean_q(r.per_day));
            out += fmt::format(",{:.10g}",
                               1e3 * scale * r.per_day_without_reactions.dose_equivalent_Sv);
            for (const double s : r.equivalent_share) {
                out += fmt::format(",{:.6g}", s);
            }
            out += "\n";
        }
        return out;
    }
    std::string out = fmt::format("GCR dose rate behind {} ({}) at {}, phi = {:g} MV\n",
                                  shield.id(), shield.name(), tissue.label, phi_MV);
    out += wrap("geometry: shell-equivalent (the isotropic field through the same thickness in "
                "every open direction: the dose at the centre of a spherical shell), " +
                    site_text(site),
                92) +
           "\n";
    out += fmt::format("  {:>8}  {:>10}  {:>11}  {:>12}  {:>6}  {:>11}   {}\n", "shield",
                       "absorbed", "dose equiv.", "RBE-weighted", "mean", "dose equiv.",
                       "share of dose equivalent, %");
    std::string groups;
    for (const auto& g : kChargeGroups) {
        groups += fmt::format(" {:>7}", g.label);
    }
    const char* unit = per == "day" ? "d" : "yr";
    out += fmt::format("  {:>8}  {:>10}  {:>11}  {:>12}  {:>6}  {:>11}  {}\n", "g/cm2",
                       fmt::format("mGy/{}", unit), fmt::format("mSv/{}", unit),
                       fmt::format("mGy-Eq/{}", unit), "Q", "no react.", groups);
    for (const auto& r : rows) {
        std::string shares;
        for (const double s : r.equivalent_share) {
            shares += fmt::format(" {:>7.1f}", 100.0 * s);
        }
        out += fmt::format(
            "  {:>8.4g}  {:>10}  {:>11}  {:>12}  {:>6.2f}  {:>11}  {}\n", r.shield_g_cm2,
            significant(1e3 * scale * r.per_day.absorbed_Gy, 3),
            significant(1e3 * scale * r.per_day.dose_equivalent_Sv, 3),
            significant(1e3 * scale * r.per_day.rbe_weighted_GyEq, 3), mean_q(r.per_day),
            significant(1e3 * scale * r.per_day_without_reactions.dose_equivalent_Sv, 3), shares);
    }
    out += "\n" + wrap(kModelText, 92) + "\n";
    out += caution_text();
    return out;
}

} // namespace crewdose::planner
