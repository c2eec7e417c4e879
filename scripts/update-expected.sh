#!/usr/bin/env bash
# Regenerates the expected-output (golden) files of tests/expected/ from a built crewdose:
#   bash scripts/update-expected.sh [BINARY]     (default: build/planner/crewdose)
#
# Each case below is one run of crewdose from the repository root, with the scenario given by
# its relative path (so no absolute path enters an output). Its standard output is written to
# tests/expected/NAME (NAME ends in .txt, .json, .csv or .svg: how the test compares it), and the
# case's name, exit code and arguments to tests/expected/cases.tsv, the manifest that
# tests/cli/expected_output_test.cpp reads: the list of cases lives here only.
# An argument @OUT@ is replaced by a temporary file; that file's content, not the standard
# output, is then the case's output (for outputs that only go to a file, such as --series).
# Arguments are split on spaces: none may contain a space or a tab.
#
# These files are regression files: crewdose's own output at the time they were made, never an
# external reference. After an intended change of the output, rerun this script and read the
# diff of tests/expected/ (git diff --stat tests/expected; git diff tests/expected): every line
# that changed must be explained in the commit.
#
# Normalised (in the same way in the test): nothing. The time of run that JSON and CSV outputs
# carry (their provenance) is fixed by SOURCE_DATE_EPOCH=0, set here and in the test; they also
# carry the project version. No output may hold an absolute path (checked below: such a case
# is refused). If something must ever be normalised, add the replacement to normalise() here
# and to normalise() in the test.
set -euo pipefail

binary=${1:-build/planner/crewdose}
export SOURCE_DATE_EPOCH=0
binary=$(realpath -- "$binary") # before the cd: a relative path is the caller's
cd "$(dirname "$0")/.."
root=$PWD
if [[ ! -x "$binary" ]]; then
  echo "update-expected: no crewdose binary at $binary; build first or pass its path" >&2
  exit 2
fi

# NAME  ARGUMENTS. The scenario commands each build the study (about 2 s on 2 cores), so the
# list keeps to one run per command and format. The storm onset, 2032-03-09T10:00Z, is inside
# the long geology traverse of osei and wren (EVA 08:00-14:00, 150 min from cover). The
# shelter-layer cases give the shelter's answer a thickness to find and a mass to weigh (a BFO
# target of 40 mGy-Eq that the bare shelter misses, backed inside the habitat's first layer).
cases='
range.txt                 range --material aluminium --particle proton --energy 1,10,100,1000
range.json                range --material aluminium --particle proton --energy 1,10,100,1000 --format json
range.csv                 range --material aluminium --particle proton --energy 1,10,100,1000 --format csv
range-iron.txt            range --material water --particle iron --energy 10,100,1000
materials.txt             materials
materials.json            materials --format json
materials.csv             materials --format csv
depth.txt                 depth --spectrum band:J0=1e10,gamma_a=1.1,gamma_b=3.5,R0_GV=0.25 --material aluminium --depths 0.5,5,20 --tissue-depth bfo
depth.json                depth --spectrum band:J0=1e10,gamma_a=1.1,gamma_b=3.5,R0_GV=0.25 --material aluminium --depths 0.5,5,20 --tissue-depth bfo --format json
depth.csv                 depth --spectrum band:J0=1e10,gamma_a=1.1,gamma_b=3.5,R0_GV=0.25 --material aluminium --depths 0.5,5,20 --tissue-depth bfo --format csv
depth-chart.svg           depth --spectrum band:J0=1e10,gamma_a=1.1,gamma_b=3.5,R0_GV=0.25 --material aluminium --depths 0.5,5,20 --tissue-depth bfo --chart @OUT@
gcr.txt                   gcr --phi 400 --material polyethylene --depths 0,10,50 --tissue-depth bfo
gcr.json                  gcr --phi 400 --material polyethylene --depths 0,10,50 --tissue-depth bfo --format json
gcr.csv                   gcr --phi 400 --material polyethylene --depths 0,10,50 --tissue-depth bfo --format csv
gcr-chart.svg             gcr --phi 400 --material polyethylene --depths 0,10,50 --tissue-depth bfo --chart @OUT@
gcr-mars.txt              gcr --site mars --surface-pressure-Pa 850 --material mare-regolith --depths 0,50
validate-lunar.txt        validate scenarios/lunar-demo.toml
validate-mars.txt         validate scenarios/mars-demo.toml
check-lunar.txt           check scenarios/lunar-demo.toml
check-lunar.json          check scenarios/lunar-demo.toml --format json
check-lunar.csv           check scenarios/lunar-demo.toml --format csv
check-lunar-series.csv    check scenarios/lunar-demo.toml --series @OUT@
check-lunar-chart.svg     check scenarios/lunar-demo.toml --chart @OUT@
check-mars.txt            check scenarios/mars-demo.toml
check-mars.json           check scenarios/mars-demo.toml --format json
check-mars.csv            check scenarios/mars-demo.toml --format csv
storm-onset.txt           storm scenarios/lunar-demo.toml --event design-spe --onset 2032-03-09T10:00:00Z
storm-onset.json          storm scenarios/lunar-demo.toml --event design-spe --onset 2032-03-09T10:00:00Z --format json
storm-onset.csv           storm scenarios/lunar-demo.toml --event design-spe --onset 2032-03-09T10:00:00Z --format csv
storm-no-response.txt     storm scenarios/lunar-demo.toml --event design-spe --onset 2032-03-09T10:00:00Z --no-response
storm-sweep.txt           storm scenarios/lunar-demo.toml --event design-spe --sweep --step 12h
storm-sweep.json          storm scenarios/lunar-demo.toml --event design-spe --sweep --step 12h --format json
storm-sweep.csv           storm scenarios/lunar-demo.toml --event design-spe --sweep --step 12h --format csv
storm-sweep-chart.svg     storm scenarios/lunar-demo.toml --event design-spe --sweep --step 12h --chart @OUT@
shelter.txt               shelter scenarios/lunar-demo.toml --event design-spe --location storm-shelter --material water
shelter.json              shelter scenarios/lunar-demo.toml --event design-spe --location storm-shelter --material water --format json
shelter.csv               shelter scenarios/lunar-demo.toml --event design-spe --location storm-shelter --material water --format csv
shelter-layer.txt         shelter scenarios/lunar-demo.toml --event design-spe --location storm-shelter --material water --material polyethylene --target bfo=40 --layer hab-module:1
shelter-layer.csv         shelter scenarios/lunar-demo.toml --event design-spe --location storm-shelter --material water --material polyethylene --target bfo=40 --layer hab-module:1 --format csv
shielding.txt             shielding scenarios/lunar-demo.toml --location storm-shelter --event design-spe
shielding.json            shielding scenarios/lunar-demo.toml --location storm-shelter --event design-spe --format json
shielding.csv             shielding scenarios/lunar-demo.toml --location storm-shelter --event design-spe --format csv
'

# Replaces what varies from run to run by a placeholder; none at present (see the header).
normalise() {
  cat
}

out=$(mktemp -d)
trap 'rm -rf "$out"' EXIT
manifest="$out/cases.tsv"
{
  echo "# Expected-output cases, written by scripts/update-expected.sh: do not edit by hand."
  echo "# Regression files: crewdose's own output when they were made, not external references."
  echo "# name<TAB>exit code<TAB>arguments (run from the repository root; split on spaces)"
} > "$manifest"

# Milliseconds since the given start (date +%s%N: nanoseconds), printed as seconds.
seconds_since() {
  local ms=$((($(date +%s%N) - $1) / 1000000))
  printf '%d.%02d' $((ms / 1000)) $((ms % 1000 / 10))
}
total_start=$(date +%s%N)
while read -r name args; do
  [[ -z "$name" ]] && continue
  if [[ ! "$name" =~ ^[a-z0-9-]+\.(txt|json|csv|svg)$ ]]; then
    echo "update-expected: bad case name '$name' (lower-case, digits, '-', then .txt, .json, .csv or .svg)" >&2
    exit 2
  fi
  if cut -f1 "$manifest" | grep -qxF "$name"; then
    echo "update-expected: case '$name' is listed twice" >&2
    exit 2
  fi
  read -r -a argv <<< "$args"
  file_out=""
  for i in "${!argv[@]}"; do
    if [[ "${argv[$i]}" == "@OUT@" ]]; then
      file_out="$out/$name.file"
      argv[i]=$file_out
    fi
  done
  start=$(date +%s%N)
  code=0
  "$binary" "${argv[@]}" > "$out/$name.stdout" 2> "$out/$name.stderr" || code=$?
  seconds=$(seconds_since "$start")
  if ((code >= 2)); then
    echo "update-expected: $name: crewdose exited $code (bad usage or internal fault):" >&2
    cat "$out/$name.stderr" >&2
    exit 1
  fi
  if [[ -n "$file_out" ]]; then
    normalise < "$file_out" > "$out/$name"
  else
    normalise < "$out/$name.stdout" > "$out/$name"
  fi
  if grep -qF "$root" "$out/$name"; then
    echo "update-expected: $name: the output holds the absolute path $root; normalise it" >&2
    exit 1
  fi
  printf '%s\t%d\t%s\n' "$name" "$code" "$args" >> "$manifest"
  printf '%6s s  exit %d  %s\n' "$seconds" "$code" "$name"
done <<< "$cases"
printf '%6s s  in all\n' "$(seconds_since "$total_start")"

# Replace the whole folder's outputs, so a case taken off the list leaves no stale file.
mkdir -p tests/expected
rm -f tests/expected/*.txt tests/expected/*.json tests/expected/*.csv tests/expected/*.svg \
      tests/expected/cases.tsv
while IFS=$'\t' read -r name _; do
  [[ "$name" == \#* ]] && continue
  cp "$out/$name" "tests/expected/$name"
done < "$manifest"
cp "$manifest" tests/expected/cases.tsv
echo "update-expected: wrote tests/expected/ ($(grep -vc '^#' tests/expected/cases.tsv) cases);" \
     "read 'git diff tests/expected' and explain every change in the commit"
