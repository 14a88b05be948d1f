#!/usr/bin/env bash
# npm run bench: the speed figures against the targets in README.md (Performance), on throwaway services like npm test's —
# a private PostgreSQL, the SMTP sink and the payments fake, a production build (in .next-bench, rebuilt
# only when the sources changed) started with OHM_BENCH=1 so its framework-floor routes answer, and the
# raw floor (bench/raw-floor.ts). bench/data.ts builds a 10,000-part shelf; bench/run.ts measures every
# case beside its baselines, runs bench/suggest.ts and bench/labels.ts, prints the figures and writes them
# to bench/out/latest.md. About 5–8 minutes on 2 cores (most of it the build, when one is needed).
#
# `npm run bench -- --large` (or OHM_BENCH_LARGE=1) measures the target table once on the bench shelf, then
# adds the large shape beside it (bench/large.ts: 50 spaces × 10,000 parts, 1,000,000 past loans) and
# measures again, printing each ratio beside its one-space value (target: within 10 %). Three rounds per
# pass and no browser or script rows: about 9 minutes in all.
#
# `npm run bench -- --phone` measures only the browser-side rows: the scan page's first-load JavaScript and a
# label's URL on a phone profile (bench/phone-profile.ts: Chromium at 390 px, 4× CPU, 150 ms / 1.6 Mb/s),
# about 2 minutes after the build; its figures go to bench/out/latest-phone.md. The full run includes both.
#
# `npm run bench -- --profile` runs only bench/profile.ts: the build again under `node --cpu-prof`, loaded with
# the lookup and then the borrow, its samples charged through the source maps to the files they were written
# in; the summary goes to bench/out/profile.md, the .cpuprofile files beside it.
#
# The cluster runs without fsync, as the test cluster does (throwaway data); OHM_BENCH_DURABLE=1 runs it
# with PostgreSQL's durable defaults instead, as `npm start` does.
source "$(dirname "$0")/lib.sh"
source "$(dirname "$0")/services.sh"
cd "$ROOT"

ensure_node_modules
ensure_postgres

RUN="$(mktemp -d /var/tmp/ohm-bench.XXXXXX)"
chmod 755 "$RUN"
PG_PORT="$(free_port)"
RAW_PORT="$(free_port)"
throwaway_app_env "$PG_PORT" ohmstead_bench
export OHM_DIST_DIR=.next-bench OHM_BENCH=1 OHM_BUILD_DOORS=bench

APP_PID="" RAW_PID=""
cleanup() {
  [ -n "$APP_PID" ] && kill "$APP_PID" 2>/dev/null
  [ -n "$RAW_PID" ] && kill "$RAW_PID" 2>/dev/null
  stop_fakes "$RUN"
  pg_stop "$RUN/pg"
  rm -rf "$RUN"
}
trap cleanup EXIT
trap 'exit 130' INT TERM

mode=throwaway
[ "${OHM_BENCH_DURABLE:-0}" = 1 ] && mode=durable
log "PostgreSQL ($mode) on port $PG_PORT"
pg_start "$RUN/pg" "$PG_PORT" "$mode"
pg_create_db "$PG_PORT" ohmstead_bench
start_fakes "$RUN"
node node_modules/tsx/dist/cli.mjs scripts/migrate.ts >/dev/null
# The invented demo first (it is added only to an empty database): the phone profile opens its kit boxes' labels.
node node_modules/tsx/dist/cli.mjs bench/phone-profile.ts --seed
log "the bench shelf"
node node_modules/tsx/dist/cli.mjs bench/data.ts "$RUN/fixture.json"

build_app_if_changed .next-bench "$RUN/build.log"
start_app "$APP_PORT" "$RUN/app.log"
node --import tsx bench/raw-floor.ts "$RAW_PORT" >"$RUN/raw-floor.log" 2>&1 &
RAW_PID=$!
wait_http "$APP_BASE_URL/signin" 120 || { tail -50 "$RUN/app.log"; exit 1; }
wait_http "http://127.0.0.1:$RAW_PORT/health" 60 || { cat "$RUN/raw-floor.log"; exit 1; }

large="${OHM_BENCH_LARGE:-0}"
for a in "$@"; do
  [ "$a" = --large ] && large=1
  [ "$a" = --phone ] && export BENCH_ONLY=phone
  [ "$a" = --profile ] && profile=1
done
if [ "${profile:-0}" = 1 ]; then
  log "profiling the way in (about 1 minute)"
  BENCH_FIXTURE="$RUN/fixture.json" BENCH_DIST_DIR=.next-bench node node_modules/tsx/dist/cli.mjs bench/profile.ts
  exit $?
fi
status=0
export BENCH_APP_URL="$APP_BASE_URL" BENCH_RAW_URL="http://127.0.0.1:$RAW_PORT" BENCH_FIXTURE="$RUN/fixture.json" BENCH_DIST_DIR=.next-bench
if [ "$large" = 1 ]; then
  # Both passes measure only the target table, three rounds each unless BENCH_ROUNDS says otherwise, so the
  # whole --large run stays under 10 minutes here; the browser and script rows belong to the plain run.
  export BENCH_ROUNDS="${BENCH_ROUNDS:-3}" BENCH_SKIP_SCRIPTS=1
  log "measuring on the bench shelf ($BENCH_ROUNDS rounds, about $((BENCH_ROUNDS * 65 / 60 + 1)) minutes)"
else
  log "measuring (about 7 minutes)"
fi
BENCH_RATIOS_OUT="$RUN/ratios.json" node node_modules/tsx/dist/cli.mjs bench/run.ts || status=1
if [ "$large" = 1 ] && [ "$status" = 0 ]; then
  log "the large shape beside the bench shelf"
  node node_modules/tsx/dist/cli.mjs bench/large.ts || exit 1
  log "measuring again at the large shape"
  BENCH_COMPARE="$RUN/ratios.json" node node_modules/tsx/dist/cli.mjs bench/run.ts || status=1
fi
if grep -qi 'error' "$RUN/app.log"; then
  log "the app logged errors during the run (tail of its log):"; tail -20 "$RUN/app.log" >&2
fi
exit "$status"
