#!/usr/bin/env bash
# npm run bench: every bench/*.bench.ts, each printing its ratios against a baseline measured in the same run.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
# The samples bench compares with numpy (Debian's python3-numpy; PyPI is not used).
if ! /usr/bin/python3 -c "import numpy" 2>/dev/null; then
  echo "Installing Debian's python3-numpy for the samples bench (one time)..."
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends python3-numpy >/dev/null || echo "bench.sh: could not install python3-numpy; the samples bench will fail." >&2
fi
shopt -s nullglob
for f in bench/*.bench.ts; do
  echo "== $f"
  node --import tsx "$f"
done
