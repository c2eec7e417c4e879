#include "shape.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <type_traits>

namespace crewdose::habitats {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

template <class... Ts> struct Overloaded : Ts... { using Ts::operator()...; };
template <class... Ts> Overloaded(Ts...) -> Overloaded<Ts...>;

std::optional<Chord> intersect(std::optional<Chord> a, std::optional<Chord> b) {
    if (!a || !b) {
        return std::nullopt;
    }
    const double lo = std::max(a->enter, b->enter);
    const double hi = std::min(a->exit, b->exit);
    if (lo > hi) {
        return std::nullopt;
    }
    return Chord{lo, hi};
}

// The slab lo <= (x - origin) . n <= hi along the ray.
std::optional<Chord> slab_chord(const Ray& ray, Point3 origin, Vector3 n, double lo, double hi) {
    const double s0 = dot(ray.origin - origin, n);
    const double ds = dot(ray.direction, n);
    if (std::abs(ds) < 1e-15) {
        if (s0 < lo || s0 > hi) {
            return std::nullopt;
        }
        return Chord{-kInf, kInf};
    }
    double t0 = (lo - s0) / ds;
    double t1 = (hi - s0) / ds;
    if (t0 > t1) {
        std::swap(t0, t1);
    }
    return Chord{t0, t1};
}

std::optional<Chord> sphere_chord(const Ray& ray, Point3 c, double r) {
    // |o + t u - c|^2 = r^2 with |u| = 1: t^2 + 2 b t + q = 0.
    const Vector3 oc = ray.origin - c;
    const double b = dot(oc, ray.direction);
    const double q = dot(oc, oc) - r * r;
    const double disc = b * b - q;
    if (disc < 0.0) {
        return std::nullopt;
    }
    const double s = std::sqrt(disc);
    return Chord{-b - s, -b + s};
}

} // namespace

std::optional<Chord> chord(const Shape& shape, const Ray& ray) {
    return std::visit(
        Overloaded{
            [&](const Sphere& s) { return sphere_chord(ray, s.center, s.radius); },
            [&](const Cylinder& c) -> std::optional<Chord> {
                // Infinite cylinder: the component of the ray across the axis.
                const Vector3 oc = ray.origin - c.base;
                const Vector3 d_perp = ray.direction - dot(ray.direction, c.axis) * c.axis;
                const Vector3 o_perp = oc - dot(oc, c.axis) * c.axis;
                const double a = dot(d_perp, d_perp);
                const double b = dot(o_perp, d_perp);
                const double q = dot(o_perp, o_perp) - c.radius * c.radius;
                std::optional<Chord> side;
                if (a < 1e-30) {
                    if (q > 0.0) {
                        return std::nullopt;
                    }
                    side = Chord{-kInf, kInf};
                } else {
                    const double disc = b * b - a * q;
                    if (disc < 0.0) {
                        return std::nullopt;
                    }
                    const double s = std::sqrt(disc);
                    side = Chord{(-b - s) / a, (-b + s) / a};
                }
                return intersect(side, slab_chord(ray, c.base, c.axis, 0.0, c.height));
            },
            [&](const Box& b) {
                auto c = slab_chord(ray, b.center, b.u, -b.half_extent.x, b.half_extent.x);
                c = intersect(c, slab_chord(ray, b.center, b.v, -b.half_extent.y, b.half_extent.y));
                return intersect(c,
                                 slab_chord(ray, b.center, b.w, -b.half_extent.z, b.half_extent.z));
            },
            [&](const Dome& d) {
                return intersect(sphere_chord(ray, d.center, d.radius),
                                 slab_chord(ray, d.center, d.up, 0.0, kInf));
            },
            [&](const Slab& s) {
                return slab_chord(ray, s.outer_point, s.normal, -s.thickness, 0.0);
            },
            [&](const HalfSpace& h) {
                return slab_chord(ray, h.surface_point, h.normal, -kInf, 0.0);
            },
        },
        shape);
}

std::optional<Shape> inset(const Shape& shape, double d) {
    return std::visit(
        Overloaded{
            [&](const Sphere& s) -> std::optional<Shape> {
                if (s.radius - d <= 0.0) {
                    return std::nullopt;
                }
                return Sphere{s.center, s.radius - d};
            },
            [&](const Cylinder& c) -> std::optional<Shape> {
                if (c.radius - d <= 0.0 || c.height - 2.0 * d <= 0.0) {
                    return std::nullopt;
                }
                return Cylinder{c.base + d * c.axis, c.axis, c.height - 2.0 * d, c.radius - d};
            },
            [&](const Box& b) -> std::optional<Shape> {
                const Vector3 h{b.half_extent.x - d, b.half_extent.y - d, b.half_extent.z - d};
                if (h.x <= 0.0 || h.y <= 0.0 || h.z <= 0.0) {
                    return std::nullopt;
                }
                return Box{b.center, h, b.u, b.v, b.w};
            },
            [&](const Dome& dm) -> std::optional<Shape> {
                if (dm.radius - d <= 0.0) {
                    return std::nullopt;
                }
                return Dome{dm.center, dm.radius - d, dm.up};
            },
            [&](const Slab& s) -> std::optional<Shape> {
                if (s.thickness - d <= 0.0) {
                    return std::nullopt;
                }
                return Slab{s.outer_point + (-d) * s.normal, s.normal, s.thickness - d};
            },
            [&](const HalfSpace& h) -> std::optional<Shape> {
                return HalfSpace{h.surface_point + (-d) * h.normal, h.normal};
            },
        },
        shape);
}

Bounds bounds(const Shape& shape, double far_m) {
    const auto around = [](Point3 c, double r) {
        return Bounds{{c.x - r, c.y - r, c.z - r}, {c.x + r, c.y + r, c.z + r}};
    };
    const Bounds everywhere{{-far_m, -far_m, -far_m}, {far_m, far_m, far_m}};
    return std::visit(
        Overloaded{
            [&](const Sphere& s) { return around(s.center, s.radius); },
            [&](const Cylinder& c) {
                // Each end disc reaches r sqrt(1 - a_i^2) from its centre along axis i.
                const Point3 top = c.base + c.height * c.axis;
                const Vector3 e{c.radius * std::sqrt(std::max(0.0, 1.0 - c.axis.x * c.axis.x)),
                                c.radius * std::sqrt(std::max(0.0, 1.0 - c.axis.y * c.axis.y)),
                                c.radius * std::sqrt(std::max(0.0, 1.0 - c.axis.z * c.axis.z))};
                return Bounds{{std::min(c.base.x, top.x) - e.x, std::min(c.base.y, top.y) - e.y,
                               std::min(c.base.z, top.z) - e.z},
                              {std::max(c.base.x, top.x) + e.x, std::max(c.base.y, top.y) + e.y,
                               std::max(c.base.z, top.z) + e.z}};
            },
            [&](const Box& b) {
                const auto reach = [&](double u, double v, double w) {
                    return std::abs(b.half_extent.x * u) + std::abs(b.half_extent.y * v) +
                           std::abs(b.half_extent.z * w);
                };
                const Vector3 e{reach(b.u.x, b.v.x, b.w.x), reach(b.u.y, b.v.y, b.w.y),
                                reach(b.u.z, b.v.z, b.w.z)};
                return Bounds{{b.center.x - e.x, b.center.y - e.y, b.center.z - e.z},
                              {b.center.x + e.x, b.center.y + e.y, b.center.z + e.z}};
            },
            [&](const Dome& d) { return around(d.center, d.radius); },
            [&](const Slab& s) {
                // Bounded only along an axis the slab is perpendicular to.
                Bounds b = everywhere;
                const Point3 inner = s.outer_point + (-s.thickness) * s.normal;
                const double n[3] = {s.normal.x, s.normal.y, s.normal.z};
                double* lo[3] = {&b.lo.x, &b.lo.y, &b.lo.z};
                double* hi[3] = {&b.hi.x, &b.hi.y, &b.hi.z};
                const double p0[3] = {s.outer_point.x, s.outer_point.y, s.outer_point.z};
                const double p1[3] = {inner.x, inner.y, inner.z};
                for (int i = 0; i < 3; ++i) {
                    if (std::abs(n[i]) > 1.0 - 1e-12) {
                        *lo[i] = std::min(p0[i], p1[i]);
                        *hi[i] = std::max(p0[i], p1[i]);
                    }
                }
                return b;
            },
            [&](const HalfSpace&) {
                return everywhere;
            }},
        shape);
}

bool contains(const Shape& shape, Point3 p) {
    // A zero-length probe: the chord of any ray from p covers t = 0 exactly when p is inside.
    const auto c = chord(shape, Ray{p, Vector3{0.0, 0.0, 1.0}});
    return c && c->enter <= 0.0 && c->exit >= 0.0;
}

std::string shape_name(const Shape& shape) {
    return std::visit(Overloaded{[](const Sphere&) { return std::string("sphere"); },
                                 [](const Cylinder&) { return std::string("cylinder"); },
                                 [](const Box&) { return std::string("box"); },
                                 [](const Dome&) { return std::string("dome"); },
                                 [](const Slab&) { return std::string("slab"); },
                                 [](const HalfSpace&) {
                                     return std::string("half-space");
                                 }},
                      shape);
}

std::optional<double> volume_m3(const Shape& shape) {
    constexpr double kPi = 3.14159265358979323846;
    return std::visit(
        [&](const auto& s) -> std::optional<double> {
            using T = std::decay_t<decltype(s)>;
            if constexpr (std::is_same_v<T, Sphere>) {
                return 4.0 / 3.0 * kPi * s.radius * s.radius * s.radius;
            } else if constexpr (std::is_same_v<T, Cylinder>) {
                return kPi * s.radius * s.radius * s.height;
            } else if constexpr (std::is_same_v<T, Box>) {
                return 8.0 * s.half_extent.x * s.half_extent.y * s.half_extent.z;
            } else if constexpr (std::is_same_v<T, Dome>) {
                return 2.0 / 3.0 * kPi * s.radius * s.radius * s.radius;
            } else {
                return std::nullopt;
            }
        },
        shape);
}

} // namespace crewdose::habitats
