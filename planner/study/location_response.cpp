#include "planner/study/location_response.hpp"

#include "exposure/gcr.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>

namespace crewdose::planner {

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
