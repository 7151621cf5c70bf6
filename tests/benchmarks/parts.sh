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
cpu_of() { awk -F': ' '/User time|System time/ {s += $2} END {printf "%.2f", s}' "$work/$1.time"; }

# The database's CPU seconds so far, from /proc: every PostgreSQL process of the cluster alive now (utime + stime),
# plus what the postmaster has collected from its exited children (cutime + cstime: the backends of closed
# connections). Differences around a run are the database's share of it (autovacuum and the checkpointer included).
# Empty when the cluster is not a local process this script can see (ATLAS_DB on another machine).
postmaster=$(head -1 "${ATLAS_HOME:-$here/.atlas}/pg/postmaster.pid" 2>/dev/null || true)
db_cpu() {
  [ -n "$postmaster" ] && [ -r "/proc/$postmaster/stat" ] || return 0
  local tick; tick=$(getconf CLK_TCK)
  { cat "/proc/$postmaster/stat"; for c in $(pgrep -P "$postmaster"); do cat "/proc/$c/stat" 2>/dev/null || true; done; } |
    awk -v root="$postmaster" -v tick="$tick" '{ sub(/^[^)]*\) /, ""); s += $12 + $13; if (NR == 1) s += $14 + $15 } END { printf "%.2f", s / tick }'
}

# Runs the queued parts with WORKERS workers, worker k pinned to core k-1, each until the queue is idle; prints the
# wall time from the first start to the last exit.
run_workers() { # name workers
  local name=$1 workers=$2 k start pids=()
  db_before[$name]=$(db_cpu)
  start=$(now)
  for ((k = 1; k <= workers; k++)); do
    taskset -c $((k - 1)) /usr/bin/time -v -o "$work/$name-w$k.time" "$atlas" worker --until-idle > "$work/$name-w$k.out" 2>&1 &
    pids+=($!)
  done
  for pid in "${pids[@]}"; do wait "$pid"; done
  awk -v a="$start" -v b="$(now)" 'BEGIN { printf "%.2f", b - a }'
  db_after[$name]=$(db_cpu)
}

# The CPU of a run (its workers' and the database's) over its wall time: the cores it kept busy. On a machine of C
# cores where the database shares the workers' cores, two workers cannot go faster than C / (cores the one-worker run
# kept busy) times the one-worker run, whatever the parts: the script prints that bound beside the speed-up.
busy_cores() { # name workers wall
  local name=$1 workers=$2 wall=$3 k cpu=0
  for ((k = 1; k <= workers; k++)); do cpu=$(awk -v a="$cpu" -v b="$(cpu_of "$name-w$k")" 'BEGIN { print a + b }'); done
  local db; db=$(awk -v a="${db_before[$name]:-}" -v b="${db_after[$name]:-}" 'BEGIN { if (a == "" || b == "") print "-"; else printf "%.2f", b - a }')
  echo "$cpu $db $(awk -v c="$cpu" -v d="$db" -v w="$wall" 'BEGIN { if (d == "-") print "-"; else printf "%.2f", (c + d) / w }')"
}

# Digests of what a dataset stores: its series (every chunk's bytes) and its statistics (every block, every column).
series_digest() { psql_cmd "SELECT md5(string_agg(cell_id || ':' || year || ':' || md5(payload), ',' ORDER BY cell_id, year)) FROM series_chunk s JOIN dataset d USING (dataset_id) WHERE d.slug = '$1'"; }
layers_digest() { psql_cmd "SELECT md5(string_agg(concat_ws('|', parameter, period, block, cell_ids, count, coverage, mean, sd, min, max, p10, p50, p90, p99, extra_width, extra), ',' ORDER BY parameter, period, block)) FROM statistic_block b JOIN dataset d USING (dataset_id) WHERE d.slug = '$1'"; }

{
  echo "# parts benchmark $(date -u +%FT%TZ), $(nproc) cores, file $(du -h "$file" | cut -f1) (${nx}x${ny} cells x ${nt} steps)"
  echo "# parts: ingest $ingest_part grid points, statistics $stats_part cell ids; worker k pinned to core k-1 (taskset)"
  declare -A ingest stats db_before db_after bound cpubound
  for workers in 1 2; do
    slug="parts-w$workers"
    "$atlas" ingest "$file" --dataset "$slug" --queue --part-cells "$ingest_part" | sed 's/^/  /'
    run_workers "ingest-$slug" "$workers" > "$work/wall"; ingest[$workers]=$(cat "$work/wall")
    "$atlas" stats "$slug" --all --queue --part-cells "$stats_part" | sed 's/^/  /'
    run_workers "stats-$slug" "$workers" > "$work/wall"; stats[$workers]=$(cat "$work/wall")
    for ((k = 1; k <= workers; k++)); do
      echo "$workers worker(s), worker $k: ingest peak RSS $(rss "ingest-$slug-w$k") kB, statistics peak RSS $(rss "stats-$slug-w$k") kB"
    done
    echo "$workers worker(s): ingest ${ingest[$workers]} s, statistics ${stats[$workers]} s"
    for stage in ingest stats; do
      wall=${ingest[$workers]}; [ "$stage" = stats ] && wall=${stats[$workers]}
      read -r cpu db busy < <(busy_cores "$stage-$slug" "$workers" "$wall")
      echo "$workers worker(s), $stage: workers' CPU $cpu s, database CPU $db s, cores kept busy $busy of $(nproc)"
      [ "$workers" = 1 ] && [ "$busy" != "-" ] && bound[$stage]=$(awk -v b="$busy" -v c="$(nproc)" 'BEGIN { printf "%.2f", c / b }')
      # The two-worker run's own CPU (workers and database) spread evenly over every core: the shortest it could have
      # taken, and the speed-up over the one-worker run that shortest time would give.
      [ "$workers" = 2 ] && [ "$db" != "-" ] && cpubound[$stage]=$(awk -v c="$cpu" -v d="$db" -v n="$(nproc)" -v w1="$( [ "$stage" = stats ] && echo "${stats[1]}" || echo "${ingest[1]}")" 'BEGIN { printf "%.2f s, speed-up %.2f", (c + d) / n, w1 / ((c + d) / n) }')
    done
    "$atlas" jobs --dataset "$slug" --limit 2 | grep '^pass' | sed 's/^/  /'
  done
  awk -v i1="${ingest[1]}" -v i2="${ingest[2]}" -v s1="${stats[1]}" -v s2="${stats[2]}" 'BEGIN {
    printf "ratio ingest speed-up (1 worker / 2 workers) = %.2f (goal >= 1.5)\n", i1 / i2;
    printf "ratio statistics speed-up (1 worker / 2 workers) = %.2f (goal >= 1.6)\n", s1 / s2 }'
  echo "bound on the speed-up from this machine's cores (cores / cores the one-worker run kept busy, the database on the same cores): ingest ${bound[ingest]:--}, statistics ${bound[stats]:--}"
  echo "shortest time the two-worker run's own CPU allows on $(nproc) cores (workers' and database CPU / cores): ingest ${cpubound[ingest]:--}; statistics ${cpubound[stats]:--}"
  s1=$(series_digest parts-w1); s2=$(series_digest parts-w2)
  l1=$(layers_digest parts-w1); l2=$(layers_digest parts-w2)
  [ "$s1" = "$s2" ] && echo "series: identical ($s1)" || echo "series: DIFFER ($s1 against $s2)"
  [ "$l1" = "$l2" ] && echo "layers: identical ($l1)" || echo "layers: DIFFER ($l1 against $l2)"
  [ "$s1" = "$s2" ] && [ "$l1" = "$l2" ]
} | tee "$report"
