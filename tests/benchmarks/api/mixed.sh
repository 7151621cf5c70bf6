#!/usr/bin/env bash
# A mixed read load on the API: point statistics, time series and layer downloads in turn (wrk with rotate.lua), for
# a fixed time on the loopback interface. Reports requests/s, p99 latency, the error count (non-2xx responses and
# socket errors) and the server's peak resident memory (VmHWM from /proc).
#
# Assumes the demo is loaded (bash deploy/demo.sh, or atlas demo) and the database is up. Starts its own server on
# 127.0.0.1:${PORT:-5092} with the rate limit lifted, loads it for ${DURATION:-60s} at ${CONNECTIONS:-16} connections
# and ${THREADS:-2} threads, then stops it. Exits 1 when any request failed.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
top=$(cd "$here/../../.." && pwd)
port=${PORT:-5092}
duration=${DURATION:-60s}
connections=${CONNECTIONS:-16}
threads=${THREADS:-2}
base="http://127.0.0.1:$port"
name=mixed
source "$here/serve.sh"
rss_kb() { awk '/^VmRSS:/ {print $2}' "/proc/$server/status"; }
rss_start=$(rss_kb)

# The dataset (SLUG, or the first with computed statistics), eight of its wet cells spread over the list the
# screening endpoint returns, and its first stored year.
slug=""
for candidate in ${SLUG:-$(curl -fsS "$base/api/v1/datasets" | /usr/bin/python3 -c 'import json,sys; print(" ".join(d["slug"] for d in json.load(sys.stdin)["datasets"]))')}; do
  cells=$(curl -fsS "$base/api/v1/datasets/$candidate/screen" | /usr/bin/python3 -c '
import json, sys
f = json.load(sys.stdin)["features"]
for k in range(8) if f else []:
    c = f[(2 * k + 1) * len(f) // 16]["geometry"]["coordinates"]
    print(f"{c[1]:.5f} {c[0]:.5f}")') || true
  if [ -n "$cells" ]; then slug=$candidate; break; fi
done
[ -n "$slug" ] || { echo "mixed: no dataset with statistics; run bash deploy/demo.sh first" >&2; exit 1; }
year=$(curl -fsS "$base/api/v1/datasets/$slug/layers" | /usr/bin/python3 -c '
import json, sys
periods = next(p for p in json.load(sys.stdin)["parameters"] if p["symbol"] == "hs")["periods"]
print(next(p[1:] for p in periods if p.startswith("y")))')

paths=()
while read -r lat lon; do
  paths+=("/api/v1/datasets/$slug/point?lat=$lat&lon=$lon")
  paths+=("/api/v1/datasets/$slug/point?lat=$lat&lon=$lon&period=djf&format=csv")
  paths+=("/api/v1/datasets/$slug/point/series?lat=$lat&lon=$lon&from=$year&to=$year&format=csv")
done <<<"$cells"
for layer in hs/mean/annual.tif j/mean/djf.csv te/mean/jja.geojson hs/p90/annual.tif j/mean/annual.png tp/mean/son.nc; do
  paths+=("/api/v1/datasets/$slug/layers/$layer")
done
for path in "${paths[@]}"; do  # every path must answer before the load starts (and the layer cache is filled)
  curl -fsS -o /dev/null "$base$path" || { echo "mixed: $path does not answer 200" >&2; exit 1; }
done

out=$(wrk -t"$threads" -c"$connections" -d"$duration" --latency -s "$here/rotate.lua" "$base" -- "${paths[@]}")
rps=$(awk '/^Requests\/sec:/ {print $2}' <<<"$out")
p99=$(awk '$1 == "99%" {v=$2; if (v ~ /us$/) {sub(/us$/,"",v); v=v/1000} else if (v ~ /ms$/) {sub(/ms$/,"",v)} else if (v ~ /s$/) {sub(/s$/,"",v); v=v*1000}; print v}' <<<"$out")
requests=$(awk '/requests in/ {print $1}' <<<"$out")
non2xx=$(awk '/Non-2xx or 3xx responses:/ {print $5}' <<<"$out")
socket=$(awk '/Socket errors:/ {gsub(",", ""); print $4 + $6 + $8 + $10}' <<<"$out")
errors=$(( ${non2xx:-0} + ${socket:-0} ))
rss_end=$(rss_kb)
peak_kb=$(awk '/^VmHWM:/ {print $2}' "/proc/$server/status")

printf 'dataset %s: %d paths (8 cells x point json, point csv, one-year series; 6 layers); %s connections, %s threads, %s\n' \
  "$slug" "${#paths[@]}" "$connections" "$threads" "$duration"
printf '%-12s %12s %10s %8s %14s %14s %14s\n' requests requests/s p99_ms errors rss_start_MB rss_end_MB peak_rss_MB
printf '%-12s %12.1f %10.2f %8d %14.0f %14.0f %14.0f\n' "$requests" "$rps" "$p99" "$errors" \
  "$(( rss_start / 1024 ))" "$(( rss_end / 1024 ))" "$(( peak_kb / 1024 ))"
if [ "$errors" -gt 0 ]; then echo "$out" >&2; exit 1; fi
