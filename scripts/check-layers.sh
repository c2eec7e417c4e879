#!/usr/bin/env bash
# The planner's stages depend one way: scenario -> study -> analyses -> report -> cli.
# A file of one stage may include headers of its own stage and of the stages before it, never
# of a later one; planner headers are included by their full path, planner/<stage>/<file>.hpp.
# Prints every include that breaks this and exits 1 (ctest runs it as "layers: one way").
set -euo pipefail
cd "$(dirname "$0")/../planner"

stages=(scenario study analyses report cli)
rank_of() {
  local i
  for i in "${!stages[@]}"; do
    if [[ "${stages[$i]}" == "$1" ]]; then echo "$i"; return; fi
  done
  echo -1
}

faults=0
files=0
while IFS= read -r file; do
  files=$((files + 1))
  stage=${file%%/*}
  rank=$(rank_of "$stage")
  if [[ "$file" != */* || "$rank" -lt 0 || "${file#*/}" == */* ]]; then
    echo "planner/$file: not directly inside a stage folder (${stages[*]})"
    faults=$((faults + 1))
    continue
  fi
  while IFS=: read -r line target; do
    case "$target" in
      exposure/* | habitats/*) continue ;;
    esac
    IFS=/ read -r top target_stage rest <<< "$target"
    target_rank=$(rank_of "$target_stage")
    if [[ "$top" != planner || -z "$rest" || "$rest" == */* || "$target_rank" -lt 0 ]]; then
      echo "planner/$file:$line: include \"$target\" by its full path planner/<stage>/<file>"
      faults=$((faults + 1))
    elif ((target_rank > rank)); then
      echo "planner/$file:$line: the $stage stage includes \"$target\" of the later" \
           "$target_stage stage"
      faults=$((faults + 1))
    fi
  done < <(grep -n -E '^[[:space:]]*#[[:space:]]*include[[:space:]]*"' "$file" |
           sed -E 's/^([0-9]+):[^"]*"([^"]+)".*/\1:\2/')
done < <(find . -name '*.hpp' -o -name '*.cpp' | sed 's|^\./||' | sort)

if ((faults > 0)); then
  echo "$faults include(s) against the stage order ${stages[*]}"
  exit 1
fi
echo "$files files: every include follows ${stages[*]}"
