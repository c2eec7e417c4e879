#!/usr/bin/env bash
# One command: install the dependencies, build with warnings as errors, run every test.
#   scripts/test.sh              normal build in build/, all tests (slow ones included)
#   scripts/test.sh --sanitize   AddressSanitizer + UndefinedBehaviorSanitizer build in
#                                build-sanitize/, every test except those labelled 'slow' or
#                                'expected' and fourteen heavy end-to-end runs (below)
set -euo pipefail
cd "$(dirname "$0")/.."

sanitize=0
for arg in "$@"; do
  case "$arg" in
    --sanitize) sanitize=1 ;;
    *) echo "usage: scripts/test.sh [--sanitize]" >&2; exit 2 ;;
  esac
done

# Chromium (headless) for the HTML report's browser test; only the test command needs it.
CREWDOSE_EXTRA_PACKAGES="chromium ${CREWDOSE_EXTRA_PACKAGES:-}" bash scripts/install-deps.sh
jobs=$(nproc 2>/dev/null || echo 2)

if ((sanitize)); then
  dir=build-sanitize
  # -g1: line tables only, enough for file and line in the sanitizers' stack traces, and about
  # 30 % less compile time than full debug information.
  cmake -S . -B "$dir" -G Ninja -DCMAKE_BUILD_TYPE=Debug -DCMAKE_CXX_FLAGS_DEBUG=-g1 \
        -DCREWDOSE_WERROR=ON -DCREWDOSE_SANITIZE=ON -DCREWDOSE_BUILD_BENCHMARKS=OFF > /dev/null
  # Only what this pass runs: the slow and expected-output test programs are not built (their
  # tests are skipped below, and Catch's placeholder for an unbuilt program is excluded).
  cmake --build "$dir" -j "$jobs" --target crewdose crewdose_unit_tests crewdose_reference_tests \
        crewdose_cli_tests
  export ASAN_OPTIONS=detect_leaks=1:abort_on_error=1
  export UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1
  # The expected-output tests are skipped too: the ASan build runs each scenario slowly, and
  # the normal build already compares every output. So are the fourteen end-to-end runs that cost
  # the most under ASan (each runs the whole lunar demo several times, 40-180 s apiece; the cache's
  # own checks run under the sanitizers in the unit tests): the
  # code they drive is exercised under the sanitizers by the unit tests and the other CLI
  # tests, and the normal build runs them all. This keeps .ci/run under 25 minutes.
  heavy='cli:shelter: sizes per material|cli:storm: one what-if, a sweep|'
  heavy+='cli:storm, shelter and shielding write --out|cli:compare: the lunar demo|'
  heavy+='cli:check: the same numbers, bit for bit|cli:check: json carries full precision|'
  heavy+='cli:storm, shelter and compare: --html is one deterministic page|'
  heavy+='cli:storm --sweep --html and shelter --html: headless Chromium|'
  heavy+='cli:check: the same bytes with a cold, warm or damaged cache|'
  heavy+='cli:progress: a line on a terminal|'
  heavy+='cli:check: --chart draws every crew member|cli:storm: --chart draws the sweep|'
  heavy+='cli:shelter: --chart draws the dose against added material|'
  heavy+='cli:check: --html is one deterministic page|'
  heavy+='_NOT_BUILT'
  (cd "$dir" && ctest --output-on-failure --no-tests=error -j "$jobs" -LE 'slow|expected' \
     -E "$heavy")
else
  dir=build
  # -O2 without debug info: a test run needs no debugger, and -g costs about 45 % of the
  # compile time of a test file (GCC 12). Not -O3: GCC 12 warns falsely there (-Wrestrict,
  # -Wmaybe-uninitialized inside std::string), which -Werror would make errors.
  cmake -S . -B "$dir" -G Ninja -DCMAKE_BUILD_TYPE=Release "-DCMAKE_CXX_FLAGS_RELEASE=-O2 -DNDEBUG" \
        -DCREWDOSE_WERROR=ON > /dev/null
  cmake --build "$dir" -j "$jobs"
  (cd "$dir" && ctest --output-on-failure --no-tests=error -j "$jobs")
fi
