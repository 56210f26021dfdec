#!/usr/bin/env bash
# npm run bench: every bench/*.bench.ts, each printing its ratios against a baseline measured in the same run.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
# The samples and forecast benches compare with numpy (Debian's python3-numpy; PyPI is not used).
if ! /usr/bin/python3 -c "import numpy" 2>/dev/null; then
  echo "Installing Debian's python3-numpy for the numpy baselines (one time)..."
  if [ "$(id -u)" -eq 0 ]; then { apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends python3-numpy >/dev/null; } || echo "(could not install python3-numpy; the numpy baselines will be skipped or fail)"
  else sudo -n apt-get install -y -q python3-numpy >/dev/null 2>&1 || echo "(python3-numpy missing; the numpy baselines will be skipped or fail)"; fi
fi
shopt -s nullglob
for f in bench/*.bench.ts; do
  echo "== $f"
  node --import tsx "$f"
done
