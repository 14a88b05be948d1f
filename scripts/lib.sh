#!/usr/bin/env bash
# Shared shell helpers for start.sh and test.sh: install what is missing, run a private PostgreSQL.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
log() { printf '\033[1;36m[ohmstead]\033[0m %s\n' "$*" >&2; }

apt_updated=0
apt_install() {
  if [ "$(id -u)" != 0 ]; then log "need root to apt-get install $*"; return 1; fi
  if [ "$apt_updated" = 0 ]; then apt-get update -qq >/dev/null; apt_updated=1; fi
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null
}

ensure_node_modules() {
  # Reinstall when node_modules is missing or older than the lock file.
  if [ ! -d "$ROOT/node_modules/.bin" ] || [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    log "installing npm packages (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error)
  fi
}

pg_bin() { ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1; }

ensure_postgres() {
  if [ -z "$(pg_bin)" ] || [ ! -x "$(pg_bin)/initdb" ]; then
    log "installing Debian's postgresql"
    mkdir -p /etc/postgresql-common
    # Keep the package from creating and starting its own cluster on 5432.
    if ! grep -q '^create_main_cluster = false' /etc/postgresql-common/createcluster.conf 2>/dev/null; then
      echo 'create_main_cluster = false' >> /etc/postgresql-common/createcluster.conf
    fi
    apt_install postgresql
  fi
}

ensure_chromium() {
  if [ ! -x /usr/bin/chromium ]; then
    log "installing Debian's chromium (about a minute)"
    apt_install chromium
  fi
}

ensure_tls_front() {
  # The TLS front a real space runs (deploy/Caddyfile) and the NSS tool that makes a test browser trust its CA.
  if ! command -v caddy >/dev/null || ! command -v certutil >/dev/null; then
    log "installing Debian's caddy and libnss3-tools (for the TLS front's browser test)"
    apt_install caddy libnss3-tools
  fi
}

as_pg() { (cd / && runuser -u postgres -- "$@"); }

# A folder the postgres OS user can reach: under the project when every parent is traversable,
# otherwise under /var/tmp (CI may clone into a folder only root can enter).
pg_data_dir() {
  local wanted="$1" fallback="$2"
  mkdir -p "$(dirname "$wanted")"
  if runuser -u postgres -- test -x "$(dirname "$wanted")" 2>/dev/null; then echo "$wanted"; else echo "$fallback"; fi
}

# pg_start DATA PORT MODE   (MODE = durable | throwaway)
pg_start() {
  local data="$1" port="$2" mode="$3" bin
  bin="$(pg_bin)"
  mkdir -p "$data"
  chown postgres:postgres "$data"
  chmod 700 "$data"
  if [ ! -s "$data/PG_VERSION" ]; then
    as_pg "$bin/initdb" -D "$data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
  fi
  if as_pg "$bin/pg_ctl" -D "$data" status >/dev/null 2>&1; then
    log "PostgreSQL already running on $port"
    return 0
  fi
  local opts="-p $port -h 127.0.0.1 -k ''"
  if [ "$mode" = throwaway ]; then
    # Unsafe but fast: only for the test cluster that is thrown away after the run.
    opts="$opts -c fsync=off -c synchronous_commit=off -c full_page_writes=off"
  fi
  as_pg "$bin/pg_ctl" -D "$data" -l "$data/server.log" -w -t 60 -o "$opts" start >/dev/null
  until "$bin/pg_isready" -q -h 127.0.0.1 -p "$port" -U postgres; do sleep 0.3; done
}

pg_stop() {
  local data="$1" bin
  bin="$(pg_bin)"
  [ -s "$data/PG_VERSION" ] || return 0
  as_pg "$bin/pg_ctl" -D "$data" -m fast -w stop >/dev/null 2>&1 || true
}

pg_create_db() {
  local port="$1" name="$2" bin
  bin="$(pg_bin)"
  if ! "$bin/psql" -h 127.0.0.1 -p "$port" -U postgres -tAc "select 1 from pg_database where datname='$name'" | grep -q 1; then
    "$bin/createdb" -h 127.0.0.1 -p "$port" -U postgres "$name"
  fi
}

free_port() { node -e 'const s=require("net").createServer();s.listen(0,"127.0.0.1",()=>{console.log(s.address().port);s.close()})'; }

wait_http() {
  local url="$1" tries="${2:-120}"
  for _ in $(seq "$tries"); do
    if node -e 'fetch(process.argv[1]).then(r=>process.exit(r.status<500?0:1),()=>process.exit(1))' "$url"; then return 0; fi
    sleep 0.5
  done
  log "timed out waiting for $url"; return 1
}

# --- backup, restore and bench helpers (added with scripts/db-backup.sh, db-restore.sh, bench.sh) ---

# The database `npm start` keeps (scripts/start.sh): the default for db:backup and db:restore.
default_database_url() { echo "postgres://postgres@127.0.0.1:${OHM_PG_PORT:-54329}/ohmstead"; }

# pg_dump / pg_restore / psql from Debian's packages, the same version as the server we run.
ensure_pg_client() {
  if [ -z "$(pg_bin)" ] || [ ! -x "$(pg_bin)/pg_dump" ]; then ensure_postgres; fi
}

# "dbname on host:port (PostgreSQL x.y)" of a connection URL, without its password; fails when unreachable.
db_describe() {
  "$(pg_bin)/psql" -X -q -v ON_ERROR_STOP=1 --dbname="$1" -tAc \
    "select current_database() || ' on ' || coalesce(host(inet_server_addr()), 'local socket') || ':' || inet_server_port() || ' (PostgreSQL ' || split_part(current_setting('server_version'), ' ', 1) || ')'" 2>/dev/null
}

# Restarts a running cluster with the options it was started with (pg_ctl keeps them in postmaster.opts);
# -m fast: open sessions are cut, as in a crash of the connection. Used by the fault tests.
pg_restart() {
  local data="$1"
  as_pg "$(pg_bin)/pg_ctl" -D "$data" -l "$data/server.log" -m fast -w -t 60 restart >/dev/null
}

# The environment of an app on throwaway services, as scripts/test.sh sets it: free ports for the app and
# the fakes, the database DB_NAME on the cluster at PG_PORT, a fresh secret, test-mode processor keys.
throwaway_app_env() {
  local pg_port="$1" db_name="$2"
  export SMTP_PORT="$(free_port)" SMTP_SINK_HTTP_PORT="$(free_port)" PAYMENTS_API_PORT="$(free_port)" APP_PORT="$(free_port)"
  export DATABASE_URL="postgres://postgres@127.0.0.1:$pg_port/$db_name"
  export NEXTAUTH_SECRET="throwaway-$(node -e 'console.log(require("crypto").randomBytes(16).toString("hex"))')"
  export APP_BASE_URL="http://127.0.0.1:$APP_PORT" NEXTAUTH_URL="http://127.0.0.1:$APP_PORT"
  export SMTP_HOST=127.0.0.1 MAILBOX_URL="http://127.0.0.1:$SMTP_SINK_HTTP_PORT" OHM_DEV_MAILBOX=1
  export PAYMENTS_API_HOST=127.0.0.1 PAYMENTS_API_PROTOCOL=http
  export STRIPE_SECRET_KEY="sk_test_ohmstead_throwaway" STRIPE_WEBHOOK_SECRET="whsec_ohmstead_throwaway_secret"
  export NEXT_TELEMETRY_DISABLED=1
}

# A fingerprint of every source file git sees (tracked or new, not ignored), contents included.
source_fingerprint() {
  (cd "$ROOT" && git ls-files -co --exclude-standard -z | xargs -0 md5sum 2>/dev/null | md5sum | cut -c1-32)
}

# next build into DIST (next.config.mjs reads OHM_DIST_DIR) unless DIST already holds a build of exactly
# these sources. OHM_REBUILD=1 builds regardless.
build_app_if_changed() {
  local dist="$1" build_log="$2" stamp now
  stamp="$ROOT/$dist/ohm-source.stamp"
  now="$(source_fingerprint)"
  if [ "${OHM_REBUILD:-0}" != 1 ] && [ -f "$ROOT/$dist/BUILD_ID" ] && [ "$(cat "$stamp" 2>/dev/null)" = "$now" ]; then
    log "the build in $dist is of these sources: not rebuilding"
    return 0
  fi
  log "building the app into $dist (next build)"
  (cd "$ROOT" && OHM_DIST_DIR="$dist" node node_modules/next/dist/bin/next build >"$build_log" 2>&1) || { tail -60 "$build_log" >&2; return 1; }
  echo "$now" >"$stamp"
}

# Starts the production build in OHM_DIST_DIR on 127.0.0.1:PORT in the background; sets APP_PID.
start_app() {
  local port="$1" app_log="$2"
  (cd "$ROOT" && exec node node_modules/next/dist/bin/next start -p "$port" -H 127.0.0.1) >"$app_log" 2>&1 &
  APP_PID=$!
}

# --- stopping everything a start script started (added with the clean-stop test) ---

# The process ids under PID (children, grandchildren, …), deepest first; by parent id only.
descendants() {
  local pid="$1" child
  for child in $(pgrep -P "$pid" 2>/dev/null); do
    descendants "$child"
    echo "$child"
  done
}

# Ends PID and everything it started: TERM, up to WAIT seconds (default 5), then KILL what is left.
kill_tree() {
  local pid="$1" wait="${2:-5}" pids p alive
  [ -n "$pid" ] || return 0
  pids="$(descendants "$pid") $pid"
  for p in $pids; do kill -TERM "$p" 2>/dev/null || true; done
  for _ in $(seq $((wait * 5))); do
    alive=0
    for p in $pids; do kill -0 "$p" 2>/dev/null && alive=1; done
    [ "$alive" = 0 ] && return 0
    sleep 0.2
  done
  for p in $pids; do kill -KILL "$p" 2>/dev/null || true; done
}

# Runs a long step as a child and waits for it, so a SIGTERM to the script acts at once (bash holds a
# trap while a foreground child runs, but not while it waits); the step's PID is STEP_PID for cleanup.
STEP_PID=""
run_step() {
  "$@" &
  STEP_PID=$!
  local rc=0
  wait "$STEP_PID" || rc=$?
  STEP_PID=""
  return "$rc"
}

# --- production start (scripts/serve.sh, scripts/upgrade.sh) ---

# Pending migrations go in only after a fresh backup into BACKUP_DIR. Kysely's Migrator runs them in one
# transaction on PostgreSQL, so a failed migration leaves the database exactly as it was.
migrate_with_backup() {
  local pending
  pending="$(node node_modules/tsx/dist/cli.mjs scripts/migrate.ts --pending)"
  if [ "$pending" = 0 ]; then
    log "database schema is up to date"
    return 0
  fi
  log "$pending migration(s) to run: backing up first"
  bash "$ROOT/scripts/db-backup.sh" "$BACKUP_DIR/before-migrate-$(date -u +%Y%m%dT%H%M%SZ).dump" >/dev/null \
    || { log "backup failed: not migrating"; return 1; }
  node node_modules/tsx/dist/cli.mjs scripts/migrate.ts \
    || { log "migration failed: the database is as it was before (one transaction); the backup is in $BACKUP_DIR"; return 1; }
}
