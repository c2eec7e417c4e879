#include "exposure/effective_dose.hpp"

#include <catch2/catch.hpp>

#include <map>
#include <string>

using namespace crewdose::exposure;

TEST_CASE("ICRP 103 tissue weighting factors sum to one", "[dosimetry]") {
    // Source: ICRP Publication 103 (2007) Table 3: w_T sum to 1 by definition.
    double sum = 0.0;
    for (const auto& w : icrp103_tissue_weights()) {
        sum += w.w_T;
    }
    CHECK(sum == Approx(1.0).epsilon(1e-12));
    CHECK(icrp103_remainder_tissues().size() == 14); // 13 per sex plus the sex-specific one
}

TEST_CASE("effective dose of a uniform whole-body exposure equals the dose equivalent",
          "[dosimetry]") {
    // By construction: with the same H in every tissue, E = H sum w_T = H.
    std::map<std::string, double> H;
    for (const auto& w : icrp103_tissue_weights()) {
        if (w.tissue != "remainder") {
            H[std::string(w.tissue)] = 0.25;
        }
    }
    for (const auto& r : icrp103_remainder_tissues()) {
        H[std::string(r)] = 0.25;
    }
    CHECK(effective_dose_Sv(H) == Approx(0.25).epsilon(1e-12));
    // Only the lung exposed (0.1 Sv): E = 0.12 x 0.1 (ICRP 103 w_T of lung).
    for (auto& [k, v] : H) {
        v = 0.0;
    }
    H["lung"] = 0.1;
    CHECK(effective_dose_Sv(H) == Approx(0.012).epsilon(1e-12));
    H.erase("liver");
    CHECK_THROWS_AS(effective_dose_Sv(H), std::invalid_argument);
}
