#!/usr/bin/env bash
# npm start: dependencies, PostgreSQL, fakes, migrations, demo seed, build, serve on http://127.0.0.1:3000
set -euo pipefail
cd "$(dirname "$0")/.."
export HOST="${HOST:-127.0.0.1}" PORT="${PORT:-3000}"
export NITRO_HOST="$HOST" NITRO_PORT="$PORT"
export KW_APP_WEBHOOK_URL="${KW_APP_WEBHOOK_URL:-http://$HOST:$PORT/api/webhooks/stripe}"
bash scripts/ensure-deps.sh
bash scripts/db.sh knotwork
bash scripts/fakes.sh
. scripts/env.sh knotwork
npx tsx scripts/migrate.ts
npx tsx scripts/seed.ts
if [ "${KW_SKIP_BUILD:-}" != "1" ] || [ ! -f .output/server/index.mjs ]; then
  echo "[start] building (log: .data/build.log)"
  npx nuxt build > .data/build.log 2>&1 || { tail -50 .data/build.log; exit 1; }
fi
export NUXT_PUBLIC_BASE_URL="${NUXT_PUBLIC_BASE_URL:-http://$HOST:$PORT}"  # links in e-mails
echo "[start] demo sign-ins: see README.md (password knotwork-demo-2026)"
echo "[start] demo mail inbox (invitations, password resets, review requests): ${KW_MAIL_INBOX_URL:-not running}"
echo "[start] Knotwork at http://$HOST:$PORT"
exec node .output/server/index.mjs
