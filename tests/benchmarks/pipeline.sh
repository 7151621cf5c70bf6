#!/usr/bin/env bash
# Ingest and statistics of the 1.05 GB benchmark hindcast against the CDO peer pipeline, in one run, on one machine.
# usage: tests/benchmarks/pipeline.sh [NX NY NT]   (default 150 100 8760: the file behind the peer timings)
# Writes tests/artifacts/benchmarks/pipeline.txt. Needs: cdo, /usr/bin/time, python3-netcdf4, a built atlas (Release).
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
cd "$here"
nx=${1:-150}; ny=${2:-100}; nt=${3:-8760}
shared="${ATLAS_SHARED:-$here/../shared}"
atlas="$here/src/Atlas.Cli/bin/Release/net10.0/atlas"
work="${ATLAS_BENCH_DIR:-/tmp/atlas-bench}"; mkdir -p "$work"
file="${ATLAS_BENCH_FILE:-$work/hindcast-${nx}x${ny}x${nt}.nc}"
out="$here/tests/artifacts/benchmarks"; mkdir -p "$out"
report="$out/pipeline-${nx}x${ny}x${nt}.txt"
slug="bench-${nx}x${ny}x${nt}"


[ -f "$file" ] || /usr/bin/python3 "$shared/bench/make_hindcast.py" "$nx" "$ny" "$nt" "$file"
cat "$file" > /dev/null   # page cache, for every contender alike

measure() { # name command...
  local name=$1; shift
  /usr/bin/time -v -o "$work/$name.time" "$@" > "$work/$name.out" 2>&1
  local wall rss
  wall=$(awk -F': ' '/Elapsed \(wall clock\)/ {print $2}' "$work/$name.time")
  rss=$(awk -F': ' '/Maximum resident set size/ {print $2}' "$work/$name.time")
  echo "$name wall=$wall rss_kb=$rss"
}
# Before each timed step the database's dirty pages are written out (CHECKPOINT, where the role may) and the
# kernel's (sync), so that no step pays for the write-back of the one before: the COPY FROM floor, run after the
# ingest's 560 MB, took 1.9 s or 3.7 s depending on what was still being written.
settle() { sync; psql "$server dbname=${bench_database:-postgres}" -qc CHECKPOINT > /dev/null 2>&1 || true; sync; }
seconds() { awk -F': ' '/Elapsed \(wall clock\)/ {n=split($2,a,":"); s=0; for(i=1;i<=n;i++) s=s*60+a[i]; print s}' "$work/$1.time"; }

# Rounds: the atlas steps and both floors run ROUNDS times (default 3), each round in a database made afresh, so that
# sizes and timings belong to that round alone; each ratio is taken within its round and the median of the rounds is
# the result (on a shared 2-core machine one round's floor of about a second moves by a tenth from run to run). CDO,
# five to ten times slower than the atlas, runs once.
rounds=${ROUNDS:-3}
source "$here/tests/benchmarks/fresh_database.sh"
fresh_database atlas_bench
median() { sort -g | awk '{ v[NR] = $1 } END { print (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2 }'; }
ratio() { awk -v a="$1" -v z="$2" 'BEGIN { if (z > 0) printf "%.3f\n", a / z; else print "nan" }'; }

{
  echo "# pipeline benchmark $(date -u +%FT%TZ), $(nproc) cores, file $(du -h "$file" | cut -f1) (${nx}x${ny} cells x ${nt} steps), $rounds rounds"
  settle
  measure cdo_peer bash "$shared/bench/peer_cdo.sh" "$file"
  cdo=$(seconds cdo_peer)
  : > "$work/pipeline-rounds.txt"
  for round in $(seq 1 "$rounds"); do
    echo "## round $round"
    [ "$round" -eq 1 ] || fresh_database atlas_bench
    settle
    measure atlas_ingest "$atlas" ingest "$file" --dataset "$slug" --no-stats
    settle
    measure atlas_stats "$atlas" stats "$slug" --all
    id=$(psql_cmd "SELECT dataset_id FROM dataset WHERE slug = '$slug'")
    settle
    measure db_stream_floor psql "$server dbname=atlas_bench" -Atc \
      "COPY (SELECT cell_id, year, payload FROM series_chunk WHERE dataset_id = $id ORDER BY cell_id, year) TO STDOUT (FORMAT BINARY)" \
      -o /dev/null
    # PostgreSQL's own COPY FROM of the same rows (the ingest floor): the dataset's series_chunk rows, every column, in
    # the order the ingest wrote them (a plain scan), dumped in binary COPY form, then loaded by psql's \copy (the
    # bytes travel from a client as the ingest's do) into an empty scratch table made LIKE series_chunk INCLUDING ALL:
    # the same primary key index, defaults and storage, logged like it. The table is made in a transaction of its own
    # before the timing, so the load writes WAL as the ingest does; it is dropped afterwards.
    rows_file="$work/series_chunk-$slug.copy"
    psql "$server dbname=atlas_bench" -qc \
      "\\copy (SELECT * FROM series_chunk WHERE dataset_id = $id) TO '$rows_file' WITH (FORMAT binary)"
    psql "$server dbname=atlas_bench" -qAt -c "SET client_min_messages = warning" -c "DROP TABLE IF EXISTS series_chunk_copy_floor" \
      -c "CREATE TABLE series_chunk_copy_floor (LIKE series_chunk INCLUDING ALL)"
    settle
    measure db_copy_from_floor psql "$server dbname=atlas_bench" -qc \
      "\\copy series_chunk_copy_floor FROM '$rows_file' WITH (FORMAT binary)"
    stored=$(psql_cmd "SELECT count(*) FROM series_chunk WHERE dataset_id = $id")
    copied=$(psql_cmd "SELECT count(*) FROM series_chunk_copy_floor")
    echo "copy-from floor: $copied of $stored series_chunk rows, $(du -h "$rows_file" | cut -f1) in binary COPY form"
    psql_cmd "DROP TABLE series_chunk_copy_floor" > /dev/null
    rm -f "$rows_file"
    [ "$copied" = "$stored" ] || { echo "pipeline: the COPY FROM floor loaded $copied rows, not $stored" >&2; exit 1; }
    ingest=$(seconds atlas_ingest); stats=$(seconds atlas_stats); floor=$(seconds db_stream_floor)
    copy_floor=$(seconds db_copy_from_floor)
    ingest_rss=$(awk -F': ' '/Maximum resident set size/ {print $2}' "$work/atlas_ingest.time")
    stats_rss=$(awk -F': ' '/Maximum resident set size/ {print $2}' "$work/atlas_stats.time")
    # /usr/bin/time counts wall time in hundredths: a floor under that on a tiny input has no ratio (nan).
    echo "$(ratio "$ingest" "$cdo") $(ratio "$ingest" "$copy_floor") $(ratio "$stats" "$cdo") $(ratio "$stats" "$floor") $ingest_rss $stats_rss" \
      | tee -a "$work/pipeline-rounds.txt" \
      | awk '{ printf "round ratios: ingest/cdo %s, ingest/copy-from-floor %s, stats/cdo %s, stats/stream-floor %s\n", $1, $2, $3, $4 }'
  done
  column_median() { awk -v c="$1" '{ print $c }' "$work/pipeline-rounds.txt" | median; }
  column_max() { awk -v c="$1" '$c > m { m = $c } END { print m }' "$work/pipeline-rounds.txt"; }
  column_all() { awk -v c="$1" '{ printf "%s%s", (NR > 1 ? " " : ""), $c }' "$work/pipeline-rounds.txt"; }
  echo "## medians of $rounds rounds (each round's ratios in brackets)"
  printf "ratio ingest/cdo = %.2f [%s] (goal <= 1.0)\n" "$(column_median 1)" "$(column_all 1)"
  printf "ratio ingest/copy-from-floor = %.2f [%s] (goal <= 2.0)\n" "$(column_median 2)" "$(column_all 2)"
  printf "ratio stats/cdo = %.2f [%s] (goal <= 0.5)\n" "$(column_median 3)" "$(column_all 3)"
  printf "ratio stats/stream-floor = %.2f [%s] (goal <= 3.0)\n" "$(column_median 4)" "$(column_all 4)"
  echo "peak RSS: ingest $(column_max 5) kB, statistics $(column_max 6) kB (the largest of the rounds; goal < 1 GB)"
  bytes=$(psql_cmd "SELECT pg_total_relation_size('series_chunk')")   # the only dataset in this database
  values=$(psql_cmd "SELECT sum((length(payload) - 6) / 2) FROM series_chunk WHERE dataset_id = $id")
  awk -v b="$bytes" -v v="$values" 'BEGIN { printf "storage = %.3f bytes per stored value (%d bytes for %d values; goal <= 2.5)\n", b / v, b, v }'
  echo "ingest summary: $(tail -1 "$work/atlas_ingest.out")"
  echo "stats summary: $(tail -1 "$work/atlas_stats.out")"
  echo "incremental: $(cd "$here" && "$atlas" stats "$slug" | tail -1)"
} | tee "$report"
