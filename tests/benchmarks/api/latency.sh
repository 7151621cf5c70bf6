#!/usr/bin/env bash
# Single-request latencies of the API on the two large shapes of data the issue names, measured with curl on the
# loopback interface, each against its own cached repeat in the same run:
#  - a custom-window point request over 20 years of hourly data (a 8x8-cell, 175,320-step hindcast written by
#    ../shared/bench/make_hindcast.py), each request at a position not asked before, so nothing is cached;
#  - a seasonal GeoTIFF of a 300,000-cell dataset (600x500 cells x 240 hourly steps, same generator): cold (never
#    rendered; the layer cache is emptied first) and cached.
# Loads both datasets into the database ATLAS_DB names (default: the embedded cluster's atlas database) when missing.
# Reports to tests/artifacts/benchmarks/latency.txt.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
top=$(cd "$here/../../.." && pwd)
shared="${ATLAS_SHARED:-$top/../shared}"
port=${PORT:-5092}
base="http://127.0.0.1:$port"
work="${ATLAS_BENCH_DIR:-/tmp/atlas-bench}"; mkdir -p "$work"
out="$top/tests/artifacts/benchmarks"; mkdir -p "$out"
atlas=${ATLAS_BIN:-"$top/src/Atlas.Cli/bin/Release/net10.0/atlas"}
[ -n "${ATLAS_BIN:-}" ] || dotnet build "$top/src/Atlas.Cli" -c Release -v quiet -nologo >/dev/null
export ATLAS_BIN=$atlas   # serve.sh need not build again
[ -n "${ATLAS_DB:-}" ] || "$atlas" db start >/dev/null
psql_url=${ATLAS_PSQL:-"host=127.0.0.1 port=${ATLAS_PG_PORT:-54329} user=atlas dbname=atlas"}

ensure() { # slug nx ny nt
  local file="$work/$1.nc"
  if [ "$(psql "$psql_url" -Atc "SELECT count(*) FROM dataset WHERE slug = '$1'")" = "1" ]; then return; fi
  [ -f "$file" ] || /usr/bin/python3 "$shared/bench/make_hindcast.py" "$2" "$3" "$4" "$file"
  "$atlas" ingest "$file" --dataset "$1" | tail -1
}
ensure hourly-20y 8 8 175320
ensure wide-300k 600 500 240

name=latency
source "$here/serve.sh"

ms() { curl -fsS -o /dev/null -w '%{time_total}\n' "$1" | awk '{printf "%.1f\n", $1 * 1000}'; }
summary() { sort -n | awk '{v[NR] = $1} END {printf "median %.1f ms, max %.1f ms over %d requests", v[int((NR + 1) / 2)], v[NR], NR}'; }

point="$base/api/v1/datasets/hourly-20y/point"
layers="$base/api/v1/datasets/wide-300k/layers"
# The server loads each dataset's cells and time lines in the background when it starts; a first request to each
# waits for that, so that nothing measured below shares the machine with it.
first=$(ms "$base/api/v1/datasets/wide-300k/point?lat=50&lon=-30&include=none")
ms "$point?lat=50&lon=-30&include=none" >/dev/null
window=$(for k in $(seq 1 20); do ms "$point?lat=50.0$k&lon=-29.9$k&from=2001&to=2020&months=12,1,2"; done | summary)
full=$(for k in $(seq 1 20); do ms "$point?lat=50.1$k&lon=-29.8$k&from=2003&to=2018"; done | summary)
repeat=$(for k in $(seq 1 20); do ms "$point?lat=50.1$k&lon=-29.8$k&from=2003&to=2018"; done | summary)

id=$(psql "$psql_url" -Atc "SELECT dataset_id FROM dataset WHERE slug = 'wide-300k'")
cold=$(for s in mean p90 max sd p10; do
  psql "$psql_url" -qc "DELETE FROM layer_cache WHERE dataset_id = $id"; ms "$layers/hs/$s/djf.tif"; done | summary)
ms "$layers/hs/mean/djf.tif" >/dev/null   # rendered again (the loop above emptied the cache after it)
cached=$(for k in $(seq 1 20); do ms "$layers/hs/mean/djf.tif"; done | summary)
size=$(curl -fsS "$layers/hs/mean/djf.tif" | wc -c)

{
  echo "# API latency benchmark $(date -u +%FT%TZ), $(nproc) cores, load average $(cut -d' ' -f1 /proc/loadavg)"
  echo "point, 20 years hourly, window 2001-2020 months 12,1,2 (uncached): $window (goal: under 50 ms)"
  echo "point, 20 years hourly, window 2003-2018 all parts (uncached): $full (goal: under 50 ms)"
  echo "point, the same requests again (cached): $repeat"
  echo "seasonal GeoTIFF, 300,000 cells, cold (layer cache emptied): $cold (goal: under 1 s); first point request of the dataset after start $first ms"
  echo "seasonal GeoTIFF, 300,000 cells, cached: $cached (goal: under 20 ms); $size bytes"
} | tee "$out/latency.txt"
