// Storm-shelter sizing: the answer put back into a plain study, materials compared, targets
// that cannot be met, the added mass of a real layer, and the errors of the options.
#include "fixture.hpp"
#include "planner/analyses/shelter.hpp"
#include "planner/report/number_format.hpp"
#include "planner/report/shelter_report.hpp"
#include "shelter_hut.hpp"

#include "exposure/material_library.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fmt/format.h>

using namespace crewdose;
using namespace crewdose::planner;

namespace {

std::string plan(const std::string& extra_layer = "") {
    return hut_plan(extra_layer);
}

ShelterRequest request(std::vector<std::string> materials, double bfo_target) {
    return hut_request(std::move(materials), bfo_target);
}

std::string error_of(const std::function<void()>& f) {
    try {
        f();
    } catch (const InputError& e) {
        return e.what();
    }
    return "no error";
}

} // namespace

TEST_CASE("shelter: the answer put back gives a dose at or below the target, within 0.5 %",
          "[shelter]") {
    const Study study(parse_scenario(plan(), "hut.toml"));
    const ShelterRequest r = request({"water"}, 60.0);
    const ShelterReport rep = size_shelter(study, r);
    REQUIRE(rep.answers.size() == 1);
    const ShelterAnswer& a = rep.answers[0];
    REQUIRE(a.achievable);
    REQUIRE_FALSE(a.none_needed);
    CHECK(a.binding_organ == "bfo");
    const double other = rep.other_30d_mGyEq.at("bfo");
    CHECK(other > 0.0); // the GCR of the stay shares the window
    const double at_answer =
        sheltered_event_dose(study, r, "water", a.areal_density_g_cm2).at("bfo") + other;
    CHECK(at_answer <= 60.0);
    CHECK(at_answer >= 0.995 * 60.0);
    // A little less material breaks the target: the answer is the minimum.
    CHECK(sheltered_event_dose(study, r, "water", 0.98 * a.areal_density_g_cm2).at("bfo") + other >
          60.0);
    // The uniform shell adds the same areal density in every direction: the report's
    // thickness is areal density / density, its mass per area 10 x g/cm2.
    CHECK(a.thickness_cm == Approx(a.areal_density_g_cm2 / 1.0).epsilon(1e-12));
    CHECK(a.mass_per_area_kg_m2 == Approx(10.0 * a.areal_density_g_cm2).epsilon(1e-12));
    CHECK_FALSE(a.added_mass_kg.has_value());
}

TEST_CASE("shelter: when the other dose takes most of a target, the answer is still within 0.5 % "
          "of what is left for the event",
          "[shelter]") {
    // By construction: the search stops within 0.5 % below the event's budget (the target less
    // the crew's other 30-day dose). It used to stop within 0.5 % of the whole target; here,
    // where the other dose is about 48 of 50 mGy-Eq, that left the event 5-10 % short
    // of its budget, and the answers to targets of 50, 50.1 and 50.2 mGy-Eq were not in order.
    const Study study(parse_scenario(read_fixture("shelter-tight.toml"), "shelter-tight.toml"));
    double previous = 0.0;
    for (const double target : {50.2, 50.1, 50.0}) {
        ShelterRequest r;
        r.event_id = "spe-1";
        r.location_id = "shelter";
        r.materials = {"water"};
        r.targets["bfo"] = target;
        const ShelterReport rep = size_shelter(study, r);
        const double other = rep.other_30d_mGyEq.at("bfo");
        REQUIRE(other > 0.9 * target);
        const ShelterAnswer& a = rep.answers.at(0);
        REQUIRE(a.achievable);
        REQUIRE_FALSE(a.none_needed);
        const double budget = target - other;
        const double event =
            sheltered_event_dose(study, r, "water", a.areal_density_g_cm2).at("bfo");
        INFO("target " << target << ", answer " << a.areal_density_g_cm2 << " g/cm2");
        CHECK(event <= budget * (1.0 + 1e-12));
        CHECK(event >= 0.995 * budget);
        // A lower target needs more water.
        CHECK(a.areal_density_g_cm2 > previous);
        previous = a.areal_density_g_cm2;
    }
}

TEST_CASE("shelter: a named layer's answer, built into the scenario, meets the target in a plain "
          "study",
          "[shelter]") {
    const Study study(parse_scenario(plan(), "hut.toml"));
    ShelterRequest r = request({"polyethylene"}, 60.0);
    parse_shelter_layer(study, "hut:1", r);
    CHECK(r.layer_index == 0);
    const ShelterReport rep = size_shelter(study, r);
    const ShelterAnswer& a = rep.answers.at(0);
    REQUIRE(a.achievable);
    // By construction: a polyethylene layer of the answer's thickness inside the aluminium.
    const double t_m = a.thickness_cm * 1e-2;
    const Study built(parse_scenario(
        plan(fmt::format(", {{ material = \"polyethylene\", thickness_m = {:.17g} }}", t_m)),
        "hut.toml"));
    const auto& ev = built.scenario().events.at(0);
    const double plain = 1.5e3 * built.event_dose("inside", "bfo", ev).rbe_weighted_GyEq +
                         rep.other_30d_mGyEq.at("bfo");
    CHECK(plain <= 60.0 * (1.0 + 1e-9));
    CHECK(plain >= 0.995 * 60.0);
    // Added mass of the spherical layer: (4/3) pi (r1^3 - r2^3) rho, r1 = 1.99 m inside the
    // aluminium, r2 = r1 - t (by construction).
    const double r1 = 1.99;
    const double r2 = r1 - t_m;
    REQUIRE(a.added_mass_kg.has_value());
    CHECK(
        *a.added_mass_kg ==
        Approx(4.0 / 3.0 * 3.14159265358979 * (r1 * r1 * r1 - r2 * r2 * r2) * 940.0).epsilon(1e-9));
}

TEST_CASE("shelter: polyethylene needs less areal density than aluminium", "[shelter]") {
    // Common practice: hydrogen-rich shields stop protons with less mass per area (more
    // electrons per gram, fewer nuclear losses per gram).
    const Study study(parse_scenario(plan(), "hut.toml"));
    const ShelterReport rep =
        size_shelter(study, request({"polyethylene", "aluminium", "water"}, 60.0));
    REQUIRE(rep.answers.size() == 3);
    for (const auto& a : rep.answers) {
        REQUIRE(a.achievable);
    }
    CHECK(rep.answers[0].areal_density_g_cm2 < rep.answers[1].areal_density_g_cm2);
    CHECK(rep.answers[0].areal_density_g_cm2 < rep.answers[2].areal_density_g_cm2);
    // The curve is ordered and falls with thickness.
    const auto& curve = rep.answers[1].curve;
    REQUIRE(curve.size() >= 5);
    for (std::size_t i = 1; i < curve.size(); ++i) {
        CHECK(curve[i].areal_density_g_cm2 > curve[i - 1].areal_density_g_cm2);
        CHECK(curve[i].event_mGyEq.at("bfo") < curve[i - 1].event_mGyEq.at("bfo"));
    }
}

TEST_CASE("shelter: unreachable and already-met targets are said so, not given a number",
          "[shelter]") {
    const Study study(parse_scenario(plan(), "hut.toml"));
    ShelterRequest generous = request({"water"}, 1e6);
    generous.targets["lens"] = 1e6; // organs not named keep their 30-day planning limits
    generous.targets["skin"] = 1e6;
    const ShelterReport yes = size_shelter(study, generous);
    CHECK(yes.answers[0].achievable);
    CHECK(yes.answers[0].none_needed);
    CHECK(yes.answers[0].areal_density_g_cm2 == 0.0);
    CHECK(yes.other_alone_exceeds.empty());
    // A target just above the other dose, which 20 g/cm2 cannot reach.
    const double other = yes.other_30d_mGyEq.at("bfo");
    ShelterRequest r = request({"water"}, other + 1e-6);
    r.max_g_cm2 = 20.0;
    const ShelterReport no = size_shelter(study, r);
    CHECK(no.other_alone_exceeds.empty());
    CHECK_FALSE(no.answers[0].achievable);
    CHECK(no.answers[0].searched_to_g_cm2 == 20.0);
    CHECK(format_shelter_report(study, no, OutputFormat::text).find("NOT ACHIEVABLE: 20.0 g/cm2") !=
          std::string::npos);
}

TEST_CASE("shelter: a target that the other dose alone exceeds is said so, not searched",
          "[shelter]") {
    // Regression: a target below the crew's other 30-day dose read "NOT ACHIEVABLE: 200 g/cm2
    // does not bring BFO within its target", as if more material might have helped.
    const Study study(parse_scenario(plan(), "hut.toml"));
    const ShelterReport low = size_shelter(study, request({"water", "polyethylene"}, 1e-3));
    const double other = low.other_30d_mGyEq.at("bfo");
    REQUIRE(other > 1e-3); // the GCR of the stay shares the window
    CHECK(low.other_alone_exceeds == std::vector<std::string>{"bfo"});
    REQUIRE(low.answers.size() == 2);
    for (const auto& a : low.answers) {
        CHECK_FALSE(a.achievable);
        CHECK(a.binding_organ == "bfo");
    }
    auto unwrapped = [&](const ShelterReport& rep) {
        std::string text = format_shelter_report(study, rep, OutputFormat::text);
        for (auto at = text.find("\n    "); at != std::string::npos; at = text.find("\n    ")) {
            text.replace(at, 5, " ");
        }
        return text;
    };
    const std::string text = unwrapped(low);
    INFO(text);
    CHECK(text.find(fmt::format("NOT ACHIEVABLE: the crew's other 30-day dose alone (BFO {} "
                                "mGy-Eq, target {}) exceeds its target, so no shelter can meet "
                                "it",
                                significant(other, 3), significant(1e-3, 3))) != std::string::npos);
    CHECK(text.find("does not bring") == std::string::npos);
    const auto doc = nlohmann::json::parse(format_shelter_report(study, low, OutputFormat::json));
    CHECK(doc["other_alone_exceeds_target"] == nlohmann::json::array({"bfo"}));
    CHECK(doc["answers"][0]["achievable"] == false);
    // A target equal to the other dose leaves nothing for the event: also out of reach.
    const ShelterReport equal = size_shelter(study, request({"water"}, other));
    CHECK(equal.other_alone_exceeds == std::vector<std::string>{"bfo"});
    CHECK_FALSE(equal.answers[0].achievable);
    CHECK(unwrapped(equal).find("reaches or exceeds its target") != std::string::npos);
}

TEST_CASE("shelter: option errors name the option and what is allowed", "[shelter]") {
    const Study study(parse_scenario(plan(), "hut.toml"));
    std::map<std::string, double> t;
    parse_shelter_target("bfo=250mGyEq", t);
    CHECK(t.at("bfo") == 250.0);
    CHECK(error_of([&] {
              parse_shelter_target("bfo:250", t);
          }).find("command line: --target: 'bfo:250': write ORGAN=VALUE") != std::string::npos);
    CHECK(error_of([&] { parse_shelter_target("bfo=lots", t); }).find("--target") !=
          std::string::npos);
    CHECK(error_of([&] {
              (void)size_shelter(study, request({"water"}, -1.0));
          }).find("--target: bfo: the target must be a dose > 0") != std::string::npos);
    ShelterRequest bad_organ = request({"water"}, 50.0);
    bad_organ.targets["liver"] = 10.0;
    CHECK(error_of([&] {
              (void)size_shelter(study, bad_organ);
          }).find("'liver' cannot be a target here; allowed: bfo, lens, skin (heart and brain") !=
          std::string::npos);
    CHECK(error_of([&] {
              (void)size_shelter(study, request({"unobtainium"}, 50.0));
          }).find("--material: unknown material 'unobtainium'") != std::string::npos);
    ShelterRequest bad_event = request({"water"}, 50.0);
    bad_event.event_id = "nope";
    CHECK(error_of([&] {
              (void)size_shelter(study, bad_event);
          }).find("--event: unknown event 'nope'; the scenario defines: spe") != std::string::npos);
    ShelterRequest layer = request({"water"}, 50.0);
    CHECK(error_of([&] { parse_shelter_layer(study, "hut:3", layer); })
              .find("solid 'hut' has no single layer '3'; its layers, outermost first: 1 = "
                    "aluminium") != std::string::npos);
    CHECK(error_of([&] {
              parse_shelter_layer(study, "shed:1", layer);
          }).find("unknown solid 'shed'") != std::string::npos);
    parse_shelter_layer(study, "hut:aluminium", layer);
    CHECK(layer.layer_index == 0);
}

TEST_CASE("shelter: a named layer grows only as far as the geometry takes", "[shelter]") {
    // The hut's inner radius is 1.99 m: at most 199 g/cm2 of water fits around the dose point
    // (by construction); asking for more is limited there, not a crash.
    const Study study(parse_scenario(plan(), "hut.toml"));
    ShelterRequest r = request({"water"}, 1e-6);
    parse_shelter_layer(study, "hut:1", r);
    r.max_g_cm2 = 400.0;
    const ShelterReport rep = size_shelter(study, r);
    const ShelterAnswer& a = rep.answers.at(0);
    CHECK_FALSE(a.achievable);
    CHECK(a.limited_by_room);
    CHECK(a.searched_to_g_cm2 == Approx(199.0).epsilon(1e-3));
    CHECK(a.searched_to_g_cm2 < 199.0);
    CHECK(a.binding_organ == "bfo");
}

TEST_CASE("shelter: an event given at another distance is scaled as the check scales it",
          "[shelter]") {
    // By construction: spectrum at 0.5 AU, site at 1 AU, exponent 2: a quarter of the fluence.
    std::string text = plan();
    text.replace(text.find("spectrum = "), 0, "spectrum_at_AU = 0.5\n");
    const Study near(parse_scenario(text, "hut.toml"));
    const Study here(parse_scenario(plan(), "hut.toml"));
    const ShelterRequest r = request({"water"}, 60.0);
    const double scaled = sheltered_event_dose(near, r, "water", 5.0).at("bfo");
    const double plain = sheltered_event_dose(here, r, "water", 5.0).at("bfo");
    CHECK(scaled == Approx(0.25 * plain).epsilon(1e-12));
    // The check's own event dose agrees.
    const auto& ev = near.scenario().events[0];
    CHECK(1.5e3 * near.event_dose("inside", "bfo", ev).rbe_weighted_GyEq ==
          Approx(sheltered_event_dose(near, r, "water", 0.0).at("bfo")).epsilon(1e-12));
}
