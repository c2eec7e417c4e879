#include "planner/study/body_depths.hpp"

#include "exposure/effective_dose.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>
#include <thread>

namespace crewdose::planner {

std::vector<QuickOrgan> quick_body_model() {
    return {{"skin", 0.007}, {"lens", 0.3}, {"bfo", 5.0}};
}

BodyDepths quick_body_depths() {
    BodyDepths b;
    b.model = "quick";
    for (const auto& o : quick_body_model()) {
        b.organs.push_back(o.name);
        b.grid_g_cm2.push_back(o.depth_g_cm2);
    }
    std::sort(b.grid_g_cm2.begin(), b.grid_g_cm2.end());
    b.weights.assign(b.organs.size() * b.grid_g_cm2.size(), 0.0);
    const auto organs = quick_body_model();
    for (std::size_t k = 0; k < organs.size(); ++k) {
        const auto at = std::find(b.grid_g_cm2.begin(), b.grid_g_cm2.end(), organs[k].depth_g_cm2);
        b.weights[k * b.grid_g_cm2.size() + static_cast<std::size_t>(at - b.grid_g_cm2.begin())] =
            1.0;
    }
    return b;
}

std::vector<double> phantom_depth_grid() {
    return {0.007, 0.05, 0.1,  0.2,  0.3,  0.4,  0.5,  0.65, 0.8,  1.0,  1.25,
            1.5,   1.8,  2.2,  2.6,  3.0,  3.6,  4.3,  5.2,  6.2,  7.4,  8.9,
            10.7,  12.8, 15.4, 18.5, 22.0, 26.5, 32.0, 46.0, 66.0, 96.0, 160.0};
}

std::vector<double> phantom_gcr_depth_grid() {
    return {0.007, 0.3, 1.0, 2.0, 3.6, 5.2, 7.4, 10.7, 15.4, 22.0, 32.0, 46.0};
}

const habitats::Phantom& shared_phantom() {
    static const habitats::Phantom phantom;
    return phantom;
}

std::string phantom_organ_for(std::string_view tissue) {
    if (tissue == "oesophagus") {
        return "thymus";
    }
    if (tissue == "salivary-glands") {
        return "thyroid";
    }
    if (tissue == "bone-surface") {
        return "red-marrow";
    }
    if (tissue == "remainder") {
        return "";
    }
    return std::string(tissue);
}

BodyDepths phantom_body_depths(const habitats::Phantom& phantom, habitats::Posture posture,
                               double heading_deg, const std::vector<habitats::Vector3>& directions,
                               const std::vector<double>& grid, std::size_t points_per_direction) {
    const std::vector<std::vector<double>> grids{grid};
    return std::move(
        phantom_body_depths(phantom, posture, heading_deg, directions, grids, points_per_direction)
            .front());
}

std::vector<BodyDepths> phantom_body_depths(const habitats::Phantom& phantom,
                                            habitats::Posture posture, double heading_deg,
                                            const std::vector<habitats::Vector3>& directions,
                                            std::span<const std::vector<double>> grids,
                                            std::size_t points_per_direction, std::size_t threads,
                                            std::vector<std::vector<DepthSample>>* samples) {
    constexpr std::size_t n_out = 6;
    if (samples) {
        samples->assign(n_out, {});
        threads = 1;
    }
    std::vector<BodyDepths> bodies;
    std::vector<std::size_t> lens_node;
    for (const auto& grid : grids) {
        if (grid.size() < 2 || !std::is_sorted(grid.begin(), grid.end()) ||
            std::adjacent_find(grid.begin(), grid.end()) != grid.end()) {
            throw std::invalid_argument("phantom depth grid: at least two increasing depths");
        }
        auto node_of = [&](double depth) {
            const auto at = std::find(grid.begin(), grid.end(), depth);
            if (at == grid.end()) {
                throw std::invalid_argument(
                    "phantom depth grid: must hold the skin and lens depths");
            }
            return static_cast<std::size_t>(at - grid.begin());
        };
        node_of(0.007); // the skin's depth outward from its surface points: a node
        lens_node.push_back(node_of(0.3));
        BodyDepths b;
        b.model = "phantom";
        b.organs = {"skin", "lens", "bfo", "heart", "brain", "effective"};
        b.grid_g_cm2 = grid;
        b.directions = directions.size();
        b.weights.assign(directions.size() * n_out * grid.size(), 0.0);
        bodies.push_back(std::move(b));
    }

    // What each phantom organ (and the skin, last) adds to each reported organ.
    std::vector<const habitats::PhantomOrgan*> organs;
    for (const auto& o : phantom.organs()) {
        organs.push_back(&o);
    }
    organs.push_back(&phantom.skin());
    std::vector<std::vector<std::pair<std::size_t, double>>> feeds(organs.size());
    auto organ_index = [&](const std::string& id) {
        for (std::size_t i = 0; i < organs.size(); ++i) {
            if (organs[i]->id == id) {
                return i;
            }
        }
        throw std::logic_error(fmt::format("phantom has no organ {}", id));
    };
    // The skin's dose is taken 0.07 mm below its surface points, in every direction (the
    // convention of the quick model's skin, now with the body behind each point).
    constexpr double kSkinDepth_g_cm2 = 0.007;
    feeds[organ_index("skin")].emplace_back(0, 1.0);
    feeds[organ_index("red-marrow")].emplace_back(2, 1.0);
    feeds[organ_index("heart")].emplace_back(3, 1.0);
    feeds[organ_index("brain")].emplace_back(4, 1.0);
    // ICRP 103 averages the male and female remainders, each the mean over that sex's
    // remainder tissues present (uterus female only, prostate male only).
    std::vector<std::pair<std::string, double>> remainder; // tissue, share of the remainder
    {
        std::vector<std::string> male;
        std::vector<std::string> female;
        for (const auto r : exposure::icrp103_remainder_tissues()) {
            for (const auto* o : organs) {
                if (o->id == r) {
                    if (r != "uterus") {
                        male.emplace_back(r);
                    }
                    if (r != "prostate") {
                        female.emplace_back(r);
                    }
                }
            }
        }
        std::map<std::string, double> share;
        for (const auto& t : male) {
            share[t] += 0.5 / static_cast<double>(male.size());
        }
        for (const auto& t : female) {
            share[t] += 0.5 / static_cast<double>(female.size());
        }
        remainder.assign(share.begin(), share.end());
    }
    for (const auto& w : exposure::icrp103_tissue_weights()) {
        if (w.tissue == "remainder") {
            for (const auto& [r, share] : remainder) {
                feeds[organ_index(r)].emplace_back(5, w.w_T * share);
            }
        } else {
            feeds[organ_index(phantom_organ_for(w.tissue))].emplace_back(5, w.w_T);
        }
    }

    // Directions write disjoint blocks of the weights: they may be shared among threads.
    auto trace = [&](std::size_t k0, std::size_t k1) {
        for (std::size_t k = k0; k < k1; ++k) {
            const habitats::Vector3 u =
                habitats::to_phantom_frame(directions[k], posture, heading_deg);
            for (std::size_t q = 0; q < bodies.size(); ++q) {
                const std::size_t n_grid = bodies[q].grid_g_cm2.size();
                double* block = bodies[q].weights.data() + k * n_out * n_grid;
                block[1 * n_grid + lens_node[q]] = 1.0;
            }
            if (samples) {
                (*samples)[1].push_back({k, 0.3, 1.0});
            }
            for (std::size_t i = 0; i < organs.size(); ++i) {
                if (feeds[i].empty()) {
                    continue;
                }
                const auto& o = *organs[i];
                const double below = &o == &phantom.skin() ? kSkinDepth_g_cm2 : 0.0;
                for (std::size_t r = 0; r + 1 < o.region_begin.size(); ++r) {
                    const std::size_t first = o.region_begin[r];
                    const std::size_t count = o.region_begin[r + 1] - first;
                    // The skin takes four times as many: whether a surface point faces the
                    // direction decides its dose, and 32 points left the skin 2.9 % low at 256
                    // directions (128 points: see docs/model-notes.md, the phantom).
                    const std::size_t wanted = below > 0.0
                                                   ? kSkinPointsFactor * points_per_direction
                                                   : points_per_direction;
                    const std::size_t m =
                        points_per_direction == 0 ? count : std::min(wanted, count);
                    // The region's weight, spread over the m points this direction uses.
                    const double scale = static_cast<double>(count) / static_cast<double>(m);
                    for (std::size_t j = 0; j < m; ++j) {
                        const std::size_t s = first + (k * m + j) % count;
                        const double t = below + phantom.tissue_g_cm2(o.points[s], u);
                        if (samples) {
                            for (const auto& [out, f] : feeds[i]) {
                                (*samples)[out].push_back({k, t, f * o.weights[s] * scale});
                            }
                        }
                        for (auto& body : bodies) {
                            const auto& grid = body.grid_g_cm2;
                            const std::size_t n_grid = grid.size();
                            double* block = body.weights.data() + k * n_out * n_grid;
                            // Split between the neighbouring nodes (beyond the last: all on it).
                            const auto g = static_cast<std::size_t>(
                                std::upper_bound(grid.begin(), grid.end(), t) - grid.begin());
                            double lo_share = 1.0;
                            std::size_t lo = 0;
                            if (g == n_grid) {
                                lo = n_grid - 1;
                            } else if (g > 0) {
                                lo = g - 1;
                                lo_share = (grid[g] - t) / (grid[g] - grid[g - 1]);
                            }
                            for (const auto& [out, f] : feeds[i]) {
                                const double w = f * o.weights[s] * scale;
                                block[out * n_grid + lo] += w * lo_share;
                                if (lo_share < 1.0) {
                                    block[out * n_grid + lo + 1] += w * (1.0 - lo_share);
                                }
                            }
                        }
                    }
                }
            }
        }
    };
    const std::size_t n = directions.size();
    const std::size_t workers =
        std::clamp<std::size_t>(threads, 1, std::max<std::size_t>(1, n / 32));
    if (workers == 1) {
        trace(0, n);
    } else {
        std::vector<std::thread> pool;
        for (std::size_t w = 1; w < workers; ++w) {
            pool.emplace_back(trace, w * n / workers, (w + 1) * n / workers);
        }
        trace(0, n / workers);
        for (auto& t : pool) {
            t.join();
        }
    }
    return bodies;
}

} // namespace crewdose::planner
