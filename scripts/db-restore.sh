#!/usr/bin/env bash
# npm run db:restore -- FILE [--yes]
# Restores a dump made by db:backup into the database in DATABASE_URL (or the cluster `npm start` keeps).
# Replaces what is there: every object in the dump is dropped first (pg_restore --clean --if-exists), and
# the whole restore runs as one transaction, so a failed restore leaves the database as it was.
# Schemas of the dump other than public (pg-boss's `pgboss`) are dropped whole first: pg_restore --clean
# cannot drop the constraints of partitioned tables one by one (PostgreSQL 15: "cannot drop inherited
# constraint"), and those schemas hold nothing but what the dump brings back.
# At a terminal it asks for the database's name before touching anything; --yes skips the question.
source "$(dirname "$0")/lib.sh"

file="" yes=0
for a in "$@"; do
  case "$a" in
    --yes | -y) yes=1 ;;
    -*) log "unknown option $a (usage: npm run db:restore -- FILE [--yes])"; exit 2 ;;
    *) file="$a" ;;
  esac
done
if [ -z "$file" ]; then
  log "refusing to restore: name the dump to restore (usage: npm run db:restore -- backups/ohmstead-<time>.dump)"
  exit 2
fi
if [ ! -f "$file" ]; then
  log "refusing to restore: no such file: $file"
  exit 2
fi

URL="${DATABASE_URL:-$(default_database_url)}"
ensure_pg_client

if ! "$(pg_bin)/pg_restore" --list "$file" >/dev/null 2>&1; then
  log "refusing to restore: $file is not a pg_dump custom-format archive"
  exit 2
fi
target="$(db_describe "$URL")" || { log "cannot reach the database to restore into (is it running? npm start starts it)"; exit 1; }
log "restoring $file"
log "into $target — its current contents will be replaced"

if [ "$yes" = 0 ] && [ -t 0 ]; then
  dbname="${target%% *}"
  read -r -p "Type the database name ($dbname) to go on: " answer
  if [ "$answer" != "$dbname" ]; then log "not restored"; exit 1; fi
fi

schemas="$("$(pg_bin)/pg_restore" --list "$file" | awk '$4 == "SCHEMA" && $5 == "-" && $6 != "public" { print $6 }')"
# COMMIT is written only after pg_restore has read the whole archive: a dump that breaks off half way
# ends psql's session inside the open transaction, which PostgreSQL then rolls back.
if ! {
  echo 'BEGIN;'
  for s in $schemas; do printf 'DROP SCHEMA IF EXISTS "%s" CASCADE;\n' "$s"; done
  "$(pg_bin)/pg_restore" --clean --if-exists --no-owner --file=- "$file" && echo 'COMMIT;'
} | PGOPTIONS="-c client_min_messages=warning" "$(pg_bin)/psql" -X -q -v ON_ERROR_STOP=1 --dbname="$URL" >/dev/null; then
  log "restore failed: nothing was changed in $target"
  exit 1
fi
log "restored $file into $target"
