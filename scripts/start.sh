#!/usr/bin/env bash
# npm start: dependencies, PostgreSQL, fakes, migrations, demo seed, build, serve on http://127.0.0.1:3000
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-deps.sh
bash scripts/db.sh knotwork
[ -f scripts/fakes.sh ] && bash scripts/fakes.sh
. scripts/env.sh knotwork
npx tsx scripts/migrate.ts
npx tsx scripts/seed.ts
if [ "${KW_SKIP_BUILD:-}" != "1" ] || [ ! -f .output/server/index.mjs ]; then
  echo "[start] building"
  npx nuxt build > .data/build.log 2>&1 || { tail -50 .data/build.log; exit 1; }
fi
export HOST="${HOST:-127.0.0.1}" PORT="${PORT:-3000}" NITRO_HOST="${HOST:-127.0.0.1}" NITRO_PORT="${PORT:-3000}"
export NUXT_PUBLIC_BASE_URL="${NUXT_PUBLIC_BASE_URL:-http://$HOST:$PORT}"  # links in e-mails
echo "[start] Knotwork at http://$HOST:$PORT  (sign-ins are printed above and listed in README.md)"
exec node .output/server/index.mjs
