#!/usr/bin/env bash
# One command for every test: install what is missing (database, netCDF-C, CDO, GDAL, NumPy/SciPy, Chromium),
# build, start the embedded database, run every test project, and print the totals.
set -uo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$here"
free_mb() { df -Pm "$1" | awk 'NR == 2 { print $4 }'; }
# What a run takes on disk, measured: about 0.6 GB of build output, the test cluster (its WAL held to 512 MB below)
# and the tests' own files, removed at the end; the packages installed on a fresh machine come on top.
need_mb=3000
for place in "$here" "${TMPDIR:-/tmp}"; do
  if [ "$(free_mb "$place")" -lt "$need_mb" ]; then
    echo "atlas: only $(free_mb "$place") MB free on the disk of $place; the tests need about $need_mb MB (free some, then run again)"
    exit 1
  fi
done
bash deploy/prepare.sh --with-test-tools || exit 1
atlas="$here/src/Atlas.Cli/bin/Release/net10.0/atlas"
started_here=0
if [ -z "${ATLAS_DB:-}" ]; then
  created_here=0; [ -f "${ATLAS_HOME:-$here/.atlas}/pg/PG_VERSION" ] || created_here=1
  # A cluster this run starts is stopped when it ends (CI leaves nothing running); one already running is left so.
  "$atlas" db status > /dev/null 2>&1 || started_here=1
  "$atlas" db start || exit 1
  # The tests write and rewrite much more than they keep: a cluster this run created (a clean clone, as in CI)
  # checkpoints at 512 MB of WAL instead of the embedded cluster's 4 GB, which keeps its disk small. A checkout's
  # existing cluster (with its benchmark data) is left as it is.
  [ "$created_here" -eq 0 ] || psql -X -q -h 127.0.0.1 -p "${ATLAS_PG_PORT:-54329}" -U atlas -d postgres \
    -c "ALTER SYSTEM SET max_wal_size = '512MB'" -c "SELECT pg_reload_conf()" > /dev/null || exit 1
fi

# Every file and folder the tests make (fixtures, downloads, clusters of their own, reference tools' output) goes
# under one folder of this run, removed when it ends however it ends.
run_tmp="$(mktemp -d "${TMPDIR:-/tmp}/atlas-tests-XXXXXX")"
trap '[ "$started_here" -eq 0 ] || "$atlas" db stop > /dev/null; rm -rf "$run_tmp"' EXIT
export TMPDIR="$run_tmp"

results="$here/tests/artifacts/results"
rm -rf "$results"; mkdir -p "$results"
status=0
dotnet test Atlas.sln -c Release --no-build -nologo -v quiet \
  --logger "trx" --results-directory "$results" -- RunConfiguration.TestSessionTimeout=3600000 || status=$?

passed=0; failed=0; skipped=0
for f in "$results"/*.trx; do
  [ -f "$f" ] || continue
  line=$(grep -o '<Counters [^>]*>' "$f" | head -1)
  p=$(sed -n 's/.* passed="\([0-9]*\)".*/\1/p' <<<"$line"); passed=$((passed + ${p:-0}))
  fl=$(sed -n 's/.* failed="\([0-9]*\)".*/\1/p' <<<"$line"); failed=$((failed + ${fl:-0}))
  s=$(sed -n 's/.* notExecuted="\([0-9]*\)".*/\1/p' <<<"$line"); skipped=$((skipped + ${s:-0}))
done
if [ "$passed" -eq 0 ] && [ "$status" -eq 0 ]; then echo "atlas: no test ran"; status=1; fi
echo "$passed passed, $failed failed, $skipped skipped ($(free_mb "$here") MB left free on the disk)"
exit $status
