#!/usr/bin/env bash
# Installs npm dependencies when missing or older than the lockfile.
set -euo pipefail
cd "$(dirname "$0")/.."
stamp=node_modules/.package-lock.json
if [ ! -d node_modules ] || [ ! -f "$stamp" ] || [ package-lock.json -nt "$stamp" ]; then
  echo "[deps] installing npm dependencies (npm ci)"
  npm ci --no-audit --no-fund
fi
