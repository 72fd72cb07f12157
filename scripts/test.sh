#!/usr/bin/env bash
# npm test: the same set-up as npm start against a throwaway database, then lint,
# type-check, unit, two-node, API, browser and reliability tests.
# Usage: npm test [-- SUITES], SUITES one or more (comma-separated) of static,unit,nodes,api,browser,reliability
# (e.g. npm test -- nodes,api: one build for both).
# The reliability suite runs its own PostgreSQL cluster and app server (tests/reliability/stack.ts), which it kills.
set -euo pipefail
cd "$(dirname "$0")/.."
only="${1:-all}"
# whether suite $1 was asked for
want() { [ "$only" = all ] || [[ ",$only," == *",$1,"* ]]; }
bash scripts/ensure-deps.sh
if [ ! -x /usr/bin/chromium ] && { want browser; }; then
  echo "[test] installing Debian's chromium"
  DEBIAN_FRONTEND=noninteractive apt-get update -qq >/dev/null && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
fi
bash scripts/db.sh knotwork >/dev/null
testdb="knotwork_test_$$"
KW_DB_ACTION=create bash scripts/db.sh "$testdb" >/dev/null
server_pid=""
cleanup() {
  [ -n "$server_pid" ] && kill "$server_pid" 2>/dev/null || true
  [ -n "${fakes_started:-}" ] && { KW_FAKES_DIR=".data/fakes-test-$$" bash scripts/fakes.sh stop >/dev/null 2>&1; rm -rf ".data/fakes-test-$$"; } || true
  KW_DB_ACTION=drop bash scripts/db.sh "$testdb" >/dev/null 2>&1 || true
}
trap cleanup EXIT
if [ -f scripts/fakes.sh ]; then
  port_base=$(( 3100 + ($$ % 400) ))
  export KW_APP_WEBHOOK_URL="http://127.0.0.1:$port_base/api/webhooks/stripe" KW_FAKES_DIR=".data/fakes-test-$$"
  bash scripts/fakes.sh >/dev/null && fakes_started=1
fi
. scripts/env.sh "$testdb"
# fakes.sh writes $KW_FAKES_DIR/fakes.env when it supports KW_FAKES_DIR, else .data/fakes.env (read by env.sh)
[ -n "${KW_FAKES_DIR:-}" ] && [ -f "$KW_FAKES_DIR/fakes.env" ] && { set -a; . "$KW_FAKES_DIR/fakes.env"; set +a; }
kw_fakes_to_nuxt
npx tsx scripts/migrate.ts >/dev/null
npx tsx scripts/seed.ts >/dev/null

if want static; then
  echo "[test] lint"; npx eslint .
  echo "[test] type-check"; npm run -s typecheck
fi
if want unit; then
  echo "[test] unit"; npx vitest run --project unit
fi
if want nodes || want api || want browser || want reliability; then
  echo "[test] building"; npx nuxt build > .data/build-test.log 2>&1 || { tail -40 .data/build-test.log; exit 1; }
fi
if want nodes; then
  # two app nodes of the built server on the test database, started by the test itself; before the server below
  # starts, so no third node takes the runs the test follows
  echo "[test] two nodes"; npx vitest run --project nodes
fi
if want api || want browser; then
  port="${port_base:-$(( 3100 + ($$ % 400) ))}"
  export KW_BASE_URL="http://127.0.0.1:$port" NUXT_TRUST_PROXY=1
  export NUXT_PUBLIC_BASE_URL="$KW_BASE_URL"
  HOST=127.0.0.1 PORT="$port" node .output/server/index.mjs > ".data/server-test.log" 2>&1 &
  server_pid=$!
  for _ in $(seq 1 60); do curl -sf "$KW_BASE_URL/signin" >/dev/null && break; sleep 0.5; done
  if want api; then echo "[test] api"; npx vitest run --project api; fi
  if want browser; then echo "[test] browser"; npx playwright test; fi
fi
if want reliability; then
  # bounded: a hung step fails instead of holding the run (its cluster and server are stopped by the suite's teardown)
  echo "[test] reliability"; timeout --kill-after=30 1200 npx vitest run --project reliability
fi
echo "[test] all requested suites passed"
