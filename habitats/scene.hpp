#pragma once
// Scenes of layered solids, and tracing a ray from a dose point outwards into the ordered list
// of materials it crosses, in areal density.
#include "shape.hpp"

#include <optional>
#include <stdexcept>
#include <string>
#include <vector>

namespace crewdose::habitats {

/// One layer of a solid, listed from the outer surface inwards.
struct SolidLayer {
    std::string material_id;
    double thickness_m;
    double density_g_cm3;
};

/// A shape with layers from its outer surface inwards and, optionally, a core material that
/// fills what the layers leave (an empty core is the room inside a wall). A solid of one
/// material is a shape with no layers and a core.
struct Solid {
    std::string id;
    Shape shape;
    std::vector<SolidLayer> layers;
    std::optional<SolidLayer> core; ///< thickness_m is ignored for the core
};

/// One segment of a layer path, in areal density.
struct PathSegment {
    std::string material_id;
    double areal_density_g_cm2;
};

/// Thrown when the geometry itself is wrong for the question asked: the dose point lies inside
/// a wall, or two solids overlap along a ray. Names the solid(s); the planner adds the file
/// and line.
class GeometryError : public std::runtime_error {
  public:
    GeometryError(std::string solid_id, const std::string& message)
        : std::runtime_error(message), solid_id_(std::move(solid_id)) {}
    [[nodiscard]] const std::string& solid_id() const noexcept { return solid_id_; }

  private:
    std::string solid_id_;
};

/// A point where the material of two solids overlaps by more than the geometric tolerance, or
/// nullopt. The test is the scene's own rule (the same pieces as `Scene::trace`) applied on a
/// grid of `grid` x `grid` parallel rays along each of the three axes through the box that both
/// solids' bounds share, so it finds an overlap wherever it lies, not only where a ray from a
/// dose point crosses it; an overlap thinner than the grid spacing (1/`grid` of the shared box)
/// across two axes at once can escape it.
[[nodiscard]] std::optional<Point3> overlap_point(const Solid& a, const Solid& b, int grid = 64);

/// A set of solids. Rule for overlaps: solids must not overlap; a ray that finds material of
/// two solids at the same place throws GeometryError naming both (touching faces are fine).
class Scene {
  public:
    Scene() = default;
    explicit Scene(std::vector<Solid> solids);

    [[nodiscard]] const std::vector<Solid>& solids() const noexcept { return solids_; }

    /// The materials crossed from `point` outwards along the unit `direction`, nearest first,
    /// adjacent segments of one material merged. GeometryError if `point` is inside material
    /// (a dose point inside a wall) or solids overlap on the way.
    [[nodiscard]] std::vector<PathSegment> trace(Point3 point, Vector3 direction) const;

    /// The solid whose material contains `point`, if any.
    [[nodiscard]] const Solid* solid_at(Point3 point) const;

  private:
    std::vector<Solid> solids_;
};

} // namespace crewdose::habitats
