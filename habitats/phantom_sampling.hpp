#pragma once
// Points that stand for the phantom's organs and skin: quasi-random (Halton) points uniform in
// a region's volume, and points uniform by area on a surface.
#include "phantom_quadric.hpp"

#include <cstddef>
#include <span>
#include <string>
#include <vector>

namespace crewdose::habitats {

/// The radical inverse of `i` in `base`: the Halton sequence.
[[nodiscard]] double halton(std::size_t i, std::size_t base);

/// `n` points uniform in the region's volume: the Halton sequence in the box that holds its
/// parts, kept where the point is inside; std::logic_error naming `id` if they cannot be
/// placed.
[[nodiscard]] std::vector<Point3> sample_region(const PhantomRegion& region, std::size_t n,
                                                const std::string& id);

/// `n` points on the surface of the union of disjoint `pieces`, uniform by area: the boundary
/// crossings of isotropic uniform random lines (Crofton: the expected number of crossings with
/// a surface element is proportional to its area), lines from a Halton sequence. Where two
/// pieces touch, the shared face is not surface. Each point is moved 1e-6 cm inside along its
/// line. `lines_per_crossing`, when given, receives the number of lines drawn divided by the
/// crossings found; the surface area is then 2 pi R^2 / lines_per_crossing for the bounding
/// sphere's radius R (returned in `bounding_radius`).
[[nodiscard]] std::vector<Point3> surface_points(std::span<const PhantomPiece> pieces,
                                                 std::size_t n,
                                                 double* lines_per_crossing = nullptr,
                                                 double* bounding_radius = nullptr);

} // namespace crewdose::habitats
