#!/usr/bin/env bash
# npm run db:reset: drops the demo database; the next npm start migrates and seeds it afresh.
set -euo pipefail
cd "$(dirname "$0")/.."
export PGPORT="${PGPORT:-54329}" PGDATA_DIR="${PGDATA_DIR:-.data/pg}" PG_DATABASES="postgres"
base="$(bash scripts/pg.sh start)"
BIN="$(ls -d /usr/lib/postgresql/*/bin | head -1)"
"$BIN/psql" -q "${base}postgres" -c 'drop database if exists dragoman with (force)'
echo "Demo database dropped; run npm start to recreate and seed it."
bash scripts/pg.sh stop
