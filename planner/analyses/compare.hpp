#pragma once
// Two plans side by side (`crewdose compare A B`): for every crew member and planning limit
// the two checks share, both doses, the change and where each stands, so that a planner sees
// what moving an EVA or thickening a shelter changes. Built from the two ledgers; it computes
// no dose of its own.
#include "planner/study/ledger.hpp"

#include <string>
#include <vector>

namespace crewdose::planner {

/// One planning limit of one crew member in both plans.
struct LimitChange {
    std::string crew;
    std::string name;
    std::string organ;
    std::string window;
    double limit_a = 0.0; ///< mGy-Eq, or mSv for the effective dose
    double limit_b = 0.0;
    double dose_a = 0.0;
    double dose_b = 0.0;
    LimitStatus status_a = LimitStatus::within;
    LimitStatus status_b = LimitStatus::within;
    /// dose_b - dose_a (NaN when either dose was not computed).
    [[nodiscard]] double change() const { return dose_b - dose_a; }
    /// The change as a share of dose_a (-0.2: 20 % lower); NaN when either dose was not
    /// computed or dose_a is not above 0.
    [[nodiscard]] double relative_change() const;
};

struct PlanComparison {
    std::vector<LimitChange> rows; ///< plan A's crew order, then its limit order
    /// Crew members, and limits (as "crew: organ window"), that only one plan checks.
    std::vector<std::string> only_in_a;
    std::vector<std::string> only_in_b;
    bool a_exceeded = false;
    bool b_exceeded = false;
};

/// The comparison of ledger `a` with ledger `b`, crew matched by id and limits by organ and
/// window; statuses with "near" from `near_share` of the limit (status_of: a dose that is not a
/// finite number >= 0 is exceeded).
[[nodiscard]] PlanComparison compare_plans(const LedgerResult& a, const LedgerResult& b,
                                           double near_share = kDefaultNearShare);

} // namespace crewdose::planner
