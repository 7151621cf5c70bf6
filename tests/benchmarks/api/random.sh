#!/usr/bin/env bash
# Uncached point answers under load: every request a new position and a new custom window (random_window.lua), against
# /healthz of the same server (the ceiling) in the same run, with wrk on the loopback interface, reported as ratios.
#
# Assumes a dataset is loaded and the database is up. Starts its own server on 127.0.0.1:${PORT:-5093} with the rate
# limit lifted, runs each load for ${DURATION:-10s} at ${CONNECTIONS:-32} connections and ${THREADS:-2} threads
# (seeded with ${SEED:-1}) after a warm-up of ${WARMUP:-30s}, and stops the server again. The dataset is SLUG, or the
# first one the catalogue lists.
# Positions are drawn uniformly inside the dataset's extent and are not steered off land: a position too far from any
# wet cell is refused with 422 by design, and those answers are counted and reported apart (their share, and the rate
# of 2xx answers alone); the p99 covers every answer. Any other non-2xx answer or socket error fails the run (exit 1).
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
top=$(cd "$here/../../.." && pwd)
port=${PORT:-5093}
duration=${DURATION:-10s}
connections=${CONNECTIONS:-32}
threads=${THREADS:-2}
seed=${SEED:-1}
base="http://127.0.0.1:$port"
name=random
source "$here/serve.sh"

slug=${SLUG:-$(curl -fsS "$base/api/v1/datasets" | /usr/bin/python3 -c 'import json,sys; d=json.load(sys.stdin)["datasets"]; print(d[0]["slug"] if d else "")')}
[ -n "$slug" ] || { echo "random: no dataset; load one first (bash deploy/demo.sh, or atlas ingest)" >&2; exit 1; }
# The extent (west south east north) and the first and last stored years, from the dataset's own description.
read -r west south east north first last < <(curl -fsS "$base/api/v1/datasets/$slug" | /usr/bin/python3 -c '
import json, sys
d = json.load(sys.stdin)
e, years = d.get("extent"), d["time"]["years"]
if not e or not years:
    sys.exit("random: dataset " + d["slug"] + " has no extent or no stored years")
print(e["west"], e["south"], e["east"], e["north"], min(years), max(years))')
args=("$slug" "$west" "$south" "$east" "$north" "$first" "$last")

p99_ms() { awk '$1 == "99%" {v=$2; if (v ~ /us$/) {sub(/us$/,"",v); v=v/1000} else if (v ~ /ms$/) {sub(/ms$/,"",v)} else if (v ~ /s$/) {sub(/s$/,"",v); v=v*1000}; print v}'; }
socket_errors() { awk '/Socket errors:/ {gsub(",", ""); s = $4 + $6 + $8 + $10} END {print s + 0}'; }

# A load on both first, so that neither is measured while the JIT is still at work (the ceiling runs first): the
# runtime compiles a method again, optimised, once it has run often (tiered compilation), and the point path reaches
# some 25,000 methods; on two busy cores a few seconds leave much of that compiling inside the measured run, which a
# long-running server never sees again. ${WARMUP:-30s} of the point load (the healthz path is short: 3 s); the warm-up
# draws with another seed, so the measured requests are still new to the server's caches.
wrk -t"$threads" -c"$connections" -d3s "$base/healthz" >/dev/null
wrk -t"$threads" -c"$connections" -d"${WARMUP:-30s}" -s "$here/random_window.lua" "$base" -- "${args[@]}" "$((seed + 1000))" >/dev/null

# The server's CPU time over each load (user + system, from /proc): on a shared machine the CPU per answer is the
# steadier figure beside the rates, which the other work on the machine moves.
cpu_ticks() { awk '{print $14 + $15}' "/proc/$server/stat"; }
c0=$(cpu_ticks)
ceiling=$(wrk -t"$threads" -c"$connections" -d"$duration" --latency "$base/healthz")
c1=$(cpu_ticks)
load=$(wrk -t"$threads" -c"$connections" -d"$duration" --latency -s "$here/random_window.lua" "$base" -- "${args[@]}" "$seed")
c2=$(cpu_ticks)
tick=$(getconf CLK_TCK)

ceiling_rps=$(awk '/^Requests\/sec:/ {print $2}' <<<"$ceiling")
ceiling_p99=$(p99_ms <<<"$ceiling")
ceiling_errors=$(( $(awk '/Non-2xx or 3xx responses:/ {print $5}' <<<"$ceiling" | grep . || echo 0) + $(socket_errors <<<"$ceiling") ))
load_rps=$(awk '/^Requests\/sec:/ {print $2}' <<<"$load")
load_p99=$(p99_ms <<<"$load")
load_socket=$(socket_errors <<<"$load")
read -r ok refused other < <(awk '/^random-window status:/ {print $4, $6, $8}' <<<"$load")
total=$(( ok + refused + other ))
[ "$total" -gt 0 ] || { echo "random: the load answered nothing" >&2; echo "$load" >&2; exit 1; }

printf 'dataset %s, extent W %s S %s E %s N %s, years %s..%s; %s connections, %s threads, %s each, seed %s\n' \
  "$slug" "$west" "$south" "$east" "$north" "$first" "$last" "$connections" "$threads" "$duration" "$seed"
printf '%-44s %12s %10s %14s\n' endpoint requests/s p99_ms ratio_to_ceiling
printf '%-44s %12.1f %10.2f %14s\n' "healthz (ceiling)" "$ceiling_rps" "$ceiling_p99" "1.000"
printf '%-44s %12.1f %10.2f %14.4f\n' "point, random position and window (all)" "$load_rps" "$load_p99" \
  "$(awk -v a="$load_rps" -v b="$ceiling_rps" 'BEGIN {print a / b}')"
two_xx_rps=$(awk -v r="$load_rps" -v k="$ok" -v n="$total" 'BEGIN {print r * k / n}')
printf '%-44s %12.1f %10s %14.4f\n' "point, 2xx answers only" "$two_xx_rps" "-" \
  "$(awk -v a="$two_xx_rps" -v b="$ceiling_rps" 'BEGIN {print a / b}')"
ceiling_requests=$(awk '/requests in/ {print $1}' <<<"$ceiling")
load_requests=$(awk '/requests in/ {print $1}' <<<"$load")
printf 'server CPU per request: healthz %.3f ms, point %.3f ms (ratio %.1f); load average %s\n' \
  "$(awk -v t=$((c1 - c0)) -v k="$tick" -v n="$ceiling_requests" 'BEGIN {print 1000 * t / k / n}')" \
  "$(awk -v t=$((c2 - c1)) -v k="$tick" -v n="$load_requests" 'BEGIN {print 1000 * t / k / n}')" \
  "$(awk -v a=$((c2 - c1)) -v b=$((c1 - c0)) -v m="$load_requests" -v n="$ceiling_requests" 'BEGIN {print (a / m) / (b / n)}')" \
  "$(cut -d' ' -f1-3 /proc/loadavg)"
printf 'p99 ratio point/healthz = %.1f\n' "$(awk -v a="$load_p99" -v b="$ceiling_p99" 'BEGIN {print a / b}')"
printf 'answers: %d 2xx, %d refused as too far from a wet cell (422, %.1f %%), %d other non-2xx, %d socket errors; healthz errors %d\n' \
  "$ok" "$refused" "$(awk -v k="$refused" -v n="$total" 'BEGIN {print 100 * k / n}')" "$other" "$load_socket" "$ceiling_errors"
if [ "$other" -gt 0 ] || [ "$load_socket" -gt 0 ] || [ "$ceiling_errors" -gt 0 ]; then
  echo "$ceiling" >&2; echo "$load" >&2; exit 1
fi
