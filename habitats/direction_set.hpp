#pragma once
#include "vector.hpp"

#include <cstddef>
#include <vector>

namespace crewdose::habitats {

/// A deterministic, nearly equal-area set of `count` unit directions on the sphere: the
/// spherical Fibonacci lattice (Gonzalez 2010, Math. Geosci. 42, 49), point i at
/// z_i = 1 - (2 i + 1) / count and azimuth 2 pi i / golden ratio. Every direction stands for the
/// same solid angle 4 pi / count, so a mean over the set is an equal-weight quadrature of the
/// sphere. `count` >= 1.
[[nodiscard]] std::vector<Vector3> fibonacci_directions(std::size_t count);

} // namespace crewdose::habitats
