# The database and the 'lagbook' user every private MariaDB of ours gets (mariadb.sh's single
# server and cluster.sh's nodes), as one SQL text. Sourced, not run.
#
#   lagbook_database_sql <database name>   prints the statements (idempotent: IF NOT EXISTS)
#
# The user may connect over TCP (127.0.0.1) and through the Unix socket ('localhost'); it owns the
# database and every `<name>_…` database the tests make beside it, and may RELOAD and see PROCESS
# (backups and the ops commands read server status).
lagbook_database_sql() {
  local db="$1" host
  printf "CREATE DATABASE IF NOT EXISTS \`%s\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;\n" "$db"
  for host in 127.0.0.1 localhost; do
    printf "CREATE USER IF NOT EXISTS 'lagbook'@'%s' IDENTIFIED BY 'lagbook';\n" "$host"
    printf "GRANT ALL PRIVILEGES ON \`%s\`.* TO 'lagbook'@'%s';\n" "$db" "$host"
    printf "GRANT ALL PRIVILEGES ON \`%s\\\\_%%\`.* TO 'lagbook'@'%s';\n" "$db" "$host"
    printf "GRANT RELOAD, PROCESS ON *.* TO 'lagbook'@'%s';\n" "$host"
  done
}
