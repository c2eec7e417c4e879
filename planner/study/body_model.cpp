#include "planner/study/body_model.hpp"

#include <array>
#include <stdexcept>

namespace crewdose::planner {

SourceBodyDepths BodyModel::depths(const BodyPlacement& placement,
                                   const std::vector<habitats::Vector3>& spe_directions,
                                   const std::vector<habitats::Vector3>& gcr_directions,
                                   std::size_t threads) const {
    return {spe_depths(placement, spe_directions, threads),
            gcr_depths(placement, gcr_directions, threads)};
}

std::vector<OrganResponse>
BodyModel::responses(exposure::TableLibrary& tables, const MaterialResolver& materials,
                     const LocationGeometry& where,
                     const std::vector<habitats::Vector3>& directions) const {
    return body_responses(tables, materials, where, directions,
                          spe_depths(placement_of(where), directions));
}

BodyPlacement placement_of(const LocationGeometry& where) {
    return {where.posture, where.heading_deg};
}

namespace {

// One model per registry line, made once, in the registry's order.
struct Registry {
    std::vector<std::unique_ptr<BodyModel>> owned;
    std::vector<const BodyModel*> models;

    Registry() {
        const auto names = body_model_names();
        std::size_t next = 0;
#define CREWDOSE_MAKE_BODY_MODEL(id, summary, has_posture, spe_directions)                         \
    owned.push_back(make_body_model_##id(names[next++]));
        CREWDOSE_BODY_MODELS(CREWDOSE_MAKE_BODY_MODEL)
#undef CREWDOSE_MAKE_BODY_MODEL
        for (const auto& m : owned) {
            models.push_back(m.get());
        }
    }
};

const Registry& registry() {
    static const Registry r;
    return r;
}

} // namespace

std::span<const BodyModel* const> body_models() {
    return registry().models;
}

const BodyModel& body_model(std::string_view id) {
    for (const BodyModel* m : body_models()) {
        if (m->id() == id) {
            return *m;
        }
    }
    throw std::logic_error("unregistered body model '" + std::string(id) + "'");
}

} // namespace crewdose::planner
