#include "table_library.hpp"

#include "nuclear.hpp"

namespace crewdose::exposure {

const RangeTable& TableLibrary::table(const Material& material, const Particle& particle) {
    auto key = std::make_pair(material.id(), particle.Z);
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
