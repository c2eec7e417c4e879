#include "planner/scenario/sun_distance.hpp"

#include "planner/scenario/scenario.hpp"
#include "planner/scenario/time_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <optional>
#include <stdexcept>

namespace crewdose::planner {

using boost::posix_time::ptime;

std::string describe(DistanceSource source, const SourceLocation& where) {
    switch (source) {
    case DistanceSource::site:
        return "at the site";
    case DistanceSource::activity:
        return fmt::format("the activity's sun_distance_AU (line {})", where.line);
    case DistanceSource::trajectory:
        return fmt::format("the mission trajectory (line {})", where.line);
    case DistanceSource::outbound:
        return "outbound leg, 1 AU to the site, by time";
    case DistanceSource::inbound:
        return "return leg, the site to 1 AU, by time";
    }
    return "?";
}

bool DistancePiece::operator==(const DistancePiece& o) const {
    return from == o.from && to == o.to && r_from_AU == o.r_from_AU && r_to_AU == o.r_to_AU &&
           source == o.source && where.line == o.where.line;
}

SunDistanceTrack::SunDistanceTrack(std::vector<DistancePiece> pieces) : pieces_(std::move(pieces)) {
    if (pieces_.empty()) {
        throw std::logic_error("SunDistanceTrack: no pieces");
    }
    for (std::size_t k = 0; k < pieces_.size(); ++k) {
        if (!(pieces_[k].to > pieces_[k].from) || (k > 0 && pieces_[k].from != pieces_[k - 1].to)) {
            throw std::logic_error("SunDistanceTrack: pieces must be consecutive and not empty");
        }
    }
}

const DistancePiece& SunDistanceTrack::piece_at(const ptime& t) const {
    // The piece whose [from, to) holds t: the first that ends after t.
    const auto it =
        std::upper_bound(pieces_.begin(), pieces_.end(), t,
                         [](const ptime& x, const DistancePiece& p) { return x < p.to; });
    return it == pieces_.end() ? pieces_.back() : *it;
}

double SunDistanceTrack::at(const ptime& t) const {
    const DistancePiece& p = piece_at(t);
    if (p.r_from_AU == p.r_to_AU) {
        return p.r_from_AU;
    }
    const double u = std::clamp(hours(t - p.from) / hours(p.to - p.from), 0.0, 1.0);
    return p.r_from_AU + u * (p.r_to_AU - p.r_from_AU);
}

double SunDistanceTrack::lowest_AU() const {
    double r = 1e300;
    for (const auto& p : pieces_) {
        r = std::min({r, p.r_from_AU, p.r_to_AU});
    }
    return r;
}

double SunDistanceTrack::highest_AU() const {
    double r = 0.0;
    for (const auto& p : pieces_) {
        r = std::max({r, p.r_from_AU, p.r_to_AU});
    }
    return r;
}

namespace {

double lerp_at(const ptime& t, const ptime& t0, double r0, const ptime& t1, double r1) {
    if (!(t1 > t0)) {
        return r1;
    }
    const double u = std::clamp(hours(t - t0) / hours(t1 - t0), 0.0, 1.0);
    return r0 + u * (r1 - r0);
}

} // namespace

std::vector<SunDistanceTrack> build_sun_distance_tracks(const Scenario& sc) {
    const Mission& m = sc.mission;
    const double site = m.sun_distance_AU;
    std::vector<SunDistanceTrack> tracks;
    for (const auto& crew : sc.crew) {
        const std::vector<const ActivitySpec*> mine = activities_of(sc, crew.id);
        auto in_space = [&](const ActivitySpec& a) {
            if (m.site == SiteKind::deep_space || a.kind == ActivityKind::transit) {
                return true;
            }
            const auto loc =
                std::find_if(sc.locations.begin(), sc.locations.end(),
                             [&](const LocationSpec& l) { return l.id == a.location; });
            return loc != sc.locations.end() && loc->deep_space;
        };
        // The default legs: in space before the first surface activity (from 1 AU at mission
        // start to the site when it begins) and after the last (back to 1 AU at mission end).
        std::optional<ptime> first_surface;
        std::optional<ptime> last_surface;
        for (const auto* a : mine) {
            if (!in_space(*a)) {
                if (!first_surface) {
                    first_surface = a->start;
                }
                last_surface = std::max(last_surface.value_or(a->end), a->end);
            }
        }
        std::vector<DistancePiece> pieces;
        auto add = [&](DistancePiece p) {
            if (p.to > p.from) {
                pieces.push_back(std::move(p));
            }
        };
        // A stretch in space with nothing of its own: the trajectory table where it reaches,
        // the default legs elsewhere.
        auto add_default = [&](const ptime& a, const ptime& b) {
            if (!(b > a)) {
                return;
            }
            if (!first_surface) {
                add({a, b, site, site, DistanceSource::site, m.where});
            } else if (b <= *first_surface) {
                add({a, b, lerp_at(a, m.start, kEarthDistance_AU, *first_surface, site),
                     lerp_at(b, m.start, kEarthDistance_AU, *first_surface, site),
                     DistanceSource::outbound, m.where});
            } else if (a >= *last_surface) {
                add({a, b, lerp_at(a, *last_surface, site, m.end, kEarthDistance_AU),
                     lerp_at(b, *last_surface, site, m.end, kEarthDistance_AU),
                     DistanceSource::inbound, m.where});
            } else {
                add({a, b, site, site, DistanceSource::site, m.where});
            }
        };
        auto add_in_space = [&](const ptime& a, const ptime& b) {
            const auto& table = m.trajectory;
            if (table.empty() || b <= table.front().at || a >= table.back().at) {
                add_default(a, b);
                return;
            }
            add_default(a, std::min(b, table.front().at));
            for (std::size_t k = 0; k + 1 < table.size(); ++k) {
                const ptime lo = std::max(a, table[k].at);
                const ptime hi = std::min(b, table[k + 1].at);
                if (hi > lo) {
                    add({lo, hi,
                         lerp_at(lo, table[k].at, table[k].r_AU, table[k + 1].at,
                                 table[k + 1].r_AU),
                         lerp_at(hi, table[k].at, table[k].r_AU, table[k + 1].at,
                                 table[k + 1].r_AU),
                         DistanceSource::trajectory, table[k].where});
                }
            }
            add_default(std::max(a, table.back().at), b);
        };
        ptime now = m.start;
        for (const auto* a : mine) {
            if (a->start > now) {
                add_in_space(now, a->start); // a gap (only with --allow-gaps)
            }
            if (a->sun_distance_AU) {
                add({a->start, a->end, a->sun_distance_AU->first, a->sun_distance_AU->second,
                     DistanceSource::activity, a->where});
            } else if (in_space(*a)) {
                add_in_space(a->start, a->end);
            } else {
                add({a->start, a->end, site, site, DistanceSource::site, a->where});
            }
            now = std::max(now, a->end);
        }
        if (m.end > now) {
            add_in_space(now, m.end);
        }
        tracks.emplace_back(std::move(pieces));
    }
    return tracks;
}

} // namespace crewdose::planner
