#!/usr/bin/env bash
# Backs up the atlas database (custom format, compressed) to FILE. Uses ATLAS_DB, else the embedded cluster.
# usage: deploy/backup.sh FILE.dump
set -euo pipefail
out=${1:?usage: deploy/backup.sh FILE.dump}
conn=${ATLAS_DB:-"host=127.0.0.1 port=54329 user=atlas dbname=atlas"}
# An Npgsql connection string (Host=...;Port=...) is turned into libpq's key=value form.
conn=$(sed -e 's/;/ /g' -e 's/Host=/host=/I; s/Port=/port=/I; s/Username=/user=/I; s/Database=/dbname=/I; s/Password=/password=/I' <<<"$conn")
pg_dump --dbname="$conn" --format=custom --compress=1 --no-owner --file="$out"
echo "atlas backup: $(du -h "$out" | cut -f1) written to $out"
