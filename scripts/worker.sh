#!/usr/bin/env bash
# npm run worker: one more job worker (docs/samples-jobs.md). With DATABASE_URL set it joins that
# database from any machine; without it, the local cluster npm start runs (PGPORT, default 54329).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
if [ -z "${DATABASE_URL:-}" ]; then
  export PGPORT="${PGPORT:-54329}"
  DATABASE_URL="postgres://postgres@127.0.0.1:${PGPORT}/dragoman"; export DATABASE_URL
fi
exec node --import tsx server/jobs/worker-main.ts
