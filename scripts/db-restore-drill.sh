#!/usr/bin/env bash
# npm run db:restore-drill -- [DUMP] [--compare]
# Proves a backup can be restored: starts a throwaway PostgreSQL cluster on a free port, restores DUMP
# into it (default: the newest nightly-*.dump in BACKUP_DIR, or backups/), prints every table's row count
# and checksum (md5 of its rows' text, in a stable order), and throws the cluster away. With --compare it
# also checksums the database in DATABASE_URL and fails (exit 1), naming the tables, if any differs —
# right after a backup, they must all match.
source "$(dirname "$0")/lib.sh"

file="" compare=0
for a in "$@"; do
  case "$a" in
    --compare) compare=1 ;;
    -*) log "unknown option $a (usage: npm run db:restore-drill -- [DUMP] [--compare])"; exit 2 ;;
    *) file="$a" ;;
  esac
done
if [ -z "$file" ]; then
  dir="${BACKUP_DIR:-$ROOT/backups}"
  file="$(ls -1 "$dir"/nightly-*.dump 2>/dev/null | sort | tail -1 || true)"
  [ -n "$file" ] || { log "no nightly-*.dump in $dir: name the dump to drill"; exit 2; }
fi
[ -f "$file" ] || { log "no such file: $file"; exit 2; }
ensure_pg_client

# "table rows md5" for every table of the public schema of a database.
table_sums() {
  local url="$1" t
  for t in $("$(pg_bin)/psql" -X -q -tA --dbname="$url" -c "select tablename from pg_tables where schemaname = 'public' order by tablename"); do
    "$(pg_bin)/psql" -X -q -tA -F ' ' --dbname="$url" \
      -c "select '$t', count(*), md5(coalesce(string_agg(t::text, E'\\n' order by t::text), '')) from public.\"$t\" t"
  done
}

RUN="$(mktemp -d /var/tmp/ohm-drill.XXXXXX)"
chmod 755 "$RUN"
port="$(free_port)"
trap 'pg_stop "$RUN/pg"; rm -rf "$RUN"' EXIT
log "restore drill: a throwaway cluster on port $port"
pg_start "$RUN/pg" "$port" throwaway
pg_create_db "$port" drill
DRILL_URL="postgres://postgres@127.0.0.1:$port/drill"
DATABASE_URL="$DRILL_URL" bash "$ROOT/scripts/db-restore.sh" "$file" --yes
table_sums "$DRILL_URL" >"$RUN/restored.txt"
cat "$RUN/restored.txt"
log "restored $(wc -l <"$RUN/restored.txt") tables from $file"

if [ "$compare" = 1 ]; then
  # backup_runs is left out of the comparison: a backup's own record is written after its dump.
  table_sums "${DATABASE_URL:-$(default_database_url)}" | grep -v '^backup_runs ' >"$RUN/source.txt"
  grep -v '^backup_runs ' "$RUN/restored.txt" >"$RUN/restored-compared.txt" || true
  if ! diff -q "$RUN/source.txt" "$RUN/restored-compared.txt" >/dev/null; then
    log "the restored copy differs from the database in these tables:"
    diff "$RUN/source.txt" "$RUN/restored-compared.txt" | awk '/^[<>]/ { print $2 }' | sort -u >&2
    exit 1
  fi
  log "every table matches the database (row counts and checksums)"
fi
