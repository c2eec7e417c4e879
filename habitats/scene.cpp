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

std::optional<Point3> overlap_point(const Solid& a, const Solid& b, int grid) {
    // Unbounded shapes are cut at 20 km: every coordinate of a scenario lies within 10 km.
    constexpr double kFar_m = 2.0e4;
    const Bounds ba = bounds(a.shape, kFar_m);
    const Bounds bb = bounds(b.shape, kFar_m);
    const double lo[3] = {std::max(ba.lo.x, bb.lo.x), std::max(ba.lo.y, bb.lo.y),
                          std::max(ba.lo.z, bb.lo.z)};
    const double hi[3] = {std::min(ba.hi.x, bb.hi.x), std::min(ba.hi.y, bb.hi.y),
                          std::min(ba.hi.z, bb.hi.z)};
    for (int i = 0; i < 3; ++i) {
        if (hi[i] - lo[i] <= kTolerance_m) {
            return std::nullopt; // the bounds at most touch
        }
    }
    std::vector<Piece> pa;
    std::vector<Piece> pb;
    for (int axis = 0; axis < 3; ++axis) {
        const int i = (axis + 1) % 3;
        const int j = (axis + 2) % 3;
        double dir[3] = {0.0, 0.0, 0.0};
        dir[axis] = 1.0;
        for (int gi = 0; gi < grid; ++gi) {
            for (int gj = 0; gj < grid; ++gj) {
                double o[3];
                o[axis] = lo[axis] - 1.0;
                o[i] = lo[i] + (gi + 0.5) / grid * (hi[i] - lo[i]);
                o[j] = lo[j] + (gj + 0.5) / grid * (hi[j] - lo[j]);
                const Ray ray{Point3{o[0], o[1], o[2]}, Vector3{dir[0], dir[1], dir[2]}};
                pa.clear();
                pb.clear();
                solid_pieces(a, ray, pa);
                if (pa.empty()) {
                    continue;
                }
                solid_pieces(b, ray, pb);
                for (const auto& p : pa) {
                    for (const auto& q : pb) {
                        // Within the shared box (unbounded pieces are infinite).
                        const double t0 = std::max({p.t0, q.t0, 1.0});
                        const double t1 = std::min({p.t1, q.t1, 1.0 + hi[axis] - lo[axis]});
                        if (t1 - t0 > kTolerance_m) {
                            return ray(0.5 * (t0 + t1));
                        }
                    }
                }
            }
        }
    }
    return std::nullopt;
}

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
