#!/usr/bin/env bash
# npm test: the whole suite on its own throwaway services. Lint, type check, unit, integration
# (real PostgreSQL, real HTTP to a production build) and browser tests (Debian Chromium).
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/services.sh"
cd "$ROOT"

ensure_node_modules
ensure_postgres
ensure_chromium
ensure_tls_front

RUN="$(mktemp -d /var/tmp/ohm-test.XXXXXX)"
chmod 755 "$RUN"
PG_PORT="$(free_port)"
export SMTP_PORT="$(free_port)" SMTP_SINK_HTTP_PORT="$(free_port)" PAYMENTS_API_PORT="$(free_port)" APP_PORT="$(free_port)"
export DATABASE_URL="postgres://postgres@127.0.0.1:$PG_PORT/ohmstead_test"
export NEXTAUTH_SECRET="test-secret-$(node -e 'console.log(require("crypto").randomBytes(16).toString("hex"))')"
export APP_BASE_URL="http://127.0.0.1:$APP_PORT" NEXTAUTH_URL="http://127.0.0.1:$APP_PORT"
export TEST_BASE_URL="$APP_BASE_URL"
export SMTP_HOST=127.0.0.1 MAILBOX_URL="http://127.0.0.1:$SMTP_SINK_HTTP_PORT" OHM_DEV_MAILBOX=1
export PAYMENTS_API_HOST=127.0.0.1 PAYMENTS_API_PROTOCOL=http
export STRIPE_SECRET_KEY="sk_test_ohmstead_tests" STRIPE_WEBHOOK_SECRET="whsec_ohmstead_tests_secret"
# The test build holds the test hooks and the dev mailbox (next.config.mjs); the one npm start serves does not.
export OHM_TEST_HOOKS=1 OHM_DIST_DIR=.next-test OHM_BUILD_DOORS=test,dev NEXT_TELEMETRY_DISABLED=1
export OHM_TEST_PG_DATA="$RUN/pg" OHM_TEST_PG_PORT="$PG_PORT" OHM_TEST_RUN_DIR="$RUN"

APP_PID=""
cleanup() {
  [ -n "$APP_PID" ] && kill "$APP_PID" 2>/dev/null
  stop_fakes "$RUN"
  pg_stop "$RUN/pg"
  rm -rf "$RUN"
}
trap cleanup EXIT

status=0
step() { log "$1"; shift; "$@" || { log "FAILED: $*"; status=1; }; }
# A check that needs no services runs beside the next steps (two cores: lint beside PostgreSQL, the seed and
# the build; the type check beside vitest); `finish` waits for it and prints its output then.
BACKGROUND=()
behind() { local name="$1"; shift; log "$name (alongside)"; ("$@" >"$RUN/$name.out" 2>&1) & BACKGROUND+=("$!:$name"); }
finish() {
  local job pid name
  for job in "${BACKGROUND[@]}"; do
    pid="${job%%:*}"; name="${job#*:}"
    if wait "$pid"; then log "$name: passed"; else cat "$RUN/$name.out" >&2; log "FAILED: $name"; status=1; fi
  done
}

# `npm test -- <vitest filters>` runs only those test files (no lint or type check): for working on one
# piece. Plain `npm test` (and CI) runs everything.
FILTERS=("$@")
[ ${#FILTERS[@]} -eq 0 ] && behind "lint" node node_modules/eslint/bin/eslint.js . --max-warnings=0

log "throwaway PostgreSQL on port $PG_PORT"
pg_start "$RUN/pg" "$PG_PORT" throwaway
pg_create_db "$PG_PORT" ohmstead_test
start_fakes "$RUN"
node node_modules/tsx/dist/cli.mjs scripts/migrate.ts >/dev/null
node node_modules/tsx/dist/cli.mjs scripts/seed.ts

log "building the app for the tests"
node node_modules/next/dist/bin/next build >"$RUN/build.log" 2>&1 || { tail -60 "$RUN/build.log"; exit 1; }
# After the build, so the route types Next generates in .next-test are fresh.
[ ${#FILTERS[@]} -eq 0 ] && behind "type-check" node node_modules/typescript/bin/tsc --noEmit
node node_modules/next/dist/bin/next start -p "$APP_PORT" -H 127.0.0.1 >"$RUN/app.log" 2>&1 &
APP_PID=$!
wait_http "$APP_BASE_URL/signin" 120 || { tail -50 "$RUN/app.log"; exit 1; }

log "vitest: unit, integration, e2e"
node node_modules/vitest/vitest.mjs run --reporter=default --reporter=json --outputFile="$RUN/vitest.json" "${FILTERS[@]}" || status=1
node -e '
  const r = require(process.argv[1]);
  console.log(`vitest: ${r.numPassedTests} passed, ${r.numFailedTests} failed`);
  if (r.numTotalTests === 0) process.exit(1);
' "$RUN/vitest.json" || status=1
finish
if [ "$status" != 0 ]; then
  log "app log tail:"; tail -40 "$RUN/app.log" >&2
fi
exit "$status"
