// Crew in the heliosphere: each crew member's distance from the Sun along the timeline, and an
// event's fluence and arrival where they meet it.
#include "fixture.hpp"
#include "planner/analyses/shelter.hpp"
#include "planner/analyses/storm.hpp"
#include "planner/report/storm_report.hpp"
#include "planner/scenario/scenario.hpp"
#include "planner/study/ledger.hpp"
#include "planner/study/study.hpp"

#include "exposure/arrival.hpp"

#include <boost/date_time/gregorian/gregorian_types.hpp>
#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <cmath>
#include <map>

using namespace crewdose;
using namespace crewdose::planner;

namespace {

const std::string kLegs = read_fixture("mars-legs.toml.in");

/// The fixture with its tokens: site, mission, flare, event, outbound (the defaults unless
/// `set` gives them).
std::string legs(const std::map<std::string, std::string>& set = {}) {
    auto value = [&](const std::string& key, const std::string& otherwise) {
        const auto it = set.find(key);
        return it == set.end() ? otherwise : it->second;
    };
    return fill(kLegs, {{"@SITE@", value("site", "mars")},
                        {"@MISSION@", value("mission", "")},
                        {"@FLARE@", value("flare", "2035-01-01T01:00:00Z")},
                        {"@EVENT@", value("event", "")},
                        {"@OUTBOUND@", value("outbound", "")}});
}

Time at(const std::string& text) {
    return *parse_rfc3339(text);
}

/// The event's part of crew member a's dose of `organ` in the ledger, mGy-Eq.
double event_dose(const LedgerResult& ledger, const std::string& organ) {
    double d = 0.0;
    for (const auto& p : ledger.pieces.at({"a", organ})) {
        if (p.event) {
            d += 1e3 * p.dose.rbe_weighted_GyEq;
        }
    }
    return d;
}

std::string error_of(const std::string& text) {
    try {
        (void)parse_scenario(text, "plan.toml");
    } catch (const InputError& e) {
        return e.what();
    }
    return "no error";
}

// Mars's mean heliocentric distance, the site's default (about 1.524 AU, common practice;
// crewdose rounds it to 1.52).
constexpr double kMars_AU = 1.52;

} // namespace

TEST_CASE("a transit leg runs from 1 AU to the site and back, linearly in time", "[distance]") {
    const Scenario sc = parse_scenario(legs(), "legs.toml");
    REQUIRE(sc.sun_tracks.size() == 1);
    // The documented default (scenarios/README.md): 1 AU at mission start, the site's distance
    // at the first surface activity, back to 1 AU at mission end, linear in time; by
    // construction from the fixture's dates (181 days out, 45 on the surface, 170 back).
    CHECK(sc.sun_distance(0, at("2035-01-01T00:00:00Z")) == 1.0);
    const double mid_out = 1.0 + 0.5 * (kMars_AU - 1.0);
    CHECK(sc.sun_distance(0, at("2035-04-01T12:00:00Z")) == Approx(mid_out).epsilon(1e-12));
    CHECK(sc.sun_distance(0, at("2035-07-20T00:00:00Z")) == kMars_AU);
    const double mid_back = kMars_AU + 0.5 * (1.0 - kMars_AU);
    CHECK(sc.sun_distance(0, at("2035-11-08T00:00:00Z")) == Approx(mid_back).epsilon(1e-12));
    CHECK(sc.sun_distance(0, at("2036-02-01T00:00:00Z")) == Approx(1.0).epsilon(1e-12));
    CHECK(sc.sun_tracks[0].piece_at(at("2035-02-01T00:00:00Z")).source == DistanceSource::outbound);
    CHECK(sc.sun_tracks[0].piece_at(at("2035-07-02T00:00:00Z")).source == DistanceSource::site);
    CHECK(sc.sun_tracks[0].piece_at(at("2035-09-01T00:00:00Z")).source == DistanceSource::inbound);

    SECTION("an activity's own distance and the mission trajectory take precedence") {
        const Scenario own =
            parse_scenario(legs({{"outbound", "sun_distance_AU = [1.0, 1.3]"}}), "legs.toml");
        CHECK(own.sun_distance(0, at("2035-04-01T12:00:00Z")) == Approx(1.15).epsilon(1e-12));
        CHECK(own.sun_tracks[0].piece_at(at("2035-02-01T00:00:00Z")).source ==
              DistanceSource::activity);
        const Scenario table = parse_scenario(
            legs({{"mission", "[[mission.trajectory]]\nat = 2035-01-01T00:00:00Z\n"
                              "sun_distance_AU = 1.0\n[[mission.trajectory]]\n"
                              "at = 2035-03-01T00:00:00Z\nsun_distance_AU = 1.2\n"}}),
            "legs.toml");
        // Inside the table: interpolated between its dates (59 days, the middle on day 29.5).
        CHECK(table.sun_distance(0, at("2035-01-30T12:00:00Z")) == Approx(1.1).epsilon(1e-12));
        // After its last date: the default leg again.
        CHECK(table.sun_tracks[0].piece_at(at("2035-04-01T00:00:00Z")).source ==
              DistanceSource::outbound);
    }
    SECTION("a deep-space mission stays at its own distance") {
        const Scenario deep = parse_scenario(legs({{"site", "deep-space"}}), "legs.toml");
        CHECK(deep.sun_distance(0, at("2035-04-01T12:00:00Z")) == 1.0);
        CHECK(deep.sun_distance(0, at("2035-07-20T00:00:00Z")) == 1.0);
    }
}

TEST_CASE("an event at the Earth end of a transit gets the 1-AU fluence, at Mars the scaled one",
          "[distance]") {
    // The spectrum given at 1 AU (spectrum_at_AU = 1), inverse-square scaling (the default
    // exponent 2). The flare seen an hour into the outbound leg: the crew are 0.52 * 1 h / 181 d
    // = 1.2e-4 AU beyond 1 AU.
    const Study mars(parse_scenario(legs({{"event", "spectrum_at_AU = 1.0"}}), "legs.toml"));
    const LedgerResult on_mars_mission = build_ledger(mars, {});
    // The same plan on a deep-space mission at 1 AU: nothing to scale.
    const Study earth(parse_scenario(
        legs({{"site", "deep-space"}, {"event", "spectrum_at_AU = 1.0"}}), "legs.toml"));
    const LedgerResult at_one_au = build_ledger(earth, {});
    const auto& d = on_mars_mission.crew[0].event_distances.at(0);
    CHECK(d.r_AU == Approx(1.0 + 0.52 / (181.0 * 24.0)).epsilon(1e-9));
    CHECK(d.fluence_scale == Approx(std::pow(d.r_AU, -2.0)).epsilon(1e-12));
    for (const std::string organ : {"bfo", "lens", "skin"}) {
        INFO(organ);
        const double here = event_dose(on_mars_mission, organ);
        REQUIRE(here > 0.0);
        // Within 0.03 % of the 1-AU dose (the distance at the flare), not 0.43 times it.
        CHECK(here / event_dose(at_one_au, organ) == Approx(std::pow(d.r_AU, -2.0)).epsilon(1e-9));
    }

    // The flare seen during the surface stay: the whole scaling to Mars, (1 / 1.52)^2.
    const Study stay(parse_scenario(
        legs({{"flare", "2035-07-20T00:00:00Z"}, {"event", "spectrum_at_AU = 1.0"}}), "legs.toml"));
    const Study as_written(parse_scenario(legs({{"flare", "2035-07-20T00:00:00Z"}}), "legs.toml"));
    const LedgerResult scaled = build_ledger(stay, {});
    CHECK(scaled.crew[0].event_distances.at(0).r_AU == kMars_AU);
    CHECK(scaled.crew[0].event_distances.at(0).fluence_scale ==
          Approx(std::pow(kMars_AU, -2.0)).epsilon(1e-12));
    CHECK(event_dose(scaled, "bfo") / event_dose(build_ledger(as_written, {}), "bfo") ==
          Approx(std::pow(kMars_AU, -2.0)).epsilon(1e-12));
}

TEST_CASE("the arrival follows the crew member's distance", "[distance]") {
    // A dispersed event (scatter-free arrival along the Parker spiral): the delay after the flare
    // is seen is L(r) / v - r / c, so (delay + r / c) scales with the field-line length L(r)
    // (Parker 1958; exposure/arrival.hpp) for every energy, the first group's included.
    const Study study(parse_scenario(legs(), "legs.toml"));
    const EventSpec& ev = study.scenario().events.at(0);
    const auto& near_earth = study.event_timing("cruise", "bfo", ev, 1.0);
    const auto& at_mars = study.event_timing("cruise", "bfo", ev, kMars_AU);
    REQUIRE(!near_earth.delay_h.empty());
    REQUIRE(!at_mars.delay_h.empty());
    const double light_h_per_AU = exposure::kLightSeconds_per_AU / 3600.0;
    CHECK(
        (near_earth.delay_h.front() + light_h_per_AU) /
            (at_mars.delay_h.front() + kMars_AU * light_h_per_AU) ==
        Approx(exposure::parker_spiral_length_AU(1.0) / exposure::parker_spiral_length_AU(kMars_AU))
            .epsilon(1e-9));
    CHECK(near_earth.delay_h.front() < at_mars.delay_h.front());
}

TEST_CASE("storm what-ifs on a transit leg scale the event to the crew's distance", "[distance]") {
    // The spectrum given at the site (Mars). On the outbound leg, 10 days out, the crew are at
    // 1 + 0.52 * 10 / 181 AU; pinning the leg at 1.52 AU (the activity's own distance) gives
    // the site's dose, and the ratio is the inverse square of the distances (the whole event
    // falls inside the transit, so its arrival time does not matter).
    const Study free(parse_scenario(legs(), "legs.toml"));
    const Study pinned(parse_scenario(legs({{"outbound", "sun_distance_AU = 1.52"}}), "legs.toml"));
    const StormContext moving(free, "spe", false);
    const StormContext fixed(pinned, "spe", false);
    const Time onset = at("2035-01-11T00:00:00Z");
    const double r = 1.0 + 0.52 * 10.0 / 181.0;
    const StormWhatIf a = moving.at(onset);
    const StormWhatIf b = fixed.at(onset);
    CHECK(a.crew[0].sun_distance_AU == Approx(r).epsilon(1e-12));
    CHECK(b.crew[0].sun_distance_AU == kMars_AU);
    for (std::size_t k = 0; k < a.crew[0].organs.size(); ++k) {
        INFO(a.crew[0].organs[k].organ);
        CHECK(a.crew[0].organs[k].without_response_mGyEq /
                  b.crew[0].organs[k].without_response_mGyEq ==
              Approx(std::pow(r / kMars_AU, -2.0)).epsilon(1e-9));
    }
    // The sweep's fast path agrees with the full what-if off the site too.
    StormDoses fast{};
    (void)moving.worst_ratio_at(onset, 0, &fast);
    for (std::size_t k = 0; k < a.crew[0].organs.size(); ++k) {
        CHECK(fast[k] == Approx(a.crew[0].organs[k].without_response_mGyEq).epsilon(1e-12));
    }
    // With the response (the crew move to the cruise shelter: the same place here) as well.
    const StormContext responding(free, "spe", true);
    const StormWhatIf w = responding.at(onset);
    (void)responding.worst_ratio_at(onset, 0, &fast);
    for (std::size_t k = 0; k < w.crew[0].organs.size(); ++k) {
        CHECK(fast[k] == Approx(w.crew[0].organs[k].with_response_mGyEq).epsilon(1e-12));
    }
}

TEST_CASE("distances the loader refuses", "[distance]") {
    auto says = [](const std::string& text, const std::string& what) {
        const std::string e = error_of(text);
        INFO(e);
        CHECK(e.find(what) != std::string::npos);
    };
    // The fill puts the outbound transit's key on line 45 of the fixture (@OUTBOUND@).
    says(legs({{"outbound", "sun_distance_AU = 0.01"}}),
         "plan.toml:45: activity.sun_distance_AU: must be a heliocentric distance from 0.1 to 40");
    says(legs({{"outbound", "sun_distance_AU = [1.0, 1.2, 1.4]"}}),
         "activity.sun_distance_AU: must be a distance in AU, or [at start, at end]");
    says(legs({{"outbound", "sun_distance_AU = \"far\""}}), "activity.sun_distance_AU");
    says(legs({{"mission", "[[mission.trajectory]]\nat = 2035-01-01T00:00:00Z\n"
                           "sun_distance_AU = 1.0\n"}}),
         "needs at least two [[mission.trajectory]] entries");
    says(legs({{"mission", "[[mission.trajectory]]\nat = 2035-02-01T00:00:00Z\n"
                           "sun_distance_AU = 1.0\n[[mission.trajectory]]\n"
                           "at = 2035-01-01T00:00:00Z\nsun_distance_AU = 1.2\n"}}),
         "mission.trajectory.at: must be later than the previous entry's at");
    says(legs({{"mission", "[[mission.trajectory]]\nat = 2030-02-01T00:00:00Z\n"
                           "sun_distance_AU = 1.0\n"}}),
         "mission.trajectory.at: 2030-02-01T00:00:00Z lies outside the mission");
    says(legs({{"mission", "[[mission.trajectory]]\nat = 2035-02-01T00:00:00Z\n"
                           "sun_distance_AU = nan\n"}}),
         "mission.trajectory.sun_distance_AU");
}

TEST_CASE("a shelter in space is sized where the crew come nearest the Sun", "[distance]") {
    // The outbound leg starts at 1 AU: the cruise vehicle's shelter meets the event there; the
    // surface habitat at the site (by construction of the fixture).
    const Study study(parse_scenario(legs(), "legs.toml"));
    CHECK(shelter_sun_distance(study, "cruise") == 1.0);
    CHECK(shelter_sun_distance(study, "hab") == kMars_AU);
}

TEST_CASE("a storm sweep over the whole Mars mission bins its profile by 4 days", "[distance]") {
    // By construction (sweep_profile_bin_h): 396 days of onsets make 99 bins of 4 days, the
    // shortest width that keeps the profile to 120 bins; every bin starts a whole number of
    // bins after --from, and the text and JSON reports say the width.
    const Study study(parse_scenario(legs(), "legs.toml"));
    const StormContext ctx(study, "spe", false);
    const Time from = at("2035-01-01T00:00:00Z");
    const StormSweep s =
        sweep_storm(ctx, from, at("2036-02-01T00:00:00Z"), boost::posix_time::hours(24));
    CHECK(s.profile_bin_h == 96);
    REQUIRE(!s.profile.empty());
    CHECK(s.profile.size() <= 120);
    for (const auto& [t, r] : s.profile) {
        CHECK((t - from).total_seconds() % (96 * 3600) == 0);
    }
    CHECK(format_storm_sweep(ctx, s, OutputFormat::text).find("per 4 days of onset") !=
          std::string::npos);
    CHECK(nlohmann::json::parse(format_storm_sweep(ctx, s, OutputFormat::json))["profile_bin_h"] ==
          96);
}
