#!/usr/bin/env bash
# Restores an atlas backup made by deploy/backup.sh into an EMPTY database (created if missing) on the same server
# as ATLAS_DB (else the embedded cluster).
# usage: deploy/restore.sh FILE.dump TARGET_DATABASE
set -euo pipefail
in=${1:?usage: deploy/restore.sh FILE.dump TARGET_DATABASE}
target=${2:?usage: deploy/restore.sh FILE.dump TARGET_DATABASE}
[[ $target =~ ^[A-Za-z_][A-Za-z0-9_]{0,62}$ ]] || { echo "atlas restore: '$target' is not a plain database name (letters, digits, _)" >&2; exit 2; }
source "$(dirname "$0")/connection.sh"
admin=$(sed -E 's/dbname=[^ ]+/dbname=postgres/' <<<"$conn")
targetconn=$(sed -E "s/dbname=[^ ]+/dbname=$target/" <<<"$conn")
if [ "$(psql "$admin" -Atc "SELECT 1 FROM pg_database WHERE datname = '$target'")" != "1" ]; then
  psql "$admin" -qc "CREATE DATABASE \"$target\""
fi
if [ "$(psql "$targetconn" -Atc "SELECT count(*) FROM pg_tables WHERE schemaname = 'public'")" != "0" ]; then
  echo "atlas restore: database $target is not empty; restore into a new database, then switch ATLAS_DB to it" >&2
  exit 1
fi
# The dump grants SELECT to the read-only role (db/V4__read_only_role.sql); on a fresh server it must exist first.
psql "$targetconn" -qv ON_ERROR_STOP=1 <<'SQL'
DO $$ BEGIN
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = 'atlas_reader') THEN CREATE ROLE atlas_reader NOLOGIN; END IF;
EXCEPTION WHEN duplicate_object OR unique_violation THEN NULL;
END $$;
SQL
pg_restore --dbname="$targetconn" --no-owner --exit-on-error --jobs=2 "$in"
echo "atlas restore: $in restored into $target ($(psql "$targetconn" -Atc "SELECT count(*) FROM dataset") dataset(s))"
