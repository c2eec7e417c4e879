#pragma once
// Where each crew member is in the heliosphere: the heliocentric distance along their timeline,
// which sets how strong an event is where they are (its fluence scaling) and when its particles
// arrive (the scatter-free path). Surface stays are at the site's distance; transits carry the
// crew between Earth (1 AU) and the site.
#include "planner/scenario/input_error.hpp"

#include <boost/date_time/posix_time/posix_time_types.hpp>

#include <string>
#include <vector>

namespace crewdose::planner {

struct Scenario;

/// Why a stretch of a crew member's timeline lies at its distance.
enum class DistanceSource {
    site,       ///< a surface activity (or between them): the site's distance
    activity,   ///< the activity's own sun_distance_AU
    trajectory, ///< the mission's [[mission.trajectory]] table
    outbound,   ///< default: in space before the first surface activity, from 1 AU to the site
    inbound,    ///< default: in space after the last surface activity, from the site to 1 AU
};

/// Words for reports: "the site", "its activity (line 42)", "the mission trajectory", ...
[[nodiscard]] std::string describe(DistanceSource source, const SourceLocation& where);

/// A stretch of time over which the distance runs linearly from r_from to r_to.
struct DistancePiece {
    boost::posix_time::ptime from;
    boost::posix_time::ptime to;
    double r_from_AU = 1.0;
    double r_to_AU = 1.0;
    DistanceSource source = DistanceSource::site;
    SourceLocation where; ///< the activity or trajectory entry it comes from
    [[nodiscard]] bool operator==(const DistancePiece& o) const;
};

/// One crew member's heliocentric distance over the mission: consecutive pieces from mission
/// start to mission end (gaps in the timeline take the default legs).
class SunDistanceTrack {
  public:
    SunDistanceTrack() = default;
    explicit SunDistanceTrack(std::vector<DistancePiece> pieces);
    /// Distance at t, AU (the first piece before the mission, the last after it).
    [[nodiscard]] double at(const boost::posix_time::ptime& t) const;
    /// The piece holding t.
    [[nodiscard]] const DistancePiece& piece_at(const boost::posix_time::ptime& t) const;
    [[nodiscard]] const std::vector<DistancePiece>& pieces() const noexcept { return pieces_; }
    [[nodiscard]] double lowest_AU() const;
    [[nodiscard]] double highest_AU() const;
    [[nodiscard]] bool operator==(const SunDistanceTrack& o) const { return pieces_ == o.pieces_; }

  private:
    std::vector<DistancePiece> pieces_;
};

/// Heliocentric distance at Earth, the Earth end of the default transit legs, AU.
inline constexpr double kEarthDistance_AU = 1.0;

/// Every crew member's track (crew order), from the activities, the mission's trajectory table
/// and the default legs; the scenario's activities must already be checked (no overlaps).
[[nodiscard]] std::vector<SunDistanceTrack> build_sun_distance_tracks(const Scenario& sc);

} // namespace crewdose::planner
