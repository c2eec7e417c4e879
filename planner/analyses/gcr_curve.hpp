#pragma once
// The `gcr` analysis: the galactic cosmic-ray dose rate at a tissue depth behind a uniform
// (shell-equivalent) shield, per shield areal density: the design curve of a habitat wall (the
// report is report/gcr_report.hpp).
#include "planner/analyses/depth_curve.hpp"

#include "exposure/data_cache.hpp"
#include "exposure/dosimetry.hpp"
#include "exposure/material.hpp"

#include <array>
#include <string>
#include <string_view>
#include <vector>

namespace crewdose::planner {

/// The charge groups the report splits the dose into.
struct ChargeGroup {
    int z_min;
    int z_max;
    std::string_view label;
};
inline constexpr std::array<ChargeGroup, 5> kChargeGroups{
    {{1, 1, "Z=1"}, {2, 2, "Z=2"}, {3, 10, "Z=3-10"}, {11, 20, "Z=11-20"}, {21, 28, "Z=21-28"}}};

/// Where each dose comes from: the primaries with their projectile fragments (the march of
/// the nuclei without the secondaries of nucleon reactions), the secondary protons, the light
/// ions (deuterons, tritons, helions, and alphas beyond the primaries'), what neutron reactions
/// deposit at the point, and what proton reactions deposit there (target fragments and slow
/// light ions). They add up to the whole field.
inline constexpr std::array<std::string_view, 5> kDoseSources{
    "primaries and fragments", "secondary protons", "light ions", "neutron reactions",
    "target fragments"};

/// One row: the daily dose behind one shield thickness, and each charge group's and each
/// source's share of it, 0..1.
struct GcrDepthRow {
    double shield_g_cm2 = 0.0;
    exposure::DoseQuantities per_day; ///< the whole field, with nuclear reactions
    /// Without any nuclear reaction: every nucleus keeps its charge (the upper value of the
    /// bracket while the model is not validated).
    exposure::DoseQuantities per_day_without_reactions;
    /// The primaries and their fragments alone, with reactions (a diagnostic).
    exposure::DoseQuantities per_day_primaries;
    std::array<double, kChargeGroups.size()> absorbed_share{};
    std::array<double, kChargeGroups.size()> equivalent_share{};
    std::array<double, kDoseSources.size()> source_absorbed_share{};
    std::array<double, kDoseSources.size()> source_equivalent_share{};

    /// Mean quality factor of the whole field: dose equivalent over absorbed dose (0 when
    /// there is no absorbed dose).
    [[nodiscard]] double mean_quality_factor() const;
    /// The share of the dose equivalent that no charged particle crossing the point carries:
    /// the energy that reactions deposit there (neutron reactions, target fragments); 1 minus
    /// the charge groups' shares, never below zero.
    [[nodiscard]] double uncharged_equivalent_share() const;
};

/// Where the shield stands.
enum class GcrSite { deep_space, moon, mars };
struct GcrSiteSpec {
    GcrSite kind = GcrSite::deep_space;
    double surface_pressure_Pa = 750.0; ///< Mars only
    double scale_height_km = 11.1;      ///< Mars only (the scenario default)
    std::size_t directions = 256;       ///< on a surface: the direction set's size
};
/// "deep-space", "moon" or "mars"; InputError naming `field` otherwise.
[[nodiscard]] GcrSite parse_site(std::string_view text, std::string_view field);

/// The Martian surface pressure from the command line: kMinSurfacePressure_Pa (10) to
/// kMaxSurfacePressure_Pa (2000) Pa, the scenario's range; InputError naming `field` otherwise.
[[nodiscard]] double parse_surface_pressure(std::string_view text, std::string_view field);

/// The modulation potential from the command line: a number of MV from kMinPhi_MV (100) to
/// kMaxPhi_MV (3000); InputError naming `field` otherwise (saying so when it looks like GV).
[[nodiscard]] double parse_phi(std::string_view text, std::string_view field);

/// Computes the rows with the physics of `check` (the whole field with nuclear reactions and
/// their secondaries, and the march without any reaction; the march's default 4 g/cm2 step),
/// scored in `detector` (soft tissue, or silicon or water to compare with detectors), in the
/// order given, at `site`: deep space (one path: the shell is the same everywhere) or a
/// planetary surface (the mean over a direction set, the ground below the horizon as zero,
/// on Mars the slant column of atmosphere before the shield). `cache` (may be null) keeps the
/// march data across runs (the rows are bit for bit the same without it).
[[nodiscard]] std::vector<GcrDepthRow>
gcr_depth_rows(double phi_MV, const exposure::Material& shield, const TissueDepth& tissue,
               const std::vector<double>& depths_g_cm2, const GcrSiteSpec& site,
               const exposure::Material& detector, const exposure::DataCache* cache = nullptr);

} // namespace crewdose::planner
