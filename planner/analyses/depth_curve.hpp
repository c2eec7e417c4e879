#pragma once
// The `depth` analysis: SPE dose at a tissue depth behind a uniform (shell-equivalent) shield,
// per shield areal density (the report is report/depth_report.hpp).
#include "exposure/data_cache.hpp"
#include "exposure/dosimetry.hpp"
#include "exposure/material.hpp"
#include "exposure/spectrum.hpp"

#include <string>
#include <string_view>
#include <vector>

namespace crewdose::planner {

/// A tissue depth as given on the command line: g/cm2, or a quick-model name.
struct TissueDepth {
    double g_cm2;
    std::string label; ///< "skin (0.07 mm of tissue)", "5 g/cm2 of tissue", ...
};

/// "skin" (0.07 mm), "lens" (3 mm), "bfo" (5 cm) of unit-density tissue, or a number of g/cm2
/// (0 to 100); InputError naming `field` otherwise.
[[nodiscard]] TissueDepth parse_tissue_depth(std::string_view text, std::string_view field);

/// A comma-separated list of shield areal densities, g/cm2, each in [0, 1000].
[[nodiscard]] std::vector<double> parse_depth_list(std::string_view text, std::string_view field);

/// One row: the dose behind one shield thickness.
struct DepthRow {
    double shield_g_cm2;
    /// with_removal: the whole field (primaries with removal and their secondaries);
    /// without_removal: the primaries without any nuclear reaction.
    exposure::BracketedDose dose;
    exposure::DoseQuantities primaries; ///< the primaries alone with removal (a diagnostic)
};

/// Computes the rows: the primaries exact (one response per thickness), their secondaries as
/// the march's whole-field over primaries ratio; scored in `detector` (soft tissue for doses
/// in the body, silicon or water for comparisons with detectors). `cache` (may be null) keeps
/// the march data across runs (the rows are bit for bit the same without it).
[[nodiscard]] std::vector<DepthRow>
depth_rows(const exposure::ProtonSpectrum& spectrum, const exposure::Material& shield,
           const TissueDepth& tissue, const std::vector<double>& depths_g_cm2,
           const exposure::Material& detector, const exposure::DataCache* cache = nullptr);

} // namespace crewdose::planner
