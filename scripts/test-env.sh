#!/usr/bin/env bash
# npm run test:env — for working on one test file at a time: the test database (fresh), the
# mail sink and `next dev` on the test ports, left running until Ctrl-C. In another shell:
#   source scripts/test-env.vars && npx vitest run tests/integration/builds.test.ts
# `npm run test:env -- --prod` serves a production build (.next-test) instead, as `npm test`
# does: the access matrix reads server-action ids from that build's manifest.
set -uo pipefail
source "$(dirname "$0")/lib.sh"
cd "$FW_ROOT"
trap 'stop_all' EXIT
trap 'exit 130' INT TERM
ensure_node_modules
ensure_postgres
pg_start test 54339
pg_ensure_db 54339 fuelwright_test fresh
source scripts/test-env.vars
migrate_and_seed
start_mail_sink 2535 2536
start_payment_fake 12121 "http://127.0.0.1:3100/api/webhooks/payments"
rm -rf .data/s3-test
start_s3_fake 4579 .data/s3-test
port_busy 3100 && die "port 3100 is taken"
if [ "${1:-}" = "--prod" ]; then
  export NEXT_DIST_DIR=.next-test
  node node_modules/next/dist/bin/next build || die "build failed"
  NODE_ENV=production node node_modules/next/dist/bin/next start -H 127.0.0.1 -p 3100 &
else
  node node_modules/next/dist/bin/next dev -H 127.0.0.1 -p 3100 &
fi
FW_PIDS+=($!)
wait_http "http://127.0.0.1:3100/api/health" 120 || die "dev server did not come up"
say "test environment ready on http://localhost:3100 (Ctrl-C stops it)"
wait
