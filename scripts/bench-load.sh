#!/usr/bin/env bash
# npm run bench:load: a fresh benchmark database (migrated, demo seeded) on this checkout's PostgreSQL cluster, the built
# server (built when missing, or always with KW_BUILD=1), then bench/load.bench.ts. Loopback only; the database is dropped.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
bash scripts/db.sh knotwork >/dev/null
benchdb="knotwork_bench_$$"
KW_DB_ACTION=create bash scripts/db.sh "$benchdb" >/dev/null
trap 'KW_DB_ACTION=drop bash scripts/db.sh "$benchdb" >/dev/null 2>&1 || true' EXIT
. scripts/env.sh "$benchdb"
npx tsx scripts/migrate.ts >/dev/null
npx tsx scripts/seed.ts >/dev/null
if [ "${KW_BUILD:-}" = "1" ] || [ ! -f .output/server/index.mjs ]; then
  echo "[bench] building (log: .data/build-bench.log)"
  npx nuxt build > .data/build-bench.log 2>&1 || { tail -40 .data/build-bench.log; exit 1; }
fi
npx tsx bench/load.bench.ts
