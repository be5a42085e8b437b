#!/usr/bin/env bash
# npm run test:env — for working on one test file at a time: the test database (fresh), the
# mail sink and `next dev` on the test ports, left running until Ctrl-C. In another shell:
#   source scripts/test-env.vars && npx vitest run tests/integration/builds.test.ts
# FW_PORT_OFFSET=N moves every port by N (one test env per checkout).
# `npm run test:env -- --prod` serves a production build (.next-test) instead, as `npm test`
# does: the access matrix reads server-action ids from that build's manifest.
set -uo pipefail
source "$(dirname "$0")/lib.sh"
cd "$FW_ROOT"
trap 'stop_all' EXIT
trap 'exit 130' INT TERM
ensure_node_modules
ensure_postgres
source scripts/test-env.vars
pg_start test "$FW_TEST_PG_PORT"
pg_ensure_db "$FW_TEST_PG_PORT" fuelwright_test fresh
migrate_and_seed
start_mail_sink "$FW_TEST_SMTP_PORT" "$FW_TEST_INBOX_PORT"
start_payment_fake "$FW_TEST_PAYMENTS_PORT" "http://127.0.0.1:$FW_TEST_APP_PORT/api/webhooks/payments"
rm -rf .data/s3-test
start_s3_fake "$FW_TEST_S3_PORT" .data/s3-test
port_busy "$FW_TEST_APP_PORT" && die "port $FW_TEST_APP_PORT is taken"
if [ "${1:-}" = "--prod" ]; then
  export NEXT_DIST_DIR=.next-test
  node node_modules/next/dist/bin/next build || die "build failed"
  NODE_ENV=production node node_modules/next/dist/bin/next start -H 127.0.0.1 -p "$FW_TEST_APP_PORT" &
else
  node node_modules/next/dist/bin/next dev -H 127.0.0.1 -p "$FW_TEST_APP_PORT" &
fi
FW_PIDS+=($!)
wait_http "http://127.0.0.1:$FW_TEST_APP_PORT/api/health" 120 || die "dev server did not come up"
say "test environment ready on http://localhost:$FW_TEST_APP_PORT (Ctrl-C stops it)"
wait
