#!/usr/bin/env bash
# Sourced by start.sh and test.sh: database URLs and secrets for one database name.
# Usage: . scripts/env.sh <database-name>   (KW_PG_ENV names another cluster's env file under .data/, as in db.sh)
kw_root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
set -a
. "$kw_root/.data/${KW_PG_ENV:-pg.env}"
set +a
kw_db="${1:-knotwork}"
secrets="$kw_root/.data/secrets.env"
if [ ! -f "$secrets" ]; then
  umask 077
  {
    echo "NUXT_SESSION_PASSWORD=$(head -c 48 /dev/urandom | base64 | tr -dc 'A-Za-z0-9' | head -c 48)"
    echo "KW_SIGNING_SECRET=$(head -c 48 /dev/urandom | base64 | tr -dc 'A-Za-z0-9' | head -c 48)"
  } > "$secrets"
fi
set -a
. "$secrets"
[ -f "$kw_root/.data/fakes.env" ] && . "$kw_root/.data/fakes.env"
# The app reads Stripe and SMTP settings as NUXT_* runtime config; here they point at the local fakes
# (scripts/fakes.sh). Set the NUXT_* variables yourself instead to use the real services.
kw_fakes_to_nuxt() {
  [ -n "${KW_STRIPE_SECRET_KEY:-}" ] || return 0
  NUXT_STRIPE_SECRET_KEY="$KW_STRIPE_SECRET_KEY" NUXT_STRIPE_HOST="$KW_STRIPE_HOST" NUXT_STRIPE_PORT="$KW_STRIPE_PORT"
  NUXT_STRIPE_PROTOCOL="${KW_STRIPE_PROTOCOL:-http}" NUXT_STRIPE_WEBHOOK_SECRET="$KW_STRIPE_WEBHOOK_SECRET"
  NUXT_SMTP_HOST="$KW_SMTP_HOST" NUXT_SMTP_PORT="$KW_SMTP_PORT" NUXT_PUBLIC_MAIL_INBOX_URL="${KW_MAIL_INBOX_URL:-}"
  export NUXT_STRIPE_SECRET_KEY NUXT_STRIPE_HOST NUXT_STRIPE_PORT NUXT_STRIPE_PROTOCOL NUXT_STRIPE_WEBHOOK_SECRET \
    NUXT_SMTP_HOST NUXT_SMTP_PORT NUXT_PUBLIC_MAIL_INBOX_URL
}
kw_fakes_to_nuxt
KW_DATABASE_OWNER_URL="postgres://$KW_PG_OWNER:$KW_PG_OWNER_PASSWORD@$KW_PG_HOST:$KW_PG_PORT/$kw_db"
NUXT_DATABASE_URL="postgres://$KW_PG_APP:$KW_PG_APP_PASSWORD@$KW_PG_HOST:$KW_PG_PORT/$kw_db"
# the server secret that seals the organisations' signing keys (runtimeConfig.signingSecret)
NUXT_SIGNING_SECRET="${NUXT_SIGNING_SECRET:-${KW_SIGNING_SECRET:-}}"
set +a
