#!/usr/bin/env bash
# scripts/pgctl.sh stop|start NAME PORT — stops or starts this checkout's private cluster NAME
# (used by the fault tests to take the database away under a running app).
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cmd="$1" name="$2" port="$3"
bin="$(pg_bindir)"; dir="$(pg_data_dir "$name")"
case "$cmd" in
  stop) pg_as_owner "$bin/pg_ctl" -D "$dir" -m fast -w stop >/dev/null ;;
  start) pg_as_owner "$bin/pg_ctl" -D "$dir" -l "$dir.log" -w -t 30 -o "-p $port -k $dir -c listen_addresses=127.0.0.1" start >/dev/null ;;
  *) die "usage: pgctl.sh stop|start NAME PORT" ;;
esac
