// Range-table benchmarks: building every table, and single look-ups.
// Targets (foundation issue): all built-in materials x {proton, alpha} under 20 ms; one R(E) or
// E(R) look-up under 30 ns.
#include "exposure/material_library.hpp"
#include "exposure/range_table.hpp"

#include <benchmark/benchmark.h>

#include <vector>

using namespace crewdose::exposure;

static void BM_BuildAllTables(benchmark::State& state) {
    const auto materials = builtin_materials();
    for (auto _ : state) {
        std::vector<RangeTable> tables;
        tables.reserve(materials.size() * 2);
        for (const auto& m : materials) {
            tables.emplace_back(m, proton());
            tables.emplace_back(m, alpha());
        }
        benchmark::DoNotOptimize(tables.data());
    }
}
BENCHMARK(BM_BuildAllTables)->Unit(benchmark::kMillisecond);

static void BM_RangeLookup(benchmark::State& state) {
    const RangeTable t(*find_builtin_material("aluminium"), proton());
    std::vector<double> energies;
    for (double E = 0.011; E < 9.0e4; E *= 1.013) {
        energies.push_back(E);
    }
    std::size_t i = 0;
    for (auto _ : state) {
        benchmark::DoNotOptimize(t.range_g_cm2(energies[i]));
        i = (i + 1 == energies.size()) ? 0 : i + 1;
    }
}
BENCHMARK(BM_RangeLookup);

static void BM_EnergyFromRange(benchmark::State& state) {
    const RangeTable t(*find_builtin_material("aluminium"), proton());
    std::vector<double> ranges;
    for (double E = 0.011; E < 9.0e4; E *= 1.013) {
        ranges.push_back(t.range_g_cm2(E));
    }
    std::size_t i = 0;
    for (auto _ : state) {
        benchmark::DoNotOptimize(t.energy_MeV_per_n(ranges[i]));
        i = (i + 1 == ranges.size()) ? 0 : i + 1;
    }
}
BENCHMARK(BM_EnergyFromRange);

BENCHMARK_MAIN();
