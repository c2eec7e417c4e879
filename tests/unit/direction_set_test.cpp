#include "habitats/direction_set.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace crewdose::habitats;

TEST_CASE("Fibonacci directions are unit vectors whose mean vanishes", "[directions]") {
    const auto dirs = fibonacci_directions(1000);
    REQUIRE(dirs.size() == 1000);
    Vector3 sum{};
    for (const auto& d : dirs) {
        CHECK(length(d) == Approx(1.0).epsilon(1e-12));
        sum = sum + d;
    }
    // Analytic: the mean of a uniform distribution on the sphere is zero; the lattice's error
    // falls like 1/N, so 1/N is a loose bound.
    CHECK(length((1.0 / 1000.0) * sum) < 1e-3);
}

TEST_CASE("Fibonacci directions are nearly equal-area: caps hold their share", "[directions]") {
    // Analytic: a polar cap of half-angle theta holds the fraction (1 - cos theta) / 2 of the
    // sphere; a hemisphere about any axis holds one half.
    const std::size_t n = 4000;
    const auto dirs = fibonacci_directions(n);
    for (double theta : {0.3, 1.0, 2.0}) {
        std::size_t inside = 0;
        for (const auto& d : dirs) {
            inside += d.z >= std::cos(theta) ? 1U : 0U;
        }
        const double expected = 0.5 * (1.0 - std::cos(theta));
        CHECK(static_cast<double>(inside) / static_cast<double>(n) ==
              Approx(expected).margin(2.0 / static_cast<double>(n)));
    }
    const Vector3 axis = normalized(Vector3{1.0, 2.0, 0.5});
    std::size_t upper = 0;
    for (const auto& d : dirs) {
        upper += dot(d, axis) > 0.0 ? 1U : 0U;
    }
    CHECK(static_cast<double>(upper) / static_cast<double>(n) == Approx(0.5).margin(0.01));
}

TEST_CASE("Fibonacci directions are deterministic", "[directions]") {
    const auto a = fibonacci_directions(77);
    const auto b = fibonacci_directions(77);
    for (std::size_t i = 0; i < a.size(); ++i) {
        CHECK(a[i].x == b[i].x);
        CHECK(a[i].y == b[i].y);
        CHECK(a[i].z == b[i].z);
    }
    CHECK_THROWS_AS(fibonacci_directions(0), std::logic_error);
}
