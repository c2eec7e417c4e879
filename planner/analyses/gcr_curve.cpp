#include "planner/analyses/gcr_curve.hpp"

#include "planner/scenario/input_error.hpp"
#include "planner/scenario/number_parse.hpp"
#include "planner/scenario/scenario.hpp"
#include "planner/study/location_response.hpp"
#include "planner/study/result_guard.hpp"
#include "planner/study/study.hpp"

#include "exposure/fragment_transport.hpp"
#include "exposure/gcr.hpp"
#include "exposure/material_library.hpp"
#include "habitats/direction_set.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace crewdose::planner {
namespace {

const SourceLocation kCommandLine{"command line", 0};

} // namespace

double parse_phi(std::string_view text, std::string_view field) {
    const auto v = parse_finite(text);
    // Not a number reads as out of range (NaN fails every comparison).
    if (const auto problem = implausible_phi(v.value_or(std::nan("")), fmt::format("'{}'", text))) {
        throw InputError(kCommandLine, std::string(field), *problem);
    }
    return *v;
}

double parse_surface_pressure(std::string_view text, std::string_view field) {
    const auto v = parse_finite(text);
    // The scenario's range (scenario.hpp); NaN fails every comparison.
    if (!v || !(*v >= kMinSurfacePressure_Pa && *v <= kMaxSurfacePressure_Pa)) {
        throw InputError(kCommandLine, std::string(field),
                         fmt::format("'{}' is not a Martian surface pressure; allowed: a number "
                                     "of Pa from {:g} to {:g}",
                                     text, kMinSurfacePressure_Pa, kMaxSurfacePressure_Pa));
    }
    return *v;
}

GcrSite parse_site(std::string_view text, std::string_view field) {
    if (text == "deep-space") {
        return GcrSite::deep_space;
    }
    if (text == "free-space") {
        throw InputError(kCommandLine, std::string(field),
                         "'free-space' is now spelt 'deep-space', the name scenario files use "
                         "for a site without ground; allowed: deep-space, moon, mars");
    }
    if (text == "moon") {
        return GcrSite::moon;
    }
    if (text == "mars") {
        return GcrSite::mars;
    }
    throw InputError(kCommandLine, std::string(field),
                     fmt::format("'{}' is not a site; allowed: deep-space, moon, mars", text));
}

std::vector<GcrDepthRow> gcr_depth_rows(double phi_MV, const exposure::Material& shield,
                                        const TissueDepth& tissue,
                                        const std::vector<double>& depths_g_cm2,
                                        const GcrSiteSpec& site, const exposure::Material& detector,
                                        const exposure::DataCache* cache) {
    exposure::TableLibrary tables(gcr_grid());
    exposure::MarchOptions whole_options;
    whole_options.secondaries = true;
    exposure::FragmentTransport march(tables, whole_options, cache);
    exposure::FragmentTransport primaries(tables, exposure::MarchOptions{}, cache);
    exposure::MarchOptions none;
    none.removal = false;
    exposure::FragmentTransport unreacted(tables, none, cache);
    const exposure::Material& soft = *exposure::find_builtin_material("soft-tissue");
    const exposure::Material& water = *exposure::find_builtin_material("water");
    // Free space: the shell is the same in every direction, one path is the whole answer. On a
    // surface: the ground blocks every direction below the horizon (zero in the equal-weight
    // mean over the direction set), and on Mars the atmosphere's slant column comes first.
    // The site is an empty location: external_path() gives each direction's atmosphere.
    std::vector<habitats::Vector3> directions{{0.0, 0.0, 1.0}};
    LocationGeometry where;
    if (site.kind != GcrSite::deep_space) {
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
    // Per row: the whole field's split, and the primaries' protons and alphas.
    std::vector<exposure::FieldDose> split(depths_g_cm2.size());
    std::vector<exposure::FieldDose> prim_split(depths_g_cm2.size());
    const exposure::IonField free_space = exposure::gcr_free_space_field(march, phi_MV);
    for (const auto& d : directions) {
        if (where.surroundings.blocked(d)) {
            continue;
        }
        exposure::IonField above = free_space;
        exposure::IonField prim_above = free_space;
        exposure::IonField plain_above = free_space;
        for (const auto& seg : external_path(where, d)) {
            const exposure::Material& m = *exposure::find_builtin_material(seg.material_id);
            march.cross(above, m, seg.areal_density_g_cm2);
            primaries.cross(prim_above, m, seg.areal_density_g_cm2);
            unreacted.cross(plain_above, m, seg.areal_density_g_cm2);
        }
        // Each row from the top of the shield: a row's numbers do not depend on the others.
        for (std::size_t i = 0; i < depths_g_cm2.size(); ++i) {
            exposure::IonField behind = above;
            march.cross(behind, shield, depths_g_cm2[i]);
            march.cross(behind, soft, tissue.g_cm2);
            exposure::IonField prim_behind = prim_above;
            primaries.cross(prim_behind, shield, depths_g_cm2[i]);
            primaries.cross(prim_behind, soft, tissue.g_cm2);
            exposure::IonField plain_behind = plain_above;
            unreacted.cross(plain_behind, shield, depths_g_cm2[i]);
            unreacted.cross(plain_behind, soft, tissue.g_cm2);
            rows[i].per_day_without_reactions +=
                unreacted.dose(plain_behind, detector, water).scaled(weight);
            rows[i].per_day_primaries +=
                primaries.dose(prim_behind, detector, water).scaled(weight);
            const auto nuclei = march.dose_by_nucleus(behind, detector, water);
            for (std::size_t z = 0; z < nuclei.size(); ++z) {
                by[i][z] += nuclei[z].scaled(weight);
            }
            const auto s = march.dose_by_species(behind, detector, water);
            const auto p = primaries.dose_by_species(prim_behind, detector, water);
            for (std::size_t j = 0; j < exposure::kFieldSpecies; ++j) {
                split[i].by_species[j] += s.by_species[j].scaled(weight);
                prim_split[i].by_species[j] += p.by_species[j].scaled(weight);
            }
            split[i].local_from_protons += s.local_from_protons.scaled(weight);
            split[i].local_from_neutrons += s.local_from_neutrons.scaled(weight);
        }
    }
    for (std::size_t i = 0; i < depths_g_cm2.size(); ++i) {
        GcrDepthRow& r = rows[i];
        r.shield_g_cm2 = depths_g_cm2[i];
        r.per_day = split[i].total();
        const std::string what = fmt::format("the GCR dose rate behind {} g/cm2", r.shield_g_cm2);
        require_dose(r.per_day, what);
        require_dose(r.per_day_without_reactions, what + " without reactions");
        require_dose(r.per_day_primaries, what + " of the primaries");
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
        // The sources (kDoseSources); the nuclei Z >= 3 are the same in both marches.
        const auto& w = split[i].by_species;
        const auto& p = prim_split[i].by_species;
        using exposure::DoseQuantities;
        auto minus = [](DoseQuantities a, const DoseQuantities& b) {
            a.absorbed_Gy -= b.absorbed_Gy;
            a.dose_equivalent_Sv -= b.dose_equivalent_Sv;
            a.rbe_weighted_GyEq -= b.rbe_weighted_GyEq;
            return a;
        };
        DoseQuantities light = w[1];
        light += w[exposure::kDeuteronSpecies];
        light += w[exposure::kTritonSpecies];
        light += w[exposure::kHelionSpecies];
        const std::array<DoseQuantities, kDoseSources.size()> sources{
            r.per_day_primaries, minus(w[0], p[0]), minus(light, p[1]),
            split[i].local_from_neutrons, split[i].local_from_protons};
        for (std::size_t k = 0; k < sources.size(); ++k) {
            r.source_absorbed_share[k] =
                r.per_day.absorbed_Gy > 0.0 ? sources[k].absorbed_Gy / r.per_day.absorbed_Gy : 0.0;
            r.source_equivalent_share[k] =
                r.per_day.dose_equivalent_Sv > 0.0
                    ? sources[k].dose_equivalent_Sv / r.per_day.dose_equivalent_Sv
                    : 0.0;
        }
    }
    return rows;
}
double GcrDepthRow::mean_quality_factor() const {
    return per_day.absorbed_Gy > 0.0 ? per_day.dose_equivalent_Sv / per_day.absorbed_Gy : 0.0;
}

double GcrDepthRow::uncharged_equivalent_share() const {
    double charged = 0.0;
    for (const double v : equivalent_share) {
        charged += v;
    }
    return std::max(0.0, 1.0 - charged);
}

} // namespace crewdose::planner
