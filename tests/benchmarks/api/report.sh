#!/usr/bin/env bash
# Site report against the point answer of the same position, in one run on one server: the time and size of
# GET /point/report.pdf on the demo (atlas demo must have loaded it), as ratios to GET /point (all parts, JSON) of the
# same position and window. Each position is asked once for each (nothing cached), after a first request that loads
# the dataset's cells and time lines. Reports to tests/artifacts/benchmarks/report.txt.
# usage: tests/benchmarks/api/report.sh [SLUG]   (default skelvane-reach)
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
top=$(cd "$here/../../.." && pwd)
slug=${1:-skelvane-reach}
port=${PORT:-5093}
base="http://127.0.0.1:$port"
out="$top/tests/artifacts/benchmarks"; mkdir -p "$out"
work=$(mktemp -d)
name=report
needs_wrk=no
source "$here/serve.sh"
trap 'kill "$server" 2>/dev/null || true; wait "$server" 2>/dev/null || true; rm -f "$log"; rm -rf "$work"' EXIT

point="$base/api/v1/datasets/$slug/point"
curl -fsS -o /dev/null "$point?lat=50&lon=-26.3&include=none"
# time (s) and size (bytes) of one request
measure() { curl -fsS -o "$work/body" -w '%{time_total} %{size_download}\n' "$1"; }
for k in 1 2 3 4 5 6 7 8; do
  at="lat=49.9$k&lon=-26.1$k"
  read -r jt js < <(measure "$point?$at")
  read -r rt rs < <(measure "$point/report.pdf?$at")
  echo "$jt $js $rt $rs"
done > "$work/runs"

{
  echo "# site report benchmark $(date -u +%FT%TZ), $(nproc) cores, load average $(cut -d' ' -f1 /proc/loadavg), dataset $slug"
  awk '{jt += $1; js += $2; rt += $3; rs += $4; n++}
       END {printf "point JSON: mean %.1f ms, %.0f bytes\nsite report: mean %.1f ms, %.0f bytes\nratio time %.1f, size %.1f (goal: report under 1 s on the demo)\n",
            1000 * jt / n, js / n, 1000 * rt / n, rs / n, rt / jt, rs / js}' "$work/runs"
} | tee "$out/report.txt"
