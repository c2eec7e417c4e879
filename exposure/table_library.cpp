#include "table_library.hpp"

#include "nuclear.hpp"

namespace crewdose::exposure {

const RangeTable& TableLibrary::table(const Material& material, const Particle& particle) {
    auto key = std::make_pair(material.id(), particle.Z);
    auto it = tables_.find(key);
    if (it == tables_.end()) {
        RangeTable t(material, particle, grid_);
        // Removal is modelled for protons; ions keep an empty optical-depth slot (no removal)
        // until nucleus-nucleus cross sections are added.
        auto built = std::make_unique<RangeTable>(particle.Z == 1 ? with_proton_removal(t, material)
                                                                  : std::move(t));
        it = tables_.emplace(std::move(key), std::move(built)).first;
    }
    return *it->second;
}

} // namespace crewdose::exposure
