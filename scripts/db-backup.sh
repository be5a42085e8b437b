#!/usr/bin/env bash
# npm run db:backup [-- FILE] — a consistent snapshot of DATABASE_URL (pg_dump, custom format).
# Without FILE it goes to .data/backups/fuelwright-<UTC time>.dump. Prints the file's path.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
[ -n "${DATABASE_URL:-}" ] || DATABASE_URL="postgres://fuelwright@127.0.0.1:54329/fuelwright"
out="${1:-$FW_ROOT/.data/backups/fuelwright-$(date -u +%Y%m%dT%H%M%SZ).dump}"
mkdir -p "$(dirname "$out")"
bin="$(pg_bindir)"; dump="$bin/pg_dump"; [ -x "$dump" ] || dump=pg_dump
"$dump" --format=custom --no-owner --no-privileges --file="$out" "$DATABASE_URL" || die "pg_dump failed"
echo "$out"
