#!/usr/bin/env bash
# Runs chosen test files with the same services `npm test` starts (private MariaDB, identity
# provider, Stripe stand-in, mail capture) on throw-away data and free ports, without the
# type-check and client build. For iterating on one suite:
#
#   bash docker-free-scripts/test-files.sh api tests/api/ingest.api.test.ts
#   bash docker-free-scripts/test-files.sh e2e tests/e2e/channels.e2e.test.ts   # needs `npx vite build` first
#
# The first argument is the Vitest project (unit, client, api, e2e); the rest go to Vitest.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
[ $# -ge 1 ] || die "usage: test-files.sh <project> [vitest arguments…]"
PROJECT="$1"; shift

require_node
install_node_modules
TEST_STATE_NAME=test-files
source "$ROOT/docker-free-scripts/test-env.sh"
npx vitest run --project "$PROJECT" "$@"
