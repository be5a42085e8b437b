#!/usr/bin/env bash
# npm run bench:ui — the production server on the bench database (demo shop), and Chromium
# typing into the build sheet (tests/bench/ui.bench.ts): p50/p95 from a keystroke to the key
# figures shown and to the charts settled. No pass/fail: figures only.
set -uo pipefail
source "$(dirname "$0")/lib.sh"
cd "$FW_ROOT"
trap 'stop_all' EXIT
trap 'exit 130' INT TERM
ensure_node_modules
ensure_postgres
ensure_chromium
bench_database bench-ui 54398
bench_server
node node_modules/.bin/tsx tests/bench/ui.bench.ts "$@"
