#!/usr/bin/env bash
# npm run db:restore -- FILE — replaces what DATABASE_URL holds with a backup made by db:backup
# (pg_restore --clean, in one transaction: a failed restore leaves the database as it was).
set -euo pipefail
source "$(dirname "$0")/lib.sh"
[ -n "${1:-}" ] || die "usage: npm run db:restore -- FILE"
[ -f "$1" ] || die "no backup file at $1"
[ -n "${DATABASE_URL:-}" ] || DATABASE_URL="postgres://fuelwright@127.0.0.1:54329/fuelwright"
bin="$(pg_bindir)"; restore="$bin/pg_restore"; [ -x "$restore" ] || restore=pg_restore
"$restore" --clean --if-exists --no-owner --no-privileges --single-transaction --exit-on-error --dbname="$DATABASE_URL" "$1" || die "pg_restore failed; the database is unchanged"
say "restored $1"
