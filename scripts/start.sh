#!/usr/bin/env bash
# npm start: install what is missing, start PostgreSQL, the mail sink and the payment fake, migrate, seed, serve.
set -euo pipefail
source "$(dirname "$0")/lib.sh"
cd "$FW_ROOT"
MODE=start; [ "${1:-}" = "--dev" ] && MODE=dev
PORT="${PORT:-3000}"
trap 'stop_all' EXIT
trap 'say "stopping…"; exit 0' INT TERM

ensure_node_modules
if [ -z "${DATABASE_URL:-}" ]; then
  ensure_postgres
  pg_start main 54329
  pg_ensure_db 54329 fuelwright
  export DATABASE_URL="postgres://fuelwright@127.0.0.1:54329/fuelwright"
else
  say "using DATABASE_URL from the environment (no local PostgreSQL started)"
fi
migrate_and_seed
if [ -z "${SMTP_URL:-}" ]; then
  start_mail_sink 2525 2526
  export SMTP_URL="smtp://127.0.0.1:2525"
else
  say "using SMTP_URL from the environment (no mail sink started)"
fi
# Secrets of this install, made once into .data/ (production refuses defaults and placeholders).
ensure_secret BETTER_AUTH_SECRET auth-secret
if [ -z "${STRIPE_SECRET_KEY:-}" ] && [ -z "${PAYMENTS_API_URL:-}" ]; then
  ensure_secret STRIPE_WEBHOOK_SECRET payments-webhook-secret whsec_
  start_payment_fake 12111 "http://127.0.0.1:$PORT/api/webhooks/payments"
  export PAYMENTS_API_URL="http://127.0.0.1:12111"
else
  [ -n "${STRIPE_WEBHOOK_SECRET:-}" ] || die "set STRIPE_WEBHOOK_SECRET to the signing secret of the payment service's webhook endpoint"
  say "using the payment service from the environment (no payment fake started)"
fi
if [ -z "${S3_ENDPOINT:-}" ]; then
  start_s3_fake 4569 .data/s3
  export S3_ENDPOINT="http://127.0.0.1:4569"
else
  say "using S3_ENDPOINT from the environment (no S3 fake started)"
fi
export APP_URL="${APP_URL:-http://localhost:$PORT}"
port_busy "$PORT" && die "the app cannot start: port $PORT is taken"

if [ "$MODE" = dev ]; then
  node node_modules/next/dist/bin/next dev -H 127.0.0.1 -p "$PORT" &
else
  build_if_needed
  NODE_ENV=production node node_modules/next/dist/bin/next start -H 127.0.0.1 -p "$PORT" &
fi
FW_PIDS+=($!)
wait_http "http://127.0.0.1:$PORT/api/health" 120 || die "the app did not come up"
cat <<TXT

  Fuelwright is running at $APP_URL
  Mail sink inbox: http://127.0.0.1:2526/messages
  Payments: local test checkout on http://127.0.0.1:12111 (no card is ever charged)

  Demo sign-ins (password: fuelwright-demo — demo data only, never in production):
    owner@demo.fuelwright.test     tuner@demo.fuelwright.test
    counter@demo.fuelwright.test   customer@demo.fuelwright.test

  Ctrl-C stops the app, the mail sink, the payment fake and the database.
TXT
wait "${FW_PIDS[-1]}"
