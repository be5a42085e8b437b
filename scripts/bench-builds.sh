#!/usr/bin/env bash
# npm run bench:builds — 100 000 builds over 10 000 customers in a private bench database, then
# p50/p95 of the queries behind GET /api/v1/builds?q=… and of opening a build. Prints a table.
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
migrate_and_seed
node node_modules/.bin/tsx tests/bench/builds.bench.ts
