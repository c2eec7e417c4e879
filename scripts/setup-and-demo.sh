#!/usr/bin/env bash
# One command on a fresh Debian 12 machine: install the dependencies, build crewdose, and run
# the main job on the lunar demo scenario.
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install-deps.sh
cmake -S . -B build -G Ninja -DCMAKE_BUILD_TYPE=Release -DCREWDOSE_WERROR=OFF > /dev/null
cmake --build build --target crewdose

echo "== crewdose check scenarios/lunar-demo.toml"
./build/planner/crewdose check scenarios/lunar-demo.toml
