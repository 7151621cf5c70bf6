# Sourced by the benchmark scripts: fresh_database NAME makes the database NAME afresh on the embedded cluster (started
# if need be) or on the server ATLAS_DB names, so that sizes, timings and the queue belong to one run alone. It sets
# `server` (libpq words for that server, without a database), exports ATLAS_DB for NAME, and defines psql_cmd SQL (one
# query in NAME, unaligned output), and migrates NAME to the atlas schema. Needs `atlas` (the built command's path) and psql.
fresh_database() { # name
  local name=$1
  port="${ATLAS_PG_PORT:-54329}"   # the embedded cluster's port, as the atlas command reads it
  if [ -z "${ATLAS_DB:-}" ]; then
    "$atlas" db start > /dev/null
    server="host=127.0.0.1 port=$port user=atlas"
  else
    server=$(sed -e 's/;/ /g' -e 's/Host=/host=/I; s/Port=/port=/I; s/Username=/user=/I; s/Password=/password=/I; s/Database=[^ ]*//I' <<<"$ATLAS_DB")
  fi
  psql "$server dbname=postgres" -qc "DROP DATABASE IF EXISTS $name WITH (FORCE)" -c "CREATE DATABASE $name"
  export ATLAS_DB="Host=127.0.0.1;Port=$port;Username=atlas;Database=$name"
  [ -n "${server##*host=127.0.0.1 port=$port*}" ] && ATLAS_DB="$(sed -e 's/ /;/g' <<<"$server");Database=$name"
  bench_database=$name
  # The schema (PostGIS included) is made here, as part of setting up, so that the first timed command does not
  # pay for it: creating it took about a second, which the ingest had been charged for against floors that write
  # into tables made before their timing.
  "$atlas" db migrate > /dev/null
}
psql_cmd() { psql "$server dbname=$bench_database" -Atc "$1"; }
