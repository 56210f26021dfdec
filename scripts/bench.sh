#!/usr/bin/env bash
# npm run bench: every bench/*.bench.ts, each printing its ratios against a baseline measured in the same run.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
# The forecast bench compares against numpy (Debian python3-numpy); PyPI is not used.
if ! python3 -c "import numpy" 2>/dev/null; then
  echo "Installing python3-numpy for the forecast baseline..."
  if [ "$(id -u)" -eq 0 ]; then apt-get install -y -q python3-numpy >/dev/null || echo "(could not install python3-numpy; the numpy baseline will be skipped)"
  else sudo -n apt-get install -y -q python3-numpy >/dev/null 2>&1 || echo "(python3-numpy missing; the numpy baseline will be skipped)"; fi
fi
shopt -s nullglob
for f in bench/*.bench.ts; do
  echo "== $f"
  node --import tsx "$f"
done
