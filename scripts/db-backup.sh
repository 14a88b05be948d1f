#!/usr/bin/env bash
# npm run db:backup [-- FILE]
# A pg_dump in PostgreSQL's custom format (-Fc: compressed, restorable table by table) of the database in
# DATABASE_URL, or of the cluster `npm start` keeps when DATABASE_URL is not set. Written to FILE, or to
# backups/ohmstead-<UTC timestamp>.dump. The dump goes to a .partial file first, so an interrupted backup
# never leaves a file that looks complete.
source "$(dirname "$0")/lib.sh"

URL="${DATABASE_URL:-$(default_database_url)}"
ensure_pg_client

out="${1:-$ROOT/backups/ohmstead-$(date -u +%Y%m%dT%H%M%SZ).dump}"
mkdir -p "$(dirname "$out")"

target="$(db_describe "$URL")" || { log "cannot reach the database to back up (is it running? npm start starts it)"; exit 1; }
log "backing up $target"
"$(pg_bin)/pg_dump" --format=custom --compress=6 --file="$out.partial" --dbname="$URL"
mv "$out.partial" "$out"

tables="$("$(pg_bin)/pg_restore" --list "$out" | grep -c ' TABLE DATA ' || true)"
log "wrote $out ($(du -h "$out" | cut -f1), $tables tables with data)"
echo "$out"
