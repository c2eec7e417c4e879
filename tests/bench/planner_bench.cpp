// Planner benchmarks on the lunar demo: the whole check (main-job issue: under 1 s with the
// responses; here the Study is built per iteration) and shelter sizing for one material
// (storm and shelter issue: under 0.5 s, the Study already built), and the storm sweep at one
// onset per minute over the whole timeline, four crew (under 0.3 s once responses exist).
#include "planner/analyses/shelter.hpp"
#include "planner/analyses/storm.hpp"
#include "planner/study/ledger.hpp"

#include <benchmark/benchmark.h>
#include <boost/date_time/gregorian/gregorian_types.hpp>
#include <boost/date_time/posix_time/posix_time.hpp>
#include <fmt/format.h>

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

// A generated long lunar surface plan: 8 crew in 4 pairs, a habitat with a storm shelter and 18
// EVA sites (20 locations), 4 SPEs, 10 activities a day (three EVA blocks, each for one pair
// while the others stay inside): 156 weeks is a 3-year plan of 10,920 activities. Invented
// values; the pairs' timelines differ, so the sweep cannot share much between crew members.
static std::string long_plan(int weeks) {
    const planner::Time t0(boost::gregorian::date(2032, 1, 1));
    const auto stamp = [&](long hour) {
        return boost::posix_time::to_iso_extended_string(t0 + boost::posix_time::hours(hour)) + "Z";
    };
    std::string s = fmt::format(R"([mission]
name = "long bench"
site = "moon"
start = {}
end = {}
directions = 64
gcr_directions = 32
gcr_phi_MV = 500

[[solid]]
id = "hab"
shape = "sphere"
center_m = [0.0, 0.0, 2.0]
radius_m = 3.0
layers = [ {{ material = "aluminium", thickness_m = 0.02 }} ]

[[solid]]
id = "bunker"
shape = "sphere"
center_m = [0.0, 0.0, 1.0]
radius_m = 1.0
layers = [ {{ material = "polyethylene", thickness_m = 0.2 }} ]

[[location]]
id = "hab"
point_m = [0.0, 0.0, 2.5]
solids = ["hab", "bunker"]
body = "quick"
[[location]]
id = "shelter"
point_m = [0.0, 0.0, 1.0]
solids = ["hab", "bunker"]
body = "quick"
[storm_response]
shelter = "shelter"
warning_delay_min = 10
move_to_shelter_min = 15
all_clear_h = 24
)",
                                stamp(0), stamp(24L * 7 * weeks));
    for (int k = 0; k < 18; ++k) {
        s += fmt::format(
            "\n[[location]]\nid = \"site{}\"\npoint_m = [{}.0, 5.0, 1.0]\nsuit = true\nbody = "
            "\"quick\"\n",
            k, 10 + 3 * k);
    }
    for (int e = 0; e < 4; ++e) {
        s += fmt::format("\n[[event]]\nid = \"spe{}\"\nflare_seen = {}\nspectrum = "
                         "\"exp-energy:J0=1e9,E0_MeV=30\"\n",
                         e, stamp(24L * 7 * weeks * (2 * e + 1) / 8 + 3));
    }
    for (int c = 0; c < 8; ++c) {
        s += fmt::format("\n[[crew]]\nid = \"c{}\"\n", c);
    }
    const auto activity = [&](const std::string& crew, const char* kind, const std::string& where,
                              long from, long to) {
        s += fmt::format("\n[[activity]]\ncrew = [{}]\nkind = \"{}\"\nlocation = \"{}\"\nstart = "
                         "{}\nend = {}\n",
                         crew, kind, where, stamp(from), stamp(to));
    };
    const auto pairs = [](std::initializer_list<int> which) {
        std::string out;
        for (const int p : which) {
            out += fmt::format("{}\"c{}\", \"c{}\"", out.empty() ? "" : ", ", 2 * p, 2 * p + 1);
        }
        return out;
    };
    for (long day = 0; day < 7L * weeks; ++day) {
        const long h = 24 * day;
        activity(pairs({0, 1, 2, 3}), "stay", "hab", h, h + 8);
        for (int block = 0; block < 3; ++block) {
            const long from = h + 8 + 4 * block;
            const int out = static_cast<int>((day + block) % 4);
            std::vector<int> in;
            for (int p = 0; p < 4; ++p) {
                if (p != out) {
                    in.push_back(p);
                }
            }
            activity(pairs({out}), "eva", fmt::format("site{}", (day * 3 + block) % 18), from,
                     from + 3);
            activity(pairs({in[0], in[1], in[2]}), "stay", "hab", from, from + 3);
            activity(pairs({0, 1, 2, 3}), "stay", "hab", from + 3, block < 2 ? from + 4 : h + 24);
        }
    }
    return s;
}

// The ledger (check without the physics) and the storm sweep (one onset per 10 minutes) of the
// long plan for 13 to 156 weeks; the goal of the long-mission issue: cost growing at most as
// n log n in the number of activities (Google Benchmark's fitted complexity).
static void BM_LongPlanLedger(benchmark::State& state) {
    const planner::Study study(
        planner::parse_scenario(long_plan(static_cast<int>(state.range(0))), "long-bench.toml"));
    for (auto _ : state) {
        benchmark::DoNotOptimize(planner::build_ledger(study));
    }
    state.SetComplexityN(static_cast<long>(study.scenario().activities.size()));
    state.counters["activities"] = static_cast<double>(study.scenario().activities.size());
}
BENCHMARK(BM_LongPlanLedger)
    ->Arg(13)
    ->Arg(26)
    ->Arg(52)
    ->Arg(104)
    ->Arg(156)
    ->Unit(benchmark::kMillisecond)
    ->Complexity(benchmark::oNLogN);

static void BM_LongPlanStormSweep(benchmark::State& state) {
    const planner::Study study(
        planner::parse_scenario(long_plan(static_cast<int>(state.range(0))), "long-bench.toml"));
    const planner::StormContext ctx(study, "spe1", true);
    const auto& m = study.scenario().mission;
    for (auto _ : state) {
        benchmark::DoNotOptimize(
            planner::sweep_storm(ctx, m.start, m.end, boost::posix_time::minutes(10)));
    }
    state.SetComplexityN(static_cast<long>(study.scenario().activities.size()));
    state.counters["activities"] = static_cast<double>(study.scenario().activities.size());
}
BENCHMARK(BM_LongPlanStormSweep)
    ->Arg(13)
    ->Arg(26)
    ->Arg(52)
    ->Arg(104)
    ->Arg(156)
    ->Unit(benchmark::kMillisecond)
    ->Complexity(benchmark::oNLogN);

BENCHMARK_MAIN();
