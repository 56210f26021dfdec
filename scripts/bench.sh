#!/usr/bin/env bash
# npm run bench: every bench/*.bench.ts, each printing its ratios against a baseline measured in the same run.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
shopt -s nullglob
for f in bench/*.bench.ts; do
  echo "== $f"
  node --import tsx "$f"
done
