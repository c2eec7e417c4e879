#include "planner/report/number_format.hpp"

#include <catch2/catch.hpp>

using crewdose::planner::signed_whole;
using crewdose::planner::significant;

TEST_CASE("significant figures for text reports", "[format]") {
    // By construction of the rule in number_format.hpp.
    CHECK(significant(602.0, 3) == "602");
    CHECK(significant(33.7, 4) == "33.70");
    CHECK(significant(0.0024758, 4) == "0.002476");
    CHECK(significant(9.996e3, 3) == "10000");
    CHECK(significant(12345678.0, 3) == "1.23e+07");
    CHECK(significant(0.000123, 3) == "1.23e-04");
    CHECK(significant(0.0, 3) == "0");
}

TEST_CASE("a change in whole numbers keeps its sign and has no negative zero", "[format]") {
    // By construction of the rule in number_format.hpp.
    CHECK(signed_whole(3.4) == "+3");
    CHECK(signed_whole(-12.6) == "-13");
    CHECK(signed_whole(-0.4) == "0");
    CHECK(signed_whole(0.4) == "0");
    CHECK(signed_whole(-0.0) == "0");
    CHECK(significant(-0.0, 3) == "0");
    CHECK(significant(-0.0004, 3) == "-4.00e-04");
}
