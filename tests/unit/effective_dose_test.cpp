#include "exposure/effective_dose.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
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

TEST_CASE("the quick model's upper bound of the effective dose", "[dosimetry]") {
    // ICRP Publication 103 (2007) Table 3: w_T of skin 0.01; the other 0.99 on the deeper of
    // lens and BFO, whichever has the higher dose equivalent (the bound's definition).
    const DoseQuantities skin{0.5, 2.0, 0.6};
    const DoseQuantities lens{0.2, 0.9, 0.25};
    const DoseQuantities bfo{0.1, 0.4, 0.12};
    const auto b = effective_dose_upper_bound(skin, lens, bfo);
    CHECK(b.deeper == DeeperOrgan::lens);
    CHECK(b.dose.dose_equivalent_Sv == Approx(0.01 * 2.0 + 0.99 * 0.9).epsilon(1e-15));
    CHECK(b.dose.absorbed_Gy == Approx(0.01 * 0.5 + 0.99 * 0.2).epsilon(1e-15));
    CHECK(b.dose.rbe_weighted_GyEq == Approx(0.01 * 0.6 + 0.99 * 0.25).epsilon(1e-15));
    // A deeper BFO (GCR-like: the dose equivalent varies little with depth) binds instead.
    const DoseQuantities bfo_high{0.21, 0.95, 0.26};
    const auto c = effective_dose_upper_bound(skin, lens, bfo_high);
    CHECK(c.deeper == DeeperOrgan::bfo);
    CHECK(c.dose.dose_equivalent_Sv == Approx(0.01 * 2.0 + 0.99 * 0.95).epsilon(1e-15));
    // A dose that was not computed, in any of the three, leaves the bound not computed.
    const double nan = std::numeric_limits<double>::quiet_NaN();
    const double inf = std::numeric_limits<double>::infinity();
    for (const auto& bad : {DoseQuantities{nan, 0.4, 0.12}, DoseQuantities{0.1, inf, 0.12},
                            DoseQuantities{0.1, 0.4, -inf}}) {
        CHECK(!effective_dose_upper_bound(bad, lens, bfo).dose.physical());
        CHECK(std::isnan(effective_dose_upper_bound(skin, bad, bfo).dose.dose_equivalent_Sv));
        CHECK(std::isnan(effective_dose_upper_bound(skin, lens, bad).dose.rbe_weighted_GyEq));
    }
}
