#!/usr/bin/env bash
# `npm test`: the same bootstrap as `npm start`, on a throw-away data folder and free ports,
# then every suite: unit and client tests, API tests (supertest against the real MariaDB),
# browser tests (playwright-core driving Debian's Chromium) and the cluster fault test (three
# Galera nodes behind HAProxy, started by the test itself). Cleans up after itself.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

require_node
apt_install_for mariadbd mariadb-server chromium chromium
install_reference_libraries
install_cluster_packages
install_node_modules

TEST_STATE_NAME=test-run
source "$ROOT/docker-free-scripts/test-env.sh"

say "type-checking…"
npx tsc -p tsconfig.json
npx tsc -p client/tsconfig.json
say "checking import boundaries…"
npm run --silent lint:boundaries
say "linting (ESLint)…"
npm run --silent lint
say "checking the format (Prettier)…"
npm run --silent format:check
say "building the client (the browser tests use the production build)…"
npx vite build --logLevel error

# Each group runs in its own Vitest process so that the database-backed groups never overlap.
FAILED=0
for project in unit client api e2e cluster; do
  say "test group: $project"
  npx vitest run --project "$project" --reporter=default --reporter=json --outputFile.json="$STATE_DIR/results-$project.json" || FAILED=1
done
# One closing line for every group together: "tests: N passed, N failed", preceded by the name and
# first message line of each failure, so that the end of a long log says what broke.
node -e '
  let passed = 0, failed = 0;
  const failures = [];
  for (const f of process.argv.slice(1)) {
    try {
      const r = require(f);
      passed += r.numPassedTests; failed += r.numFailedTests + (r.numRuntimeErrorTestSuites ?? 0);
      for (const file of r.testResults) {
        const where = file.name.replace(process.cwd() + "/", "");
        if (file.status === "failed" && file.assertionResults.every((t) => t.status !== "failed")) failures.push(`${where}: ${String(file.message).split("\n")[0]}`);
        for (const t of file.assertionResults) if (t.status === "failed") failures.push(`${where} › ${t.fullName}: ${String(t.failureMessages[0] ?? "").split("\n")[0]}`);
      }
    } catch { failed += 1; failures.push(`${f}: no readable results`); }
  }
  for (const line of failures) console.log(`FAILED ${line}`);
  console.log(`tests: ${passed} passed, ${failed} failed`);
' "$STATE_DIR"/results-*.json
[ "$FAILED" = 0 ] || die "some tests failed"
say "all test groups passed"
