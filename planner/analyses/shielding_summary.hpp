#pragma once
// What one location's shielding looks like, as numbers: the areal-density distribution over
// its directions (external shielding, and per organ with the body's tissue added), the share
// of the sky the ground blocks, the GCR dose rate per organ and, for an event, its organ
// doses there. The `shielding` report (report/shielding_report.hpp) lays it out.
#include "planner/study/study.hpp"

#include "exposure/dosimetry.hpp"

#include <array>
#include <optional>
#include <string>
#include <vector>

namespace crewdose::planner {

/// The percentiles the summary gives, in this order: 5, 25, 50, 75 and 95 %.
inline constexpr std::array<double, 5> kShieldingPercentiles{0.05, 0.25, 0.5, 0.75, 0.95};

struct OrganShielding {
    std::string organ;
    /// The organ's tissue, g/cm2, averaged over the open directions (and over the organ's
    /// points for the phantom).
    double mean_tissue_g_cm2 = 0.0;
    /// External shielding plus the organ's tissue, g/cm2: 5th, 50th and 95th percentiles over
    /// the open directions (and the organ's points).
    double total_p05_g_cm2 = 0.0;
    double total_p50_g_cm2 = 0.0;
    double total_p95_g_cm2 = 0.0;
    /// GCR per day at the mission's starting phi, with and without nuclear reactions.
    exposure::BracketedDose gcr_per_day;
    /// The event's whole dose at this location (the higher of the reactions bracket).
    std::optional<exposure::DoseQuantities> event;
};

struct ShieldingSummary {
    std::string location;
    std::string scenario_file;
    std::size_t directions = 0;
    double blocked_share = 0.0; ///< of the sky, by the ground or terrain
    double external_mean_g_cm2 = 0.0;
    /// External areal density over the open directions at kShieldingPercentiles.
    std::array<double, 5> external_g_cm2{};
    double gcr_phi_MV = 0.0;
    std::string body_model;
    /// What the organ figures mean for this body model (a sentence of the body model).
    std::string organ_heading;
    /// True where the tissue is a mean over points (the phantom), false where it is the
    /// organ's one depth (the quick model).
    bool tissue_is_mean = false;
    std::optional<std::string> event_id;
    std::vector<OrganShielding> organs;
};

/// The summary of `location`, with an event's doses when `event` is given. InputError for an
/// unknown location or event id (field "--location" / "--event").
[[nodiscard]] ShieldingSummary shielding_summary(const Study& study, const std::string& location,
                                                 const std::optional<std::string>& event);

} // namespace crewdose::planner
