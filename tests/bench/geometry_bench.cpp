// Geometry benchmarks (geometry issue): tracing 10,000 directions through a 20-solid scene
// (goal under 10 ms), and the quick-model organ responses of one location.
#include "exposure/material_library.hpp"
#include "habitats/direction_set.hpp"
#include "habitats/scene.hpp"
#include "planner/location_response.hpp"

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
    planner::LocationGeometry where;
    where.scene = &scene;
    where.point = {0, 0, 1.5};
    where.surroundings.ground = true;
    const auto dirs = habitats::fibonacci_directions(static_cast<std::size_t>(state.range(0)));
    auto materials = [](const std::string& id) -> const exposure::Material& {
        return *exposure::find_builtin_material(id);
    };
    (void)planner::quick_model_responses(tables, materials, where, dirs); // build tables once
    for (auto _ : state) {
        benchmark::DoNotOptimize(planner::quick_model_responses(tables, materials, where, dirs));
    }
}
BENCHMARK(BM_QuickModelLocation)->Arg(256)->Arg(1024)->Unit(benchmark::kMillisecond);
