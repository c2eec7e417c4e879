#include "planner/study/location_response.hpp"

#include "exposure/effective_dose.hpp"
#include "exposure/gcr.hpp"

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

std::vector<habitats::PathSegment> external_path(const LocationGeometry& where,
                                                 habitats::Vector3 direction) {
    std::vector<habitats::PathSegment> path;
    if (where.surroundings.atmosphere && direction.z > -1.0) {
        const double zenith_deg =
            std::acos(std::clamp(direction.z, -1.0, 1.0)) * 180.0 / 3.14159265358979323846;
        path.push_back({where.atmosphere_material_id,
                        habitats::slant_column_g_cm2(*where.surroundings.atmosphere,
                                                     std::min(zenith_deg, 90.0))});
    }
    if (where.imported) {
        const auto& rows = where.imported->nearest(direction); // nearest first
        path.insert(path.end(), rows.rbegin(), rows.rend());
    } else if (where.scene) {
        auto walls = where.scene->trace(where.point, direction); // nearest first
        std::reverse(walls.begin(), walls.end());                // outermost first
        path.insert(path.end(), walls.begin(), walls.end());
    }
    path.insert(path.end(), where.shell.begin(), where.shell.end());
    if (where.suit) {
        for (const auto& s : where.suit->all_around) {
            path.push_back({s.material_id, s.areal_density_g_cm2});
        }
        // The pack covers a cone about the direction of the wearer's back: horizontal and
        // away from the heading when standing, straight down when lying on the back.
        constexpr double kDeg = 3.14159265358979323846 / 180.0;
        const double back_az = (where.heading_deg + 180.0) * kDeg;
        const habitats::Vector3 back =
            where.posture == habitats::Posture::lying
                ? habitats::Vector3{0.0, 0.0, -1.0}
                : habitats::Vector3{std::sin(back_az), std::cos(back_az), 0.0};
        if (habitats::dot(back, direction) >= std::cos(where.suit->pack_half_angle_deg * kDeg)) {
            for (const auto& s : where.suit->pack) {
                path.push_back({s.material_id, s.areal_density_g_cm2});
            }
        }
    }
    return path;
}

std::vector<OrganResponse> quick_model_responses(exposure::TableLibrary& tables,
                                                 const MaterialResolver& materials,
                                                 const LocationGeometry& where,
                                                 const std::vector<habitats::Vector3>& directions) {
    return quick_model_responses(tables, materials, where, directions, exposure::proton());
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
                    // directions (128 points: see DEVELOPERS.md).
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

std::vector<OrganResponse> quick_model_responses(exposure::TableLibrary& tables,
                                                 const MaterialResolver& materials,
                                                 const LocationGeometry& where,
                                                 const std::vector<habitats::Vector3>& directions,
                                                 const exposure::Particle& p) {
    return body_responses(tables, materials, where, directions, quick_body_depths(), p);
}

namespace {

void check_body(const BodyDepths& body, std::size_t directions) {
    if (body.directions != 0 && body.directions != directions) {
        throw std::logic_error(fmt::format("body depths built for {} directions, used with {}",
                                           body.directions, directions));
    }
}

} // namespace

std::vector<OrganResponse> body_responses(exposure::TableLibrary& tables,
                                          const MaterialResolver& materials,
                                          const LocationGeometry& where,
                                          const std::vector<habitats::Vector3>& directions,
                                          const BodyDepths& body, const exposure::Particle& p) {
    check_body(body, directions.size());
    const exposure::Material& tissue = materials("soft-tissue");
    const exposure::Material& water = materials("water");
    const exposure::DoseMedium medium{&tables.table(tissue, p), &tables.table(water, p)};
    const std::size_t n_organs = body.organs.size();
    const std::size_t n_nodes = medium.medium->grid().size();
    std::vector<OrganResponse> out(n_organs);
    for (std::size_t o = 0; o < n_organs; ++o) {
        out[o].organ = body.organs[o];
        auto& acc = out[o].response;
        acc.node_energies_MeV_per_n.resize(n_nodes);
        for (std::size_t j = 0; j < n_nodes; ++j) {
            acc.node_energies_MeV_per_n[j] = medium.medium->energy_at_node(j);
        }
        acc.with_removal.assign(n_nodes, {});
        acc.without_removal.assign(n_nodes, {});
    }
    std::size_t blocked = 0;
    const double weight = 1.0 / static_cast<double>(directions.size());
    const exposure::NodeDoses doses = exposure::node_doses(medium, p, exposure::RbeModel{});
    std::vector<std::size_t> needed;
    std::vector<double> depths;
    for (std::size_t k = 0; k < directions.size(); ++k) {
        const auto& d = directions[k];
        if (where.surroundings.blocked(d)) {
            ++blocked; // fully shielded: contributes zero to the equal-weight mean
            continue;
        }
        exposure::LayerPath path;
        for (const auto& seg : external_path(where, d)) {
            path.push_back({&tables.table(materials(seg.material_id), p), seg.areal_density_g_cm2});
        }
        // The grid depths some organ needs along this direction.
        body.needed_nodes(k, needed);
        depths.clear();
        for (const std::size_t g : needed) {
            depths.push_back(body.grid_g_cm2[g]);
        }
        // One path response per depth: the exact one for a few depths, the fast path (the
        // external map computed once, tests/unit/response_test) for a grid.
        std::vector<exposure::PathResponse> at_depth;
        if (depths.size() <= 3) {
            path.push_back({medium.medium, 0.0});
            for (const double t : depths) {
                path.back().areal_density_g_cm2 = t;
                at_depth.push_back(exposure::path_response(path, doses));
            }
        } else {
            at_depth = exposure::depth_responses(path, *medium.medium, depths, doses);
        }
        for (std::size_t q = 0; q < needed.size(); ++q) {
            const std::size_t g = needed[q];
            const auto& r = at_depth[q];
            for (std::size_t o = 0; o < n_organs; ++o) {
                const double f = weight * body.of(k, o)[g];
                if (f == 0.0) {
                    continue;
                }
                auto& acc = out[o].response;
                for (std::size_t j = 0; j < n_nodes; ++j) {
                    acc.with_removal[j] += r.with_removal[j].scaled(f);
                    acc.without_removal[j] += r.without_removal[j].scaled(f);
                }
            }
        }
    }
    for (auto& o : out) {
        o.blocked_fraction = static_cast<double>(blocked) * weight;
    }
    return out;
}

std::map<std::pair<std::string, double>, exposure::BracketedDose> gcr_quick_model_doses(
    const GcrMarches& marches, const MaterialResolver& materials, const LocationGeometry& where,
    const std::vector<habitats::Vector3>& directions, std::span<const double> phis_given) {
    return gcr_body_doses(marches, materials, where, directions, quick_body_depths(), phis_given);
}

std::vector<std::vector<exposure::BracketedDose>>
field_body_doses(const GcrMarches& marches, const MaterialResolver& materials,
                 const LocationGeometry& where, const std::vector<habitats::Vector3>& directions,
                 const BodyDepths& body, std::span<const exposure::IonField> fields,
                 std::size_t direction_stride) {
    check_body(body, directions.size());
    if (direction_stride == 0) {
        throw std::logic_error("field_body_doses: direction_stride must be >= 1");
    }
    const exposure::Material& tissue = materials("soft-tissue");
    const exposure::Material& water = materials("water");
    const std::size_t n_organs = body.organs.size();
    const std::size_t n_grid = body.grid_g_cm2.size();
    // Per (field, organ) accumulators, both marches.
    std::vector<std::vector<exposure::BracketedDose>> acc(
        fields.size(), std::vector<exposure::BracketedDose>(n_organs));
    std::size_t used = 0;
    for (std::size_t k = 0; k < directions.size(); k += direction_stride) {
        ++used;
    }
    const double weight = 1.0 / static_cast<double>(used);
    std::vector<std::pair<const exposure::Material*, double>> path;
    std::vector<std::size_t> needed;
    std::vector<std::vector<exposure::DoseQuantities>> at_node(
        fields.size(), std::vector<exposure::DoseQuantities>(n_grid));
    std::vector<exposure::IonField> current;
    for (std::size_t k = 0; k < directions.size(); k += direction_stride) {
        const auto& d = directions[k];
        if (where.surroundings.blocked(d)) {
            continue; // fully shielded: zero in the equal-weight mean
        }
        path.clear();
        for (const auto& seg : external_path(where, d)) {
            path.emplace_back(&materials(seg.material_id), seg.areal_density_g_cm2);
        }
        body.needed_nodes(k, needed);
        for (const bool reactions : {true, false}) {
            exposure::FragmentTransport& march =
                reactions ? marches.with_reactions : marches.without_reactions;
            // Layer by layer, every field in turn: the fields share each layer's step map.
            current.assign(fields.begin(), fields.end());
            for (const auto& [m, t] : path) {
                for (auto& field : current) {
                    march.cross(field, *m, t);
                }
            }
            double depth = 0.0;
            for (const std::size_t g : needed) {
                for (std::size_t i = 0; i < fields.size(); ++i) {
                    march.cross(current[i], tissue, body.grid_g_cm2[g] - depth);
                    at_node[i][g] = march.dose(current[i], tissue, water);
                }
                depth = body.grid_g_cm2[g];
            }
            for (std::size_t i = 0; i < fields.size(); ++i) {
                for (std::size_t o = 0; o < n_organs; ++o) {
                    const auto w = body.of(k, o);
                    auto& slot = acc[i][o];
                    auto& q = reactions ? slot.with_removal : slot.without_removal;
                    for (std::size_t g = 0; g < n_grid; ++g) {
                        if (w[g] != 0.0) {
                            q += at_node[i][g].scaled(weight * w[g]);
                        }
                    }
                }
            }
        }
    }
    return acc;
}

std::map<std::pair<std::string, double>, exposure::BracketedDose>
gcr_body_doses(const GcrMarches& marches, const MaterialResolver& materials,
               const LocationGeometry& where, const std::vector<habitats::Vector3>& directions,
               const BodyDepths& body, std::span<const double> phis_given) {
    // Each distinct phi once (a repeated one would be summed twice).
    std::vector<double> phis_MV(phis_given.begin(), phis_given.end());
    std::sort(phis_MV.begin(), phis_MV.end());
    phis_MV.erase(std::unique(phis_MV.begin(), phis_MV.end()), phis_MV.end());
    // Both marches share one energy grid (the library's), so one free-space field serves both.
    std::vector<exposure::IonField> free_space;
    for (const double phi : phis_MV) {
        free_space.push_back(exposure::gcr_free_space_field(marches.with_reactions, phi));
    }
    const auto acc = field_body_doses(marches, materials, where, directions, body, free_space);
    std::map<std::pair<std::string, double>, exposure::BracketedDose> out;
    for (std::size_t i = 0; i < phis_MV.size(); ++i) {
        for (std::size_t o = 0; o < body.organs.size(); ++o) {
            out[{body.organs[o], phis_MV[i]}] = acc[i][o];
        }
    }
    return out;
}

} // namespace crewdose::planner
