#!/usr/bin/env bash
# Builds an optimised tree and runs the Google Benchmark programs in tests/bench.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/install-deps.sh
cmake -S . -B build-bench -G Ninja -DCMAKE_BUILD_TYPE=Release -DCREWDOSE_BUILD_BENCHMARKS=ON > /dev/null
cmake --build build-bench
for b in build-bench/tests/bench/crewdose_bench_*; do
  "$b" --benchmark_min_time=0.5
done
