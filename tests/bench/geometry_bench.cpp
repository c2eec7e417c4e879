// Geometry benchmarks (geometry issue): tracing 10,000 directions through a 20-solid scene
// (goal under 10 ms), the quick-model organ responses of one location, and the GCR responses
// of every nucleus and organ at one location (GCR issue: goal under 200 ms).
#include "exposure/gcr.hpp"
#include "exposure/material_library.hpp"
#include "habitats/direction_set.hpp"
#include "habitats/scene.hpp"
#include "planner/study/body_model.hpp"
#include "planner/study/location_response.hpp"
#include "planner/study/study.hpp"

#include <benchmark/benchmark.h>

#include <stdexcept>

using namespace crewdose;

namespace {

habitats::Scene twenty_solids() {
    // An invented outpost: a layered cylindrical module, a dome, berms and boxes around it.
    std::vector<habitats::Solid> s;
    s.push_back({"module",
                 habitats::Cylinder{{0, -6, 1.5}, {0, 1, 0}, 12.0, 2.2},
                 {{"aluminium", 0.004, 2.7}, {"polyethylene", 0.05, 0.94}, {"water", 0.02, 1.0}},
                 {}});
    s.push_back({"dome", habitats::Dome{{15, 0, 0}, 4.0}, {{"mare-regolith", 1.0, 1.5}}, {}});
    for (int i = 0; i < 18; ++i) {
        const double x = -20.0 + 2.3 * i;
        s.push_back({"block" + std::to_string(i),
                     habitats::Box{{x, 12.0, 1.0}, {1.0, 1.0, 1.0}},
                     {},
                     habitats::SolidLayer{"mare-regolith", 0, 1.5}});
    }
    return habitats::Scene(std::move(s));
}

// A dose point on the module's deck, on the ground.
planner::LocationGeometry module_deck(const habitats::Scene& scene) {
    planner::LocationGeometry where;
    where.scene = &scene;
    where.point = {0, 0, 1.5};
    where.surroundings.ground = true;
    return where;
}

const exposure::Material& materials(const std::string& id) {
    return *exposure::find_builtin_material(id);
}

} // namespace

static void BM_Trace10000Directions(benchmark::State& state) {
    const habitats::Scene scene = twenty_solids();
    const auto dirs = habitats::fibonacci_directions(10000);
    for (auto _ : state) {
        std::size_t segments = 0;
        for (const auto& d : dirs) {
            segments += scene.trace({0, 0, 1.5}, d).size();
        }
        benchmark::DoNotOptimize(segments);
    }
}
BENCHMARK(BM_Trace10000Directions)->Unit(benchmark::kMillisecond);

static void BM_QuickModelLocation(benchmark::State& state) {
    const habitats::Scene scene = twenty_solids();
    exposure::TableLibrary tables;
    const planner::LocationGeometry where = module_deck(scene);
    const auto dirs = habitats::fibonacci_directions(static_cast<std::size_t>(state.range(0)));
    (void)planner::quick_model_responses(tables, materials, where, dirs); // build tables once
    for (auto _ : state) {
        benchmark::DoNotOptimize(planner::quick_model_responses(tables, materials, where, dirs));
    }
}
BENCHMARK(BM_QuickModelLocation)->Arg(256)->Arg(1024)->Unit(benchmark::kMillisecond);

// What the study does per location for the GCR: the whole ion field marched along every
// direction with nuclear reactions (the check's march step) and without, the body model's
// organs scored along its tissue grid, one phi.
static void gcr_location(benchmark::State& state, bool phantom) {
    const habitats::Scene scene = twenty_solids();
    exposure::TableLibrary tables(planner::gcr_grid());
    exposure::FragmentTransport with_reactions(tables, planner::gcr_march_options());
    exposure::MarchOptions none;
    none.removal = false;
    exposure::FragmentTransport without_reactions(tables, none);
    const planner::GcrMarches march{with_reactions, without_reactions};
    const planner::LocationGeometry where = module_deck(scene);
    const auto dirs = habitats::fibonacci_directions(static_cast<std::size_t>(state.range(0)));
    const auto body = phantom ? planner::phantom_body_depths(planner::shared_phantom(),
                                                             habitats::Posture::standing, 0.0, dirs,
                                                             planner::phantom_gcr_depth_grid())
                              : planner::quick_body_depths();
    const std::vector<double> phis{400.0};
    auto run = [&] {
        double total = 0.0;
        for (const auto& [key, d] :
             planner::gcr_body_doses(march, materials, where, dirs, body, phis)) {
            total += d.for_limits().absorbed_Gy;
        }
        return total;
    };
    (void)run(); // build the tables once, as a run does before its locations
    for (auto _ : state) {
        benchmark::DoNotOptimize(run());
    }
}
static void BM_GcrLocation(benchmark::State& state) {
    gcr_location(state, false); // the quick model's three organs
}
// The phantom's organs (the goal: under 200 ms).
static void BM_GcrPhantomLocation(benchmark::State& state) {
    gcr_location(state, true);
}
BENCHMARK(BM_GcrPhantomLocation)->Arg(256)->Unit(benchmark::kMillisecond);
// The primaries-only responses (the exact reference path of the march without fragments).
static void BM_GcrLocationPrimariesOnly(benchmark::State& state) {
    const habitats::Scene scene = twenty_solids();
    exposure::TableLibrary tables(planner::gcr_grid());
    const planner::LocationGeometry where = module_deck(scene);
    const auto dirs = habitats::fibonacci_directions(static_cast<std::size_t>(state.range(0)));
    auto run = [&] {
        double total = 0.0;
        for (const auto& p : exposure::particles()) {
            if (!exposure::gcr_nucleus_included(p.Z)) {
                continue;
            }
            for (const auto& r :
                 planner::quick_model_responses(tables, materials, where, dirs, p)) {
                const auto d = exposure::fold(
                    r.response,
                    exposure::gcr_node_fluences(p, 400.0, r.response.node_energies_MeV_per_n));
                total += d.for_limits().absorbed_Gy;
            }
        }
        return total;
    };
    (void)run();
    for (auto _ : state) {
        benchmark::DoNotOptimize(run());
    }
}
BENCHMARK(BM_GcrLocationPrimariesOnly)->Arg(256)->Unit(benchmark::kMillisecond);
BENCHMARK(BM_GcrLocation)->Arg(256)->Unit(benchmark::kMillisecond);

// The phantom's organ depths over a direction set, on the SPE and GCR grids at once (one ray
// trace through the body per organ point and direction), one thread.
static void BM_PhantomBodyDepths(benchmark::State& state) {
    const auto dirs = habitats::fibonacci_directions(static_cast<std::size_t>(state.range(0)));
    const std::vector<std::vector<double>> grids{planner::phantom_depth_grid(),
                                                 planner::phantom_gcr_depth_grid()};
    (void)planner::shared_phantom();
    for (auto _ : state) {
        benchmark::DoNotOptimize(planner::phantom_body_depths(
            planner::shared_phantom(), habitats::Posture::standing, 0.0, dirs, grids));
    }
}
BENCHMARK(BM_PhantomBodyDepths)->Arg(256)->Unit(benchmark::kMillisecond);

// SPE responses of the phantom's organs at one location (the 20-solid scene), as the study
// computes them: the phantom's energy grid, one response per needed tissue depth.
static void BM_PhantomModelLocation(benchmark::State& state) {
    const habitats::Scene scene = twenty_solids();
    exposure::TableLibrary tables(planner::body_model("phantom").spe_grid());
    const planner::LocationGeometry where = module_deck(scene);
    const auto dirs = habitats::fibonacci_directions(static_cast<std::size_t>(state.range(0)));
    const auto body =
        planner::phantom_body_depths(planner::shared_phantom(), habitats::Posture::standing, 0.0,
                                     dirs, planner::phantom_depth_grid());
    (void)planner::body_responses(tables, materials, where, dirs, body); // build tables once
    for (auto _ : state) {
        benchmark::DoNotOptimize(planner::body_responses(tables, materials, where, dirs, body));
    }
}
BENCHMARK(BM_PhantomModelLocation)->Arg(256)->Unit(benchmark::kMillisecond);
