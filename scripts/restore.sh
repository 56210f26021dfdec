#!/usr/bin/env bash
# npm run db:restore <file> [--yes]: replaces the demo database with a dump made by npm run db:backup.
# The dump is first restored into a scratch database; only when that succeeded is the current database
# dropped and the scratch one renamed in its place, so a bad file leaves the current data untouched.
# Asks for confirmation unless given --yes. Stop npm start first (its connections are closed by force).
# Env: PGPORT, PGDATA_DIR, DRAGOMAN_DB (default dragoman), as scripts/backup.sh.
set -euo pipefail
cd "$(dirname "$0")/.."
file=""; yes=0
for a in "$@"; do
  case "$a" in
    --yes|-y) yes=1 ;;
    -*) echo "db:restore: unknown option $a (usage: npm run db:restore <file> [-- --yes])" >&2; exit 2 ;;
    *) file="$a" ;;
  esac
done
if [ -z "$file" ]; then echo "db:restore: name the dump to restore: npm run db:restore .data/backups/<file>.dump" >&2; exit 2; fi
if [ ! -s "$file" ]; then echo "db:restore: $file does not exist or is empty." >&2; exit 1; fi
export PGPORT="${PGPORT:-54329}" PGDATA_DIR="${PGDATA_DIR:-.data/pg}" PG_DATABASES="postgres"
DB="${DRAGOMAN_DB:-dragoman}"
SCRATCH="${DB}_restoring"
if [ "$yes" != 1 ]; then
  if [ ! -t 0 ]; then echo "db:restore: this replaces database \"$DB\"; run it in a terminal to confirm, or add --yes." >&2; exit 1; fi
  read -r -p "Replace database \"$DB\" (port $PGPORT) with $file? Type yes to go on: " answer
  [ "$answer" = yes ] || { echo "db:restore: nothing changed."; exit 1; }
fi
was_running=0; bash scripts/pg.sh status >/dev/null 2>&1 && was_running=1
base="$(bash scripts/pg.sh start)"
finish() { [ "$was_running" = 1 ] || bash scripts/pg.sh stop 2>/dev/null || true; }
trap finish EXIT
BIN="$(ls -d /usr/lib/postgresql/*/bin | head -1)"
psql_admin() { "$BIN/psql" -q -v ON_ERROR_STOP=1 -h 127.0.0.1 -p "$PGPORT" -U postgres -d postgres "$@"; }
psql_admin -c "drop database if exists \"$SCRATCH\" with (force)" -c "create database \"$SCRATCH\""
if ! "$BIN/pg_restore" -h 127.0.0.1 -p "$PGPORT" -U postgres -d "$SCRATCH" --no-owner --exit-on-error "$file"; then
  psql_admin -c "drop database if exists \"$SCRATCH\" with (force)"
  echo "db:restore: $file could not be restored (message above); database \"$DB\" is unchanged." >&2
  exit 1
fi
psql_admin -c "drop database if exists \"$DB\" with (force)" -c "alter database \"$SCRATCH\" rename to \"$DB\""
echo "Database \"$DB\" restored from $file."
