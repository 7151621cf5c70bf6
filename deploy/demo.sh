#!/usr/bin/env bash
# One command for the demo: install what is missing, build, generate the invented demo scenario, ingest it,
# compute its statistics and serve the atlas (Ctrl-C stops the server; the database keeps running: atlas db stop).
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$here"
bash deploy/prepare.sh
atlas="$here/src/Atlas.Cli/bin/Release/net10.0/atlas"
exec "$atlas" demo --serve "$@"
