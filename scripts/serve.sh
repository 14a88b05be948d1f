#!/usr/bin/env bash
# npm run serve: Ohmstead for a real space (the demo is `npm start`). Reads the env file
# (OHM_ENV_FILE, default ./ohmstead.env; deploy/ohmstead.env.example lists every setting), checks it
# with lib/env.ts (each missing or wrong variable named), builds when the sources changed, backs the
# database up before any pending migration, migrates, and serves on APP_HOST:APP_PORT. It never seeds
# the demo, never starts the local fakes, and its build has no test, bench or dev doors.
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

ENV_FILE="${OHM_ENV_FILE:-$ROOT/ohmstead.env}"
if [ ! -f "$ENV_FILE" ]; then
  log "no env file at $ENV_FILE: copy deploy/ohmstead.env.example there and fill it in (or set OHM_ENV_FILE)"
  exit 2
fi
set -a
# shellcheck disable=SC1090
source "$ENV_FILE"
set +a
export NODE_ENV=production OHM_PRODUCTION=1 NEXT_TELEMETRY_DISABLED=1
export NEXTAUTH_URL="${NEXTAUTH_URL:-${APP_BASE_URL:-}}"
export APP_HOST="${APP_HOST:-127.0.0.1}" APP_PORT="${APP_PORT:-3000}"
# The processor's real API unless the env file points elsewhere.
export PAYMENTS_API_HOST="${PAYMENTS_API_HOST:-api.stripe.com}" PAYMENTS_API_PORT="${PAYMENTS_API_PORT:-443}" PAYMENTS_API_PROTOCOL="${PAYMENTS_API_PROTOCOL:-https}"

ensure_node_modules
node node_modules/tsx/dist/cli.mjs scripts/check-env.ts || exit 2
ensure_pg_client

# The build comes first: while it runs (and if it fails) nothing is changed.
DIST="${OHM_DIST_DIR:-.next-serve}"
export OHM_DIST_DIR="$DIST"
mkdir -p "$BACKUP_DIR"
build_app_if_changed "$DIST" "$BACKUP_DIR/last-build.log"

migrate_with_backup

log "serving $APP_BASE_URL (listening on $APP_HOST:$APP_PORT)"
exec node node_modules/next/dist/bin/next start -p "$APP_PORT" -H "$APP_HOST"
