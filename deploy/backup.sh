#!/usr/bin/env bash
# Backs up the atlas database (custom format, compressed) to FILE. Uses ATLAS_DB, else the embedded cluster.
# usage: deploy/backup.sh FILE.dump
set -euo pipefail
out=${1:?usage: deploy/backup.sh FILE.dump}
source "$(dirname "$0")/connection.sh"
pg_dump --dbname="$conn" --format=custom --compress=1 --no-owner --file="$out"
echo "atlas backup: $(du -h "$out" | cut -f1) written to $out"
