#pragma once
// The body models a scenario may name (location.body): the registry, one line per model. This
// list is data only, so that the loader (this stage) can check an id; the models themselves, what
// they compute, are in planner/study/ (body_model.hpp), found through the same list.
#include <span>
#include <string>
#include <string_view>

namespace crewdose::planner {

/// Which of the mission's direction counts a body model's SPE responses are computed over at a
/// location with solids (an imported table brings its own directions): mission.directions, or
/// mission.phantom_directions (a body whose depths change with direction needs its own count).
enum class SpeDirectionSet { mission, phantom };

/// A body model as the scenario, the messages and the reports name it.
struct BodyModelName {
    std::string_view id;      ///< as written in the scenario (location.body)
    std::string_view summary; ///< what it is, in one line (the loader's "allowed:" list)
    bool has_posture;         ///< location.posture applies to it
    SpeDirectionSet spe_directions;
};

// The registry. CREWDOSE_BODY_MODELS(X) calls X(id, summary, has_posture, spe_directions) once per
// model, the default (a location without `body`) first. A model with id `foo` is the class that
// make_body_model_foo() returns (planner/study/foo_body_model.cpp; DEVELOPERS.md, "Adding a
// body model").
#define CREWDOSE_BODY_MODELS(X)                                                                    \
    X(phantom, "the stylised adult phantom: adds heart, brain and the effective dose", true,       \
      SpeDirectionSet::phantom)                                                                    \
    X(quick, "screening: skin, lens, BFO at fixed tissue depths", false, SpeDirectionSet::mission)

/// Every registered body model, in the registry's order (the default first).
[[nodiscard]] std::span<const BodyModelName> body_model_names();
/// The model with this id, or nullptr when none has it.
[[nodiscard]] const BodyModelName* find_body_model_name(std::string_view id);
/// The model of a location that gives no `body`.
[[nodiscard]] const BodyModelName& default_body_model_name();
/// "quick (skin, ...), phantom (...)": every id with its summary, for "allowed:" messages.
[[nodiscard]] std::string allowed_body_models();

} // namespace crewdose::planner
