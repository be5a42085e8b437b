#!/usr/bin/env bash
# npm test: the same set-up on a fresh, separate test database, then every suite:
# lint, typecheck, vitest unit + integration, a production build, browser end-to-end tests,
# then the system suites (app instances, faults, backup) on their own.
# Ends with one line: "N passed, N failed".
set -uo pipefail
source "$(dirname "$0")/lib.sh"
cd "$FW_ROOT"
trap 'stop_all' EXIT
trap 'exit 130' INT TERM

TEST_PG_PORT=54339 TEST_APP_PORT=3100 TEST_SMTP_PORT=2535 TEST_INBOX_PORT=2536 TEST_PAYMENTS_PORT=12121
CHECK_PASSED=0 CHECK_FAILED=0
check() { # check NAME CMD…: a suite that passes or fails as a whole
  local name="$1"; shift
  say "── $name"
  if "$@"; then CHECK_PASSED=$((CHECK_PASSED + 1)); else CHECK_FAILED=$((CHECK_FAILED + 1)); say "$name FAILED"; fi
}

ensure_node_modules
ensure_postgres
ensure_chromium
pg_start test "$TEST_PG_PORT"
pg_ensure_db "$TEST_PG_PORT" fuelwright_test fresh
export DATABASE_URL="postgres://fuelwright@127.0.0.1:$TEST_PG_PORT/fuelwright_test"
migrate_and_seed
start_mail_sink "$TEST_SMTP_PORT" "$TEST_INBOX_PORT"
source scripts/test-env.vars
start_payment_fake "$TEST_PAYMENTS_PORT" "http://127.0.0.1:$TEST_APP_PORT/api/webhooks/payments"
rm -rf .data/s3-test
start_s3_fake 4579 .data/s3-test
mkdir -p test-results
rm -f test-results/vitest.json test-results/vitest-system.json

check "format (prettier)" node node_modules/prettier/bin/prettier.cjs --check . --log-level=warn
check "lint (eslint)" node node_modules/eslint/bin/eslint.js . --max-warnings=0
check "typecheck (tsc)" node node_modules/typescript/bin/tsc --noEmit

# The production build goes to its own folder, so a running `npm start` keeps its build.
export NEXT_DIST_DIR=.next-test
check "production build" node node_modules/next/dist/bin/next build
APP_UP=0
if [ -f .next-test/BUILD_ID ]; then
  port_busy "$TEST_APP_PORT" && die "test server cannot start: port $TEST_APP_PORT is taken"
  NODE_ENV=production node node_modules/next/dist/bin/next start -H 127.0.0.1 -p "$TEST_APP_PORT" > test-results/server.log 2>&1 &
  FW_PIDS+=($!)
  wait_http "http://127.0.0.1:$TEST_APP_PORT/api/health" 60 && APP_UP=1 || say "test server did not come up (see test-results/server.log)"
fi

say "── vitest: unit, integration, end-to-end"
PROJECTS=(--project unit)
[ "$APP_UP" = 1 ] && PROJECTS+=(--project integration --project e2e)
node node_modules/vitest/vitest.mjs run "${PROJECTS[@]}" --reporter=default --reporter=json --outputFile=test-results/vitest.json
VITEST_RC=$?
[ "$APP_UP" = 1 ] || CHECK_FAILED=$((CHECK_FAILED + 1))

# System suites last and alone: they start and kill their own app instances and stop the
# database cluster under them.
SYSTEM_RC=1
if [ -f .next-test/BUILD_ID ]; then
  say "── vitest: system (instances, faults, backup)"
  node node_modules/vitest/vitest.mjs run --project system --reporter=default --reporter=json --outputFile=test-results/vitest-system.json
  SYSTEM_RC=$?
fi

totals() { # totals FILE → "passed failed"
  node -e '
    try { const r = require(process.argv[1]); console.log(r.numPassedTests, r.numFailedTests + (r.numRuntimeErrorTestSuites ?? 0) + r.testResults.filter((t) => t.status === "failed" && t.assertionResults.length === 0).length); }
    catch { console.log("0 1"); }' "$1"
}
read -r V_PASSED V_FAILED < <(totals ./test-results/vitest.json)
[ "$VITEST_RC" != 0 ] && [ "$V_FAILED" = 0 ] && V_FAILED=1
read -r S_PASSED S_FAILED < <(totals ./test-results/vitest-system.json)
[ "$SYSTEM_RC" != 0 ] && [ "$S_FAILED" = 0 ] && S_FAILED=1
V_PASSED=$((V_PASSED + S_PASSED)); V_FAILED=$((V_FAILED + S_FAILED))

PASSED=$((V_PASSED + CHECK_PASSED)); FAILED=$((V_FAILED + CHECK_FAILED))
echo
echo "tests: $V_PASSED passed, $V_FAILED failed; checks (format, lint, typecheck, build): $CHECK_PASSED passed, $CHECK_FAILED failed"
echo "$PASSED passed, $FAILED failed"
[ "$FAILED" = 0 ]
