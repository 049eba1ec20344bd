# The services and environment every test group runs in, sourced by test.sh and test-files.sh
# after lib.sh: a throw-away state folder (.lagbook/<TEST_STATE_NAME>-<pid>), free ports for each
# service, the test database, the OIDC client, the Stripe key; then MariaDB and the stand-ins are
# started, and stopped (the folder removed) when the script exits.
export STATE_DIR="$ROOT/.lagbook/${TEST_STATE_NAME:-test-run}-$$"
rm -rf "$STATE_DIR"; mkdir -p "$STATE_DIR"
mapfile -t PORTS < <(node docker-free-scripts/free-ports.mjs 6)
export NODE_ENV=test
export LAGBOOK_DB_DIR="$STATE_DIR/mariadb"
export LAGBOOK_DB_PORT="${PORTS[0]}"
export LAGBOOK_DB_NAME=lagbook_test
export LAGBOOK_HOST=127.0.0.1
export LAGBOOK_PORT="${PORTS[1]}"
export LAGBOOK_PUBLIC_URL="http://127.0.0.1:$LAGBOOK_PORT"
export LAGBOOK_SESSION_SECRET="test-secret-$(node -e "console.log(require('crypto').randomBytes(24).toString('hex'))")"
export OIDC_ISSUER="http://127.0.0.1:${PORTS[2]}"
export OIDC_CLIENT_ID=lagbook-test
export OIDC_CLIENT_SECRET="test-client-secret"
export STRIPE_API_BASE="http://127.0.0.1:${PORTS[3]}"
export STRIPE_SECRET_KEY=sk_test_lagbook_tests
export STRIPE_WEBHOOK_SECRET=whsec_lagbook_tests
export SMTP_PORT="${PORTS[4]}"
export LAGBOOK_MAIL_HTTP_PORT="${PORTS[5]}"
export LAGBOOK_MAIL_CAPTURE_URL="http://127.0.0.1:$LAGBOOK_MAIL_HTTP_PORT"
export LAGBOOK_CLIENT_DIR="$ROOT/dist/client"
export LAGBOOK_ARTIFACTS_DIR="$ROOT/test-results"
export CHROMIUM_PATH="$(command -v chromium || true)"

DEV_SERVICES_PID=""
cleanup() {
  local status=$?
  trap - INT TERM EXIT
  [ -n "$DEV_SERVICES_PID" ] && kill "$DEV_SERVICES_PID" 2>/dev/null && wait "$DEV_SERVICES_PID" 2>/dev/null || true
  docker-free-scripts/mariadb.sh stop >/dev/null 2>&1 || true
  rm -rf "$STATE_DIR"
  exit $status
}
trap cleanup INT TERM EXIT

docker-free-scripts/mariadb.sh start >/dev/null
start_dev_services "$STATE_DIR/dev-services.log"
