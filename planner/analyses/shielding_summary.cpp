#include "planner/analyses/shielding_summary.hpp"

#include "planner/study/body_model.hpp"

#include <algorithm>
#include <utility>

namespace crewdose::planner {
namespace {

// The value below which a share p of the weight lies, for (value, weight) pairs sorted by
// value: the i-th value sits at (S_i - w_i) / (S_n - w_n) of the cumulative weight S
// (inclusive), linear in between; with equal weights the usual (n - 1) p interpolation.
double weighted_percentile(const std::vector<std::pair<double, double>>& sorted, double p) {
    if (sorted.empty()) {
        return 0.0;
    }
    double total = 0.0;
    for (const auto& [v, w] : sorted) {
        total += w;
    }
    const double span = total - sorted.back().second;
    if (!(span > 0.0)) {
        return sorted.back().first;
    }
    const double target = p * span;
    double before = 0.0; // S_i - w_i of the current pair
    for (std::size_t i = 0; i + 1 < sorted.size(); ++i) {
        const double next = before + sorted[i].second;
        if (target <= next) {
            const double f = sorted[i].second > 0.0 ? (target - before) / sorted[i].second : 0.0;
            return sorted[i].first + f * (sorted[i + 1].first - sorted[i].first);
        }
        before = next;
    }
    return sorted.back().first;
}

double percentile(const std::vector<double>& sorted, double p) {
    std::vector<std::pair<double, double>> unit;
    unit.reserve(sorted.size());
    for (const double v : sorted) {
        unit.emplace_back(v, 1.0);
    }
    return weighted_percentile(unit, p);
}

} // namespace

ShieldingSummary shielding_summary(const Study& study, const std::string& location,
                                   const std::optional<std::string>& event) {
    const Scenario& sc = study.scenario();
    (void)sc.location_named(location, "--location");
    const EventSpec* ev = event ? &sc.event_named(*event, "--event") : nullptr;
    const LocationGeometry& where = study.geometry(location);
    std::vector<double> external;
    std::size_t blocked = 0;
    const auto& dirs = study.directions(location);
    const BodyDepths& body = study.body(location);
    const BodyModel& model = body_model(study.location(location).body);
    // Every point's own depth where the grid's weights split it between two nodes (the
    // phantom); nullopt where each organ's depth is a node (the quick model).
    const auto samples = model.depth_samples(placement_of(where), dirs, body);
    // Per organ: the external areal density plus the organ's tissue, over its points and the
    // open directions (the phantom: every traced point's own depth; the quick model: its fixed
    // depth), and the mean tissue.
    std::vector<std::vector<std::pair<double, double>>> totals(body.organs.size());
    std::vector<double> mean_tissue(body.organs.size(), 0.0);
    std::vector<double> external_of(dirs.size(), -1.0); // < 0: blocked
    for (std::size_t k = 0; k < dirs.size(); ++k) {
        const auto& d = dirs[k];
        if (where.surroundings.blocked(d)) {
            ++blocked;
            continue;
        }
        double total = 0.0;
        for (const auto& seg : external_path(where, d)) {
            total += seg.areal_density_g_cm2;
        }
        external.push_back(total);
        external_of[k] = total;
        for (std::size_t o = 0; o < body.organs.size(); ++o) {
            const auto w = body.of(k, o);
            double tissue = 0.0;
            for (std::size_t g = 0; g < w.size(); ++g) {
                tissue += w[g] * body.grid_g_cm2[g];
                if (w[g] > 0.0 && !samples) {
                    totals[o].emplace_back(total + body.grid_g_cm2[g], w[g]);
                }
            }
            mean_tissue[o] += tissue;
        }
    }
    if (samples) {
        for (std::size_t o = 0; o < body.organs.size(); ++o) {
            for (const auto& smp : samples->at(o)) {
                if (external_of[smp.direction] >= 0.0 && smp.weight > 0.0) {
                    totals[o].emplace_back(external_of[smp.direction] + smp.tissue_g_cm2,
                                           smp.weight);
                }
            }
        }
    }
    std::sort(external.begin(), external.end());
    ShieldingSummary out;
    out.location = location;
    out.scenario_file = sc.file;
    out.directions = dirs.size();
    out.blocked_share = static_cast<double>(blocked) / static_cast<double>(dirs.size());
    double mean = 0.0;
    for (const double v : external) {
        mean += v;
    }
    out.external_mean_g_cm2 = external.empty() ? 0.0 : mean / static_cast<double>(external.size());
    for (std::size_t i = 0; i < kShieldingPercentiles.size(); ++i) {
        out.external_g_cm2[i] = percentile(external, kShieldingPercentiles[i]);
    }
    out.gcr_phi_MV = sc.mission.gcr_phi_MV;
    out.body_model = body.model;
    out.organ_heading = model.organ_table_heading();
    out.tissue_is_mean = samples.has_value();
    if (ev) {
        out.event_id = ev->id;
    }
    for (std::size_t o = 0; o < body.organs.size(); ++o) {
        std::sort(totals[o].begin(), totals[o].end());
        OrganShielding s;
        s.organ = body.organs[o];
        s.mean_tissue_g_cm2 =
            mean_tissue[o] / std::max<double>(1.0, static_cast<double>(external.size()));
        s.total_p05_g_cm2 = weighted_percentile(totals[o], 0.05);
        s.total_p50_g_cm2 = weighted_percentile(totals[o], 0.5);
        s.total_p95_g_cm2 = weighted_percentile(totals[o], 0.95);
        s.gcr_per_day = study.gcr_daily_dose(location, s.organ, sc.mission.gcr_phi_MV);
        if (ev) {
            s.event = study.event_dose(location, s.organ, *ev);
        }
        out.organs.push_back(std::move(s));
    }
    return out;
}

} // namespace crewdose::planner
