# Sourced by backup.sh and restore.sh: the atlas database as a libpq connection string in $conn.
# ATLAS_DB may be an Npgsql connection string (Host=...;Port=...;Username=...;Database=...); its keys that libpq
# knows are translated and the client-side ones (pooling, timeouts) dropped. A string without ';' is taken as
# libpq's own key=value form. Without ATLAS_DB: the embedded cluster on 127.0.0.1 at ATLAS_PG_PORT (default 54329).
libpq_connection() {
  local source=$1 out="" pair key value
  if [[ $source != *";"* ]]; then echo "$source"; return; fi
  IFS=';' read -ra pairs <<<"$source"
  for pair in "${pairs[@]}"; do
    [[ $pair == *"="* ]] || continue
    key=$(tr -d ' ' <<<"${pair%%=*}" | tr '[:upper:]' '[:lower:]')
    value=${pair#*=}
    case $key in
      host|server) out+="host=$value " ;;
      port) out+="port=$value " ;;
      username|user|userid) out+="user=$value " ;;
      database|db) out+="dbname=$value " ;;
      password) out+="password='${value//\'/\\\'}' " ;;
      sslmode) out+="sslmode=$(tr '[:upper:]' '[:lower:]' <<<"$value") " ;;
      *) ;;  # client-side settings of Npgsql (pooling, timeouts, application name)
    esac
  done
  echo "${out% }"
}
conn=$(libpq_connection "${ATLAS_DB:-"host=127.0.0.1 port=${ATLAS_PG_PORT:-54329} user=atlas dbname=atlas"}")
