#include "planner/scenario/scenario.hpp"
#include "planner/scenario/time_format.hpp"

#include "exposure/arrival.hpp"

#include "exposure/material_library.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace crewdose::planner {

std::optional<std::string> implausible_phi(double phi_MV, const std::string& as_typed) {
    if (phi_MV >= kMinPhi_MV && phi_MV <= kMaxPhi_MV) {
        return std::nullopt;
    }
    const std::string allowed =
        fmt::format("allowed: a number of MV from {:g} to {:g} (for this LIS about 300 to 400 "
                    "near solar minimum, 1000 or more near maximum)",
                    kMinPhi_MV, kMaxPhi_MV);
    const double as_MV = 1000.0 * phi_MV;
    if (as_MV >= kMinPhi_MV && as_MV <= kMaxPhi_MV) {
        return fmt::format("{} looks like GV; give {:g} (phi is in MV, not GV); {}", as_typed,
                           as_MV, allowed);
    }
    return fmt::format("{} is not a modulation potential; {} (phi is in MV, not GV)", as_typed,
                       allowed);
}

double Mission::gcr_phi_at(const Time& t) const {
    double phi = gcr_phi_MV;
    for (const auto& phase : gcr_phases) {
        if (t >= phase.from) {
            phi = phase.phi_MV;
        }
    }
    return phi;
}

double EventProfile::fraction_by(double t) const {
    if (t <= 0.0) {
        return 0.0;
    }
    // I(t) = (1 - e^{-t/r}) e^{-t/d}: integral_0^t = d (1 - e^{-t/d}) - c (1 - e^{-t/c}) with
    // c = 1 / (1/r + 1/d); the total is d - c.
    const double d = decay_h;
    const double c = 1.0 / (1.0 / rise_h + 1.0 / decay_h);
    const double part = d * -std::expm1(-t / d) - c * -std::expm1(-t / c);
    // d - c = d^2 / (rise + d), written so that it does not cancel when rise >> decay.
    return std::clamp(part / (d * d / (rise_h + d)), 0.0, 1.0);
}

double EventProfile::rate_per_h(double t) const {
    if (t <= 0.0) {
        return 0.0;
    }
    // d/dt of fraction_by: (e^{-t/d} - e^{-t/c}) / (d - c).
    const double d = decay_h;
    const double c = 1.0 / (1.0 / rise_h + 1.0 / decay_h);
    return (std::exp(-t / d) - std::exp(-t / c)) / (d * d / (rise_h + d));
}

double EventSpec::delay_h(double energy_MeV) const {
    if (fixed_arrival) {
        return arrival_delay_h;
    }
    return exposure::scatter_free_delay_h(energy_MeV, path_length_AU, sun_distance_AU);
}

Time EventSpec::arrival() const {
    return flare_seen + duration_from_hours(delay_h(1000.0));
}

double EventSpec::fluence_scale(double exponent) const {
    if (!spectrum_at_AU) {
        return 1.0;
    }
    return std::pow(sun_distance_AU / *spectrum_at_AU, -exponent);
}

double EventSpec::fluence_scale_at(double r_AU, double exponent) const {
    return std::pow(r_AU / spectrum_at_AU.value_or(sun_distance_AU), -exponent);
}

double EventSpec::distance_factor(double r_AU, double exponent) const {
    return r_AU == sun_distance_AU ? 1.0 : std::pow(r_AU / sun_distance_AU, -exponent);
}

EventSpec EventSpec::seen_at(double r_AU, double path_AU) const {
    EventSpec there = *this;
    there.spectrum_at_AU = spectrum_at_AU.value_or(sun_distance_AU);
    there.sun_distance_AU = r_AU;
    there.path_length_AU = path_AU;
    return there;
}

double Mission::path_length_at(double r_AU) const {
    return sep_path_length_AU * exposure::parker_spiral_length_AU(r_AU) /
           exposure::parker_spiral_length_AU(sun_distance_AU);
}

double Scenario::sun_distance(std::size_t crew_index, const Time& t) const {
    return crew_index < sun_tracks.size() ? sun_tracks[crew_index].at(t) : mission.sun_distance_AU;
}

const exposure::Material* Scenario::material(const std::string& id) const {
    for (const auto& m : materials) {
        if (m.id() == id) {
            return &m;
        }
    }
    return exposure::find_builtin_material(id);
}

namespace {

template <class T>
const T& named(const std::vector<T>& items, const std::string& id, const std::string& option,
               const char* what) {
    std::string known;
    for (const auto& x : items) {
        if (x.id == id) {
            return x;
        }
        known += (known.empty() ? "" : ", ") + x.id;
    }
    throw InputError({"command line", 0}, option,
                     fmt::format("unknown {} '{}'; the scenario defines: {}", what, id,
                                 known.empty() ? "none" : known));
}

} // namespace

const EventSpec& Scenario::event_named(const std::string& id, const std::string& option) const {
    return named(events, id, option, "event");
}

const LocationSpec& Scenario::location_named(const std::string& id,
                                             const std::string& option) const {
    return named(locations, id, option, "location");
}

const std::vector<std::string>& limited_organs() {
    static const std::vector<std::string> organs{"bfo", "lens", "skin"};
    return organs;
}

const std::vector<std::string>& phantom_limited_organs() {
    static const std::vector<std::string> organs{"heart", "brain"};
    return organs;
}

const std::vector<std::string>& ledger_organs() {
    static const std::vector<std::string> organs{"bfo",   "lens",  "skin",
                                                 "heart", "brain", "effective"};
    return organs;
}

std::string organ_label(const std::string& organ) {
    return organ == "bfo" ? "BFO" : organ;
}

std::vector<Limit> default_limits() {
    // Planning defaults, never official limits. NCRP Report 132 (2000) for BFO, lens and skin
    // (from memory); career effective dose 600 mSv from the 2022 revision of NASA-STD-3001
    // (from memory); circulatory (heart) 250 / 500 and CNS (brain) 500 / 1000 mGy-Eq per 30
    // days / year from the same revision (from memory). Heart, brain and effective dose need
    // the phantom's organ doses.
    const std::string ncrp = "NCRP Report 132 (planning value, from memory)";
    const std::string std3001 = "NASA-STD-3001 2022 revision (planning value, from memory)";
    return {{"bfo", "30-day", 250.0, ncrp},         {"bfo", "annual", 500.0, ncrp},
            {"lens", "30-day", 1000.0, ncrp},       {"lens", "annual", 2000.0, ncrp},
            {"lens", "career", 4000.0, ncrp},       {"skin", "30-day", 1500.0, ncrp},
            {"skin", "annual", 3000.0, ncrp},       {"skin", "career", 6000.0, ncrp},
            {"heart", "30-day", 250.0, std3001},    {"heart", "annual", 500.0, std3001},
            {"brain", "30-day", 500.0, std3001},    {"brain", "annual", 1000.0, std3001},
            {"effective", "career", 600.0, std3001}};
}

std::string to_string(SiteKind site) {
    switch (site) {
    case SiteKind::moon:
        return "moon";
    case SiteKind::mars:
        return "mars";
    case SiteKind::deep_space:
        return "deep-space";
    }
    return "?";
}

std::size_t spe_direction_count(const Mission& mission, std::string_view body) {
    const BodyModelName* name = find_body_model_name(body);
    if (!name) {
        throw std::logic_error("unregistered body model " + std::string(body));
    }
    return name->spe_directions == SpeDirectionSet::phantom ? mission.phantom_directions
                                                            : mission.directions;
}

std::string to_string(ActivityKind kind) {
    switch (kind) {
    case ActivityKind::stay:
        return "stay";
    case ActivityKind::sleep:
        return "sleep";
    case ActivityKind::eva:
        return "eva";
    case ActivityKind::rover:
        return "rover";
    case ActivityKind::transit:
        return "transit";
    case ActivityKind::shelter:
        return "shelter";
    }
    return "?";
}

std::string activity_origin(const ActivitySpec& a) {
    if (!a.instance) {
        return fmt::format("line {}", a.where.line);
    }
    return fmt::format("line {}, instance of {}", a.where.line, format_time(a.instance->start));
}

std::string activity_origin_text(const ActivitySpec& a) {
    if (!a.instance) {
        return fmt::format("the activity at line {}", a.where.line);
    }
    return fmt::format("the activity at line {} in the instance of {} of the routine at line {}",
                       a.where.line, format_time(a.instance->start), a.instance->routine_line);
}

std::vector<const ActivitySpec*> activities_of(const Scenario& sc, std::string_view crew_id) {
    std::vector<const ActivitySpec*> mine;
    for (const auto& a : sc.activities) {
        if (std::find(a.crew.begin(), a.crew.end(), crew_id) != a.crew.end()) {
            mine.push_back(&a);
        }
    }
    std::stable_sort(mine.begin(), mine.end(), [](const ActivitySpec* x, const ActivitySpec* y) {
        return x->start < y->start;
    });
    return mine;
}

std::vector<TimelineGap> timeline_gaps(const Scenario& sc) {
    std::vector<TimelineGap> gaps;
    for (const auto& c : sc.crew) {
        const std::vector<const ActivitySpec*> mine = activities_of(sc, c.id);
        Time cursor = sc.mission.start;
        for (std::size_t i = 0; i <= mine.size(); ++i) {
            const Time next = i < mine.size() ? mine[i]->start : sc.mission.end;
            if (next > cursor && !mine.empty()) {
                gaps.push_back({c.id, cursor, next, (i > 0 ? mine[i - 1] : mine[0])->where});
            }
            if (i < mine.size()) {
                cursor = std::max(cursor, mine[i]->end);
            }
        }
    }
    return gaps;
}

void refuse_timeline_gaps(const Scenario& sc) {
    const auto gaps = timeline_gaps(sc);
    if (gaps.empty()) {
        return;
    }
    const auto& g = gaps.front();
    throw InputError(g.where, "activity",
                     fmt::format("crew member '{}' has no activity from {} to {}{}; cover the "
                                 "whole mission, or run with --allow-gaps to charge each gap at "
                                 "the location of the activity before it",
                                 g.crew, format_time(g.from), format_time(g.to),
                                 gaps.size() > 1
                                     ? fmt::format(" (and {} more gap{})", gaps.size() - 1,
                                                   gaps.size() > 2 ? "s" : "")
                                     : std::string()));
}

} // namespace crewdose::planner
