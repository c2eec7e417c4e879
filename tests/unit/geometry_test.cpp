// Analytic geometry of shapes, scenes and surroundings (source: by construction unless named).
#include "habitats/direction_set.hpp"
#include "habitats/scene.hpp"
#include "habitats/surroundings.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace crewdose::habitats;

namespace {
constexpr double kPi = 3.14159265358979323846;
}

TEST_CASE("from the centre of a spherical shell every direction sees the same areal density",
          "[geometry]") {
    // 3.7 cm of aluminium (2.699 g/cm3) = 9.986 g/cm2 in every direction.
    const Scene scene({Solid{"shell", Sphere{{1, 2, 3}, 4.0}, {{"aluminium", 0.037, 2.699}}, {}}});
    for (const auto& d : fibonacci_directions(500)) {
        const auto path = scene.trace({1, 2, 3}, d);
        REQUIRE(path.size() == 1);
        CHECK(path[0].material_id == "aluminium");
        CHECK(path[0].areal_density_g_cm2 == Approx(3.7 * 2.699).epsilon(1e-9));
    }
}

TEST_CASE("a slab seen at angle theta gives t / cos theta", "[geometry]") {
    const Scene scene(
        {Solid{"wall", Slab{{0, 0, 10}, {0, 0, 1}, 0.5}, {}, SolidLayer{"water", 0, 1.0}}});
    for (double theta_deg : {0.0, 30.0, 60.0, 80.0}) {
        const double th = theta_deg * kPi / 180.0;
        const auto path = scene.trace({0, 0, 0}, {std::sin(th), 0.0, std::cos(th)});
        REQUIRE(path.size() == 1);
        CHECK(path[0].areal_density_g_cm2 == Approx(50.0 / std::cos(th)).epsilon(1e-9));
    }
    CHECK(scene.trace({0, 0, 0}, {0, 0, -1}).empty()); // facing away
}

TEST_CASE("box and cylinder chords match hand computation", "[geometry]") {
    // Box 2 x 4 x 6 m of polyethylene (0.94 g/cm3), point outside on the x axis looking along
    // +x through the middle: 2 m; along a diagonal of the xy-face at 45 degrees through the
    // centre from a corner distance: by hand 2 sqrt(2) m while inside the x range.
    const Scene box(
        {Solid{"block", Box{{0, 0, 0}, {1, 2, 3}}, {}, SolidLayer{"polyethylene", 0, 0.94}}});
    auto p = box.trace({-5, 0, 0}, {1, 0, 0});
    REQUIRE(p.size() == 1);
    CHECK(p[0].areal_density_g_cm2 == Approx(200.0 * 0.94).epsilon(1e-9));
    const double s = 1.0 / std::sqrt(2.0);
    p = box.trace({-5, -5, 0}, {s, s, 0});
    REQUIRE(p.size() == 1);
    CHECK(p[0].areal_density_g_cm2 == Approx(200.0 * std::sqrt(2.0) * 0.94).epsilon(1e-9));
    // A rotated box (axes turned 90 degrees about z) swaps its x and y extents.
    const Scene turned({Solid{"block",
                              Box{{0, 0, 0}, {1, 2, 3}, {0, 1, 0}, {-1, 0, 0}, {0, 0, 1}},
                              {},
                              SolidLayer{"polyethylene", 0, 0.94}}});
    CHECK(turned.trace({-5, 0, 0}, {1, 0, 0})[0].areal_density_g_cm2 ==
          Approx(400.0 * 0.94).epsilon(1e-9));
    // Cylinder along y, radius 1 m, length 10 m, aluminium wall 1 cm: from the axis straight
    // out across the axis the wall is 1 cm; along the axis it is the 1 cm end cap.
    const Scene cyl({Solid{
        "module", Cylinder{{0, -5, 0}, {0, 1, 0}, 10.0, 1.0}, {{"aluminium", 0.01, 2.7}}, {}}});
    CHECK(cyl.trace({0, 0, 0}, {1, 0, 0})[0].areal_density_g_cm2 == Approx(2.7).epsilon(1e-9));
    CHECK(cyl.trace({0, 0, 0}, {0, 1, 0})[0].areal_density_g_cm2 == Approx(2.7).epsilon(1e-9));
    // At 45 degrees in the xz-plane the chord through a 1 cm cylindrical wall is 1 cm too.
    CHECK(cyl.trace({0, 0, 0}, {s, 0, s})[0].areal_density_g_cm2 == Approx(2.7).epsilon(1e-9));
    // Off-axis point 0.5 m from the axis, looking along x: wall chord by hand,
    // sqrt(1 - 0.25) - sqrt(0.99^2 - 0.25) m.
    const double chord_m = std::sqrt(1.0 - 0.25) - std::sqrt(0.99 * 0.99 - 0.25);
    CHECK(cyl.trace({0, 0, 0.5}, {1, 0, 0})[0].areal_density_g_cm2 ==
          Approx(chord_m * 100.0 * 2.7).epsilon(1e-9));
}

TEST_CASE("layers are listed outside to inside and adjacent segments merge", "[geometry]") {
    // Sphere with Al, PE, water layers; from the centre the path outward is water, PE, Al.
    const Scene scene(
        {Solid{"wall",
               Sphere{{0, 0, 0}, 3.0},
               {{"aluminium", 0.01, 2.7}, {"polyethylene", 0.05, 0.94}, {"water", 0.1, 1.0}},
               {}}});
    const auto path = scene.trace({0, 0, 0}, {0, 0, 1});
    REQUIRE(path.size() == 3);
    CHECK(path[0].material_id == "water");
    CHECK(path[1].material_id == "polyethylene");
    CHECK(path[2].material_id == "aluminium");
    CHECK(path[0].areal_density_g_cm2 == Approx(10.0).epsilon(1e-9));
    // Two touching solids of one material merge into one segment.
    const Scene two({Solid{"a", Slab{{0, 0, 2}, {0, 0, 1}, 1.0}, {}, SolidLayer{"water", 0, 1.0}},
                     Solid{"b", Slab{{0, 0, 3}, {0, 0, 1}, 1.0}, {}, SolidLayer{"water", 0, 1.0}}});
    const auto merged = two.trace({0, 0, 0}, {0, 0, 1});
    REQUIRE(merged.size() == 1);
    CHECK(merged[0].areal_density_g_cm2 == Approx(200.0).epsilon(1e-9));
}

TEST_CASE("a dose point inside a wall and overlapping solids are errors naming the solid",
          "[geometry]") {
    const Scene scene({Solid{"hab-wall", Sphere{{0, 0, 0}, 3.0}, {{"aluminium", 0.1, 2.7}}, {}}});
    try {
        (void)scene.trace({0, 0, 2.95}, {0, 0, 1});
        FAIL("expected an error");
    } catch (const GeometryError& e) {
        CHECK(e.solid_id() == "hab-wall");
        CHECK(std::string(e.what()).find("inside solid 'hab-wall'") != std::string::npos);
    }
    CHECK(scene.solid_at({0, 0, 2.95}) != nullptr);
    CHECK(scene.solid_at({0, 0, 0}) == nullptr);
    const Scene overlap(
        {Solid{"a", Box{{0, 0, 5}, {1, 1, 1}}, {}, SolidLayer{"water", 0, 1.0}},
         Solid{"b", Box{{0, 0, 5.5}, {1, 1, 1}}, {}, SolidLayer{"lead", 0, 11.35}}});
    CHECK_THROWS_AS(overlap.trace({0, 0, 0}, {0, 0, 1}), GeometryError);
}

TEST_CASE("a dome on the ground: wall overhead, open floor", "[geometry]") {
    const Scene dome({Solid{"dome", Dome{{0, 0, 0}, 5.0}, {{"mare-regolith", 1.0, 1.5}}, {}}});
    // Straight up from the centre: 1 m of regolith at 1.5 g/cm3 = 150 g/cm2.
    CHECK(dome.trace({0, 0, 0.01}, {0, 0, 1})[0].areal_density_g_cm2 ==
          Approx(150.0).epsilon(1e-6));
    // Horizontal from the centre just above the floor: the wall, 1 m.
    CHECK(dome.trace({0, 0, 0.01}, {1, 0, 0})[0].areal_density_g_cm2 ==
          Approx(150.0).epsilon(1e-4));
    // Straight down: nothing (the ground is the site's, not the dome's).
    CHECK(dome.trace({0, 0, 0.01}, {0, 0, -1}).empty());
}

TEST_CASE("open ground blocks half the sky, and a terrain mask blocks more", "[geometry]") {
    Surroundings site;
    site.ground = true;
    const std::size_t n = 4000;
    std::size_t blocked = 0;
    const auto dirs = fibonacci_directions(n);
    for (const auto& d : dirs) {
        blocked += site.blocked(d) ? 1U : 0U;
    }
    // Analytic: exactly half the sphere lies below the horizon; the lattice holds it to 1/N.
    CHECK(static_cast<double>(blocked) / n == Approx(0.5).margin(1.0 / n));
    // A uniform 30-degree rim adds the band up to 30 degrees: (1 + sin 30) / 2 = 0.75.
    site.mask = TerrainMask({{0.0, 30.0}, {180.0, 30.0}});
    blocked = 0;
    for (const auto& d : dirs) {
        blocked += site.blocked(d) ? 1U : 0U;
    }
    CHECK(static_cast<double>(blocked) / n == Approx(0.75).margin(2.0 / n));
    // Interpolation across north.
    const TerrainMask m({{90.0, 10.0}, {270.0, 30.0}});
    CHECK(m.horizon_elevation_deg(180.0) == Approx(20.0));
    CHECK(m.horizon_elevation_deg(0.0) == Approx(20.0));
    CHECK(m.horizon_elevation_deg(315.0) == Approx(25.0));
    CHECK_THROWS_AS(TerrainMask({{10.0, 5.0}, {5.0, 5.0}}), std::invalid_argument);
    CHECK(azimuth_deg({0, 1, 0}) == Approx(0.0));
    CHECK(azimuth_deg({1, 0, 0}) == Approx(90.0));
    Surroundings space;
    CHECK_FALSE(space.blocked({0, 0, -1}));
}

TEST_CASE("Mars atmosphere: vertical column P/g, sec(theta) law, finite at the horizon",
          "[geometry]") {
    // Source: vertical column = P / g, e.g. 750 Pa / 3.71 m/s2 = 202 kg/m2 = 20.2 g/cm2 (the
    // geometry issue's figure); scale height 11.1 km and radius 3389.5 km (NASA Mars fact sheet,
    // from memory).
    const Atmosphere mars{750.0 / 3.71 / 10.0, 11.1, 3389.5};
    CHECK(slant_column_g_cm2(mars, 0.0) == Approx(mars.vertical_column_g_cm2).epsilon(1e-3));
    // The flat-atmosphere sec(theta) law holds at small zenith angles up to the curvature term,
    // of relative order (H / R) tan^2(theta): 0.1 % at 30 degrees (analytic).
    for (double z : {10.0, 20.0, 30.0}) {
        CHECK(slant_column_g_cm2(mars, z) ==
              Approx(mars.vertical_column_g_cm2 / std::cos(z * kPi / 180.0)).epsilon(1.5e-3));
    }
    // Analytic (Chapman grazing incidence): sigma sqrt(pi R / (2 H)) to first order.
    const double horizon = slant_column_g_cm2(mars, 90.0);
    CHECK(std::isfinite(horizon));
    CHECK(horizon ==
          Approx(mars.vertical_column_g_cm2 * std::sqrt(kPi * 3389.5 / (2 * 11.1))).epsilon(1e-2));
}

TEST_CASE("solids are tested against each other for overlaps, wherever the overlap lies",
          "[geometry]") {
    // By construction: two balls of radius 1 overlap exactly when their centres are closer
    // than 2 (a lens 0.1 m thick at 1.9 m, whatever a dose point sees of it).
    const SolidLayer water{"water", 0, 1.0};
    const auto ball = [&](const char* id, double x) {
        return Solid{id, Sphere{{x, 0, 0}, 1.0}, {}, water};
    };
    const auto lens = overlap_point(ball("a", 0.0), ball("b", 1.9));
    REQUIRE(lens);
    CHECK(lens->x > 0.9 - 1e-9);
    CHECK(lens->x < 1.0 + 1e-9);
    CHECK_FALSE(overlap_point(ball("a", 0.0), ball("b", 2.1)));
    CHECK_FALSE(overlap_point(ball("a", 0.0), ball("b", 2.0))); // touching is not overlapping
    // Boxes sharing a face do not overlap; pushed 1 mm into each other they do.
    const auto block = [&](const char* id, double x) {
        return Solid{id, Box{{x, 0, 0}, {0.5, 0.5, 0.5}}, {}, water};
    };
    CHECK_FALSE(overlap_point(block("a", 0.0), block("b", 1.0)));
    CHECK(overlap_point(block("a", 0.0), block("b", 0.999)));
    // A tank in the room of a walled hut is not an overlap; one through its wall is.
    const Solid hut{"hut", Sphere{{0, 0, 0}, 3.0}, {{"aluminium", 0.05, 2.699}}, {}};
    const Solid inside{"tank", Box{{1, 0, 0}, {0.5, 0.5, 0.5}}, {}, water};
    const Solid through{"tank", Box{{2.9, 0, 0}, {0.5, 0.5, 0.5}}, {}, water};
    CHECK_FALSE(overlap_point(hut, inside));
    const auto wall = overlap_point(hut, through);
    REQUIRE(wall);
    CHECK(length(*wall - Point3{0, 0, 0}) > 2.95 - 1e-6);
    CHECK(length(*wall - Point3{0, 0, 0}) < 3.0 + 1e-6);
    // A slab (unbounded sideways) crossing a cylinder far from the origin.
    const Solid floor{"floor", Slab{{0, 0, 0}, {0, 0, 1}, 0.2}, {}, water};
    const Solid post{"post", Cylinder{{500, 40, -1}, {0, 0, 1}, 3.0, 0.1}, {}, water};
    const Solid above{"post", Cylinder{{500, 40, 0.0}, {0, 0, 1}, 3.0, 0.1}, {}, water};
    CHECK(overlap_point(floor, post));
    CHECK_FALSE(overlap_point(floor, above));
}
