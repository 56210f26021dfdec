#!/usr/bin/env bash
# npm start: install what is missing, start PostgreSQL and the fakes, migrate, seed once, build, serve.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
export PGPORT="${PGPORT:-54329}" PGDATA_DIR="${PGDATA_DIR:-.data/pg}" PG_DATABASES="${PG_DATABASES:-dragoman}"
base="$(bash scripts/pg.sh start)"
export DATABASE_URL="${DATABASE_URL:-${base}dragoman}"
mkdir -p .data
if [ -z "${SESSION_SECRET:-}" ]; then
  [ -s .data/session-secret ] || node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("hex"))' > .data/session-secret
  SESSION_SECRET="$(cat .data/session-secret)"; export SESSION_SECRET
fi
export DEV_OUTBOX="${DEV_OUTBOX:-true}"
echo "Building the client..."
npx vite build --logLevel warn
node --import tsx scripts/stack.ts &
APP=$!
stop() { kill -TERM "$APP" 2>/dev/null || true; wait "$APP" 2>/dev/null || true; bash scripts/pg.sh stop; exit 0; }
trap stop INT TERM
set +e
wait "$APP"; rc=$?
set -e
if [ "$rc" -ne 0 ]; then bash scripts/pg.sh stop; exit "$rc"; fi
bash scripts/pg.sh stop
