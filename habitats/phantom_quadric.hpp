#pragma once
// The phantom's geometric kernel: convex quadric solids (ellipsoids, elliptic cylinders and
// cones, tori, cut by planes), pieces (a solid less disjoint solids) and regions (unions less
// unions), with the chords a ray cuts through them. Lengths in cm in the phantom's frame
// (phantom.hpp).
#include "vector.hpp"

#include <utility>
#include <vector>

namespace crewdose::habitats {

/// Keeps the side of a plane where dot(normal, p) <= offset (p in phantom coordinates).
struct PhantomCut {
    Vector3 normal;
    double offset = 0.0;
};

/// A convex solid: one quadric (or none) intersected with half-spaces. The quadric is written
/// in local coordinates q = (dot(p - center, ex), dot(p - center, ey), dot(p - center, ez)).
struct PhantomSolid {
    enum class Kind {
        ellipsoid,         ///< (qx/a)^2 + (qy/b)^2 + (qz/c)^2 <= 1
        elliptic_cylinder, ///< (qx/a)^2 + (qy/b)^2 <= 1 (bound it along ez with cuts)
        /// (qx/a)^2 + (qy/b)^2 <= (1 + k qz)^2, 1 + k qz > 0: semi-axes a (1 + k qz), b (1 + k qz)
        elliptic_cone,
        polytope, ///< the cuts alone
        /// tube of radius a about the circle of radius c in the local x-z plane; organs only
        /// (no chord): not convex
        torus,
    };
    Kind kind = Kind::ellipsoid;
    Point3 center;
    Vector3 ex{1, 0, 0};
    Vector3 ey{0, 1, 0};
    Vector3 ez{0, 0, 1};
    Vector3 semi; ///< a, b, c
    double k = 0.0;
    std::vector<PhantomCut> cuts;
    Point3 bound_lo; ///< a box that holds the solid
    Point3 bound_hi;

    [[nodiscard]] bool contains(Point3 p) const;
    /// The ray parameters [lo, hi] (lo >= 0) at which p + t u is inside the convex solid;
    /// empty when hi <= lo. Not for tori.
    [[nodiscard]] std::pair<double, double> interval_ahead(Point3 p, Vector3 u) const;
};

/// A convex solid minus disjoint convex solids: what a ray crosses of it is its own interval
/// less the overlaps with each of `minus` (so each must lie in a region the others do not).
struct PhantomPiece {
    PhantomSolid base;
    std::vector<PhantomSolid> minus;
    [[nodiscard]] double chord_ahead(Point3 p, Vector3 u) const;
};

/// A union of solids minus another union: a point is in the region when it is in some `parts`
/// solid and in no `minus` solid.
struct PhantomRegion {
    std::vector<PhantomSolid> parts;
    std::vector<PhantomSolid> minus;
    [[nodiscard]] bool contains(Point3 p) const;
    /// A box (low and high corners) that holds the region: its parts' boxes together.
    [[nodiscard]] std::pair<Point3, Point3> bounds() const;
};

} // namespace crewdose::habitats
