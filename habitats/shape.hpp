#pragma once
// The closed set of convex shapes crewdose builds scenes from. Lengths in metres.
#include "vector.hpp"

#include <optional>
#include <string>
#include <variant>

namespace crewdose::habitats {

/// Ball of radius `radius` about `center`.
struct Sphere {
    Point3 center;
    double radius;
};

/// Right circular cylinder: bottom cap centred on `base`, extending `height` along the unit
/// vector `axis` (any direction).
struct Cylinder {
    Point3 base;
    Vector3 axis;
    double height;
    double radius;
};

/// Box with centre `center`, half extents along its own orthonormal axes `u`, `v`, `w`.
struct Box {
    Point3 center;
    Vector3 half_extent; ///< half sizes along u, v, w
    Vector3 u{1, 0, 0};
    Vector3 v{0, 1, 0};
    Vector3 w{0, 0, 1};
};

/// Half ball standing on the plane through `center` with normal `up`: the part of the sphere
/// of `radius` on the `up` side. Open at the bottom (the ground closes it).
struct Dome {
    Point3 center;
    double radius;
    Vector3 up{0, 0, 1};
};

/// Slab between the plane through `outer_point` with outward unit normal `normal` and the
/// plane `thickness` further in (against the normal).
struct Slab {
    Point3 outer_point;
    Vector3 normal;
    double thickness;
};

/// Half-space behind the plane through `surface_point` (against the outward normal).
struct HalfSpace {
    Point3 surface_point;
    Vector3 normal;
};

using Shape = std::variant<Sphere, Cylinder, Box, Dome, Slab, HalfSpace>;

/// Parameters [t_enter, t_exit] at which the line origin + t direction is inside the shape
/// (boundary included), or nullopt. t may be negative; infinite for unbounded shapes.
struct Chord {
    double enter;
    double exit;
};
[[nodiscard]] std::optional<Chord> chord(const Shape& shape, const Ray& ray);

/// The shape moved inward by `depth_m` on every face (the inner surface of a layer of that
/// thickness); nullopt when nothing is left. A dome keeps its floor plane; a slab's outer face
/// moves in; a half-space's surface moves down.
[[nodiscard]] std::optional<Shape> inset(const Shape& shape, double depth_m);

/// Volume in m3 of a bounded shape (sphere, cylinder, box, dome); nullopt for a slab or a
/// half-space.
[[nodiscard]] std::optional<double> volume_m3(const Shape& shape);

/// Axis-aligned box holding a shape. Unbounded shapes (slab, half-space) reach to +-`far_m`
/// along the axes they are unbounded on (a slab is bounded only along an axis it is
/// perpendicular to).
struct Bounds {
    Point3 lo;
    Point3 hi;
};
[[nodiscard]] Bounds bounds(const Shape& shape, double far_m);

/// True if the point lies inside the shape (boundary included).
[[nodiscard]] bool contains(const Shape& shape, Point3 p);

/// "sphere", "cylinder", "box", "dome", "slab" or "half-space".
[[nodiscard]] std::string shape_name(const Shape& shape);

} // namespace crewdose::habitats
