// Planner benchmarks on the lunar demo: the whole check (main-job issue: under 1 s with the
// responses; here the Study is built per iteration) and shelter sizing for one material
// (storm and shelter issue: under 0.5 s, the Study already built), and the storm sweep at one
// onset per minute over the whole timeline, four crew (under 0.3 s once responses exist).
#include "planner/ledger.hpp"
#include "planner/shelter.hpp"
#include "planner/storm.hpp"

#include <benchmark/benchmark.h>

#include <string>

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

BENCHMARK_MAIN();
