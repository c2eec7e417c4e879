#include "exposure/interpolation.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <vector>

using namespace crewdose::exposure;

TEST_CASE("interval_index finds the interval and clamps at both ends", "[interpolation]") {
    const std::vector<double> x{1.0, 2.0, 4.0, 8.0};
    CHECK(interval_index(x, 1.0) == 0);
    CHECK(interval_index(x, 1.5) == 0);
    CHECK(interval_index(x, 2.0) == 1); // a node belongs to the interval it starts
    CHECK(interval_index(x, 7.9) == 2);
    CHECK(interval_index(x, 8.0) == 2);   // last node: last interval
    CHECK(interval_index(x, 0.5) == 0);   // below: clamped
    CHECK(interval_index(x, 100.0) == 2); // above: clamped
    CHECK(interval_index(x, std::numeric_limits<double>::quiet_NaN()) == 0);
    CHECK_THROWS_AS(interval_index(std::vector<double>{1.0}, 1.0), std::logic_error);
}

TEST_CASE("LogGrid nodes are uniform in ln x and its interval lookup agrees with the search",
          "[interpolation]") {
    const LogGrid g(0.01, 1.0e5, 351);
    CHECK(g.size() == 351);
    // By construction: node 0 is x_min and the last node is x_max.
    CHECK(std::exp(g.log_node(0)) == Approx(0.01).epsilon(1e-14));
    CHECK(std::exp(g.log_node(350)) == Approx(1.0e5).epsilon(1e-12));
    std::vector<double> logs;
    for (std::size_t i = 0; i < g.size(); ++i) {
        logs.push_back(g.log_node(i));
    }
    for (double x : {0.01, 0.0123, 0.5, 1.0, 7.7, 999.0, 99999.0, 1.0e5}) {
        CHECK(g.interval_of_log(std::log(x)) == interval_index(logs, std::log(x)));
    }
    CHECK(g.interval_of_log(std::log(1e-9)) == 0);
    CHECK(g.interval_of_log(std::log(1e9)) == 349);
}

TEST_CASE("lerp_at is exact on a line (by construction)", "[interpolation]") {
    CHECK(lerp_at(1.0, 3.0, 3.0, 7.0, 2.0) == Approx(5.0).epsilon(1e-15));
    CHECK(lerp_at(1.0, 3.0, 3.0, 7.0, 3.0) == Approx(7.0).epsilon(1e-15));
}
