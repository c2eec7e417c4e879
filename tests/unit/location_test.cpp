// The geometry-physics bridge: organ responses at a location (quick body model).
#include "exposure/depth_dose.hpp"
#include "exposure/material_library.hpp"
#include "habitats/direction_set.hpp"
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/shielding_table_file.hpp"
#include "planner/study/location_response.hpp"

#include <catch2/catch.hpp>

#include <stdexcept>

using namespace crewdose;
using namespace crewdose::exposure;

namespace {

const Material& builtin(const std::string& id) {
    if (const auto* m = find_builtin_material(id)) {
        return *m;
    }
    throw std::logic_error("no material " + id);
}

// Demo spectrum (invented values).
const ProtonSpectrum kBand(BandRigidity{1e10, 1.1, 3.5, 0.25}, FitRange{10, 1000});

double bfo_dose(const std::vector<planner::OrganResponse>& r) {
    for (const auto& o : r) {
        if (o.organ == "bfo") {
            return fold(o.response, node_fluences(kBand, o.response.node_energies_MeV_per_n))
                .for_limits()
                .absorbed_Gy;
        }
    }
    throw std::logic_error("no bfo");
}

} // namespace

TEST_CASE("the centre of a 10 g/cm2 aluminium shell equals the shell-equivalent depth dose",
          "[location]") {
    // An identity of the isotropic convention (DESIGN.md item 5): every direction sees the full
    // fluence through 10 g/cm2, so the mean over directions is the depth-dose value (1e-9).
    const double thickness_m = 10.0 / 2.699 / 100.0;
    const habitats::Scene scene({habitats::Solid{
        "shell", habitats::Sphere{{0, 0, 0}, 3.0}, {{"aluminium", thickness_m, 2.699}}, {}}});
    TableLibrary tables;
    planner::LocationGeometry where;
    where.scene = &scene;
    const auto r =
        planner::quick_model_responses(tables, builtin, where, habitats::fibonacci_directions(40));
    const DepthDoseSetup setup{&builtin("aluminium"), &builtin("soft-tissue"), &builtin("water"),
                               5.0, RbeModel{}};
    const double expected = depth_dose(tables, setup, kBand, 10.0).for_limits().absorbed_Gy;
    CHECK(bfo_dose(r) == Approx(expected).epsilon(1e-9));
    CHECK(r[0].blocked_fraction == 0.0);
}

TEST_CASE("on open ground half the sky is blocked and the dose halves", "[location]") {
    // Analytic: blocked directions count as zero, so the dose on open ground is half the
    // free-space dose, to the direction set's accuracy (1/N in the blocked share).
    TableLibrary tables;
    const auto dirs = habitats::fibonacci_directions(400);
    planner::LocationGeometry space;
    planner::LocationGeometry ground;
    ground.surroundings.ground = true;
    const double free_dose = bfo_dose(planner::quick_model_responses(tables, builtin, space, dirs));
    const auto on_ground = planner::quick_model_responses(tables, builtin, ground, dirs);
    CHECK(on_ground[0].blocked_fraction == Approx(0.5).margin(1.0 / 400));
    CHECK(bfo_dose(on_ground) == Approx(0.5 * free_dose).epsilon(3e-3));
}

TEST_CASE("the Mars atmosphere and a suit lower the dose", "[location]") {
    TableLibrary tables;
    const auto dirs = habitats::fibonacci_directions(200);
    planner::LocationGeometry moon;
    moon.surroundings.ground = true;
    planner::LocationGeometry mars = moon;
    mars.surroundings.atmosphere = habitats::Atmosphere{20.2, 11.1, 3389.5};
    planner::LocationGeometry suited = moon;
    suited.suit = planner::SuitModel{};
    suited.suit->pack.clear(); // thin suit only: 0.3 g/cm2 aluminium-equivalent (from memory)
    const double d_moon = bfo_dose(planner::quick_model_responses(tables, builtin, moon, dirs));
    const double d_mars = bfo_dose(planner::quick_model_responses(tables, builtin, mars, dirs));
    const double d_suit = bfo_dose(planner::quick_model_responses(tables, builtin, suited, dirs));
    CHECK(d_mars < 0.6 * d_moon); // at least 20 g/cm2 of CO2 overhead
    CHECK(d_suit < d_moon);
    CHECK(d_suit > 0.9 * d_moon); // a thin suit barely changes the BFO dose
    // The path of a direction: atmosphere first, then the suit (by construction).
    const auto path = planner::external_path(mars, habitats::Vector3{0, 0, 1});
    REQUIRE(path.size() == 1);
    CHECK(path[0].material_id == "mars-atmosphere");
    CHECK(path[0].areal_density_g_cm2 == Approx(20.2).epsilon(1e-3));
}

TEST_CASE("the suit's pack shields the directions behind the wearer", "[location]") {
    planner::LocationGeometry eva;
    eva.surroundings.ground = true;
    eva.suit = planner::SuitModel{};
    eva.heading_deg = 90.0; // facing east: the pack is to the west
    const auto west = planner::external_path(eva, habitats::Vector3{-1, 0, 0.1});
    const auto east = planner::external_path(eva, habitats::Vector3{1, 0, 0.1});
    REQUIRE(west.size() == 2);
    REQUIRE(east.size() == 1);
    CHECK(west[1].areal_density_g_cm2 == 2.0);
    TableLibrary tables;
    const auto dirs = habitats::fibonacci_directions(512);
    planner::LocationGeometry thin = eva;
    thin.suit->pack.clear();
    CHECK(bfo_dose(planner::quick_model_responses(tables, builtin, eva, dirs)) <
          bfo_dose(planner::quick_model_responses(tables, builtin, thin, dirs)));
}

TEST_CASE("imported shielding tables: parsed with file and line, same response code",
          "[location]") {
    auto known = [](const std::string& id) {
        return find_builtin_material(id) != nullptr;
    };
    const std::string text = "# invented CAD export\n"
                             "0 0 1   aluminium=2.7 polyethylene=4.7\n"
                             "\n"
                             "0 0 -2  aluminium=2.7\n";
    const auto table = planner::parse_shielding_table(text, "hab.dirs", known);
    REQUIRE(table.directions.size() == 2);
    CHECK(table.directions[1].z == Approx(-1.0));
    CHECK(table.paths[0][1].material_id == "polyethylene");
    struct Bad {
        const char* text;
        const char* must_say;
    };
    for (const Bad& b :
         {Bad{"0 0\n", "hab.dirs:1: direction: needs three numbers"},
          Bad{"0 0 0 aluminium=1\n", "hab.dirs:1: direction: is the zero vector"},
          Bad{"# c\n1 0 0 cheese=1\n", "hab.dirs:2: layer: unknown material 'cheese'"},
          Bad{"1 0 0 aluminium=-1\n", "hab.dirs:1: layer: 'aluminium=-1'"},
          Bad{"1 0 x\n", "hab.dirs:1: direction: this line does not start with three numbers"},
          Bad{"1 0 0 aluminium=1\n1 0 x\n", "hab.dirs:2: direction: 'x' does not start"},
          Bad{"1 0 0 aluminium=1e6\n", "the areal density must be a number from 0 to 100000"},
          Bad{"# nothing\n", "hab.dirs: table: has no direction rows"}}) {
        try {
            (void)planner::parse_shielding_table(b.text, "hab.dirs", known);
            FAIL("expected an error for " << b.text);
        } catch (const InputError& e) {
            INFO(e.what());
            CHECK(std::string(e.what()).find(b.must_say) != std::string::npos);
        }
    }
    // A file that is not a table (a wrong path: here a password-file line) is named with its
    // line, and nothing of it is quoted.
    try {
        (void)planner::parse_shielding_table("root:x:0:0:secret:/root:/bin/sh\n", "f", known);
        FAIL("expected an error");
    } catch (const InputError& e) {
        INFO(e.what());
        CHECK(std::string(e.what()).find("f:1: direction:") != std::string::npos);
        CHECK(std::string(e.what()).find("secret") == std::string::npos);
        CHECK(std::string(e.what()).find("root") == std::string::npos);
    }
    // A table whose every row is the 10 g/cm2 aluminium shell gives the shell's dose (by
    // construction: the same response code serves scenes and tables).
    habitats::DirectionalShielding shell;
    shell.directions = habitats::fibonacci_directions(30);
    shell.paths.assign(30, {{"aluminium", 10.0}});
    TableLibrary tables;
    planner::LocationGeometry where;
    where.imported = &shell;
    const DepthDoseSetup setup{&builtin("aluminium"), &builtin("soft-tissue"), &builtin("water"),
                               5.0, RbeModel{}};
    CHECK(bfo_dose(planner::quick_model_responses(tables, builtin, where, shell.directions)) ==
          Approx(depth_dose(tables, setup, kBand, 10.0).for_limits().absorbed_Gy).epsilon(1e-9));
}
