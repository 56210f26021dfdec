#!/usr/bin/env bash
# npm run dev: the API (with fakes, migrations, seeds) on PORT=3000 and Vite with HMR on 5173.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
export PGPORT="${PGPORT:-54329}" PGDATA_DIR="${PGDATA_DIR:-.data/pg}" PG_DATABASES="${PG_DATABASES:-dragoman}"
base="$(bash scripts/pg.sh start)"
export DATABASE_URL="${DATABASE_URL:-${base}dragoman}" DEV_OUTBOX="${DEV_OUTBOX:-true}" PUBLIC_URL="${PUBLIC_URL:-http://127.0.0.1:5173}"
mkdir -p .data
[ -s .data/session-secret ] || node -e 'process.stdout.write(require("crypto").randomBytes(32).toString("hex"))' > .data/session-secret
export SESSION_SECRET="${SESSION_SECRET:-$(cat .data/session-secret)}"
node --watch-path=server --watch-path=common --import tsx scripts/stack.ts &
API=$!
npx vite &
VITE=$!
trap 'kill $API $VITE 2>/dev/null; wait; bash scripts/pg.sh stop' INT TERM EXIT
wait
