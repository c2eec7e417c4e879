#pragma once
#include "material.hpp"

#include <span>
#include <string_view>

namespace crewdose::exposure {

/// The built-in materials, in a fixed order. Each carries its sources (`Material::source()`).
[[nodiscard]] std::span<const Material> builtin_materials();
/// Built-in material by id; nullptr if there is none.
[[nodiscard]] const Material* find_builtin_material(std::string_view id);

} // namespace crewdose::exposure
