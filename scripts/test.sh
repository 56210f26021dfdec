#!/usr/bin/env bash
# npm test: the same set-up as npm start, against the test cluster, then every check.
# Ends with one plain line "N passed, N failed" and exits non-zero on any failure.
set -uo pipefail
cd "$(dirname "$0")/.."
started=$(date +%s)
bash scripts/ensure-deps.sh || { echo "0 passed, 1 failed"; exit 1; }

if [ ! -x /usr/bin/chromium ] && [ ! -x /usr/lib/chromium/chromium ]; then
  echo "Installing Debian's chromium for the browser tests (one time)..."
  if ! { apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends chromium >/dev/null; }; then
    echo "test.sh: could not install chromium with apt-get; install Debian's 'chromium' package and run again." >&2
    echo "0 passed, 1 failed"; exit 1
  fi
fi

if ! command -v pdflatex >/dev/null 2>&1 || ! command -v bibtex >/dev/null 2>&1 || ! kpsewhich booktabs.sty >/dev/null 2>&1; then
  echo "Installing Debian's texlive for the LaTeX export test (one time)..."
  if ! { apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends texlive-latex-base texlive-latex-recommended >/dev/null; }; then
    echo "test.sh: could not install texlive with apt-get; install Debian's 'texlive-latex-base' and 'texlive-latex-recommended' and run again." >&2
    echo "0 passed, 1 failed"; exit 1
  fi
fi

# The test runs the python3 on PATH if it has requests, else Debian's /usr/bin/python3 (tests/api/readme-python.test.ts).
if ! python3 -c "import requests" >/dev/null 2>&1 && ! /usr/bin/python3 -c "import requests" >/dev/null 2>&1; then
  echo "Installing Debian's python3-requests for the README's Python example test (one time)..."
  if ! { apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends python3 python3-requests >/dev/null; }; then
    echo "test.sh: could not install python3-requests with apt-get; install Debian's 'python3-requests' and run again." >&2
    echo "0 passed, 1 failed"; exit 1
  fi
fi

export TEST_PGPORT="${TEST_PGPORT:-54339}" TEST_PGDATA_DIR="${TEST_PGDATA_DIR:-.data/pg-test}"
# The test cluster is throw-away: PG_THROWAWAY=1 trades durability for speed (scripts/pg.sh).
pg() { PGPORT="$TEST_PGPORT" PGDATA_DIR="$TEST_PGDATA_DIR" PG_DATABASES="dragoman_test_template" PG_THROWAWAY=1 bash scripts/pg.sh "$@"; }
# Stop the cluster at the end only if this run started it (another run may be using it).
was_running=0; pg status >/dev/null 2>&1 && was_running=1
pg start >/dev/null || { echo "0 passed, 1 failed"; exit 1; }
stop_pg() { [ "$was_running" = 1 ] || pg stop 2>/dev/null; }
trap stop_pg EXIT

passed=0; failed=0
step() {
  local name="$1"; shift
  echo "== $name"
  if "$@"; then passed=$((passed + 1)); echo "   $name: ok"; else failed=$((failed + 1)); echo "   $name: FAILED"; fi
}
step typecheck npx tsc --noEmit -p .
step lint npx eslint . --max-warnings=0
step "client build" npx vite build --logLevel warn

mkdir -p test-output
summary="test-output/vitest-summary.json"; rm -f "$summary"
echo "== vitest (unit, API, browser)"
SUMMARY_FILE="$summary" npx vitest run --reporter=default --reporter=./tests/summary-reporter.ts
vitest_rc=$?
if [ -s "$summary" ]; then
  vp=$(node -e 'const s=require("./'"$summary"'");process.stdout.write(String(s.passed))')
  vf=$(node -e 'const s=require("./'"$summary"'");process.stdout.write(String(s.failed))')
  passed=$((passed + vp)); failed=$((failed + vf))
fi
if [ "$vitest_rc" -ne 0 ] && { [ ! -s "$summary" ] || [ "${vf:-0}" -eq 0 ]; }; then failed=$((failed + 1)); fi

stop_pg; trap - EXIT
echo "Wall time: $(( $(date +%s) - started )) s"
echo "${passed} passed, ${failed} failed"
[ "$failed" -eq 0 ]
