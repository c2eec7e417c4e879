#pragma once
// Reading an imported per-direction shielding table. Format, one direction per line:
//   dx dy dz  material=g_cm2 material=g_cm2 ...
// The direction (any length, not zero) is in the site frame (x east, y north, z up); the
// layers follow from the dose point outwards, nearest first, areal densities in g/cm2 (>= 0).
// Blank lines and lines starting with '#' are skipped.
#include "habitats/directional_shielding.hpp"

#include <functional>
#include <string>

namespace crewdose::planner {

/// Parses `text` read from `file_name`; InputError naming the file, line and field on any
/// problem. `known_material(id)` says whether a material id exists.
[[nodiscard]] habitats::DirectionalShielding
parse_shielding_table(const std::string& text, const std::string& file_name,
                      const std::function<bool(const std::string&)>& known_material);

/// Reads and parses a file (InputError if it cannot be read).
[[nodiscard]] habitats::DirectionalShielding
read_shielding_table(const std::string& path,
                     const std::function<bool(const std::string&)>& known_material);

} // namespace crewdose::planner
