#pragma once
// Storm what-ifs: a design event starting at a chosen moment (its flare seen at the site at
// t0 = onset), the crew responding by the scenario's [storm_response] policy, the doses with
// and without the response against the 30-day limits; and the onset swept over the timeline.
#include "planner/study/ledger.hpp"

#include <array>
#include <functional>
#include <map>
#include <optional>
#include <span>
#include <string>
#include <unordered_map>
#include <vector>

namespace crewdose::planner {

/// The response's times for one onset.
struct StormTimes {
    Time onset;     ///< t0: the flare is seen at the site
    Time warning;   ///< t0 + warning delay
    Time all_clear; ///< the end of the response
};

/// Where a crew member is during a what-if: the planned timeline changed by the response.
/// Exposed for tests and reports.
[[nodiscard]] std::vector<TimelineSpan> respond(const std::vector<TimelineSpan>& planned,
                                                const StormPolicy& policy, const StormTimes& t);

/// The all-clear for an event whose flare is seen at `onset`: fixed, or when the flux above
/// the policy's energy falls below its threshold after the peak (searched minute by minute up
/// to 10 days after the onset).
[[nodiscard]] Time all_clear_time(const StormPolicy& policy, const EventSpec& event, Time onset,
                                  double fluence_exponent);

struct StormOrgan {
    std::string organ;
    double without_response_mGyEq = 0.0; ///< the event over the planned timeline
    double with_response_mGyEq = 0.0;    ///< the event over the responded timeline
    double other_30d_mGyEq = 0.0;        ///< highest 30-day dose from everything else
    double limit_30d_mGyEq = 0.0;
    /// limit - (with response + other): conservative, as if both fell in one window.
    [[nodiscard]] double margin() const {
        return limit_30d_mGyEq - with_response_mGyEq - other_30d_mGyEq;
    }
    [[nodiscard]] double ratio() const {
        return (with_response_mGyEq + other_30d_mGyEq) / limit_30d_mGyEq;
    }
    /// Written so that a ratio that is not a number reads as exceeded, never as within.
    [[nodiscard]] bool exceeded() const { return !(ratio() <= 1.0); }
};

struct StormCrew {
    std::string crew;
    std::string name;
    std::vector<StormOrgan> organs;
    std::vector<TimelineSpan> responded; ///< the spans that overlap the event
    /// Where the crew member is in the heliosphere at the onset, why, and the factor on the
    /// event's spectrum as written there.
    double sun_distance_AU = 1.0;
    std::string distance_basis = "at the site";
    double fluence_scale = 1.0;
    [[nodiscard]] double worst_ratio() const;
    [[nodiscard]] bool exceeded() const { return !(worst_ratio() <= 1.0); }
};

struct StormWhatIf {
    std::string event_id;
    StormTimes times;
    bool respond = true;
    std::vector<StormCrew> crew;
    [[nodiscard]] bool any_exceeded() const;
};

/// The most organs a what-if checks: limited_organs() and phantom_limited_organs().
inline constexpr std::size_t kMaxStormOrgans = 5;
/// The event's dose per checked organ (StormContext::organs() order; the rest unused).
using StormDoses = std::array<double, kMaxStormOrgans>;

/// Everything a what-if needs that does not depend on the onset, computed once.
class StormContext {
  public:
    /// InputError if the event is unknown, or `respond` is asked without a [storm_response].
    StormContext(const Study& study, const std::string& event_id, bool respond);

    [[nodiscard]] StormWhatIf at(Time onset) const;
    /// The fast path of the sweep: crew member `crew`'s highest (event with response + other) /
    /// limit over the organs at `onset`; the same numbers as at(onset), fewer of them.
    [[nodiscard]] double worst_ratio_at(Time onset, std::size_t crew,
                                        StormDoses* with_mGyEq = nullptr) const;
    /// The event's dose with the response (uncertainty factor applied, mGy-Eq) per organ of
    /// organs() for crew member `crew` at `onset`, from the part of the timeline the event can
    /// reach: time independent of the timeline's length.
    [[nodiscard]] StormDoses doses_at(Time onset, std::size_t crew) const;
    /// Crew member `crew`'s highest (event dose `d` + other) / limit over the checked organs.
    [[nodiscard]] double ratio_of(std::size_t crew, const StormDoses& d) const;
    /// The first crew member whose planned timeline is the same as `crew`'s (the same spans,
    /// places and activities): their event doses are the same at every onset.
    [[nodiscard]] std::size_t twin(std::size_t crew) const { return twin_.at(crew); }

    [[nodiscard]] const Study& study() const noexcept { return study_; }
    /// True when the crew follow the [storm_response] policy; false under --no-response.
    [[nodiscard]] bool responds() const noexcept { return respond_; }
    [[nodiscard]] const EventSpec& event() const noexcept { return *event_; }
    [[nodiscard]] const std::vector<TimelineSpan>& planned(std::size_t crew) const {
        return planned_.at(crew);
    }
    /// Hours from t0 to the all-clear at the site.
    [[nodiscard]] double all_clear_after_h() const noexcept { return all_clear_after_h_; }
    /// Hours from t0 to the all-clear for an onset: the site's, or, when the all-clear follows
    /// the flux and crew are elsewhere in the heliosphere, the latest of the crew's.
    [[nodiscard]] double all_clear_after_h(Time onset) const;
    /// The organs checked against their 30-day limits: BFO, lens and skin, and heart and brain
    /// when, for some crew member, every location the what-if can put them at gives them (the
    /// phantom body model).
    [[nodiscard]] const std::vector<std::string>& organs() const noexcept { return organs_; }
    /// Whether organ k of organs() is checked for crew member `crew` (BFO, lens and skin
    /// always; heart and brain when all of that crew member's places give them).
    [[nodiscard]] bool checked(std::size_t crew, std::size_t k) const {
        return k < organs_.size() && checked_.at(crew).at(k);
    }
    /// Organs with a 30-day limit that are not checked, and why (empty when all are).
    [[nodiscard]] const std::string& unchecked_note() const noexcept { return unchecked_note_; }
    /// Crew member `crew`'s other 30-day dose and the 30-day limit of organ k of organs().
    [[nodiscard]] double other(std::size_t crew, std::size_t k) const;
    [[nodiscard]] double limit(std::size_t k) const;

  private:
    /// The event's dose (uncertainty factor applied, mGy-Eq) per organ of organs() over `spans`
    /// of crew member `crew`.
    [[nodiscard]] StormDoses doses_over(std::span<const TimelineSpan> spans, Time onset,
                                        std::size_t crew) const;
    StormTimes times_at(Time onset) const;

    struct Cached {
        double mGyEq = 0.0; ///< the whole event there, factor applied
        const ArrivalGroups* timing = nullptr;
        /// An earlier organ at this location whose timing is the same (then its fraction is
        /// reused: with a fixed arrival every organ has one group), or this organ's own index.
        std::size_t same_timing_as = 0;
    };
    using PerOrgan = std::array<Cached, kMaxStormOrgans>;
    /// Adds `factor` times the event's dose between `from` and `to` at a place to `d`.
    void add_piece(StormDoses& d, Time from, Time to, const PerOrgan& at, Time onset,
                   double factor) const;
    std::unordered_map<std::string, PerOrgan> by_location_; ///< at the site
    /// A dispersed event's arrival at each grid distance (arrival_bin) the crew reach.
    std::map<long, std::unordered_map<std::string, PerOrgan>> by_bin_;
    std::map<long, double> all_clear_by_bin_;
    /// A crew member's place in the heliosphere at an onset: the table of their distance and
    /// the factor on the site's dose.
    struct Where {
        double r_AU = 1.0;
        double factor = 1.0;
        const std::unordered_map<std::string, PerOrgan>* table = nullptr;
    };
    [[nodiscard]] Where where(std::size_t crew, Time onset) const;
    std::vector<std::string> organs_;
    std::vector<std::array<bool, kMaxStormOrgans>> checked_; ///< per crew member, per organ
    std::string unchecked_note_;
    const Study& study_;
    const EventSpec* event_ = nullptr;
    bool respond_ = true;
    std::vector<std::vector<TimelineSpan>> planned_; ///< per crew member
    std::vector<std::size_t> twin_;                  ///< per crew member, see twin()
    std::vector<StormDoses> other_by_index_;         ///< the same per organs() index
    StormDoses limit_by_index_{};                    ///< 30-day limits per organs() index
    double horizon_h_ = 0.0;         ///< after the onset, beyond which the event gives nothing
    double all_clear_after_h_ = 0.0; ///< all-clear - onset: the same for every onset
};

/// One onset per `step` from `from` to `to`, plus the onsets at which the policy changes (the
/// warning or the first arrival meeting an EVA's or rover drive's start or end, the all-clear
/// meeting one), so the worst case is not missed between steps.
struct StormSweep {
    std::string event_id;
    boost::posix_time::time_duration step;
    Time from;
    Time to;
    std::size_t onsets = 0;
    /// Per crew member: the worst onset and its what-if.
    std::vector<std::pair<Time, StormCrew>> worst;
    /// Per EVA (and rover drive): the worst onset inside it, its worst crew ratio, go/no-go.
    struct Eva {
        std::string label;
        Time start;
        Time end;
        Time worst_onset;
        std::string crew;
        std::string organ;
        double ratio = -1.0; ///< (event with response + other) / 30-day limit; < 0 not swept
        [[nodiscard]] bool swept() const { return ratio >= 0.0; }
        [[nodiscard]] bool go() const { return swept() && ratio <= 1.0; }
    };
    std::vector<Eva> evas;
    /// Coarse profile: per onset bin (profile_bin_h wide from `from`; only bins an onset falls
    /// in), the highest ratio over the crew.
    std::vector<std::pair<Time, double>> profile;
    long profile_bin_h = 6; ///< sweep_profile_bin_h(from, to)
    [[nodiscard]] bool any_exceeded() const;
};

/// The width of a sweep profile's onset bins, hours: 6 hours while that makes at most
/// kMaxProfileBins bins (30 days of onsets), else the shortest of 12 h, 1, 2, 4, 7, 14 and 28
/// days that does (a year's sweep: 4-day bins), so that the profile stays a page long.
[[nodiscard]] long sweep_profile_bin_h(Time from, Time to);
inline constexpr long kMaxProfileBins = 120;

/// A profile bin's width in words: "6 hours", "1 day", "4 days".
[[nodiscard]] std::string profile_bin_text(long hours);

/// The most regular onsets a sweep takes (InputError naming --step beyond).
inline constexpr long long kMaxSweepOnsets = 2'000'000;

[[nodiscard]] StormSweep sweep_storm(const StormContext& context, Time from, Time to,
                                     boost::posix_time::time_duration step,
                                     const std::function<void(double)>& progress = {});

/// A command-line date-time, RFC 3339 with its offset ("2032-03-11T10:30:00Z"); InputError
/// naming `option` otherwise.
[[nodiscard]] Time parse_command_time(const std::string& text, const std::string& option);
/// A duration such as "10min", "1min", "30s", "2h" or "1d" (a positive number and a unit).
[[nodiscard]] boost::posix_time::time_duration parse_duration(const std::string& text,
                                                              const std::string& option);

} // namespace crewdose::planner
