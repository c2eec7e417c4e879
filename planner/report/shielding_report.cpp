#include "planner/report/shielding_report.hpp"

#include "planner/report/cautions.hpp"
#include "planner/report/depth_report.hpp"
#include "planner/report/number_format.hpp"
#include "planner/study/body_model.hpp"
#include "planner/study/result_guard.hpp"

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>

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
        return dump_checked(j);
    }
    if (format == OutputFormat::csv) {
        // One row per organ; the location's own figures repeat on every row so that each row
        // stands alone. Doses per day at the mission's starting phi; the event's whole dose.
        std::string out =
            "location,body_model,directions,blocked_by_ground_share,external_mean_g_cm2,"
            "external_p05_g_cm2,external_p50_g_cm2,external_p95_g_cm2,organ,mean_tissue_g_cm2,"
            "total_p05_g_cm2,total_p50_g_cm2,total_p95_g_cm2,gcr_phi_MV,"
            "gcr_dose_equivalent_with_reactions_mSv_per_day,"
            "gcr_dose_equivalent_without_reactions_mSv_per_day,event,event_absorbed_mGy,"
            "event_dose_equivalent_mSv,event_rbe_weighted_mGyEq\n";
        for (std::size_t o = 0; o < body.organs.size(); ++o) {
            const std::string& organ = body.organs[o];
            const auto& g = study.gcr_daily_dose(location, organ, sc.mission.gcr_phi_MV);
            out += fmt::format(
                "{},{},{},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{},{:.10g},{:.10g},{:.10g},"
                "{:.10g},{:.10g},{:.10g},{:.10g}",
                location, body.model, dirs.size(), blocked_share, mean, percentile(external, 0.05),
                percentile(external, 0.5), percentile(external, 0.95), organ, mean_tissue[o],
                weighted_percentile(totals[o], 0.05), weighted_percentile(totals[o], 0.5),
                weighted_percentile(totals[o], 0.95), sc.mission.gcr_phi_MV,
                1e3 * g.with_removal.dose_equivalent_Sv,
                1e3 * g.without_removal.dose_equivalent_Sv);
            if (ev) {
                const auto d = study.event_dose(location, organ, *ev);
                out += fmt::format(",{},{:.10g},{:.10g},{:.10g}\n", ev->id, 1e3 * d.absorbed_Gy,
                                   1e3 * d.dose_equivalent_Sv, 1e3 * d.rbe_weighted_GyEq);
            } else {
                out += ",,,,\n";
            }
        }
        return out;
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
    out += model.organ_table_heading();
    for (std::size_t o = 0; o < body.organs.size(); ++o) {
        const std::string& organ = body.organs[o];
        const auto& g = study.gcr_daily_dose(location, organ, sc.mission.gcr_phi_MV);
        std::string line = fmt::format(
            "    {:<9} tissue {} g/cm2{}, total p5/p50/p95 {} / {} / {} g/cm2; GCR {} / {} mSv per "
            "day",
            organ, significant(mean_tissue[o], 3), samples ? " (mean)" : "",
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
               "higher of the\n  reactions bracket)\n";
    }
    out += "\n" + caution_text();
    return out;
}

} // namespace crewdose::planner
