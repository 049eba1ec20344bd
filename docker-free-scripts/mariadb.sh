#!/usr/bin/env bash
# Runs a private MariaDB server for Lagbook on 127.0.0.1, without systemd or containers.
#
#   docker-free-scripts/mariadb.sh start   # init the data folder if new, start, wait until it answers
#   docker-free-scripts/mariadb.sh stop    # clean shutdown
#   docker-free-scripts/mariadb.sh status  # exit 0 when it answers
#
# Settings (environment):
#   LAGBOOK_DB_DIR   data folder (default: .lagbook/dev/mariadb, git-ignored)
#   LAGBOOK_DB_PORT  TCP port on 127.0.0.1 (default: 4306)
#   LAGBOOK_DB_NAME  database to create (default: lagbook)
#   LAGBOOK_DB_EXTRA_ARGS  more server options, space-separated (tests use it, e.g. to cap the tablespace)
# The lagbook user may connect over TCP (127.0.0.1) or through the Unix socket $LAGBOOK_DB_DIR/mysqld.sock
# (as 'lagbook'@'localhost'; npm start's server uses the socket, see LAGBOOK_DB_SOCKET).
# The server runs with --no-defaults so Debian's /etc/mysql settings never take over.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
# shellcheck source=docker-free-scripts/database-setup.sh
source "$ROOT/docker-free-scripts/database-setup.sh"
DB_DIR="${LAGBOOK_DB_DIR:-$ROOT/.lagbook/dev/mariadb}"
DB_PORT="${LAGBOOK_DB_PORT:-4306}"
DB_NAME="${LAGBOOK_DB_NAME:-lagbook}"
read -r -a EXTRA_ARGS <<< "${LAGBOOK_DB_EXTRA_ARGS:-}"
DATA="$DB_DIR/data"
SOCK="$DB_DIR/mysqld.sock"
PIDFILE="$DB_DIR/mysqld.pid"
LOG="$DB_DIR/mysqld.err"

fail() { echo "mariadb: $*" >&2; exit 1; }

client() { mariadb --no-defaults --socket="$SOCK" -uroot "$@"; }

answers() { mariadb-admin --no-defaults --socket="$SOCK" -uroot --connect-timeout=2 ping >/dev/null 2>&1; }

port_in_use() {
  node -e "const s=require('net').createServer();s.once('error',()=>process.exit(0));s.listen($DB_PORT,'127.0.0.1',()=>s.close(()=>process.exit(1)))"
}

start() {
  command -v mariadbd >/dev/null || fail "mariadbd not found (install Debian's mariadb-server; docker-free-scripts/install.sh does it)"
  mkdir -p "$DB_DIR"
  if answers; then echo "mariadb: already running on 127.0.0.1:$DB_PORT"; ensure_database; return; fi
  if port_in_use; then fail "port $DB_PORT on 127.0.0.1 is in use by another program; set LAGBOOK_DB_PORT to a free port"; fi
  if [ ! -d "$DATA/mysql" ]; then
    rm -rf "$DATA"
    mariadb-install-db --no-defaults --datadir="$DATA" --user=root \
      --auth-root-authentication-method=normal --skip-test-db --skip-name-resolve >"$DB_DIR/install.log" 2>&1 \
      || fail "could not initialise $DATA (see $DB_DIR/install.log)"
  fi
  # nohup + setsid: the server outlives this script and ignores the terminal's Ctrl-C;
  # the caller stops it with `mariadb.sh stop`.
  # Page compression (readings and rollups are PAGE_COMPRESSED=1): zlib is named explicitly
  # because it is built into Debian's mariadbd; lz4, lzma, bzip2 and snappy come only as the
  # separate mariadb-plugin-provider-* packages, and a table written with a provider that is later
  # missing cannot be read. Level 6 is zlib's usual default. The storage benchmark measures lz4
  # beside it for the record (README, storage section).
  setsid nohup mariadbd --no-defaults --user=root --datadir="$DATA" --socket="$SOCK" \
    --port="$DB_PORT" --bind-address=127.0.0.1 --pid-file="$PIDFILE" --log-error="$LOG" \
    --skip-name-resolve --local-infile=1 --character-set-server=utf8mb4 \
    --collation-server=utf8mb4_unicode_ci --skip-log-bin \
    --innodb-buffer-pool-size=512M --innodb-log-file-size=256M \
    --innodb-flush-log-at-trx-commit=1 --max-connections=300 --max-allowed-packet=64M \
    --innodb-compression-algorithm=zlib --innodb-compression-level=6 \
    ${EXTRA_ARGS[@]+"${EXTRA_ARGS[@]}"} \
    >/dev/null 2>&1 < /dev/null &
  for _ in $(seq 1 150); do
    if answers; then ensure_database; echo "mariadb: ready on 127.0.0.1:$DB_PORT (data in $DATA)"; return; fi
    sleep 0.1
  done
  tail -n 20 "$LOG" >&2 2>/dev/null || true
  fail "the server did not answer within 15 s (log: $LOG)"
}

ensure_database() {
  client -e "$(lagbook_database_sql "$DB_NAME")" || fail "could not create database $DB_NAME"
}

stop() {
  if answers; then
    mariadb-admin --no-defaults --socket="$SOCK" -uroot shutdown || true
  fi
  for _ in $(seq 1 100); do
    [ -f "$PIDFILE" ] || { echo "mariadb: stopped"; return; }
    sleep 0.1
  done
  if [ -f "$PIDFILE" ]; then kill "$(cat "$PIDFILE")" 2>/dev/null || true; rm -f "$PIDFILE"; fi
  echo "mariadb: stopped"
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) answers && echo "mariadb: running on 127.0.0.1:$DB_PORT" || { echo "mariadb: not running"; exit 1; } ;;
  *) echo "usage: $0 start|stop|status" >&2; exit 2 ;;
esac
