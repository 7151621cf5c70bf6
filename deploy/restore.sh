#!/usr/bin/env bash
# Restores an atlas backup made by deploy/backup.sh into an EMPTY database (created if missing) on the same server.
# usage: deploy/restore.sh FILE.dump TARGET_DATABASE
set -euo pipefail
in=${1:?usage: deploy/restore.sh FILE.dump TARGET_DATABASE}
target=${2:?usage: deploy/restore.sh FILE.dump TARGET_DATABASE}
conn=${ATLAS_DB:-"host=127.0.0.1 port=54329 user=atlas dbname=atlas"}
conn=$(sed -e 's/;/ /g' -e 's/Host=/host=/I; s/Port=/port=/I; s/Username=/user=/I; s/Database=/dbname=/I; s/Password=/password=/I' <<<"$conn")
admin=$(sed -E 's/dbname=[^ ]+/dbname=postgres/' <<<"$conn")
targetconn=$(sed -E "s/dbname=[^ ]+/dbname=$target/" <<<"$conn")
if [ "$(psql "$admin" -Atc "SELECT 1 FROM pg_database WHERE datname = '$target'")" != "1" ]; then
  psql "$admin" -qc "CREATE DATABASE \"$target\""
fi
if [ "$(psql "$targetconn" -Atc "SELECT count(*) FROM pg_tables WHERE schemaname = 'public'")" != "0" ]; then
  echo "atlas restore: database $target is not empty; restore into a new database, then switch ATLAS_DB to it" >&2
  exit 1
fi
pg_restore --dbname="$targetconn" --no-owner --exit-on-error --jobs=2 "$in"
echo "atlas restore: $in restored into $target ($(psql "$targetconn" -Atc "SELECT count(*) FROM dataset") dataset(s))"
