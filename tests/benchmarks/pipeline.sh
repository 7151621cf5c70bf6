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
seconds() { awk -F': ' '/Elapsed \(wall clock\)/ {n=split($2,a,":"); s=0; for(i=1;i<=n;i++) s=s*60+a[i]; print s}' "$work/$1.time"; }

# A database of its own, made afresh, so that sizes and timings belong to this run alone.
port="${ATLAS_PG_PORT:-54329}"   # the embedded cluster's port, as the atlas command reads it
if [ -z "${ATLAS_DB:-}" ]; then
  "$atlas" db start > /dev/null
  server="host=127.0.0.1 port=$port user=atlas"
else
  server=$(sed -e 's/;/ /g' -e 's/Host=/host=/I; s/Port=/port=/I; s/Username=/user=/I; s/Password=/password=/I; s/Database=[^ ]*//I' <<<"$ATLAS_DB")
fi
psql "$server dbname=postgres" -qc "DROP DATABASE IF EXISTS atlas_bench WITH (FORCE)" -c "CREATE DATABASE atlas_bench"
export ATLAS_DB="Host=127.0.0.1;Port=$port;Username=atlas;Database=atlas_bench"
[ -n "${server##*host=127.0.0.1 port=$port*}" ] && ATLAS_DB="$(sed -e 's/ /;/g' <<<"$server");Database=atlas_bench"
psql_cmd() { psql "$server dbname=atlas_bench" -Atc "$1"; }

{
  echo "# pipeline benchmark $(date -u +%FT%TZ), $(nproc) cores, file $(du -h "$file" | cut -f1) (${nx}x${ny} cells x ${nt} steps)"
  measure cdo_peer bash "$shared/bench/peer_cdo.sh" "$file"
  measure atlas_ingest "$atlas" ingest "$file" --dataset "$slug" --no-stats
  measure atlas_stats "$atlas" stats "$slug" --all
  id=$(psql_cmd "SELECT dataset_id FROM dataset WHERE slug = '$slug'")
  measure db_stream_floor psql "$server dbname=atlas_bench" -Atc \
    "COPY (SELECT cell_id, year, payload FROM series_chunk WHERE dataset_id = $id ORDER BY cell_id, year) TO STDOUT (FORMAT BINARY)" \
    -o /dev/null
  bytes=$(psql_cmd "SELECT pg_total_relation_size('series_chunk')")   # the only dataset in this database
  values=$(psql_cmd "SELECT sum((length(payload) - 6) / 2) FROM series_chunk WHERE dataset_id = $id")
  cdo=$(seconds cdo_peer); ingest=$(seconds atlas_ingest); stats=$(seconds atlas_stats); floor=$(seconds db_stream_floor)
  awk -v c="$cdo" -v i="$ingest" -v s="$stats" -v f="$floor" -v b="$bytes" -v v="$values" 'BEGIN {
    printf "ratio ingest/cdo = %.2f (goal <= 1.0)\n", i / c;
    printf "ratio stats/cdo = %.2f (goal <= 0.5)\n", s / c;
    printf "ratio stats/stream-floor = %.2f\n", s / f;
    printf "storage = %.3f bytes per stored value (%d bytes for %d values; goal <= 2.5)\n", b / v, b, v }'
  echo "ingest summary: $(tail -1 "$work/atlas_ingest.out")"
  echo "stats summary: $(tail -1 "$work/atlas_stats.out")"
  echo "incremental: $(cd "$here" && "$atlas" stats "$slug" | tail -1)"
} | tee "$report"
