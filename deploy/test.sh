#!/usr/bin/env bash
# One command for every test: install what is missing (database, netCDF-C, CDO, GDAL, NumPy/SciPy, Chromium),
# build, start the embedded database, run every test project, and print the totals.
set -uo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$here"
bash deploy/prepare.sh --with-test-tools || exit 1
atlas="$here/src/Atlas.Cli/bin/Release/net10.0/atlas"
if [ -z "${ATLAS_DB:-}" ]; then "$atlas" db start || exit 1; fi

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
echo "$passed passed, $failed failed, $skipped skipped"
exit $status
