#pragma once
// Imported shielding: a per-direction table of layer paths, as habitat designers deliver
// ray traces from their CAD models. Each direction stands for an equal share of the sphere.
#include "scene.hpp"

#include <vector>

namespace crewdose::habitats {

struct DirectionalShielding {
    std::vector<Vector3> directions;             ///< unit vectors
    std::vector<std::vector<PathSegment>> paths; ///< per direction, nearest layer first

    /// The path of the table direction nearest to `direction`.
    [[nodiscard]] const std::vector<PathSegment>& nearest(Vector3 direction) const;
};

} // namespace crewdose::habitats
