#include "table_library.hpp"

#include "nuclear.hpp"

#include <stdexcept>

namespace crewdose::exposure {

const RangeTable& TableLibrary::table(const Material& material, const Particle& particle) {
    if (particle.Z < 1) {
        throw std::logic_error("TableLibrary: a neutral particle has no range table");
    }
    // Isotopes of one element (the proton, deuteron and triton) are different tables.
    auto key = std::make_pair(material.id(), 1000 * particle.Z + particle.A);
    auto it = tables_.find(key);
    if (it == tables_.end()) {
        RangeTable t(material, particle, grid_);
        // Every table carries its removal: Letaw/Kafexhiu for protons, Sihver for nuclei.
        auto built = std::make_unique<RangeTable>(with_removal(t, material));
        it = tables_.emplace(std::move(key), std::move(built)).first;
    }
    return *it->second;
}

} // namespace crewdose::exposure
