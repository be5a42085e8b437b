#!/usr/bin/env bash
# npm run test:env — for working on one test file at a time: the test database (fresh), the
# mail sink and `next dev` on the test ports, left running until Ctrl-C. In another shell:
#   source scripts/test-env.vars && npx vitest run tests/integration/builds.test.ts
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
node node_modules/next/dist/bin/next dev -H 127.0.0.1 -p 3100 &
FW_PIDS+=($!)
wait_http "http://127.0.0.1:3100/api/health" 120 || die "dev server did not come up"
say "test environment ready on http://localhost:3100 (Ctrl-C stops it)"
wait
