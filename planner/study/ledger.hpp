#pragma once
// The dose ledger: per crew member and organ, dose pieces along the timeline (SPE doses inside
// activities, prior history, recorded doses), their rolling 30-day and 365-day maxima, career
// totals, and the margins to every planning limit.
#include "planner/study/study.hpp"

#include <functional>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace crewdose::planner {

/// A dose delivered over [start, end]: spread evenly, or following an event's time profile.
struct DosePiece {
    Time start;
    Time end;
    exposure::DoseQuantities dose;         ///< Gy, Sv, Gy-Eq, already times the uncertainty factor
    const EventSpec* event = nullptr;      ///< shape of the piece, if from an event
    std::string source;                    ///< "spe:ID", "prior", "recorded: ..."
    std::string activity;                  ///< "eva at rover-site (line 40)", ...
    const ArrivalGroups* timing = nullptr; ///< with `event`: how its dose arrives

    /// Part of the piece's dose delivered by time t (0 before start, all of it after end).
    [[nodiscard]] double fraction_by(const Time& t) const;
};

/// A timeline gap filled under --allow-gaps.
struct Gap {
    std::string crew;
    Time start;
    Time end;
    std::string charged_at; ///< location id
};

/// One stretch of a crew member's timeline: an activity, or a gap charged at a location.
struct TimelineSpan {
    Time start;
    Time end;
    std::string location;
    std::string label;                      ///< "eva at eva-site (line 212)"
    const ActivitySpec* activity = nullptr; ///< null for a gap
};

/// A crew member's timeline over the whole mission, sorted; gaps are InputError unless
/// `allow_gaps`, when they are filled at the location of the activity before them and
/// appended to `gaps`.
[[nodiscard]] std::vector<TimelineSpan> crew_timeline(const Scenario& sc, const CrewSpec& crew,
                                                      bool allow_gaps, std::vector<Gap>& gaps);

/// The largest dose in a rolling window and where it lies.
struct WindowMax {
    double dose_mGyEq = 0.0;
    Time window_start;
    Time window_end;
    std::string top_contributor; ///< the piece that gave most of it
};

/// The source name of GCR pieces.
inline constexpr const char* kGcrSource = "GCR";

/// Mission dose of one kind of source, in the report's units.
struct DoseTotals {
    double mGyEq = 0.0;
    double absorbed_mGy = 0.0;
    double dose_equivalent_mSv = 0.0;
    void add(const exposure::DoseQuantities& d) {
        mGyEq += 1e3 * d.rbe_weighted_GyEq;
        absorbed_mGy += 1e3 * d.absorbed_Gy;
        dose_equivalent_mSv += 1e3 * d.dose_equivalent_Sv;
    }
};

/// One organ's ledger. For "effective" every dose field holds the effective dose (mSv) where
/// the others hold mGy-Eq: its limit is in mSv.
struct OrganResult {
    std::string organ;
    DoseTotals gcr;      ///< mission GCR part
    DoseTotals spe;      ///< mission SPE part
    DoseTotals recorded; ///< recorded doses of the mission period
    WindowMax max_30d;
    WindowMax max_365d;
    double career_mGyEq = 0.0;  ///< prior + mission
    double mission_mGyEq = 0.0; ///< mission part only
    double mission_absorbed_mGy = 0.0;
    double mission_dose_equivalent_mSv = 0.0;
};

/// One limit checked: dose, limit and margin (limit - dose; negative means exceeded).
struct LimitCheck {
    Limit limit;
    double dose = 0.0;
    double margin = 0.0;
    bool exceeded = false;
    std::string window_text; ///< where the dose was highest
    std::string top_contributor;
};

/// What budget remains: continuing the timeline's mix of activities after the mission end at
/// its average GCR rate (no further events), the days until the first planning limit binds.
/// Conservative for the 30-day and annual windows: every dose already in the highest window is
/// taken to stay in it; a window limit that even so is not reached within one window length
/// never binds from the background alone.
struct Budget {
    bool binds = false;              ///< some limit binds
    double days = 0.0;               ///< after the mission end (0 if a limit is exceeded)
    std::string organ;               ///< of the limit that binds first
    std::string window;              ///< its window
    double rate_mGyEq_per_day = 0.0; ///< that organ's average GCR rate over the mission
};

struct CrewResult {
    std::string crew;
    std::string name;
    std::vector<OrganResult> organs;
    std::vector<LimitCheck> checks;
    Budget budget;
    std::vector<DosePiece> pieces; ///< all pieces of the lowest-margin organ's ledger
    std::vector<std::pair<std::string, double>> contributors; ///< BFO mGy-Eq by activity x source
    /// Organs not evaluated for this crew member (heart, brain, effective), with the locations
    /// of the timeline whose body model does not give them (the quick model).
    std::map<std::string, std::vector<std::string>> not_evaluated;
    /// Organs bounded from above rather than computed at some locations (the career effective
    /// dose where the quick model stands: effective_upper_bound), with those locations.
    std::map<std::string, std::vector<std::string>> estimated;
    /// Where the crew member is in the heliosphere when each event's flare is seen (scenario
    /// event order): the distance, why, and the factor on the spectrum's fluence as written.
    struct EventDistance {
        std::string event;
        double r_AU = 1.0;
        std::string basis;
        double fluence_scale = 1.0;
    };
    std::vector<EventDistance> event_distances;
};

/// exposure::effective_dose_upper_bound with `dose` giving each of skin, lens and BFO; `deeper`
/// receives the organ of the max ("lens" or "bfo"). Checked against the phantom's effective
/// dose at every location of both demos (ledger_test).
[[nodiscard]] exposure::DoseQuantities
effective_upper_bound(const std::function<exposure::DoseQuantities(const std::string&)>& dose,
                      std::string* deeper);

/// Where a dose stands against its limit: `near` from `near_share` of the limit (0.9 by
/// default) up to the limit. A dose that is not a finite number >= 0 is `exceeded`, never
/// within.
enum class LimitStatus { within, near, exceeded };
inline constexpr double kDefaultNearShare = 0.9;
[[nodiscard]] LimitStatus status_of(const LimitCheck& check, double near_share);
[[nodiscard]] std::string to_string(LimitStatus status);
/// The crew member's binding check: the highest share of its limit (nullptr if none).
[[nodiscard]] const LimitCheck* binding_check(const CrewResult& crew);

struct LedgerOptions {
    bool allow_gaps = false;
    /// Resolution inside smooth event profiles when searching window maxima.
    boost::posix_time::time_duration profile_step = boost::posix_time::minutes(10);
};

struct LedgerResult {
    std::vector<CrewResult> crew;
    std::vector<Gap> gaps;
    bool any_exceeded = false;
    /// Per crew and organ, the pieces (for --series output).
    std::map<std::pair<std::string, std::string>, std::vector<DosePiece>> pieces;
};

/// The highest 30-day dose (mGy-Eq) of `crew`'s `organ` from every ledger piece except those of
/// event `excluded`: the other dose that shares a window with a what-if event (conservative:
/// wherever the window lies).
[[nodiscard]] double highest_30d_without(const LedgerResult& ledger, const std::string& crew,
                                         const std::string& organ, const EventSpec* excluded);

/// The budget of one crew member from the checks and each organ's mission GCR dose over
/// `mission_days`.
[[nodiscard]] Budget remaining_budget(const std::vector<LimitCheck>& checks,
                                      const std::vector<OrganResult>& organs, double mission_days);

/// Builds the ledger of every crew member. Timeline gaps are InputError (at the crew entry's
/// line) unless `options.allow_gaps`.
[[nodiscard]] LedgerResult build_ledger(const Study& study, const LedgerOptions& options = {});

/// The cumulative dose (mGy-Eq; for the effective dose, mSv) of the pieces by each of `times`
/// (sorted, ascending): a sweep, linear in pieces and times after sorting the pieces.
[[nodiscard]] std::vector<double> cumulative_at(const std::vector<DosePiece>& pieces,
                                                const std::vector<Time>& times);

/// The largest dose (mGy-Eq) in any window of `length` over the pieces, exact at piece
/// boundaries and sampled at `step` inside event profiles; O(n log n) in the pieces and
/// window ends (cumulative_at()).
[[nodiscard]] WindowMax window_maximum(const std::vector<DosePiece>& pieces,
                                       boost::posix_time::time_duration length,
                                       boost::posix_time::time_duration step);

} // namespace crewdose::planner
