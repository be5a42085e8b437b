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
export BENCH_ROUTES=on
bench_database bench 54397
BENCH_SEED_ONLY=1 node node_modules/.bin/tsx tests/bench/builds.bench.ts || die "seeding the bench database failed"
bench_server
node node_modules/.bin/tsx tests/bench/http.bench.ts "$@"
