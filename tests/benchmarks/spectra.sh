#!/usr/bin/env bash
# Ingest and statistics of spectra at output points against a NumPy + netCDF4-python script computing the same per-step
# parameters and period means (tests/benchmarks/spectra/reference.py), in one run, on one machine.
# usage: tests/benchmarks/spectra.sh [STATIONS YEARS]   (default 50 10: 50 stations x 10 years of 3-hourly 45 x 24 spectra)
# RUNS rounds (default 3), each the script then the atlas, so that a drift of the machine's speed (a third within the
# hour on the shared machines) moves both sides of a round alike: every round's ratio is printed, then their median.
# Writes tests/artifacts/benchmarks/spectra-STATIONSxYEARS.txt. Needs /usr/bin/time, python3-netcdf4, python3-scipy, a
# built atlas (Release). Goals: atlas (ingest + statistics) at most 0.5 x the script's time; atlas peak RSS under 1 GB.
# The atlas side is one command, `atlas ingest FILES --dataset SLUG`, which computes the statistics after the load as it
# does by default; its own output gives the two parts' times. The fresh database is migrated before (as parts.sh does):
# creating the schema and PostGIS is set-up, not ingest.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
cd "$here"
stations=${1:-50}; years=${2:-10}
atlas="$here/src/Atlas.Cli/bin/Release/net10.0/atlas"
work="${ATLAS_BENCH_DIR:-/tmp/atlas-bench}/spectra-${stations}x${years}"; mkdir -p "$work"
out="$here/tests/artifacts/benchmarks"; mkdir -p "$out"
report="$out/spectra-${stations}x${years}.txt"
slug="bench-spectra-${stations}x${years}"

ls "$work"/points-*.nc > /dev/null 2>&1 || /usr/bin/python3 tests/benchmarks/spectra/make_spectra.py "$work" "$stations" "$years" > /dev/null
files=("$work"/points-*.nc)
cat "${files[@]}" > /dev/null   # page cache, for both contenders alike

measure() { # name command...
  local name=$1; shift
  /usr/bin/time -v -o "$work/$name.time" "$@" > "$work/$name.out" 2>&1
  echo "$name wall=$(awk -F': ' '/Elapsed \(wall clock\)/ {print $2}' "$work/$name.time") cpu_s=$(cpu "$name") rss_kb=$(awk -F': ' '/Maximum resident set size/ {print $2}' "$work/$name.time") load=$(cut -d' ' -f1-3 /proc/loadavg)"
}
cpu() { awk -F': ' '/User time|System time/ {s += $2} END {printf "%.2f", s}' "$work/$1.time"; }
seconds() { awk -F': ' '/Elapsed \(wall clock\)/ {n=split($2,a,":"); s=0; for(i=1;i<=n;i++) s=s*60+a[i]; print s}' "$work/$1.time"; }

source "$here/tests/benchmarks/fresh_database.sh"
runs=${RUNS:-3}

{
  echo "# spectra benchmark $(date -u +%FT%TZ), $(nproc) cores, ${#files[@]} file(s), $(du -ch "${files[@]}" | tail -1 | cut -f1), $stations stations x $years years, $runs round(s)"
  ratios=()
  for round in $(seq 1 "$runs"); do
    fresh_database atlas_bench_spectra
    measure numpy_reference_$round /usr/bin/python3 tests/benchmarks/spectra/reference.py "${files[@]}"
    measure atlas_$round "$atlas" ingest "${files[@]}" --dataset "$slug"
    ref=$(seconds numpy_reference_$round); at=$(seconds atlas_$round)
    ratio=$(awk -v r="$ref" -v a="$at" 'BEGIN { printf "%.3f", a / r }'); ratios+=("$ratio")
    # CPU seconds (user + system) as well: on a shared machine they move less with others' load than wall time does.
    echo "round $round: ratio atlas(ingest+stats)/numpy = $ratio, cpu ratio = $(awk -v r="$(cpu numpy_reference_$round)" -v a="$(cpu atlas_$round)" 'BEGIN { printf "%.3f", a / r }')"
  done
  printf '%s\n' "${ratios[@]}" | sort -n | awk '{ v[NR] = $1 } END { m = NR % 2 ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2; printf "median ratio atlas(ingest+stats)/numpy over %d round(s) = %.3f (goal <= 0.5)\n", NR, m }'
  grep -E "^(ingest|statistics) $slug" "$work/atlas_$runs.out"
  # Inside the block: fresh_database set `server` in this subshell of the pipe, not in the script around it.
  psql "$server dbname=postgres" -qc "DROP DATABASE IF EXISTS atlas_bench_spectra WITH (FORCE)"
} | tee "$report"
