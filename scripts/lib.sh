# Shared set-up for `npm start`, `npm test` and the benchmarks: installs what is missing, runs a private
# PostgreSQL cluster on loopback, and the local mail sink. Source it; do not run it.

FW_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
FW_PIDS=()
FW_PG_STARTED=()

say() { printf '\033[1mfuelwright:\033[0m %s\n' "$*"; }
die() { printf 'fuelwright: %s\n' "$*" >&2; exit 1; }
is_root() { [ "$(id -u)" = 0 ]; }

apt_install() {
  is_root || die "missing system packages ($*): install them with: sudo apt-get install -y $*"
  say "installing $* (apt)…"
  if [ -z "${FW_APT_UPDATED:-}" ]; then DEBIAN_FRONTEND=noninteractive apt-get update -qq >/dev/null || die "apt-get update failed"; FW_APT_UPDATED=1; fi
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null || die "apt-get install $* failed"
}

ensure_node_modules() {
  cd "$FW_ROOT"
  if [ ! -d node_modules ] || [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    say "installing npm packages (npm ci)…"
    npm ci --no-audit --no-fund --loglevel=error || die "npm ci failed"
  fi
}

pg_bindir() { ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1; }

ensure_postgres() {
  if [ -z "$(pg_bindir)" ] || [ ! -x "$(pg_bindir)/initdb" ]; then apt_install postgresql; fi
  [ -x "$(pg_bindir)/initdb" ] || die "PostgreSQL's initdb was not found after installing"
  command -v psql >/dev/null || apt_install postgresql-client
}

ensure_chromium() {
  command -v chromium >/dev/null || apt_install chromium
  command -v pdftotext >/dev/null || apt_install poppler-utils
}

# Runs a PostgreSQL command as the cluster's owner (postgres refuses to run as root).
pg_as_owner() {
  if is_root; then runuser -u postgres -- "$@"; else "$@"; fi
}

port_busy() { (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

# pg_data_dir NAME → where this checkout keeps cluster NAME.
pg_data_dir() {
  local name="$1" dir="$FW_ROOT/.data/pg-$name"
  if is_root; then
    mkdir -p "$FW_ROOT/.data"
    # The postgres user must reach the folder; a checkout under a private home cannot.
    if ! runuser -u postgres -- test -x "$FW_ROOT/.data" 2>/dev/null; then
      dir="/var/tmp/fuelwright-$(printf '%s' "$FW_ROOT" | md5sum | cut -c1-10)/pg-$name"
    fi
  fi
  printf '%s' "$dir"
}

# pg_start NAME PORT: starts (initialising if needed) a private cluster on 127.0.0.1:PORT.
pg_start() {
  local name="$1" port="$2" bin dir log
  bin="$(pg_bindir)"; dir="$(pg_data_dir "$name")"; log="$dir.log"
  mkdir -p "$dir"
  if is_root; then chown postgres:postgres "$dir" "$(dirname "$dir")" 2>/dev/null || true; chmod 700 "$dir"; fi
  if [ "$dir" != "$FW_ROOT/.data/pg-$name" ]; then say "cluster '$name' lives in $dir (the postgres user cannot enter this checkout)"; fi
  if [ ! -f "$dir/PG_VERSION" ]; then
    say "creating PostgreSQL cluster '$name'…"
    pg_as_owner "$bin/initdb" -D "$dir" -U fuelwright --auth=trust -E UTF8 --locale=C.UTF-8 >"$log" 2>&1 || die "PostgreSQL could not initialise $dir: $(tail -n 1 "$log")"
  fi
  if pg_as_owner "$bin/pg_ctl" -D "$dir" status >/dev/null 2>&1; then
    # Line 4 of postmaster.pid is the port it listens on: another port offset left it running.
    if [ "$(sed -n 4p "$dir/postmaster.pid" 2>/dev/null)" = "$port" ]; then
      say "PostgreSQL '$name' already running on port $port"
      return 0
    fi
    say "PostgreSQL '$name' runs on another port: restarting it on $port"
    pg_as_owner "$bin/pg_ctl" -D "$dir" -m fast -w stop >/dev/null 2>&1 || die "PostgreSQL '$name' could not be stopped"
  fi
  port_busy "$port" && die "PostgreSQL cannot start: port $port on 127.0.0.1 is taken by another program"
  touch "$log"; is_root && chown postgres:postgres "$log"
  if ! pg_as_owner "$bin/pg_ctl" -D "$dir" -l "$log" -w -t 30 -o "-p $port -k $dir -c listen_addresses=127.0.0.1" start >/dev/null 2>&1; then
    die "PostgreSQL cannot start: $(grep -E 'FATAL|PANIC|No space|could not' "$log" | tail -n 1 || tail -n 1 "$log")"
  fi
  FW_PG_STARTED+=("$dir")
  say "PostgreSQL '$name' on 127.0.0.1:$port"
}

pg_stop_all() {
  local bin dir; bin="$(pg_bindir)"
  for dir in "${FW_PG_STARTED[@]}"; do pg_as_owner "$bin/pg_ctl" -D "$dir" -m fast -w stop >/dev/null 2>&1 || true; done
  FW_PG_STARTED=()
}

# pg_ensure_db PORT NAME [fresh]
pg_ensure_db() {
  local port="$1" db="$2" fresh="${3:-}"
  local psql=(psql -h 127.0.0.1 -p "$port" -U fuelwright -d postgres -v ON_ERROR_STOP=1 -qtA)
  if [ -n "$fresh" ]; then "${psql[@]}" -c "drop database if exists $db with (force)" >/dev/null; fi
  if [ "$("${psql[@]}" -c "select 1 from pg_database where datname = '$db'")" != 1 ]; then
    "${psql[@]}" -c "create database $db" >/dev/null || die "could not create database $db"
  fi
}

# start_node_service LABEL PORT SCRIPT [VAR=VALUE…] — runs scripts/SCRIPT in the background with
# those variables and waits until PORT answers (each local stand-in below is one of these).
start_node_service() {
  local label="$1" port="$2" script="$3"; shift 3
  port_busy "$port" && die "$label cannot start: port $port is taken"
  env "$@" node "$FW_ROOT/scripts/$script" &
  FW_PIDS+=($!)
  for _ in $(seq 100); do port_busy "$port" && return 0; sleep 0.1; done
  die "$label did not start"
}

# start_mail_sink SMTP_PORT INBOX_PORT
start_mail_sink() {
  port_busy "$1" && die "mail sink cannot start: port $1 is taken"
  start_node_service "mail sink" "$2" mail-sink.mjs SMTP_PORT="$1" INBOX_PORT="$2"
}

# ensure_secret VAR FILE [PREFIX]: VAR as the environment gives it, else the random secret kept in
# .data/FILE (made once per checkout, readable by its owner only). Production refuses defaults.
ensure_secret() {
  local var="$1" file="$FW_ROOT/.data/$2" prefix="${3:-}"
  [ -n "${!var:-}" ] && return 0
  mkdir -p "$FW_ROOT/.data"
  if [ ! -s "$file" ]; then
    (umask 077 && node -e 'console.log(process.argv[1] + require("crypto").randomBytes(32).toString("hex"))' "$prefix" > "$file") || die "could not write $file"
  fi
  printf -v "$var" '%s' "$(cat "$file")"
  export "${var?}"
}

# start_payment_fake PORT WEBHOOK_URL — the local card-payment API (scripts/payment-fake.mjs); it
# signs its webhooks with $STRIPE_WEBHOOK_SECRET, which the app checks them with.
start_payment_fake() {
  [ -n "${STRIPE_WEBHOOK_SECRET:-}" ] || die "the payment fake needs STRIPE_WEBHOOK_SECRET (the app's webhook secret)"
  start_node_service "payment fake" "$1" payment-fake.mjs PAYMENTS_PORT="$1" PAYMENTS_WEBHOOK_URL="$2"
}

# start_s3_fake PORT DIR — the local S3-compatible store for uploads (scripts/s3-fake.mjs)
start_s3_fake() { mkdir -p "$2" && start_node_service "S3 fake" "$1" s3-fake.mjs S3_PORT="$1" S3_DIR="$2"; }

# wait_http URL SECONDS
wait_http() {
  local url="$1" t="${2:-60}"
  node -e '
    const [url, t] = process.argv.slice(1); const end = Date.now() + Number(t) * 1000;
    (async () => { while (Date.now() < end) { try { const r = await fetch(url); if (r.ok) process.exit(0); } catch {} await new Promise((r) => setTimeout(r, 250)); } process.exit(1); })();
  ' "$url" "$t"
}

stop_all() {
  local pid
  for pid in "${FW_PIDS[@]}"; do kill "$pid" 2>/dev/null || true; done
  for pid in "${FW_PIDS[@]}"; do wait "$pid" 2>/dev/null || true; done
  FW_PIDS=()
  pg_stop_all
}

migrate_and_seed() {
  "$FW_ROOT/node_modules/.bin/tsx" "$FW_ROOT/db/migrate.ts" || die "migrations failed"
  "$FW_ROOT/node_modules/.bin/tsx" "$FW_ROOT/db/seed.ts" || die "seeding failed"
}

# build_if_needed: next build when there is no build or a source file is newer than it.
build_if_needed() {
  cd "$FW_ROOT"
  if [ -f .next/BUILD_ID ] && [ -z "$(find app components lib db public types proxy.ts instrumentation.ts next.config.ts tailwind.config.ts postcss.config.mjs package-lock.json -newer .next/BUILD_ID -type f -print -quit 2>/dev/null)" ]; then
    return 0
  fi
  say "building the app (next build)…"
  node node_modules/next/dist/bin/next build || die "next build failed"
}

# bench_database NAME PORT — the benchmarks' own cluster NAME on 127.0.0.1:PORT with the database
# fuelwright_bench (DATABASE_URL), the app's secrets and stand-in addresses for a bench server on
# port 3300, migrated and seeded with the demo shop (npm run bench:http, bench:ui). With
# FW_PORT_OFFSET set, the cluster's port and the server's (3300) are moved by it, so
# two checkouts can bench at once.
bench_app_port() { printf '%s' "$((3300 + ${FW_PORT_OFFSET:-0}))"; }
bench_database() {
  local name="$1" port="$(($2 + ${FW_PORT_OFFSET:-0}))"
  pg_start "$name" "$port"
  pg_ensure_db "$port" fuelwright_bench
  export DATABASE_URL="postgres://fuelwright@127.0.0.1:$port/fuelwright_bench"
  ensure_secret BETTER_AUTH_SECRET bench-auth-secret
  ensure_secret STRIPE_WEBHOOK_SECRET bench-payments-webhook-secret whsec_
  export APP_URL="http://127.0.0.1:$(bench_app_port)" AUTH_RATE_LIMIT=off SMTP_URL="smtp://127.0.0.1:2599" S3_ENDPOINT="http://127.0.0.1:4599"
  migrate_and_seed
}

# bench_server — the production build in .next-bench (built again when a source is newer than it)
# started on 127.0.0.1:3300 + FW_PORT_OFFSET (log: .data/bench-server.log, stopped by stop_all); returns once it answers.
bench_server() {
  cd "$FW_ROOT"
  export NEXT_DIST_DIR=.next-bench
  if [ ! -f .next-bench/BUILD_ID ] || [ -n "$(find app components lib db proxy.ts next.config.ts -newer .next-bench/BUILD_ID -type f -print -quit)" ]; then
    say "building for the benchmark (.next-bench)…"
    node node_modules/next/dist/bin/next build >/dev/null || die "build failed"
  fi
  local port
  port="$(bench_app_port)"
  port_busy "$port" && die "port $port is taken"
  NODE_ENV=production node node_modules/next/dist/bin/next start -H 127.0.0.1 -p "$port" > .data/bench-server.log 2>&1 &
  FW_PIDS+=($!)
  export BENCH_BASE_URL="http://127.0.0.1:$port"
  wait_http "$BENCH_BASE_URL/api/health" 60 || die "bench server did not come up (.data/bench-server.log)"
}
