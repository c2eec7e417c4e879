#!/usr/bin/env bash
# One command on a fresh Debian 12 machine: install the dependencies, build crewdose, and run
# the demo (the stopping and range tables; the scenario check arrives with the planner).
set -euo pipefail
cd "$(dirname "$0")/.."

bash scripts/install-deps.sh
cmake -S . -B build -G Ninja -DCMAKE_BUILD_TYPE=RelWithDebInfo > /dev/null
cmake --build build --target crewdose

echo "== crewdose materials"
./build/planner/crewdose materials
echo
echo "== crewdose range --material aluminium --particle proton --energy 1,10,30,100,300,1000"
./build/planner/crewdose range --material aluminium --particle proton --energy 1,10,30,100,300,1000
echo
echo "== crewdose range --material water --particle iron --energy 100,1000"
./build/planner/crewdose range --material water --particle iron --energy 100,1000
