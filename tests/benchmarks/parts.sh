#!/usr/bin/env bash
# One dataset's ingest and statistics passes in parts, run by one worker pinned to one core against two workers pinned
# to one core each, on the same queued passes, in one run: speed-up ratios, byte-identical results, peak RSS per worker.
# usage: tests/benchmarks/parts.sh NX NY NT   (the issue's size is 150 100 8760: the 1.05 GB benchmark hindcast)
# Environment: INGEST_PART_CELLS (default 2400 grid points a part), STATS_PART_CELLS (default 2048 cell ids a part).
# Writes tests/artifacts/benchmarks/parts-NXxNYxNT.txt. Needs: taskset, /usr/bin/time, psql, python3-netcdf4, a built
# atlas (Release), 2 cores.
set -euo pipefail
[ $# -eq 3 ] || { echo "usage: $0 NX NY NT (e.g. 150 100 8760)" >&2; exit 2; }
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
cd "$here"
nx=$1; ny=$2; nt=$3
ingest_part=${INGEST_PART_CELLS:-2400}; stats_part=${STATS_PART_CELLS:-2048}
shared="${ATLAS_SHARED:-$here/../shared}"
atlas="$here/src/Atlas.Cli/bin/Release/net10.0/atlas"
work="${ATLAS_BENCH_DIR:-/tmp/atlas-bench}"; mkdir -p "$work"
file="${ATLAS_BENCH_FILE:-$work/hindcast-${nx}x${ny}x${nt}.nc}"
out="$here/tests/artifacts/benchmarks"; mkdir -p "$out"
report="$out/parts-${nx}x${ny}x${nt}.txt"
[ "$(nproc)" -ge 2 ] || { echo "parts: needs 2 cores, this machine has $(nproc)" >&2; exit 1; }

[ -f "$file" ] || /usr/bin/python3 "$shared/bench/make_hindcast.py" "$nx" "$ny" "$nt" "$file"
cat "$file" > /dev/null   # page cache, for every run alike

# A database of its own, made afresh, so that the queue holds this run's passes alone.
source "$here/tests/benchmarks/fresh_database.sh"
fresh_database atlas_parts_bench
"$atlas" db migrate > /dev/null

now() { date +%s.%N; }
rss() { awk -F': ' '/Maximum resident set size/ {print $2}' "$work/$1.time"; }

# Runs the queued parts with WORKERS workers, worker k pinned to core k-1, each until the queue is idle; prints the
# wall time from the first start to the last exit.
run_workers() { # name workers
  local name=$1 workers=$2 k start pids=()
  start=$(now)
  for ((k = 1; k <= workers; k++)); do
    taskset -c $((k - 1)) /usr/bin/time -v -o "$work/$name-w$k.time" "$atlas" worker --until-idle > "$work/$name-w$k.out" 2>&1 &
    pids+=($!)
  done
  for pid in "${pids[@]}"; do wait "$pid"; done
  awk -v a="$start" -v b="$(now)" 'BEGIN { printf "%.2f", b - a }'
}

# Digests of what a dataset stores: its series (every chunk's bytes) and its statistics (every block, every column).
series_digest() { psql_cmd "SELECT md5(string_agg(cell_id || ':' || year || ':' || md5(payload), ',' ORDER BY cell_id, year)) FROM series_chunk s JOIN dataset d USING (dataset_id) WHERE d.slug = '$1'"; }
layers_digest() { psql_cmd "SELECT md5(string_agg(concat_ws('|', parameter, period, block, cell_ids, count, coverage, mean, sd, min, max, p10, p50, p90, p99, extra_width, extra), ',' ORDER BY parameter, period, block)) FROM statistic_block b JOIN dataset d USING (dataset_id) WHERE d.slug = '$1'"; }

{
  echo "# parts benchmark $(date -u +%FT%TZ), $(nproc) cores, file $(du -h "$file" | cut -f1) (${nx}x${ny} cells x ${nt} steps)"
  echo "# parts: ingest $ingest_part grid points, statistics $stats_part cell ids; worker k pinned to core k-1 (taskset)"
  declare -A ingest stats
  for workers in 1 2; do
    slug="parts-w$workers"
    "$atlas" ingest "$file" --dataset "$slug" --queue --part-cells "$ingest_part" | sed 's/^/  /'
    ingest[$workers]=$(run_workers "ingest-$slug" "$workers")
    "$atlas" stats "$slug" --all --queue --part-cells "$stats_part" | sed 's/^/  /'
    stats[$workers]=$(run_workers "stats-$slug" "$workers")
    for ((k = 1; k <= workers; k++)); do
      echo "$workers worker(s), worker $k: ingest peak RSS $(rss "ingest-$slug-w$k") kB, statistics peak RSS $(rss "stats-$slug-w$k") kB"
    done
    echo "$workers worker(s): ingest ${ingest[$workers]} s, statistics ${stats[$workers]} s"
    "$atlas" jobs --dataset "$slug" --limit 2 | grep '^pass' | sed 's/^/  /'
  done
  awk -v i1="${ingest[1]}" -v i2="${ingest[2]}" -v s1="${stats[1]}" -v s2="${stats[2]}" 'BEGIN {
    printf "ratio ingest speed-up (1 worker / 2 workers) = %.2f (goal >= 1.5)\n", i1 / i2;
    printf "ratio statistics speed-up (1 worker / 2 workers) = %.2f (goal >= 1.6)\n", s1 / s2 }'
  s1=$(series_digest parts-w1); s2=$(series_digest parts-w2)
  l1=$(layers_digest parts-w1); l2=$(layers_digest parts-w2)
  [ "$s1" = "$s2" ] && echo "series: identical ($s1)" || echo "series: DIFFER ($s1 against $s2)"
  [ "$l1" = "$l2" ] && echo "layers: identical ($l1)" || echo "layers: DIFFER ($l1 against $l2)"
  [ "$s1" = "$s2" ] && [ "$l1" = "$l2" ]
} | tee "$report"
