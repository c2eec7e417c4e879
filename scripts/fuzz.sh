#!/usr/bin/env bash
# Coverage-guided fuzzing of the scenario loader and the spectrum parser (libFuzzer, clang,
# AddressSanitizer + UndefinedBehaviorSanitizer, toml++ compiled in), from the seeds in
# tests/fuzz/corpus, the demos and the malformed fixtures.
#   scripts/fuzz.sh            30 s per harness (CI)
#   scripts/fuzz.sh 600        ten minutes per harness (before a release, or after touching
#                              the loader, the spectrum parser or planner/scenario/toml*)
# A finding stops the run with exit 1 and leaves the input as build-fuzz/crash-*; reproduce it
# with build-fuzz/tests/fuzz/crewdose_fuzz_loader build-fuzz/crash-... and add it as a
# malformed fixture once fixed.
set -euo pipefail
cd "$(dirname "$0")/.."
seconds=${1:-30}
[[ "$seconds" =~ ^[0-9]+$ ]] || { echo "usage: scripts/fuzz.sh [seconds per harness]" >&2; exit 2; }

CREWDOSE_EXTRA_PACKAGES="clang libclang-rt-14-dev" bash scripts/install-deps.sh
dir=build-fuzz
CC=clang CXX=clang++ cmake -S . -B "$dir" -G Ninja -DCMAKE_BUILD_TYPE=Debug -DCREWDOSE_FUZZ=ON \
      -DCREWDOSE_BUILD_TESTS=OFF -DCREWDOSE_BUILD_BENCHMARKS=OFF -DCREWDOSE_WERROR=ON > /dev/null
cmake --build "$dir" --target crewdose_fuzz_loader crewdose_fuzz_spectrum

export ASAN_OPTIONS=detect_leaks=1:abort_on_error=1
export UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1
run() {
    local name=$1 dict=$2
    shift 2
    local work="$dir/corpus-$name"
    mkdir -p "$work"
    echo "== fuzzing the $name for $seconds s"
    # The first folder collects new inputs; the others are read-only seeds.
    "$dir/tests/fuzz/crewdose_fuzz_$name" -max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 \
        -max_len=65536 -dict="tests/fuzz/$dict" -artifact_prefix="$dir/" -print_final_stats=1 \
        "$work" "$@" 2>&1 | grep -E "^(#[0-9]+ +DONE|stat::number_of_executed_units|==|SUMMARY|.*ERROR|.*runtime error|artifact_prefix|Test unit written)" || true
    # libFuzzer's exit code is lost in the pipe: a finding leaves an artifact.
    if compgen -G "$dir/crash-*" > /dev/null || compgen -G "$dir/leak-*" > /dev/null ||
       compgen -G "$dir/timeout-*" > /dev/null || compgen -G "$dir/oom-*" > /dev/null; then
        echo "fuzz: the $name harness found an input that fails; see $dir/" >&2
        exit 1
    fi
}
rm -f "$dir"/crash-* "$dir"/leak-* "$dir"/timeout-* "$dir"/oom-*
run loader toml.dict tests/fuzz/corpus/loader scenarios tests/fixtures/malformed
run spectrum spectrum.dict tests/fuzz/corpus/spectrum
echo "fuzz: no finding"
