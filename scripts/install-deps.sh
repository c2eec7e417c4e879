#!/usr/bin/env bash
# Installs the Debian 12 packages crewdose builds with, if any is missing. Non-interactive.
set -euo pipefail

packages=(libboost-date-time-dev libfmt-dev catch2 libcli11-dev libtomlplusplus-dev
          nlohmann-json3-dev libbenchmark-dev cmake ninja-build g++)

# Callers may ask for more (scripts/fuzz.sh: clang and its fuzzer runtime).
read -r -a extra <<< "${CREWDOSE_EXTRA_PACKAGES:-}"
packages+=("${extra[@]}")

missing=()
for p in "${packages[@]}"; do
  if ! dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed"; then
    missing+=("$p")
  fi
done
if ((${#missing[@]} == 0)); then
  exit 0
fi

sudo_cmd=()
if [ "$(id -u)" -ne 0 ]; then
  sudo_cmd=(sudo)
fi
echo "installing: ${missing[*]}" >&2
export DEBIAN_FRONTEND=noninteractive
"${sudo_cmd[@]}" apt-get update -q < /dev/null
"${sudo_cmd[@]}" apt-get install -y -q --no-install-recommends "${missing[@]}" < /dev/null
