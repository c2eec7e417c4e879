#pragma once
// How a body puts tissue in front of its organs: the quick screening model's fixed depths and
// the stylised phantom's organ depths per direction (ray traces through habitats::Phantom), on
// grids of tissue areal density shared by every organ. The responses and doses at a location
// (location_response.hpp) weight the doses at the grid depths with these.
#include "habitats/phantom.hpp"

#include <cstddef>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace crewdose::planner {

/// An organ of the quick screening body model: the same tissue depth in every direction
/// (conservative; common practice depths skin 0.07 mm, lens 3 mm, BFO 5 cm).
struct QuickOrgan {
    std::string name;
    double depth_g_cm2;
};
[[nodiscard]] std::vector<QuickOrgan> quick_body_model();

/// How a body model puts tissue in front of its organs: a grid of tissue areal densities shared
/// by every organ and, per direction and organ, weights on that grid that sum to 1 (the tissue
/// depths of the organ's sample points along the direction, each split between its two
/// neighbouring nodes in proportion to its distance from them). The dose of an organ along a
/// direction is then the weighted sum of the doses at the grid depths. The quick model has one
/// node per organ and the same weights in every direction; the phantom's depend on direction.
struct BodyDepths {
    std::string model;               ///< the body model's id (location.body)
    std::vector<std::string> organs; ///< organ ids, in output order
    std::vector<double> grid_g_cm2;  ///< increasing tissue areal densities
    std::size_t directions = 0;      ///< 0: one block of weights for every direction
    /// Row-major [direction][organ][grid node] (only [organ][node] when `directions` is 0).
    std::vector<double> weights;

    /// The weights of one organ along direction `k` (grid-sized).
    [[nodiscard]] std::span<const double> of(std::size_t k, std::size_t organ) const {
        const std::size_t block = organs.size() * grid_g_cm2.size();
        const std::size_t base = (directions == 0 ? 0 : k * block) + organ * grid_g_cm2.size();
        return {weights.data() + base, grid_g_cm2.size()};
    }
    /// The grid nodes some organ has weight on along direction `k`, increasing, into `nodes`.
    void needed_nodes(std::size_t k, std::vector<std::size_t>& nodes) const {
        nodes.clear();
        for (std::size_t g = 0; g < grid_g_cm2.size(); ++g) {
            for (std::size_t o = 0; o < organs.size(); ++o) {
                if (of(k, o)[g] != 0.0) {
                    nodes.push_back(g);
                    break;
                }
            }
        }
    }
};

/// The quick model as BodyDepths: skin, lens and BFO each at its one depth.
[[nodiscard]] BodyDepths quick_body_depths();

/// Phantom points each direction uses per organ region (of the 512 each region has).
/// Convergence: tests/unit/phantom_test.
inline constexpr std::size_t kPhantomPointsPerDirection = 32;
/// The skin takes this many times as many points per direction (whether a surface point faces
/// the direction decides its dose; convergence: tests/unit/phantom_convergence_test).
inline constexpr std::size_t kSkinPointsFactor = 4;

/// Nodes per decade of the proton tables for the SPE responses of phantom locations (quick
/// ones keep the tables' default 64). Against 64 (phantom organs behind a suit, 10 g/cm2
/// aluminium and 60 g/cm2 regolith, the demo Band event and a harder one): within 0.1 %
/// (tests/unit/phantom_test); 16 would be within 0.45 %. The phantom's 25 depths per direction
/// cost a response each: 32 halves that cost.
inline constexpr std::size_t kPhantomSpeNodesPerDecade = 32;

/// The phantom's tissue-depth grid, g/cm2: the skin and lens depths, then nodes from 0.5 to
/// 160 g/cm2 (the longest path through the body) about 20 % apart. Convergence against a grid
/// twice as fine and against every sample point's own depth: tests/unit/phantom_test.
[[nodiscard]] std::vector<double> phantom_depth_grid();

/// The organs a phantom location reports: "skin", the mean over the body's surface of the
/// dose 0.07 mm below it (each point with the body behind it), "lens" at the quick model's
/// 3 mm in every direction (the phantom has no eyes), "bfo" the active marrow, "heart" and "brain"
/// (the circulatory and CNS limits), and "effective": the ICRP 103 tissue-weighted sum of the
/// phantom's organs (exposure::icrp103_tissue_weights), so that its dose equivalent is the
/// effective dose. Tissues the phantom lacks take a named proxy: oesophagus -> thymus, salivary
/// glands -> thyroid, bone surface -> active marrow; the remainder is the mean of the remainder
/// tissues it has.
///
/// Each direction uses `points_per_direction` of each organ region's points (the skin four
/// times as many), a different block of them for each direction in turn (stratified sampling:
/// over all directions every point is used); 0 uses every point in every direction (the
/// reference).
[[nodiscard]] BodyDepths
phantom_body_depths(const habitats::Phantom& phantom, habitats::Posture posture, double heading_deg,
                    const std::vector<habitats::Vector3>& directions,
                    const std::vector<double>& grid_g_cm2,
                    std::size_t points_per_direction = kPhantomPointsPerDirection);

/// A coarser grid for the GCR marches (the GCR dose changes slowly with depth; every node is a
/// step boundary of the march): the skin and lens depths, then 1 to 46 g/cm2 about 45 % apart;
/// deeper points count at 46 g/cm2 (the GCR dose falls with depth: the higher value; 0.2 % on
/// the organ doses against nodes to 160 g/cm2). Against phantom_depth_grid():
/// tests/unit/phantom_test.
[[nodiscard]] std::vector<double> phantom_gcr_depth_grid();

/// The adult phantom every phantom location shares (built once, thread-safe).
[[nodiscard]] const habitats::Phantom& shared_phantom();

/// One sample point's tissue along one direction, for reports: the direction's index, the
/// tissue areal density (g/cm2) and the point's weight in the reported organ (the weights of
/// one direction sum to 1 per organ).
struct DepthSample {
    std::size_t direction = 0;
    double tissue_g_cm2 = 0.0;
    double weight = 0.0;
};

/// The same on several grids at once (one ray trace per point and direction for all), the
/// directions shared among `threads` threads (the result does not depend on their number).
/// With `samples`, also every traced depth before it is split onto the grid, per reported
/// organ (then on one thread).
[[nodiscard]] std::vector<BodyDepths> phantom_body_depths(
    const habitats::Phantom& phantom, habitats::Posture posture, double heading_deg,
    const std::vector<habitats::Vector3>& directions, std::span<const std::vector<double>> grids,
    std::size_t points_per_direction = kPhantomPointsPerDirection, std::size_t threads = 1,
    std::vector<std::vector<DepthSample>>* samples = nullptr);

/// Which phantom organ stands for an ICRP 103 tissue (the tissue itself where the phantom has
/// it), or "" for "remainder".
[[nodiscard]] std::string phantom_organ_for(std::string_view icrp_tissue);

} // namespace crewdose::planner
