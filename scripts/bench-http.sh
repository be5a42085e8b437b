#!/usr/bin/env bash
# npm run bench:http — the production server on a bench database seeded with 100 000 builds,
# loaded with autocannon; prints a table (requests/s, p50, p99, errors) and the calc route's
# ratio to a bare node:http server doing the same sizing. No pass/fail: figures only.
# npm run soak — the same server under moderate load for SOAK_SECONDS (600), sampling its memory.
# BENCH_SECONDS (20) sets each case's length.
set -uo pipefail
source "$(dirname "$0")/lib.sh"
cd "$FW_ROOT"
trap 'stop_all' EXIT
trap 'exit 130' INT TERM
ensure_node_modules
ensure_postgres
pg_start bench 54397
pg_ensure_db 54397 fuelwright_bench
export DATABASE_URL="postgres://fuelwright@127.0.0.1:54397/fuelwright_bench"
ensure_secret BETTER_AUTH_SECRET bench-auth-secret
ensure_secret STRIPE_WEBHOOK_SECRET bench-payments-webhook-secret whsec_
export BENCH_ROUTES=on APP_URL="http://127.0.0.1:3300" AUTH_RATE_LIMIT=off SMTP_URL="smtp://127.0.0.1:2599" S3_ENDPOINT="http://127.0.0.1:4599"
migrate_and_seed
BENCH_SEED_ONLY=1 node node_modules/.bin/tsx tests/bench/builds.bench.ts || die "seeding the bench database failed"
export NEXT_DIST_DIR=.next-bench
if [ ! -f .next-bench/BUILD_ID ] || [ -n "$(find app components lib db proxy.ts next.config.ts -newer .next-bench/BUILD_ID -type f -print -quit)" ]; then
  say "building for the benchmark (.next-bench)…"
  node node_modules/next/dist/bin/next build >/dev/null || die "build failed"
fi
port_busy 3300 && die "port 3300 is taken"
NODE_ENV=production node node_modules/next/dist/bin/next start -H 127.0.0.1 -p 3300 > .data/bench-server.log 2>&1 &
FW_PIDS+=($!)
wait_http "http://127.0.0.1:3300/api/health" 60 || die "bench server did not come up (.data/bench-server.log)"
node node_modules/.bin/tsx tests/bench/http.bench.ts "$@"
