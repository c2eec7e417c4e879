#pragma once
// Reading an imported per-direction shielding table. Format, one direction per line:
//   dx dy dz  material=g_cm2 material=g_cm2 ...
// The direction (any length, not zero) is in the site frame (x east, y north, z up); the
// layers follow from the dose point outwards, nearest first, areal densities in g/cm2 (>= 0).
// Blank lines and lines starting with '#' are skipped.
#include "planner/scenario/input_error.hpp"

#include "habitats/directional_shielding.hpp"

#include <cstdint>
#include <functional>
#include <string>

namespace crewdose::planner {

/// Parses `text` read from `file_name`; InputError naming the file, line and field on any
/// problem. `known_material(id)` says whether a material id exists.
[[nodiscard]] habitats::DirectionalShielding
parse_shielding_table(const std::string& text, const std::string& file_name,
                      const std::function<bool(const std::string&)>& known_material);

/// Largest shielding table file read, bytes (a table of 65,536 directions with a dozen layers
/// each is about 8 MiB).
inline constexpr std::uintmax_t kMaxShieldingTableBytes = 16u << 20;
/// Most direction rows of a table (as mission.directions).
inline constexpr std::size_t kMaxShieldingTableRows = 65536;
/// Largest areal density of one layer of a table, g/cm2 (1e5 g/cm2 stops every particle of the
/// transport grid, up to 100 GeV/n, in any material; common practice).
inline constexpr double kMaxLayer_g_cm2 = 1.0e5;

/// Reads and parses a file: it must be a regular file of at most kMaxShieldingTableBytes of
/// printable ASCII text. InputError at `named_at` (where the scenario names the file) and
/// `field` when the file is missing, not a regular file, too large or not text; content errors
/// name the table's own file and line, and quote nothing from a file until one row has parsed.
[[nodiscard]] habitats::DirectionalShielding
read_shielding_table(const std::string& path,
                     const std::function<bool(const std::string&)>& known_material,
                     const SourceLocation& named_at, const std::string& field);

} // namespace crewdose::planner
