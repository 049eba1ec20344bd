#!/usr/bin/env bash
# `npm start`: installs what is missing, starts MariaDB and the local stand-ins, migrates,
# builds the client and the server, and serves Lagbook on 127.0.0.1. Ctrl-C stops everything.
#
# `LAGBOOK_CLUSTER=1 npm start` runs Lagbook on three MariaDB Galera nodes behind HAProxy instead
# (docker-free-scripts/cluster.sh, data kept in .lagbook/cluster): HAProxy's HTTP listener takes
# LAGBOOK_PORT (4310, so the public URL and the identity provider's redirect stay the same) and
# balances over two app servers on LAGBOOK_CLUSTER_APP_PORTS (default "4317 4318"), each under
# supervise.sh. They write through HAProxy's writer listener and read through its reader listener.
# Only the first app server migrates (DDL runs once, from one server, as Galera's total order
# isolation expects); the second starts after the first answers. The demo lab goes to the writer.
# The server runs under supervise.sh: if it dies it is started again (pauses of 1 s, 2 s, 4 s … at
# most 30 s, reset after a minute's run; the log says why it stopped) while MariaDB and the
# stand-ins keep running and nothing is rebuilt.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

require_node
apt_install_for mariadbd mariadb-server
install_node_modules

CLUSTER="${LAGBOOK_CLUSTER:-0}"
[ "$CLUSTER" = 0 ] || [ "$CLUSTER" = 1 ] || die "LAGBOOK_CLUSTER must be 0 or 1 (got '$CLUSTER')"
[ "$CLUSTER" = 1 ] && install_cluster_packages

export NODE_ENV=production
export STATE_DIR="$ROOT/.lagbook/dev"
mkdir -p "$STATE_DIR"
export LAGBOOK_DB_DIR="$STATE_DIR/mariadb"
export LAGBOOK_HOST=127.0.0.1
export LAGBOOK_PORT="${LAGBOOK_PORT:-4310}"
export LAGBOOK_PUBLIC_URL="${LAGBOOK_PUBLIC_URL:-http://127.0.0.1:$LAGBOOK_PORT}"
export LAGBOOK_DB_PORT="${LAGBOOK_DB_PORT:-4306}"
export LAGBOOK_DB_NAME="${LAGBOOK_DB_NAME:-lagbook}"
if [ "$CLUSTER" = 1 ]; then
  export LAGBOOK_CLUSTER_DIR="${LAGBOOK_CLUSTER_DIR:-$ROOT/.lagbook/cluster}"
  export LAGBOOK_CLUSTER_HTTP_PORT="$LAGBOOK_PORT"
  export LAGBOOK_CLUSTER_APP_PORTS="${LAGBOOK_CLUSTER_APP_PORTS:-4317 4318}"
  read -r -a APP_PORTS <<< "$LAGBOOK_CLUSTER_APP_PORTS"
  [ ${#APP_PORTS[@]} -ge 1 ] || die "LAGBOOK_CLUSTER_APP_PORTS is empty"
  for port in "${APP_PORTS[@]}"; do
    [[ "$port" =~ ^[0-9]+$ ]] || die "LAGBOOK_CLUSTER_APP_PORTS must be port numbers separated by spaces (got '$LAGBOOK_CLUSTER_APP_PORTS')"
  done
  # Writer and reader listeners (LAGBOOK_DB_HOST/PORT, LAGBOOK_DB_READ_HOST/PORT); over TCP, no socket.
  eval "$(docker-free-scripts/cluster.sh env)"
  unset LAGBOOK_DB_SOCKET
else
  # The server and the demo loader reach MariaDB through its Unix socket (same machine; see README "Configuration").
  export LAGBOOK_DB_SOCKET="$LAGBOOK_DB_DIR/mysqld.sock"
fi
export LAGBOOK_CLIENT_DIR="$ROOT/dist/client"
[ -f "$STATE_DIR/session-secret" ] || node -e "console.log(require('crypto').randomBytes(32).toString('base64url'))" > "$STATE_DIR/session-secret"
export LAGBOOK_SESSION_SECRET="$(cat "$STATE_DIR/session-secret")"
export OIDC_ISSUER="${OIDC_ISSUER:-http://127.0.0.1:4311}"
export OIDC_CLIENT_ID="${OIDC_CLIENT_ID:-lagbook-dev}"
export OIDC_CLIENT_SECRET="${OIDC_CLIENT_SECRET:-lagbook-dev-secret}"
export SMTP_PORT="${SMTP_PORT:-4325}"
export LAGBOOK_MAIL_HTTP_PORT="${LAGBOOK_MAIL_HTTP_PORT:-4326}"
export STRIPE_SECRET_KEY="${STRIPE_SECRET_KEY:-sk_test_lagbook_local_stand_in}"
export STRIPE_WEBHOOK_SECRET="${STRIPE_WEBHOOK_SECRET:-whsec_lagbook_local_stand_in}"
# The Stripe stand-in is a development tool; config refuses it when NODE_ENV=production,
# so the local run is marked as development while still serving the production build.
export NODE_ENV=development
export STRIPE_API_BASE="${STRIPE_API_BASE:-http://127.0.0.1:4312}"

APP_PID=""
APP_PIDS=()
DEV_SERVICES_PID=""
cleanup() {
  trap - INT TERM EXIT
  say "stopping…"
  [ -n "$APP_PID" ] && kill "$APP_PID" 2>/dev/null && wait "$APP_PID" 2>/dev/null || true
  for pid in ${APP_PIDS[@]+"${APP_PIDS[@]}"}; do kill "$pid" 2>/dev/null || true; done
  for pid in ${APP_PIDS[@]+"${APP_PIDS[@]}"}; do wait "$pid" 2>/dev/null || true; done
  [ -n "$DEV_SERVICES_PID" ] && kill "$DEV_SERVICES_PID" 2>/dev/null && wait "$DEV_SERVICES_PID" 2>/dev/null || true
  if [ "$CLUSTER" = 1 ]; then
    docker-free-scripts/cluster.sh stop >/dev/null || true
  else
    docker-free-scripts/mariadb.sh stop >/dev/null || true
  fi
  say "stopped."
}
trap cleanup INT TERM EXIT

if [ "$CLUSTER" = 1 ]; then
  docker-free-scripts/cluster.sh start
else
  docker-free-scripts/mariadb.sh start
fi
start_dev_services "$STATE_DIR/dev-services.log"
say "building the client and the server…"
npx vite build --logLevel error
npx tsc -p server/tsconfig.build.json
# The server's V8 flags live in package.json ("config.serverNodeFlags", see README "Configuration").
SERVER_NODE_FLAGS="$(node -p "require('./package.json').config.serverNodeFlags")"
if [ "$CLUSTER" = 1 ]; then
  # The first app server migrates; the others start once it answers.
  MIGRATE=--migrate
  for port in "${APP_PORTS[@]}"; do
    # shellcheck disable=SC2086 # the flags are words
    LAGBOOK_PORT="$port" docker-free-scripts/supervise.sh node $SERVER_NODE_FLAGS dist/server/main.js $MIGRATE &
    APP_PIDS+=($!)
    wait_for_http "http://127.0.0.1:$port/healthz" 60 "the Lagbook app server on port $port"
    MIGRATE=""
  done
  wait_for_http "$LAGBOOK_PUBLIC_URL/healthz" 30 "HAProxy's HTTP listener"
  say "app servers on ports ${APP_PORTS[*]} behind HAProxy; the cluster: docker-free-scripts/cluster.sh status"
else
  # shellcheck disable=SC2086 # the flags are words
  docker-free-scripts/supervise.sh node $SERVER_NODE_FLAGS dist/server/main.js --migrate &
  APP_PID=$!
  wait_for_http "$LAGBOOK_PUBLIC_URL/healthz" 30 "Lagbook"
fi
if [ "${LAGBOOK_SKIP_DEMO:-0}" != 1 ]; then
  say "loading the demo lab on first run (skip with LAGBOOK_SKIP_DEMO=1)…"
  node --import tsx server/cli/ops.ts seed-demo 2>/dev/null || die "could not load the demo lab"
fi
say "Lagbook is running at $LAGBOOK_PUBLIC_URL"
say "sign in with one of these dev accounts (local identity provider at $OIDC_ISSUER):"
node --import tsx docker-free-scripts/print-dev-accounts.ts
say "captured mail: http://127.0.0.1:$LAGBOOK_MAIL_HTTP_PORT/messages — press Ctrl-C to stop."
if [ "$CLUSTER" = 1 ]; then wait "${APP_PIDS[@]}"; else wait "$APP_PID"; fi
