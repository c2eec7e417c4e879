#include "exposure/quality_factor.hpp"

#include <catch2/catch.hpp>

using namespace crewdose::exposure;

TEST_CASE("Q(L) follows ICRP Publication 60", "[dosimetry]") {
    // Source: ICRP Publication 60 (1991), Table A-1 relation; values at 5 LETs.
    CHECK(quality_factor_icrp60(3.0) == 1.0);
    CHECK(quality_factor_icrp60(10.0) == Approx(1.0).epsilon(1e-12));
    CHECK(quality_factor_icrp60(50.0) == Approx(13.8).epsilon(1e-12));
    CHECK(quality_factor_icrp60(100.0) == Approx(29.8).epsilon(1e-12));
    CHECK(quality_factor_icrp60(400.0) == Approx(15.0).epsilon(1e-12));
    // Analytic: the branches meet at 10 keV/um (Q = 1) and nearly at 100 keV/um
    // (29.8 against 300 / 10 = 30), as published.
    CHECK(quality_factor_icrp60(100.0 + 1e-9) == Approx(30.0).epsilon(1e-9));
}
