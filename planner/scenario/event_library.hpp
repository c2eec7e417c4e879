#pragma once
// Reference solar particle events: published fits of historical events and statistical design
// events, each with its exact source, that a scenario names instead of writing a spectrum
// (spectrum = "library:ID", optionally with scale=X or scale_to=F@E; `crewdose events`).
#include <optional>
#include <string_view>
#include <vector>

namespace crewdose::planner {

struct ReferenceEvent {
    std::string_view id;
    std::string_view title;
    /// "historical" (one observed event) or "design" (a statistical event with a return period)
    std::string_view kind;
    std::optional<double> return_period_years;
    /// The fit in crewdose's spectrum spelling (spectrum_spec.hpp), as the source gives it.
    std::string_view spectrum;
    /// The publication of the fit (paper, table).
    std::string_view source;
    /// Where it was read, when not in the publication itself (a transcription, a later paper).
    std::string_view read_in;
    /// What was not checked, and the assumptions made in using it.
    std::string_view note;
};

/// An event the library should hold but does not, and why.
struct MissingReferenceEvent {
    std::string_view what;
    std::string_view why;
};

/// The library, in the order `crewdose events` lists it.
[[nodiscard]] const std::vector<ReferenceEvent>& reference_events();
/// The known gaps, listed by `crewdose events`.
[[nodiscard]] const std::vector<MissingReferenceEvent>& missing_reference_events();
/// The entry with `id`, or nullptr.
[[nodiscard]] const ReferenceEvent* find_reference_event(std::string_view id);

} // namespace crewdose::planner
