#include "location_response.hpp"

#include "exposure/gcr.hpp"

#include <algorithm>
#include <cmath>

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
        // The pack covers a cone about the horizontal direction behind the wearer.
        constexpr double kDeg = 3.14159265358979323846 / 180.0;
        const double back_az = (where.heading_deg + 180.0) * kDeg;
        const habitats::Vector3 back{std::sin(back_az), std::cos(back_az), 0.0};
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
    const exposure::Material& tissue = materials("soft-tissue");
    const exposure::Material& water = materials("water");
    const exposure::DoseMedium medium{&tables.table(tissue, p), &tables.table(water, p)};
    const auto organs = quick_body_model();
    std::vector<OrganResponse> out;
    for (const auto& organ : organs) {
        OrganResponse r;
        r.organ = organ.name;
        out.push_back(std::move(r));
    }
    std::size_t blocked = 0;
    const double weight = 1.0 / static_cast<double>(directions.size());
    const exposure::NodeDoses doses = exposure::node_doses(medium, p, exposure::RbeModel{});
    for (const auto& d : directions) {
        if (where.surroundings.blocked(d)) {
            ++blocked; // fully shielded: contributes zero to the equal-weight mean
            continue;
        }
        exposure::LayerPath path;
        for (const auto& seg : external_path(where, d)) {
            path.push_back({&tables.table(materials(seg.material_id), p), seg.areal_density_g_cm2});
        }
        path.push_back({medium.medium, 0.0});
        for (std::size_t k = 0; k < organs.size(); ++k) {
            path.back().areal_density_g_cm2 = organs[k].depth_g_cm2;
            const auto r = exposure::path_response(path, doses);
            auto& acc = out[k].response;
            if (acc.node_energies_MeV_per_n.empty()) {
                acc.node_energies_MeV_per_n = r.node_energies_MeV_per_n;
                acc.with_removal.assign(r.with_removal.size(), {});
                acc.without_removal.assign(r.without_removal.size(), {});
            }
            for (std::size_t j = 0; j < r.with_removal.size(); ++j) {
                acc.with_removal[j] += r.with_removal[j].scaled(weight);
                acc.without_removal[j] += r.without_removal[j].scaled(weight);
            }
        }
    }
    for (auto& o : out) {
        o.blocked_fraction = static_cast<double>(blocked) * weight;
        if (o.response.node_energies_MeV_per_n.empty()) { // every direction blocked
            o.response.node_energies_MeV_per_n.assign(medium.medium->grid().size(), 0.0);
            for (std::size_t j = 0; j < o.response.node_energies_MeV_per_n.size(); ++j) {
                o.response.node_energies_MeV_per_n[j] = std::exp(medium.medium->grid().log_node(j));
            }
            o.response.with_removal.assign(o.response.node_energies_MeV_per_n.size(), {});
            o.response.without_removal.assign(o.response.node_energies_MeV_per_n.size(), {});
        }
    }
    return out;
}

std::map<std::pair<std::string, double>, exposure::BracketedDose> gcr_quick_model_doses(
    const GcrMarches& marches, const MaterialResolver& materials, const LocationGeometry& where,
    const std::vector<habitats::Vector3>& directions, std::span<const double> phis_given) {
    // Each distinct phi once (a repeated one would be summed twice).
    std::vector<double> phis_MV(phis_given.begin(), phis_given.end());
    std::sort(phis_MV.begin(), phis_MV.end());
    phis_MV.erase(std::unique(phis_MV.begin(), phis_MV.end()), phis_MV.end());
    const exposure::Material& tissue = materials("soft-tissue");
    const exposure::Material& water = materials("water");
    auto organs = quick_body_model();
    std::sort(organs.begin(), organs.end(), [](const QuickOrgan& a, const QuickOrgan& b) {
        return a.depth_g_cm2 < b.depth_g_cm2;
    });
    std::map<std::pair<std::string, double>, exposure::BracketedDose> out;
    // Both marches share one energy grid (the library's), so one free-space field serves both.
    std::vector<exposure::IonField> free_space;
    for (const double phi : phis_MV) {
        free_space.push_back(exposure::gcr_free_space_field(marches.with_reactions, phi));
        for (const auto& o : organs) {
            out[{o.name, phi}] = {};
        }
    }
    const double weight = 1.0 / static_cast<double>(directions.size());
    std::vector<std::pair<const exposure::Material*, double>> path;
    for (const auto& d : directions) {
        if (where.surroundings.blocked(d)) {
            continue; // fully shielded: zero in the equal-weight mean
        }
        path.clear();
        for (const auto& seg : external_path(where, d)) {
            path.emplace_back(&materials(seg.material_id), seg.areal_density_g_cm2);
        }
        for (std::size_t k = 0; k < phis_MV.size(); ++k) {
            for (const bool reactions : {true, false}) {
                exposure::FragmentTransport& march =
                    reactions ? marches.with_reactions : marches.without_reactions;
                exposure::IonField field = free_space[k];
                for (const auto& [m, t] : path) {
                    march.cross(field, *m, t);
                }
                double depth = 0.0;
                for (const auto& o : organs) {
                    march.cross(field, tissue, o.depth_g_cm2 - depth);
                    depth = o.depth_g_cm2;
                    auto& slot = out[{o.name, phis_MV[k]}];
                    (reactions ? slot.with_removal : slot.without_removal) +=
                        march.dose(field, tissue, water).scaled(weight);
                }
            }
        }
    }
    return out;
}

} // namespace crewdose::planner
