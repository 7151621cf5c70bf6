# Sourced by the API load scripts: builds the Release binary unless ATLAS_BIN names one, starts `atlas serve` on
# $base (rate limit lifted, warnings only) in the background as $server, stops it on exit, and waits for /healthz.
# Needs: top (the checkout), base (http://127.0.0.1:PORT), name (for messages).
# Scripts that time single requests with curl set needs_wrk=no before sourcing.
[ "${needs_wrk:-yes}" = no ] || command -v wrk >/dev/null || { echo "$name: wrk is not installed (apt-get install -y wrk)" >&2; exit 2; }

atlas=${ATLAS_BIN:-"$top/src/Atlas.Cli/bin/Release/net10.0/atlas"}
if [ -z "${ATLAS_BIN:-}" ]; then  # keep the Release build current
  dotnet build "$top/src/Atlas.Cli" -c Release -v quiet -nologo >/dev/null
fi

log=$(mktemp)
ASPNETCORE_URLS="$base" AtlasApiOptions__ExpensiveRequestsPerMinute=1000000 Logging__LogLevel__Default=Warning \
  "$atlas" serve >"$log" 2>&1 &
server=$!
trap 'kill "$server" 2>/dev/null || true; wait "$server" 2>/dev/null || true; rm -f "$log"' EXIT
for _ in $(seq 1 120); do
  curl -fsS "$base/healthz" >/dev/null 2>&1 && break
  kill -0 "$server" 2>/dev/null || { echo "$name: the server exited:" >&2; cat "$log" >&2; exit 1; }
  sleep 0.5
done
