#!/usr/bin/env bash
# npm run db:backup: a pg_dump (custom format) of the demo database into .data/backups/, named with a
# UTC timestamp. Works whether or not npm start is running (starts the cluster for the dump if needed,
# and stops it again afterwards when it was not running). Prints the path of the new file.
# Env: PGPORT, PGDATA_DIR (the cluster, as scripts/pg.sh), DRAGOMAN_DB (default dragoman),
#      BACKUP_DIR (default .data/backups).
set -euo pipefail
cd "$(dirname "$0")/.."
export PGPORT="${PGPORT:-54329}" PGDATA_DIR="${PGDATA_DIR:-.data/pg}" PG_DATABASES="postgres"
DB="${DRAGOMAN_DB:-dragoman}"
DIR="${BACKUP_DIR:-.data/backups}"
was_running=0; bash scripts/pg.sh status >/dev/null 2>&1 && was_running=1
base="$(bash scripts/pg.sh start)"
finish() { [ "$was_running" = 1 ] || bash scripts/pg.sh stop 2>/dev/null || true; }
trap finish EXIT
BIN="$(ls -d /usr/lib/postgresql/*/bin | head -1)"
if [ "$("$BIN/psql" -h 127.0.0.1 -p "$PGPORT" -U postgres -d postgres -tAc "select 1 from pg_database where datname='$DB'")" != 1 ]; then
  echo "db:backup: there is no database \"$DB\" on port $PGPORT to back up (run npm start once to create it)." >&2
  exit 1
fi
mkdir -p "$DIR"
file="$DIR/$DB-$(date -u +%Y%m%dT%H%M%SZ).dump"
# Written under a temporary name and renamed when complete: a half-written dump never looks like a backup.
"$BIN/pg_dump" -h 127.0.0.1 -p "$PGPORT" -U postgres -d "$DB" --format=custom --no-owner --file="$file.partial"
mv "$file.partial" "$file"
echo "$file"
