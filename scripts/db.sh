#!/usr/bin/env bash
# Starts this checkout's own PostgreSQL cluster (Debian's packages) on 127.0.0.1.
# Idempotent: reuses a running or stopped cluster, clears a stale pid file, picks a free port.
# Usage: scripts/db.sh [database-name]   (default: knotwork)
# Writes .data/pg.env with KW_PG_PORT, KW_PG_HOST and the role passwords.
# KW_PG_DIR / KW_PG_ENV (relative to .data/) select another cluster, e.g. the reliability suite's own
# (KW_PG_DIR=pg-reliability KW_PG_ENV=pg-reliability.env), which it may kill without disturbing this one.
# Durability: fsync, synchronous_commit and full_page_writes are always on (flags on the command line, which
# override postgresql.conf and postgresql.auto.conf, and ALTER SYSTEM for a cluster started by hand); a running
# cluster started with any of them off (older versions of this script did) is restarted with them on.
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
data="$root/.data"
pgdata="$data/${KW_PG_DIR:-pg}"
envfile="$data/${KW_PG_ENV:-pg.env}"
dbname="${1:-knotwork}"
log() { printf '[db] %s\n' "$*" >&2; }

find_bin() {
  local d
  for d in /usr/lib/postgresql/*/bin; do [ -x "$d/pg_ctl" ] && { echo "$d"; return; }; done
  return 1
}
bin="$(find_bin || true)"
if [ -z "$bin" ]; then
  log "PostgreSQL binaries missing: installing Debian's postgresql package"
  if [ "$(id -u)" -ne 0 ]; then log "not root: run 'sudo apt-get install -y postgresql' and retry"; exit 1; fi
  DEBIAN_FRONTEND=noninteractive apt-get update -qq >/dev/null
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql >/dev/null
  # Debian starts its own default cluster on 5432; we do not need it.
  command -v pg_ctlcluster >/dev/null && pg_ctlcluster --mode fast "$(ls /usr/lib/postgresql | sort -V | tail -1)" main stop 2>/dev/null || true
  bin="$(find_bin)"
fi

as_pg() {
  if [ "$(id -u)" -eq 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi
}

mkdir -p "$data"
if [ "$(id -u)" -eq 0 ]; then
  # postgres must be able to reach the data folder through the checkout's path
  p="$data"; while [ "$p" != "/" ]; do chmod o+x "$p" 2>/dev/null || true; p="$(dirname "$p")"; done
fi

port_free() { ! (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }
pick_port() {
  local p
  for p in $(seq 54329 54429); do port_free "$p" && { echo "$p"; return; }; done
  log "no free port in 54329..54429"; exit 1
}

[ -f "$envfile" ] && . "$envfile"

if [ ! -f "$pgdata/PG_VERSION" ]; then
  log "initialising a new cluster in $pgdata"
  rm -rf "$pgdata"; mkdir -p "$pgdata"
  [ "$(id -u)" -eq 0 ] && chown postgres:postgres "$pgdata"
  chmod 700 "$pgdata"
  as_pg "$bin/initdb" -D "$pgdata" -U postgres --auth-local=trust --auth-host=scram-sha-256 -E UTF8 --locale=C.UTF-8 >/dev/null
  owner_pw="$(head -c 24 /dev/urandom | base64 | tr -dc 'A-Za-z0-9' | head -c 32)"
  app_pw="$(head -c 24 /dev/urandom | base64 | tr -dc 'A-Za-z0-9' | head -c 32)"
  KW_PG_PORT=""
  cat > "$envfile" <<ENV
KW_PG_HOST=127.0.0.1
KW_PG_PORT=
KW_PG_OWNER=knotwork_owner
KW_PG_OWNER_PASSWORD=$owner_pw
KW_PG_APP=knotwork_app
KW_PG_APP_PASSWORD=$app_pw
ENV
  chmod 600 "$envfile"
  . "$envfile"
fi

running() {
  as_pg "$bin/pg_ctl" -D "$pgdata" status >/dev/null 2>&1 || return 1
  # a postmaster killed a moment ago lingers as a zombie until init reaps it, and pg_ctl still calls that running
  local pid state
  pid="$(head -1 "$pgdata/postmaster.pid" 2>/dev/null || true)"
  state="$(sed 's/^.*) //' "/proc/$pid/stat" 2>/dev/null | cut -d' ' -f1 || true)"
  [ -n "$pid" ] && [ -n "$state" ] && [ "$state" != "Z" ] # gone by now, or a zombie: not running
}
psql_su() { as_pg psql -X -q -v ON_ERROR_STOP=1 -h "$pgdata" -p "$KW_PG_PORT" -U postgres -d postgres "$@"; }

# A commit acknowledged to the app must survive SIGKILL of PostgreSQL (and of the machine): never turn these off.
DURABLE="-c fsync=on -c synchronous_commit=on -c full_page_writes=on"
weak_settings() {
  psql_su -tAc "SELECT string_agg(name || '=' || setting, ', ' ORDER BY name) FROM pg_settings
                WHERE name IN ('fsync', 'synchronous_commit', 'full_page_writes') AND setting <> 'on'"
}

if running && [ -n "$(weak_settings 2>/dev/null || true)" ]; then
  log "cluster runs with $(weak_settings) (acknowledged commits could be lost): restarting it with durability on"
  as_pg "$bin/pg_ctl" -D "$pgdata" -w -t 60 -m fast stop >/dev/null
fi

if ! running; then
  if [ -f "$pgdata/postmaster.pid" ]; then
    log "removing stale pid file (cluster not running)"
    rm -f "$pgdata/postmaster.pid"
  fi
  # The socket's lock file names the old postmaster too; PostgreSQL refuses to start while that pid exists, and a
  # postmaster killed with SIGKILL stays a zombie where nothing reaps orphans (a container whose pid 1 is not init).
  rm -f "$pgdata"/.s.PGSQL.*.lock "$pgdata"/.s.PGSQL.[0-9]*
  if [ -z "${KW_PG_PORT:-}" ] || ! port_free "$KW_PG_PORT"; then
    KW_PG_PORT="$(pick_port)"
    sed -i "s/^KW_PG_PORT=.*/KW_PG_PORT=$KW_PG_PORT/" "$envfile"
  fi
  log "starting PostgreSQL on 127.0.0.1:$KW_PG_PORT"
  as_pg "$bin/pg_ctl" -D "$pgdata" -l "$pgdata/server.log" -w -t 180 start \
    -o "-c listen_addresses=127.0.0.1 -p $KW_PG_PORT -c unix_socket_directories='$pgdata' -c max_connections=200 $DURABLE" >/dev/null \
    || { log "PostgreSQL did not start; the end of $pgdata/server.log:"; tail -n 15 "$pgdata/server.log" >&2; exit 1; }
else
  log "PostgreSQL already running on 127.0.0.1:$KW_PG_PORT"
fi

# Also in postgresql.auto.conf, so a start by hand (pg_ctl without these flags) keeps them; then check what runs.
psql_su -c "ALTER SYSTEM SET fsync = on" -c "ALTER SYSTEM SET synchronous_commit = on" -c "ALTER SYSTEM SET full_page_writes = on" >/dev/null
weak="$(weak_settings)"
if [ -n "$weak" ]; then log "PostgreSQL still runs with $weak: refusing to continue"; exit 1; fi

psql_su <<SQL
DO \$\$ BEGIN
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = '$KW_PG_OWNER') THEN
    CREATE ROLE $KW_PG_OWNER LOGIN PASSWORD '$KW_PG_OWNER_PASSWORD' CREATEDB;
  END IF;
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = '$KW_PG_APP') THEN
    CREATE ROLE $KW_PG_APP LOGIN PASSWORD '$KW_PG_APP_PASSWORD';
  END IF;
END \$\$;
SQL

create_db() {
  local name="$1"
  if [ -z "$(psql_su -tAc "SELECT 1 FROM pg_database WHERE datname = '$name'")" ]; then
    log "creating database $name"
    psql_su -c "CREATE DATABASE \"$name\" OWNER $KW_PG_OWNER"
  fi
  psql_su -d "$name" -c "REVOKE ALL ON SCHEMA public FROM PUBLIC; GRANT USAGE ON SCHEMA public TO $KW_PG_APP; ALTER SCHEMA public OWNER TO $KW_PG_OWNER;" >/dev/null
}

drop_db() {
  psql_su -c "DROP DATABASE IF EXISTS \"$1\" WITH (FORCE)"
}

case "${KW_DB_ACTION:-create}" in
  create) create_db "$dbname" ;;
  drop) drop_db "$dbname" ;;
esac
