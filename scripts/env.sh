#!/usr/bin/env bash
# Sourced by start.sh and test.sh: database URLs and secrets for one database name.
# Usage: . scripts/env.sh <database-name>
kw_root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
set -a
. "$kw_root/.data/pg.env"
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
KW_DATABASE_OWNER_URL="postgres://$KW_PG_OWNER:$KW_PG_OWNER_PASSWORD@$KW_PG_HOST:$KW_PG_PORT/$kw_db"
NUXT_DATABASE_URL="postgres://$KW_PG_APP:$KW_PG_APP_PASSWORD@$KW_PG_HOST:$KW_PG_PORT/$kw_db"
set +a
