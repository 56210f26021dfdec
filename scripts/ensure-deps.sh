#!/usr/bin/env bash
# Installs node_modules with `npm ci` when it is missing or older than package-lock.json.
set -euo pipefail
cd "$(dirname "$0")/.."
STAMP=node_modules/.dragoman-lock.sha
want="$(sha256sum package-lock.json | cut -d' ' -f1)"
if [ -d node_modules ] && [ -f "$STAMP" ] && [ "$(cat "$STAMP")" = "$want" ]; then exit 0; fi
echo "Installing dependencies (npm ci)..." >&2
npm ci --no-audit --no-fund --loglevel=error >&2
echo "$want" > "$STAMP"
