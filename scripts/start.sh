#!/usr/bin/env bash
# npm start: install what is missing, start PostgreSQL (durable), the SMTP sink and the payments fake,
# migrate, seed the demo once, build, and serve on http://127.0.0.1:3000.
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/services.sh"
cd "$ROOT"

ensure_node_modules
ensure_postgres

# OHM_STATE_DIR, OHM_APP_PORT and OHM_START_PREBUILT exist for the clean-stop test (a throwaway folder,
# free ports, the test build); npm start leaves them unset.
STATE="${OHM_STATE_DIR:-$ROOT/.data}"
APP_PORT_OHM="${OHM_APP_PORT:-3000}"
mkdir -p "$STATE"
[ -s "$STATE/secret" ] || node -e 'console.log(require("crypto").randomBytes(32).toString("hex"))' >"$STATE/secret"

export PGPORT_OHM="${OHM_PG_PORT:-54329}"
PGDATA_OHM="$(pg_data_dir "$STATE/pg" "/var/tmp/ohmstead-$(echo "$ROOT" | md5sum | cut -c1-8)/pg")"
export DATABASE_URL="postgres://postgres@127.0.0.1:$PGPORT_OHM/ohmstead"
export NEXTAUTH_SECRET="$(cat "$STATE/secret")"
export NEXTAUTH_URL="http://127.0.0.1:$APP_PORT_OHM" APP_BASE_URL="http://127.0.0.1:$APP_PORT_OHM"
export SMTP_HOST=127.0.0.1 SMTP_PORT="${SMTP_PORT:-2525}" SMTP_SINK_HTTP_PORT="${SMTP_SINK_HTTP_PORT:-2580}"
export MAILBOX_URL="http://127.0.0.1:$SMTP_SINK_HTTP_PORT"
export PAYMENTS_API_HOST=127.0.0.1 PAYMENTS_API_PORT="${PAYMENTS_API_PORT:-12111}" PAYMENTS_API_PROTOCOL=http
export STRIPE_SECRET_KEY="sk_test_ohmstead_local" STRIPE_WEBHOOK_SECRET="whsec_ohmstead_local_dev_secret"
export NEXT_TELEMETRY_DISABLED=1
# The build npm start serves holds no test, bench or dev doors (next.config.mjs). OHM_DEMO_MAILBOX=1 asks
# for a demo build (in .next-demo) that also holds the dev mailbox page, answering on this machine only.
unset OHM_BUILD_DOORS OHM_TEST_HOOKS OHM_BENCH
DIST=.next
if [ "${OHM_DEMO_MAILBOX:-0}" = 1 ]; then
  export OHM_BUILD_DOORS=dev OHM_DEV_MAILBOX=1 OHM_DIST_DIR=.next-demo
  DIST=.next-demo
fi

# Ctrl-C (SIGINT to the whole group) or SIGTERM (to this script alone, as `kill` or a service manager
# sends it) ends every process started here, PostgreSQL included: its server detaches from the terminal,
# so it stops only when asked. The cleanup must run to its end whatever fails inside it (no `set -e`),
# and a second Ctrl-C must not cut it short.
APP_PID=""
cleanup() {
  trap '' INT TERM
  set +e
  log "stopping services"
  kill_tree "$STEP_PID"
  kill_tree "$APP_PID"
  stop_fakes "$STATE/run"
  pg_stop "$PGDATA_OHM"
  log "stopped"
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

log "PostgreSQL (data in $PGDATA_OHM, port $PGPORT_OHM)"
pg_start "$PGDATA_OHM" "$PGPORT_OHM" durable
pg_create_db "$PGPORT_OHM" ohmstead

log "SMTP sink and payments fake"
stop_fakes "$STATE/run"
start_fakes "$STATE/run"

log "migrating"
run_step node node_modules/tsx/dist/cli.mjs scripts/migrate.ts
log "seeding the demo (only into an empty database)"
run_step node node_modules/tsx/dist/cli.mjs scripts/seed.ts

# Build when the sources changed since the last build (never when serving a build made elsewhere).
if [ -n "${OHM_START_PREBUILT:-}" ]; then
  DIST="$OHM_START_PREBUILT"
  export OHM_DIST_DIR="$DIST"
else
  stamp="$STATE/build$DIST.stamp"
  src_hash="$(git ls-files -s 2>/dev/null | md5sum | cut -c1-32)$(git diff 2>/dev/null | md5sum | cut -c1-32)"
  if [ ! -f "$DIST/BUILD_ID" ] || [ "$(cat "$stamp" 2>/dev/null)" != "$src_hash" ]; then
    log "building (next build)"
    run_step node node_modules/next/dist/bin/next build
    echo "$src_hash" >"$stamp"
  fi
fi

node node_modules/next/dist/bin/next start -p "$APP_PORT_OHM" -H 127.0.0.1 &
APP_PID=$!
wait_http "http://127.0.0.1:$APP_PORT_OHM/signin" 120
cat <<MSG

  Ohmstead is serving on http://127.0.0.1:$APP_PORT_OHM
  Dev mailbox (every e-mail it sends: sign-in links, receipts, reminders): $MAILBOX_URL/
  (served by the local SMTP sink on this machine only; nothing leaves it)

$(node node_modules/tsx/dist/cli.mjs scripts/demo-logins.ts)

  Stop with Ctrl-C (data stays in $PGDATA_OHM).
MSG
wait "$APP_PID"
