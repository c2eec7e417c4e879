// Transport benchmarks (transport issue): the response along one 3-layer path at the default
// grid (goal under 50 us) and one depth-dose curve of 50 depths (goal under 2 ms).
#include "exposure/depth_dose.hpp"
#include "exposure/material_library.hpp"
#include "exposure/response.hpp"
#include "exposure/table_library.hpp"

#include <benchmark/benchmark.h>

#include <cmath>
#include <vector>

using namespace crewdose::exposure;

static void BM_ResponseThreeLayerPath(benchmark::State& state) {
    TableLibrary tables;
    const auto& p = proton();
    const RangeTable& al = tables.table(*find_builtin_material("aluminium"), p);
    const RangeTable& pe = tables.table(*find_builtin_material("polyethylene"), p);
    const RangeTable& tissue = tables.table(*find_builtin_material("soft-tissue"), p);
    const RangeTable& water = tables.table(*find_builtin_material("water"), p);
    const LayerPath path{{&al, 3.0}, {&pe, 5.0}, {&tissue, 5.0}};
    const DoseMedium medium{&tissue, &water};
    for (auto _ : state) {
        benchmark::DoNotOptimize(path_response(path, medium, p, RbeModel{}));
    }
}
BENCHMARK(BM_ResponseThreeLayerPath)->Unit(benchmark::kMicrosecond);

// The same with the node doses computed once, as the location code does for its directions.
static void BM_ResponseThreeLayerPathSharedNodeDoses(benchmark::State& state) {
    TableLibrary tables;
    const auto& p = proton();
    const RangeTable& al = tables.table(*find_builtin_material("aluminium"), p);
    const RangeTable& pe = tables.table(*find_builtin_material("polyethylene"), p);
    const RangeTable& tissue = tables.table(*find_builtin_material("soft-tissue"), p);
    const RangeTable& water = tables.table(*find_builtin_material("water"), p);
    const LayerPath path{{&al, 3.0}, {&pe, 5.0}, {&tissue, 5.0}};
    const NodeDoses doses = node_doses(DoseMedium{&tissue, &water}, p, RbeModel{});
    for (auto _ : state) {
        benchmark::DoNotOptimize(path_response(path, doses));
    }
}
BENCHMARK(BM_ResponseThreeLayerPathSharedNodeDoses)->Unit(benchmark::kMicrosecond);

static void BM_DepthDoseCurve50(benchmark::State& state) {
    TableLibrary tables;
    const DepthDoseSetup setup{find_builtin_material("aluminium"),
                               find_builtin_material("soft-tissue"), find_builtin_material("water"),
                               5.0, RbeModel{}};
    const ProtonSpectrum band(BandRigidity{1e10, 1.1, 3.5, 0.25}, FitRange{10, 1000});
    (void)depth_dose(tables, setup, band, 1.0); // tables built outside the timing
    std::vector<double> depths;
    for (int i = 0; i < 50; ++i) {
        depths.push_back(0.1 * std::pow(1.2, i));
    }
    for (auto _ : state) {
        benchmark::DoNotOptimize(depth_dose_curve(tables, setup, band, depths));
    }
}
BENCHMARK(BM_DepthDoseCurve50)->Unit(benchmark::kMillisecond);

BENCHMARK_MAIN();
