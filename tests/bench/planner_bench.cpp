// Planner benchmarks on the lunar demo: the whole check (main-job issue: under 1 s with the
// responses; here the Study is built per iteration) and shelter sizing for one material
// (storm and shelter issue: under 0.5 s, the Study already built), and the storm sweep at one
// onset per minute over the whole timeline, four crew (under 0.3 s once responses exist).
#include "planner/ledger.hpp"
#include "planner/shelter.hpp"
#include "planner/storm.hpp"

#include <benchmark/benchmark.h>
#include <boost/date_time/gregorian/gregorian_types.hpp>

#include <string>
#include <vector>

using namespace crewdose;

namespace {
const std::string kDemo = std::string(CREWDOSE_SOURCE_DIR) + "/scenarios/lunar-demo.toml";
}

static void BM_CheckLunarDemo(benchmark::State& state) {
    const planner::Scenario sc = planner::load_scenario(kDemo);
    for (auto _ : state) {
        const planner::Study study(sc);
        benchmark::DoNotOptimize(planner::build_ledger(study));
    }
}
BENCHMARK(BM_CheckLunarDemo)->Unit(benchmark::kMillisecond);

static void BM_ShelterOneMaterial(benchmark::State& state) {
    const planner::Study study(planner::load_scenario(kDemo));
    planner::ShelterRequest r;
    r.event_id = "design-spe";
    r.location_id = "storm-shelter";
    r.materials = {"water"};
    r.targets["bfo"] = 40.0;
    int evaluations = 0;
    for (auto _ : state) {
        const auto rep = planner::size_shelter(study, r);
        evaluations = rep.answers.at(0).evaluations;
        benchmark::DoNotOptimize(rep);
    }
    state.counters["evaluations"] = evaluations;
}
BENCHMARK(BM_ShelterOneMaterial)->Unit(benchmark::kMillisecond);

static void BM_StormSweepOneMinute(benchmark::State& state) {
    const planner::Study study(planner::load_scenario(kDemo));
    const planner::StormContext ctx(study, "design-spe", true);
    const auto& m = study.scenario().mission;
    std::size_t onsets = 0;
    for (auto _ : state) {
        const auto s = planner::sweep_storm(ctx, m.start, m.end, boost::posix_time::minutes(1));
        onsets = s.onsets;
        benchmark::DoNotOptimize(s);
    }
    state.counters["onsets"] = static_cast<double>(onsets);
}
BENCHMARK(BM_StormSweepOneMinute)->Unit(benchmark::kMillisecond);

// The rolling-window maximum over a crew member's ledger of n pieces (a timeline of
// back-to-back activities, a GCR piece each and an event piece every tenth): the scaling goal
// of the long-mission issue is O(n log n). Google Benchmark fits the complexity (BigO, RMS) over
// n = 1024 ... 16384 pieces (a 3-year, 10,000-activity plan is about 20,000 pieces).
static void BM_WindowMaximum(benchmark::State& state) {
    const auto n = static_cast<std::size_t>(state.range(0));
    const planner::Time t0(boost::gregorian::date(2032, 1, 1));
    std::vector<planner::DosePiece> pieces;
    planner::Time t = t0;
    for (std::size_t i = 0; i < n; ++i) {
        const auto len = boost::posix_time::minutes(static_cast<long>(60 + (i * 7919) % 600));
        const double g = 1e-5 * static_cast<double>(1 + (i * 104729) % 17);
        pieces.push_back({t, t + len, {g, g, g}, nullptr, "GCR", "bench"});
        t += len;
    }
    for (auto _ : state) {
        benchmark::DoNotOptimize(planner::window_maximum(pieces, boost::posix_time::hours(24 * 30),
                                                         boost::posix_time::minutes(10)));
    }
    state.SetComplexityN(state.range(0));
}
BENCHMARK(BM_WindowMaximum)
    ->RangeMultiplier(2)
    ->Range(1 << 10, 1 << 14)
    ->Unit(benchmark::kMillisecond)
    ->Complexity();

BENCHMARK_MAIN();
