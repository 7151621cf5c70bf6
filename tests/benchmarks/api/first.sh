#!/usr/bin/env bash
# The first point request after a start: `atlas serve` started afresh RUNS times (default 3) on a dataset of
# 300,000 cells; each run times the start until /healthz answers, the first point request (a new position) and a second
# one at another position (the same path, warm: the peer in the same run), and reports the ratio first / second and
# the time from the start to the first answer. Goal (issue 19): the first request under 300 ms.
#
# Assumes the dataset is loaded and the database is up. The dataset is SLUG (default big300k); make it with
#   python3 ../shared/bench/make_hindcast.py 600 500 48 /tmp/h300k.nc && atlas ingest /tmp/h300k.nc --dataset big300k --no-stats
# (statistics are not needed: point answers read the series). Positions are drawn inside the dataset's extent with
# ${SEED:-1}; a position refused (422, too far from a wet cell) is drawn again. Needs curl, python3, bc.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
top=$(cd "$here/../../.." && pwd)
port=${PORT:-5094}
runs=${RUNS:-3}
slug=${SLUG:-big300k}
base="http://127.0.0.1:$port"
atlas=${ATLAS_BIN:-"$top/src/Atlas.Cli/bin/Release/net10.0/atlas"}
[ -n "${ATLAS_BIN:-}" ] || dotnet build "$top/src/Atlas.Cli" -c Release -v quiet -nologo >/dev/null
out="$top/tests/artifacts/benchmarks"; mkdir -p "$out"
log=$(mktemp)
server=""
trap '[ -n "$server" ] && kill "$server" 2>/dev/null; rm -f "$log"' EXIT

start() {
  t0=$(date +%s.%N)
  ASPNETCORE_URLS="$base" Logging__LogLevel__Default=Warning "$atlas" serve >"$log" 2>&1 &
  server=$!
  for _ in $(seq 1 6000); do
    curl -fsS "$base/healthz" >/dev/null 2>&1 && break
    kill -0 "$server" 2>/dev/null || { echo "first: the server exited:" >&2; cat "$log" >&2; exit 1; }
    sleep 0.01
  done
  t1=$(date +%s.%N)
}
stop() { kill "$server"; wait "$server" 2>/dev/null || true; server=""; }

# Positions: drawn once inside the extent (from a server started for the purpose), each one answered 200.
start
read -r west south east north < <(curl -fsS "$base/api/v1/datasets/$slug" | /usr/bin/python3 -c '
import json, sys
e = json.load(sys.stdin)["extent"]
print(e["west"], e["south"], e["east"], e["north"])')
positions=()
seed=${SEED:-1}
while [ ${#positions[@]} -lt $((2 * runs)) ]; do
  p=$(/usr/bin/python3 -c "import random; r = random.Random($seed); print('lat=%.5f&lon=%.5f' % ($south + ($north - $south) * r.random(), $west + ($east - $west) * r.random()))")
  seed=$((seed + 1))
  [ "$(curl -s -o /dev/null -w '%{http_code}' "$base/api/v1/datasets/$slug/point?$p&include=none")" = 200 ] && positions+=("$p")
done
stop

{
  echo "# first point request after a start, $(date -u +%FT%TZ), $(nproc) cores, dataset $slug, load $(cut -d' ' -f1-3 /proc/loadavg)"
  printf '%-4s %12s %12s %12s %10s %18s %s\n' run listening_s first_ms second_ms ratio start_to_answer_s load
  for run in $(seq 1 "$runs"); do
    start
    first=$(curl -s -o /dev/null -w '%{http_code} %{time_total}' "$base/api/v1/datasets/$slug/point?${positions[$((2 * run - 2))]}")
    t2=$(date +%s.%N)
    second=$(curl -s -o /dev/null -w '%{http_code} %{time_total}' "$base/api/v1/datasets/$slug/point?${positions[$((2 * run - 1))]}")
    stop
    [ "${first%% *}" = 200 ] && [ "${second%% *}" = 200 ] || { echo "first: answers $first / $second" >&2; exit 1; }
    f=${first#* }; s=${second#* }
    printf '%-4s %12.3f %12.1f %12.1f %10.1f %18.3f %s\n' "$run" "$(echo "$t1 - $t0" | bc)" "$(echo "$f * 1000" | bc)" "$(echo "$s * 1000" | bc)" \
      "$(echo "$f / $s" | bc -l)" "$(echo "$t2 - $t0" | bc)" "$(cut -d' ' -f1 /proc/loadavg)"
  done
  echo "goal: first request under 300 ms"
} | tee "$out/first-$slug.txt"
