#!/usr/bin/env bash
# Point-statistics throughput of the API against a trivial endpoint of the same server (the ceiling), measured
# with wrk on the loopback interface in the same run, reported as ratios.
#
# Assumes the demo is loaded (bash deploy/demo.sh, or atlas demo) and the database is up. Starts its own server on
# 127.0.0.1:${PORT:-5091} with the rate limit lifted, runs each load for ${DURATION:-10s} at ${CONNECTIONS:-32}
# connections and ${THREADS:-2} threads, and stops the server again.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
top=$(cd "$here/../../.." && pwd)
port=${PORT:-5091}
duration=${DURATION:-10s}
connections=${CONNECTIONS:-32}
threads=${THREADS:-2}
base="http://127.0.0.1:$port"
name=bench
source "$here/serve.sh"

# The dataset (SLUG, or the first with computed statistics) and a wet cell of it: the middle one the screening
# endpoint returns with no criteria (it lists the cells that have an annual mean power).
lon=""; lat=""
for candidate in ${SLUG:-$(curl -fsS "$base/api/v1/datasets" | /usr/bin/python3 -c 'import json,sys; print(" ".join(d["slug"] for d in json.load(sys.stdin)["datasets"]))')}; do
  read -r lon lat < <(curl -fsS "$base/api/v1/datasets/$candidate/screen" |
    /usr/bin/python3 -c 'import json,sys; f=json.load(sys.stdin)["features"]; c=f[len(f)//2]["geometry"]["coordinates"] if f else ["",""]; print(c[0], c[1])') || true
  if [ -n "$lon" ]; then slug=$candidate; break; fi
done
[ -n "$lon" ] || { echo "bench: no dataset with statistics; run bash deploy/demo.sh first" >&2; exit 1; }
point="$base/api/v1/datasets/$slug/point?lat=$lat&lon=$lon"
curl -fsS "$point&include=none" >/dev/null   # warm up the dataset caches once

run() {  # name url [wrk options] -> "requests_per_second p99_ms"
  local out
  out=$(wrk -t"$threads" -c"$connections" -d"$duration" --latency "${@:3}" "$2")
  local rps p99
  rps=$(awk '/^Requests\/sec:/ {print $2}' <<<"$out")
  p99=$(awk '$1 == "99%" {v=$2; if (v ~ /us$/) {sub(/us$/,"",v); v=v/1000} else if (v ~ /ms$/) {sub(/ms$/,"",v)} else if (v ~ /s$/) {sub(/s$/,"",v); v=v*1000}; print v}' <<<"$out")
  local errors
  errors=$(awk '/Non-2xx or 3xx responses:/ {print $5}' <<<"$out")
  [ -z "$errors" ] || { echo "bench: $1 had $errors non-2xx responses" >&2; echo "$out" >&2; exit 1; }
  echo "$rps $p99"
}

# Most HTTP clients (browsers, curl --compressed, Python's requests) ask for gzip; the point answers are then sent in
# the form compressed once when they were made. Both are measured.
gzip=(-H "Accept-Encoding: gzip")
# A short load on both first, so that neither is measured while the JIT is still at work (the ceiling runs first).
wrk -t"$threads" -c"$connections" -d3s "$base/healthz" >/dev/null
wrk -t"$threads" -c"$connections" -d3s -H "Accept-Encoding: gzip" "$point" >/dev/null
read -r ceiling_rps ceiling_p99 < <(run healthz "$base/healthz")
read -r summary_rps summary_p99 < <(run point-summary "$point&include=none" "${gzip[@]}")
read -r full_rps full_p99 < <(run point-full "$point" "${gzip[@]}")
read -r summary_plain_rps summary_plain_p99 < <(run point-summary-identity "$point&include=none")
read -r full_plain_rps full_plain_p99 < <(run point-full-identity "$point")

printf 'dataset %s, cell near lat %s lon %s; %s connections, %s threads, %s each\n' "$slug" "$lat" "$lon" "$connections" "$threads" "$duration"
printf '%-34s %12s %10s %18s\n' endpoint requests/s p99_ms share_of_ceiling
printf '%-34s %12.1f %10.2f %18s\n' "healthz (ceiling)" "$ceiling_rps" "$ceiling_p99" "1.000"
row() { printf '%-34s %12.1f %10.2f %18.4f\n' "$1" "$2" "$3" "$(awk -v a="$2" -v b="$ceiling_rps" 'BEGIN {print a / b}')"; }
row "point, summaries only (gzip)" "$summary_rps" "$summary_p99"
row "point, all parts (gzip)" "$full_rps" "$full_p99"
row "point, summaries only (identity)" "$summary_plain_rps" "$summary_plain_p99"
row "point, all parts (identity)" "$full_plain_rps" "$full_plain_p99"
