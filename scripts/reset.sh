#!/usr/bin/env bash
# npm run db:reset [-- --yes]: drops the demo database; the next npm start migrates and seeds it afresh.
# Asks for confirmation unless given --yes (take a backup first: npm run db:backup).
set -euo pipefail
cd "$(dirname "$0")/.."
yes=0
for a in "$@"; do
  case "$a" in
    --yes|-y) yes=1 ;;
    *) echo "db:reset: unknown argument $a (usage: npm run db:reset [-- --yes])" >&2; exit 2 ;;
  esac
done
export PGPORT="${PGPORT:-54329}" PGDATA_DIR="${PGDATA_DIR:-.data/pg}" PG_DATABASES="postgres"
DB="${DRAGOMAN_DB:-dragoman}"
if [ "$yes" != 1 ]; then
  if [ ! -t 0 ]; then echo "db:reset: this deletes every row of database \"$DB\"; run it in a terminal to confirm, or add --yes." >&2; exit 1; fi
  read -r -p "Delete database \"$DB\" (port $PGPORT) and all its data? Type yes to go on: " answer
  [ "$answer" = yes ] || { echo "db:reset: nothing changed."; exit 1; }
fi
was_running=0; bash scripts/pg.sh status >/dev/null 2>&1 && was_running=1
base="$(bash scripts/pg.sh start)"
BIN="$(ls -d /usr/lib/postgresql/*/bin | head -1)"
"$BIN/psql" -q "${base}postgres" -c "drop database if exists \"$DB\" with (force)"
echo "Database \"$DB\" dropped; run npm start to recreate and seed it."
[ "$was_running" = 1 ] || bash scripts/pg.sh stop
