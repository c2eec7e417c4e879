#include "shielding_report.hpp"

#include "cautions.hpp"
#include "depth_report.hpp"
#include "number_format.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>

namespace crewdose::planner {
namespace {

double percentile(const std::vector<double>& sorted, double p) {
    if (sorted.empty()) {
        return 0.0;
    }
    const double x = p * static_cast<double>(sorted.size() - 1);
    const auto i = static_cast<std::size_t>(std::floor(x));
    const std::size_t j = std::min(i + 1, sorted.size() - 1);
    return sorted[i] + (sorted[j] - sorted[i]) * (x - static_cast<double>(i));
}

// The value below which a share p of the total weight lies: (value, weight) pairs sorted by
// value, interpolated linearly in the cumulative weight between pair midpoints.
double weighted_percentile(const std::vector<std::pair<double, double>>& sorted, double p) {
    double total = 0.0;
    for (const auto& [v, w] : sorted) {
        total += w;
    }
    if (sorted.empty() || !(total > 0.0)) {
        return 0.0;
    }
    const double target = p * total;
    double below = 0.0; // weight below the current pair's midpoint
    for (std::size_t i = 0; i < sorted.size(); ++i) {
        const double mid = below + 0.5 * sorted[i].second;
        if (target <= mid) {
            if (i == 0) {
                return sorted[0].first;
            }
            const double prev_mid = below - 0.5 * sorted[i - 1].second;
            const double f = (target - prev_mid) / (mid - prev_mid);
            return sorted[i - 1].first + f * (sorted[i].first - sorted[i - 1].first);
        }
        below += sorted[i].second;
    }
    return sorted.back().first;
}

} // namespace

std::string format_shielding_report(const Study& study, const std::string& location,
                                    const std::optional<std::string>& event, OutputFormat format) {
    const Scenario& sc = study.scenario();
    (void)sc.location_named(location, "--location");
    const EventSpec* ev = event ? &sc.event_named(*event, "--event") : nullptr;
    const LocationGeometry& where = study.geometry(location);
    std::vector<double> external;
    std::size_t blocked = 0;
    const auto& dirs = study.directions(location);
    const BodyDepths& body = study.body(location);
    // Per organ: the external areal density plus the organ's tissue, over its points and the
    // open directions (each tissue depth node with its weight; the quick model: its fixed
    // depth), and the mean tissue.
    std::vector<std::vector<std::pair<double, double>>> totals(body.organs.size());
    std::vector<double> mean_tissue(body.organs.size(), 0.0);
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
        for (std::size_t o = 0; o < body.organs.size(); ++o) {
            const auto w = body.of(k, o);
            double tissue = 0.0;
            for (std::size_t g = 0; g < w.size(); ++g) {
                tissue += w[g] * body.grid_g_cm2[g];
                if (w[g] > 0.0) {
                    totals[o].emplace_back(total + body.grid_g_cm2[g], w[g]);
                }
            }
            mean_tissue[o] += tissue;
        }
    }
    for (std::size_t o = 0; o < body.organs.size(); ++o) {
        std::sort(totals[o].begin(), totals[o].end());
        mean_tissue[o] /= std::max<double>(1.0, static_cast<double>(external.size()));
    }
    std::sort(external.begin(), external.end());
    double mean = 0.0;
    for (double v : external) {
        mean += v;
    }
    mean = external.empty() ? 0.0 : mean / static_cast<double>(external.size());
    const double blocked_share = static_cast<double>(blocked) / static_cast<double>(dirs.size());
    const std::vector<double> ps{0.05, 0.25, 0.5, 0.75, 0.95};

    if (format == OutputFormat::json) {
        nlohmann::json j;
        j["location"] = location;
        j["directions"] = dirs.size();
        j["blocked_by_ground_share"] = blocked_share;
        j["external_g_cm2"] = {{"mean", mean},
                               {"p05", percentile(external, 0.05)},
                               {"p25", percentile(external, 0.25)},
                               {"p50", percentile(external, 0.5)},
                               {"p75", percentile(external, 0.75)},
                               {"p95", percentile(external, 0.95)}};
        j["gcr_phi_MV"] = sc.mission.gcr_phi_MV;
        j["body_model"] = body.model;
        for (std::size_t o = 0; o < body.organs.size(); ++o) {
            const std::string& organ = body.organs[o];
            auto& oj = j["organs"][organ];
            oj["mean_tissue_g_cm2"] = mean_tissue[o];
            oj["total_g_cm2"] = {{"p05", weighted_percentile(totals[o], 0.05)},
                                 {"p50", weighted_percentile(totals[o], 0.5)},
                                 {"p95", weighted_percentile(totals[o], 0.95)}};
            const auto& g = study.gcr_daily_dose(location, organ, sc.mission.gcr_phi_MV);
            oj["gcr_per_day"] = {{"with_reactions", dose_si_json(g.with_removal)},
                                 {"without_reactions", dose_si_json(g.without_removal)}};
            if (ev) {
                oj["event"] = dose_si_json(study.event_dose(location, organ, *ev));
            }
        }
        j["cautions"] = caution_text();
        return j.dump(2) + "\n";
    }
    std::string out =
        fmt::format("Shielding at {} ({}), {} directions\n", location, sc.file, dirs.size());
    out += fmt::format(
        "  blocked by the ground or terrain: {:.1f} % of the sky (counted as zero dose)\n",
        100.0 * blocked_share);
    std::string ext = fmt::format("  external areal density over the open sky, g/cm2: mean {}",
                                  significant(mean, 3));
    for (double p : ps) {
        ext += fmt::format(", p{:.0f} {}", 100 * p, significant(percentile(external, p), 3));
    }
    out += wrap(ext, 100, "    ");
    out += body.model == "phantom"
               ? "  per organ (stylised phantom: the organ's own tissue along each direction;\n"
                 "  percentiles over the organ's points and the open directions; effective =\n"
                 "  ICRP 103 weighted, its doses in mSv):\n"
               : "  per organ (quick body model: the tissue depth is added in every "
                 "direction):\n";
    for (std::size_t o = 0; o < body.organs.size(); ++o) {
        const std::string& organ = body.organs[o];
        const auto& g = study.gcr_daily_dose(location, organ, sc.mission.gcr_phi_MV);
        std::string line = fmt::format(
            "    {:<9} tissue {} g/cm2{}, total p5/p50/p95 {} / {} / {} g/cm2; GCR {} / {} mSv per "
            "day",
            organ, significant(mean_tissue[o], 3), body.model == "phantom" ? " (mean)" : "",
            significant(weighted_percentile(totals[o], 0.05), 3),
            significant(weighted_percentile(totals[o], 0.5), 3),
            significant(weighted_percentile(totals[o], 0.95), 3),
            significant(1e3 * g.with_removal.dose_equivalent_Sv, 3),
            significant(1e3 * g.without_removal.dose_equivalent_Sv, 3));
        if (ev) {
            const auto d = study.event_dose(location, organ, *ev);
            if (organ == "effective") {
                line +=
                    fmt::format("; {}: {} mSv", ev->id, significant(1e3 * d.dose_equivalent_Sv, 3));
            } else {
                line += fmt::format("; {}: {} mGy, {} mSv, {} mGy-Eq", ev->id,
                                    significant(1e3 * d.absorbed_Gy, 3),
                                    significant(1e3 * d.dose_equivalent_Sv, 3),
                                    significant(1e3 * d.rbe_weighted_GyEq, 3));
            }
        }
        out += wrap(line, 100, "              ");
    }
    out += fmt::format("  (GCR at the mission start, phi = {:g} MV, with / without nuclear "
                       "reactions;\n  no uncertainty factor)\n",
                       sc.mission.gcr_phi_MV);
    if (ev) {
        out += "  (event doses: the whole event at this location, no uncertainty factor, the "
               "higher of the\n  removal bracket)\n";
    }
    out += "\n" + caution_text();
    return out;
}

} // namespace crewdose::planner
