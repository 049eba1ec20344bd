#!/usr/bin/env bash
# `npm start`: installs what is missing, starts MariaDB and the local stand-ins, migrates,
# builds the client and the server, and serves Lagbook on 127.0.0.1. Ctrl-C stops everything.
# The server runs under supervise.sh: if it dies it is started again (pauses of 1 s, 2 s, 4 s … at
# most 30 s, reset after a minute's run; the log says why it stopped) while MariaDB and the
# stand-ins keep running and nothing is rebuilt.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

require_node
apt_install_for mariadbd mariadb-server
install_node_modules

export NODE_ENV=production
export STATE_DIR="$ROOT/.lagbook/dev"
mkdir -p "$STATE_DIR"
export LAGBOOK_DB_DIR="$STATE_DIR/mariadb"
export LAGBOOK_HOST=127.0.0.1
export LAGBOOK_PORT="${LAGBOOK_PORT:-4310}"
export LAGBOOK_PUBLIC_URL="${LAGBOOK_PUBLIC_URL:-http://127.0.0.1:$LAGBOOK_PORT}"
export LAGBOOK_DB_PORT="${LAGBOOK_DB_PORT:-4306}"
export LAGBOOK_DB_NAME="${LAGBOOK_DB_NAME:-lagbook}"
# The server and the demo loader reach MariaDB through its Unix socket (same machine; see README "Configuration").
export LAGBOOK_DB_SOCKET="$LAGBOOK_DB_DIR/mysqld.sock"
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
DEV_SERVICES_PID=""
cleanup() {
  trap - INT TERM EXIT
  say "stopping…"
  [ -n "$APP_PID" ] && kill "$APP_PID" 2>/dev/null && wait "$APP_PID" 2>/dev/null || true
  [ -n "$DEV_SERVICES_PID" ] && kill "$DEV_SERVICES_PID" 2>/dev/null && wait "$DEV_SERVICES_PID" 2>/dev/null || true
  docker-free-scripts/mariadb.sh stop >/dev/null || true
  say "stopped."
}
trap cleanup INT TERM EXIT

docker-free-scripts/mariadb.sh start
start_dev_services "$STATE_DIR/dev-services.log"
say "building the client and the server…"
npx vite build --logLevel error
npx tsc -p server/tsconfig.build.json
# The server's V8 flags live in package.json ("config.serverNodeFlags", see README "Configuration").
SERVER_NODE_FLAGS="$(node -p "require('./package.json').config.serverNodeFlags")"
# shellcheck disable=SC2086 # the flags are words
docker-free-scripts/supervise.sh node $SERVER_NODE_FLAGS dist/server/main.js --migrate &
APP_PID=$!
wait_for_http "$LAGBOOK_PUBLIC_URL/healthz" 30 "Lagbook"
if [ "${LAGBOOK_SKIP_DEMO:-0}" != 1 ]; then
  say "loading the demo lab on first run (skip with LAGBOOK_SKIP_DEMO=1)…"
  node --import tsx server/cli/ops.ts seed-demo 2>/dev/null || die "could not load the demo lab"
fi
say "Lagbook is running at $LAGBOOK_PUBLIC_URL"
say "sign in with one of these dev accounts (local identity provider at $OIDC_ISSUER):"
node --import tsx docker-free-scripts/print-dev-accounts.ts
say "captured mail: http://127.0.0.1:$LAGBOOK_MAIL_HTTP_PORT/messages — press Ctrl-C to stop."
wait "$APP_PID"
