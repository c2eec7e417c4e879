#pragma once
// The stylised adult phantom: the body and its organs as quadric solids (ellipsoids, elliptic
// cylinders, elliptic cones and tori, cut by planes), after the MIRD adult phantom (Snyder et
// al., MIRD Pamphlet No. 5, J. Nucl. Med. Suppl. 3, 1969, revised 1978) in the dimensions of
// the public Geant4 transcription (examples/advanced/human_phantom, G4MIRD*.cc).
// Lengths in cm in the phantom's frame: x towards the phantom's left, y towards its back, z up,
// z = 0 at the base of the trunk. What it is for: the tissue areal density between each organ
// and the skin along a direction (DESIGN.md "body model").
#include "phantom_quadric.hpp"
#include "phantom_sampling.hpp"
#include "vector.hpp"

#include <optional>
#include <span>
#include <string>
#include <utility>
#include <vector>

namespace crewdose::habitats {

/// One organ: the regions it is made of, each with its share of the organ (red marrow is
/// spread over several bones), and the points that stand for it.
struct PhantomOrgan {
    std::string id;
    std::string note; ///< what the organ's points are (a proxy is named as such)
    std::vector<std::pair<PhantomRegion, double>> regions;
    /// Sample points (quasi-random, uniform in each region's volume), region after region,
    /// and their weights (sum 1: a region's share spread evenly over its points).
    std::vector<Point3> points;
    std::vector<double> weights;
    /// Where each region's points start in `points` (one entry per region, then the end).
    std::vector<std::size_t> region_begin;
};

/// A part of the body whose density differs from soft tissue (lungs, skull, spine).
struct PhantomInsert {
    std::string id;
    std::vector<PhantomPiece> pieces; ///< disjoint
    double density_g_cm3 = 1.0;
    /// Optional convex solid holding every piece: a ray that misses it misses them all.
    std::optional<PhantomSolid> envelope;
};

class Phantom {
  public:
    /// The adult phantom with `points_per_region` sample points in every organ region.
    explicit Phantom(std::size_t points_per_region = 512);

    [[nodiscard]] std::span<const PhantomOrgan> organs() const { return organs_; }
    /// The skin: `points_per_region` points on the outer body's surface, uniform by area, with
    /// equal weights (one region; `regions` is empty). Its dose is taken 0.07 mm below each
    /// point (the caller adds that depth), each point shielded by the body behind it.
    [[nodiscard]] const PhantomOrgan& skin() const { return skin_; }
    /// The outer body's disjoint pieces.
    [[nodiscard]] std::span<const PhantomPiece> body_pieces() const { return body_; }
    /// Throws std::out_of_range for an unknown id.
    [[nodiscard]] const PhantomOrgan& organ(const std::string& id) const;
    /// True when the point is inside the outer body (head, trunk, breasts, legs, genitalia).
    [[nodiscard]] bool in_body(Point3 p) const;
    /// Tissue areal density, g/cm2, from `p` along unit vector `u` to the skin and beyond (a
    /// ray that leaves the trunk may cross a leg or the head): soft tissue at its density, the
    /// lungs and the skeleton at theirs (the clavicles count as soft tissue).
    [[nodiscard]] double tissue_g_cm2(Point3 p, Vector3 u) const;
    [[nodiscard]] static constexpr double soft_tissue_density() { return 0.9869; }

  private:
    std::vector<PhantomPiece> body_; ///< disjoint pieces of the outer body
    std::vector<PhantomInsert> inserts_;
    std::vector<PhantomOrgan> organs_;
    PhantomOrgan skin_;
};

/// How the person at a dose point is placed.
enum class Posture {
    standing, ///< body axis vertical, facing the heading
    lying,    ///< on the back, face up, head towards the heading
};

/// A direction in the scene frame (x east, y north, z up) in the phantom's frame, for a person
/// in `posture` whose heading (compass azimuth, degrees from north towards east) is
/// `heading_deg`.
[[nodiscard]] Vector3 to_phantom_frame(Vector3 scene_direction, Posture posture,
                                       double heading_deg);

} // namespace crewdose::habitats
