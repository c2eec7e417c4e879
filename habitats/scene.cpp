#include "scene.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace crewdose::habitats {
namespace {

// Geometric tolerance: 1 micrometre. Touching faces of neighbouring solids meet within it.
constexpr double kTolerance_m = 1e-6;

struct Piece {
    double t0;
    double t1;
    const SolidLayer* layer;
    const Solid* solid;
};

// The pieces of one solid along a ray: layer k occupies inset(D_k) minus inset(D_k+1).
void solid_pieces(const Solid& solid, const Ray& ray, std::vector<Piece>& out) {
    std::vector<std::optional<Chord>> chords;
    double depth = 0.0;
    chords.push_back(chord(solid.shape, ray));
    if (!chords.back()) {
        return;
    }
    for (const auto& layer : solid.layers) {
        depth += layer.thickness_m;
        const auto inner = inset(solid.shape, depth);
        chords.push_back(inner ? chord(*inner, ray) : std::nullopt);
    }
    for (std::size_t k = 0; k < solid.layers.size(); ++k) {
        const auto& outer = chords[k];
        const auto& inner = chords[k + 1];
        if (!outer) {
            break;
        }
        const SolidLayer* layer = &solid.layers[k];
        if (!inner) {
            out.push_back({outer->enter, outer->exit, layer, &solid});
        } else {
            out.push_back({outer->enter, inner->enter, layer, &solid});
            out.push_back({inner->exit, outer->exit, layer, &solid});
        }
    }
    if (solid.core && chords.back()) {
        out.push_back({chords.back()->enter, chords.back()->exit, &*solid.core, &solid});
    }
}

} // namespace

Scene::Scene(std::vector<Solid> solids) : solids_(std::move(solids)) {}

std::vector<PathSegment> Scene::trace(Point3 point, Vector3 direction) const {
    const Ray ray{point, direction};
    std::vector<Piece> pieces;
    for (const auto& s : solids_) {
        solid_pieces(s, ray, pieces);
    }
    // Keep what lies ahead (t > 0); a piece that straddles t = 0 means the point is inside.
    std::vector<Piece> ahead;
    for (const auto& p : pieces) {
        if (p.t1 - p.t0 <= kTolerance_m || p.t1 <= kTolerance_m) {
            continue;
        }
        if (p.t0 < -kTolerance_m) {
            throw GeometryError(p.solid->id, "the dose point lies inside solid '" + p.solid->id +
                                                 "' (material " + p.layer->material_id + ")");
        }
        ahead.push_back(p);
    }
    std::sort(ahead.begin(), ahead.end(),
              [](const Piece& a, const Piece& b) { return a.t0 < b.t0; });
    for (std::size_t i = 1; i < ahead.size(); ++i) {
        if (ahead[i].t0 < ahead[i - 1].t1 - kTolerance_m && ahead[i].solid != ahead[i - 1].solid) {
            throw GeometryError(ahead[i].solid->id, "solids '" + ahead[i - 1].solid->id +
                                                        "' and '" + ahead[i].solid->id +
                                                        "' overlap; solids must not overlap");
        }
    }
    std::vector<PathSegment> path;
    for (const auto& p : ahead) {
        if (std::isinf(p.t1)) {
            throw GeometryError(p.solid->id, "solid '" + p.solid->id +
                                                 "' is unbounded along this direction; use the "
                                                 "site's ground for half-spaces below the horizon");
        }
        const double g_cm2 = (p.t1 - std::max(p.t0, 0.0)) * 100.0 * p.layer->density_g_cm3;
        if (!path.empty() && path.back().material_id == p.layer->material_id) {
            path.back().areal_density_g_cm2 += g_cm2;
        } else {
            path.push_back({p.layer->material_id, g_cm2});
        }
    }
    return path;
}

const Solid* Scene::solid_at(Point3 point) const {
    const Ray ray{point, Vector3{0.0, 0.0, 1.0}};
    for (const auto& s : solids_) {
        std::vector<Piece> pieces;
        solid_pieces(s, ray, pieces);
        for (const auto& p : pieces) {
            if (p.t0 < -kTolerance_m && p.t1 > kTolerance_m) {
                return &s;
            }
        }
    }
    return nullptr;
}

} // namespace crewdose::habitats
