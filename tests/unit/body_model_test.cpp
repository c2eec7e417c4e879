// The body model registry: the loader, the study and the reports find every body model through
// one list (planner/scenario/body_models.hpp, planner/study/body_model.hpp), and a model reached
// through it computes exactly what its own functions compute.
#include "fixture.hpp"
#include "phantom_helpers.hpp"
#include "scenario_errors.hpp"

#include "planner/scenario/body_models.hpp"
#include "planner/study/body_model.hpp"

#include <catch2/catch.hpp>

#include <stdexcept>
#include <string>
#include <vector>

using namespace crewdose;
using crewdose::phantom_test::builtin;

namespace {

const std::string kBase = read_fixture("scenario-base.toml");

// Exact equality of two sets of organ responses (same organs, same numbers bit for bit).
void require_same(const std::vector<planner::OrganResponse>& a,
                  const std::vector<planner::OrganResponse>& b) {
    REQUIRE(a.size() == b.size());
    REQUIRE(!a.empty());
    auto same = [](const exposure::DoseQuantities& x, const exposure::DoseQuantities& y) {
        return x.absorbed_Gy == y.absorbed_Gy && x.dose_equivalent_Sv == y.dose_equivalent_Sv &&
               x.rbe_weighted_GyEq == y.rbe_weighted_GyEq;
    };
    for (std::size_t o = 0; o < a.size(); ++o) {
        INFO(a[o].organ);
        CHECK(a[o].organ == b[o].organ);
        CHECK(a[o].blocked_fraction == b[o].blocked_fraction);
        CHECK(a[o].response.node_energies_MeV_per_n == b[o].response.node_energies_MeV_per_n);
        const auto& ra = a[o].response;
        const auto& rb = b[o].response;
        REQUIRE(ra.with_removal.size() == rb.with_removal.size());
        REQUIRE(ra.without_removal.size() == rb.without_removal.size());
        std::size_t differ = 0;
        double largest = 0.0;
        for (std::size_t j = 0; j < ra.with_removal.size(); ++j) {
            differ += same(ra.with_removal[j], rb.with_removal[j]) ? 0U : 1U;
            differ += same(ra.without_removal[j], rb.without_removal[j]) ? 0U : 1U;
            largest = std::max(largest, ra.with_removal[j].dose_equivalent_Sv);
        }
        CHECK(differ == 0);
        CHECK(largest > 0.0); // a response that is all zero would compare equal to anything
    }
}

bool same_depths(const planner::BodyDepths& a, const planner::BodyDepths& b) {
    return a.model == b.model && a.organs == b.organs && a.grid_g_cm2 == b.grid_g_cm2 &&
           a.directions == b.directions && a.weights == b.weights;
}

// An EVA-like place: on the ground behind a suit, so that directions and posture matter.
planner::LocationGeometry eva_site() {
    planner::LocationGeometry w = phantom_test::suited();
    w.posture = habitats::Posture::lying;
    w.heading_deg = 40.0;
    return w;
}

} // namespace

TEST_CASE("body models: the registry lists phantom and quick, the default first", "[body]") {
    std::vector<std::string> ids;
    for (const planner::BodyModel* m : planner::body_models()) {
        ids.emplace_back(m->id());
    }
    CHECK(ids == std::vector<std::string>{"phantom", "quick"});
    std::vector<std::string> names;
    for (const auto& n : planner::body_model_names()) {
        names.emplace_back(n.id);
    }
    CHECK(names == ids); // the loader's list and the study's models are one list
    // The phantom is the default (issue 19): heart, brain and the effective dose are evaluated
    // unless a scenario asks for the quick screening model.
    CHECK(planner::default_body_model_name().id == "phantom");
    CHECK(planner::LocationSpec{}.body == "phantom");
    CHECK_FALSE(planner::body_model("quick").has_posture());
    CHECK(planner::body_model("phantom").has_posture());
}

TEST_CASE("body models: each id round-trips through the registry and the loader", "[body]") {
    for (const planner::BodyModel* m : planner::body_models()) {
        const std::string id(m->id());
        INFO(id);
        CHECK(&planner::body_model(id) == m);
        const planner::BodyModelName* name = planner::find_body_model_name(id);
        REQUIRE(name != nullptr);
        CHECK(name->id == id);
        CHECK(m->summary() == name->summary);
        CHECK(!m->summary().empty());
        const planner::Scenario sc = planner::parse_scenario(
            replace(kBase, "body = \"quick\"", "body = \"" + id + "\""), "plan.toml");
        REQUIRE(sc.locations.size() == 1);
        CHECK(sc.locations[0].body == id);
        CHECK(&planner::body_model(sc.locations[0].body) == m);
    }
}

TEST_CASE("body models: an unknown id is refused with the allowed list", "[body]") {
    const std::string e = error_of(replace(kBase, "body = \"quick\"", "body = \"voxel\""));
    INFO(e);
    CHECK(e.find("plan.toml:19: location.body: 'voxel'; allowed: ") != std::string::npos);
    for (const auto& n : planner::body_model_names()) {
        CHECK(e.find(std::string(n.id) + " (" + std::string(n.summary) + ")") != std::string::npos);
    }
    CHECK(planner::find_body_model_name("voxel") == nullptr);
    CHECK(planner::find_body_model_name("") == nullptr);
    CHECK_THROWS_AS(planner::body_model("voxel"), std::logic_error);
    // Ids are case-sensitive, as the scenario is.
    CHECK(error_of(replace(kBase, "body = \"quick\"", "body = \"Phantom\""))
              .find("location.body: 'Phantom'; allowed: phantom") != std::string::npos);
}

TEST_CASE("body models: the quick model through the registry is the direct quick model", "[body]") {
    const planner::BodyModel& quick = planner::body_model("quick");
    CHECK(quick.organs() == std::vector<std::string>{"skin", "lens", "bfo"});
    CHECK(quick.spe_grid().nodes_per_decade == exposure::EnergyGridSpec{}.nodes_per_decade);
    const auto dirs = habitats::fibonacci_directions(48);
    const planner::LocationGeometry where = eva_site();
    CHECK(same_depths(quick.spe_depths(planner::placement_of(where), dirs),
                      planner::quick_body_depths()));
    CHECK(same_depths(quick.gcr_depths(planner::placement_of(where), dirs),
                      planner::quick_body_depths()));
    CHECK_FALSE(
        quick.depth_samples(planner::placement_of(where), dirs, planner::quick_body_depths()));
    exposure::TableLibrary a(quick.spe_grid());
    exposure::TableLibrary b;
    require_same(quick.responses(a, builtin, where, dirs),
                 planner::quick_model_responses(b, builtin, where, dirs));
}

TEST_CASE("body models: the phantom through the registry is the direct phantom", "[body]") {
    const planner::BodyModel& phantom = planner::body_model("phantom");
    CHECK(phantom.spe_grid().nodes_per_decade == planner::kPhantomSpeNodesPerDecade);
    const auto dirs = habitats::fibonacci_directions(48);
    const auto gcr_dirs = habitats::fibonacci_directions(24);
    const planner::LocationGeometry where = eva_site();
    const planner::BodyPlacement at = planner::placement_of(where);
    CHECK(at.posture == habitats::Posture::lying);
    CHECK(at.heading_deg == 40.0);
    auto direct = [&](const std::vector<habitats::Vector3>& d, const std::vector<double>& grid) {
        return planner::phantom_body_depths(planner::shared_phantom(), at.posture, at.heading_deg,
                                            d, grid);
    };
    const planner::BodyDepths spe = direct(dirs, planner::phantom_depth_grid());
    const planner::BodyDepths gcr = direct(gcr_dirs, planner::phantom_gcr_depth_grid());
    CHECK(phantom.organs() == spe.organs);
    CHECK(same_depths(phantom.spe_depths(at, dirs), spe));
    CHECK(same_depths(phantom.gcr_depths(at, gcr_dirs), gcr));
    // Both sources at once: one trace when the direction sets are the same, two otherwise.
    const auto apart = phantom.depths(at, dirs, gcr_dirs, 2);
    CHECK(same_depths(apart.spe, spe));
    CHECK(same_depths(apart.gcr, gcr));
    const auto together = phantom.depths(at, dirs, dirs, 2);
    CHECK(same_depths(together.spe, spe));
    CHECK(same_depths(together.gcr, direct(dirs, planner::phantom_gcr_depth_grid())));
    // Another placement gives other depths (the placement reaches the model).
    CHECK_FALSE(same_depths(phantom.spe_depths({habitats::Posture::standing, 40.0}, dirs), spe));
    // Every point's own depth, for the shielding report: one list per organ.
    const auto samples = phantom.depth_samples(at, dirs, spe);
    REQUIRE(samples);
    CHECK(samples->size() == spe.organs.size());
    // The organ responses, exactly those of the direct calls.
    exposure::TableLibrary a(phantom.spe_grid());
    exposure::EnergyGridSpec grid;
    grid.nodes_per_decade = planner::kPhantomSpeNodesPerDecade;
    exposure::TableLibrary b(grid);
    require_same(phantom.responses(a, builtin, where, dirs),
                 planner::body_responses(b, builtin, where, dirs, spe));
}
