#include "planner/analyses/compare.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace crewdose::planner {
namespace {

const CrewResult* crew_named(const LedgerResult& ledger, const std::string& id) {
    const auto it = std::find_if(ledger.crew.begin(), ledger.crew.end(),
                                 [&](const CrewResult& c) { return c.crew == id; });
    return it == ledger.crew.end() ? nullptr : &*it;
}

const LimitCheck* check_of(const CrewResult& crew, const Limit& limit) {
    const auto it = std::find_if(crew.checks.begin(), crew.checks.end(), [&](const LimitCheck& c) {
        return c.limit.organ == limit.organ && c.limit.window == limit.window;
    });
    return it == crew.checks.end() ? nullptr : &*it;
}

std::string limit_name(const CrewResult& crew, const Limit& limit) {
    return crew.crew + ": " + limit.organ + " " + limit.window;
}

} // namespace

double LimitChange::relative_change() const {
    const bool both =
        std::isfinite(dose_a) && dose_a > 0.0 && std::isfinite(dose_b) && dose_b >= 0.0;
    return both ? change() / dose_a : std::numeric_limits<double>::quiet_NaN();
}

PlanComparison compare_plans(const LedgerResult& a, const LedgerResult& b, double near_share) {
    PlanComparison out;
    out.a_exceeded = a.any_exceeded;
    out.b_exceeded = b.any_exceeded;
    for (const auto& ca : a.crew) {
        const CrewResult* cb = crew_named(b, ca.crew);
        if (!cb) {
            out.only_in_a.push_back(ca.crew);
            continue;
        }
        for (const auto& check_a : ca.checks) {
            const LimitCheck* check_b = check_of(*cb, check_a.limit);
            if (!check_b) {
                out.only_in_a.push_back(limit_name(ca, check_a.limit));
                continue;
            }
            LimitChange r;
            r.crew = ca.crew;
            r.name = ca.name;
            r.organ = check_a.limit.organ;
            r.window = check_a.limit.window;
            r.limit_a = check_a.limit.value;
            r.limit_b = check_b->limit.value;
            r.dose_a = check_a.dose;
            r.dose_b = check_b->dose;
            r.status_a = status_of(check_a, near_share);
            r.status_b = status_of(*check_b, near_share);
            out.rows.push_back(r);
        }
        for (const auto& check_b : cb->checks) {
            if (!check_of(ca, check_b.limit)) {
                out.only_in_b.push_back(limit_name(*cb, check_b.limit));
            }
        }
    }
    for (const auto& cb : b.crew) {
        if (!crew_named(a, cb.crew)) {
            out.only_in_b.push_back(cb.crew);
        }
    }
    return out;
}

} // namespace crewdose::planner
