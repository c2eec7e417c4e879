#include "directional_shielding.hpp"

#include <stdexcept>

namespace crewdose::habitats {

const std::vector<PathSegment>& DirectionalShielding::nearest(Vector3 direction) const {
    if (directions.empty() || directions.size() != paths.size()) {
        throw std::logic_error("DirectionalShielding: empty or inconsistent table");
    }
    std::size_t best = 0;
    double best_dot = -2.0;
    for (std::size_t i = 0; i < directions.size(); ++i) {
        const double c = dot(directions[i], direction);
        if (c > best_dot) {
            best_dot = c;
            best = i;
        }
    }
    return paths[best];
}

} // namespace crewdose::habitats
