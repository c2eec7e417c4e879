#include "planner/scenario/body_models.hpp"

#include <array>
#include <stdexcept>

namespace crewdose::planner {
namespace {

#define CREWDOSE_BODY_MODEL_NAME(id, summary, has_posture, spe_directions)                         \
    BodyModelName{#id, summary, has_posture, spe_directions},
constexpr std::array kNames{CREWDOSE_BODY_MODELS(CREWDOSE_BODY_MODEL_NAME)};
#undef CREWDOSE_BODY_MODEL_NAME

} // namespace

std::span<const BodyModelName> body_model_names() {
    return kNames;
}

const BodyModelName* find_body_model_name(std::string_view id) {
    for (const auto& n : kNames) {
        if (n.id == id) {
            return &n;
        }
    }
    return nullptr;
}

const BodyModelName& default_body_model_name() {
    return kNames.front();
}

std::string allowed_body_models() {
    std::string out;
    for (const auto& n : kNames) {
        if (!out.empty()) {
            out += ", ";
        }
        out.append(n.id).append(" (").append(n.summary).append(")");
    }
    return out;
}

} // namespace crewdose::planner
