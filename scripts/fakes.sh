#!/usr/bin/env bash
# Starts this checkout's local fakes on 127.0.0.1: fake Stripe (fakes/stripe) and fake SMTP + inbox (fakes/smtp).
# Usage: scripts/fakes.sh [start|stop|status|reset]     (default: start)
# start: reuses fakes of this checkout that are alive and answer GET /_health, otherwise starts them on free ports
#        (the previous ports when still free), then writes .data/fakes.env. Logs: .data/fakes/*.log.
#        The webhook target is KW_APP_WEBHOOK_URL (default http://127.0.0.1:3000/api/webhooks/stripe); a running
#        fake Stripe with another target is restarted (its state is kept in .data/fakes/stripe-state.json).
# reset: empties the fake Stripe state and the inbox.
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd -P)"
data="$root/.data"
# KW_FAKES_DIR (relative to the checkout or absolute) keeps a separate set, e.g. for npm test
case "${KW_FAKES_DIR:-}" in
  "") dir="$data/fakes"; envfile="$data/fakes.env" ;;
  /*) dir="$KW_FAKES_DIR"; envfile="$dir/fakes.env" ;;
  *) dir="$root/$KW_FAKES_DIR"; envfile="$dir/fakes.env" ;;
esac
cmd="${1:-start}"
webhook_url="${KW_APP_WEBHOOK_URL:-http://127.0.0.1:3000/api/webhooks/stripe}"
log() { printf '[fakes] %s\n' "$*" >&2; }

mkdir -p "$dir" 2>/dev/null || { log "cannot create $dir (owned by another user? $(stat -c %U "$data" 2>/dev/null))"; exit 1; }
[ -w "$dir" ] || { log "$dir is not writable by $(id -un); fix its owner or run as its owner"; exit 1; }
if command -v flock >/dev/null; then exec 9>"$dir/.lock"; flock -w 60 9; fi

# pid of a fake of this checkout, or nothing: the pid file's process must still run this checkout's server file.
live_pid() {
  local name="$1" pid
  pid="$(cat "$dir/$name.pid" 2>/dev/null || true)"
  [ -n "$pid" ] && kill -0 "$pid" 2>/dev/null || return 0
  tr '\0' ' ' < "/proc/$pid/cmdline" 2>/dev/null | grep -q "fakes/$name/server.ts" || return 0
  [ "$(readlink "/proc/$pid/cwd" 2>/dev/null)" = "$root" ] && echo "$pid"
  return 0
}

healthy() { # port pid
  local body
  body="$(curl -fsS --max-time 2 "http://127.0.0.1:$1/_health" 2>/dev/null || true)"
  [[ "$body" == *"\"pid\":$2"* ]]
}

port_free() { ! (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }
reuse_port() { if [ -n "${1:-}" ] && port_free "$1"; then echo "$1"; else echo 0; fi; }

stop_one() {
  local name="$1" pid
  pid="$(live_pid "$name")"
  if [ -n "$pid" ]; then
    kill -TERM "$pid" 2>/dev/null || true
    for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
    kill -0 "$pid" 2>/dev/null && kill -KILL "$pid" 2>/dev/null || true
    log "stopped $name (pid $pid)"
  fi
  rm -f "$dir/$name.pid"
}

launch() { # name, then env assignments
  local name="$1"; shift
  [ -f "$root/node_modules/tsx/package.json" ] || { log "node_modules/tsx missing: run 'npm ci' first"; exit 1; }
  rm -f "$dir/$name.ports"
  ( cd "$root" && exec 9>&- && exec env "$@" setsid node --import tsx "fakes/$name/server.ts" >>"$dir/$name.log" 2>&1 </dev/null ) &
  echo $! > "$dir/$name.pid"
  for _ in $(seq 1 200); do
    [ -s "$dir/$name.ports" ] && return 0
    kill -0 "$(cat "$dir/$name.pid")" 2>/dev/null || break
    sleep 0.1
  done
  log "$name did not start; last log lines:"; tail -n 20 "$dir/$name.log" >&2; exit 1
}

start_stripe() {
  local pid port secret
  [ -s "$dir/stripe.webhook-secret" ] || printf 'whsec_%s\n' "$(od -An -N24 -tx1 /dev/urandom | tr -d ' \n')" > "$dir/stripe.webhook-secret"
  secret="$(cat "$dir/stripe.webhook-secret")"
  pid="$(live_pid stripe)"
  port="$(cat "$dir/stripe.ports" 2>/dev/null || true)"
  if [ -n "$pid" ] && healthy "$port" "$pid" && [ "$(cat "$dir/stripe.webhook-url" 2>/dev/null)" = "$webhook_url" ]; then
    log "fake Stripe already running (pid $pid, port $port)"
  else
    stop_one stripe
    launch stripe FAKE_STRIPE_PORT="$(reuse_port "$port")" FAKE_STRIPE_PORT_FILE="$dir/stripe.ports" \
      FAKE_STRIPE_STATE="$dir/stripe-state.json" FAKE_STRIPE_WEBHOOK_URL="$webhook_url" FAKE_STRIPE_WEBHOOK_SECRET="$secret"
    echo "$webhook_url" > "$dir/stripe.webhook-url"
    port="$(cat "$dir/stripe.ports")"
    log "fake Stripe on 127.0.0.1:$port (webhooks → $webhook_url)"
  fi
  STRIPE_PORT="$port"; STRIPE_SECRET="$secret"
}

start_smtp() {
  local pid ports smtp http
  pid="$(live_pid smtp)"
  ports="$(cat "$dir/smtp.ports" 2>/dev/null || true)"
  smtp="$(sed -n 's/.*"smtp":\([0-9]*\).*/\1/p' <<<"$ports")"; http="$(sed -n 's/.*"http":\([0-9]*\).*/\1/p' <<<"$ports")"
  if [ -n "$pid" ] && [ -n "$http" ] && healthy "$http" "$pid"; then
    log "fake SMTP already running (pid $pid, smtp $smtp, inbox $http)"
  else
    stop_one smtp
    launch smtp FAKE_SMTP_PORT="$(reuse_port "$smtp")" FAKE_SMTP_HTTP_PORT="$(reuse_port "$http")" \
      FAKE_SMTP_PORT_FILE="$dir/smtp.ports" FAKE_SMTP_STORE="$dir/mail.jsonl"
    ports="$(cat "$dir/smtp.ports")"
    smtp="$(sed -n 's/.*"smtp":\([0-9]*\).*/\1/p' <<<"$ports")"; http="$(sed -n 's/.*"http":\([0-9]*\).*/\1/p' <<<"$ports")"
    log "fake SMTP on 127.0.0.1:$smtp, inbox http://127.0.0.1:$http/"
  fi
  SMTP_PORT="$smtp"; INBOX_PORT="$http"
}

case "$cmd" in
  start)
    start_stripe
    start_smtp
    cat > "$envfile.tmp" <<ENV
KW_STRIPE_HOST=127.0.0.1
KW_STRIPE_PORT=$STRIPE_PORT
KW_STRIPE_PROTOCOL=http
KW_STRIPE_SECRET_KEY=sk_test_knotwork_local
KW_STRIPE_WEBHOOK_SECRET=$STRIPE_SECRET
KW_STRIPE_HOSTED_URL=http://127.0.0.1:$STRIPE_PORT
KW_SMTP_HOST=127.0.0.1
KW_SMTP_PORT=$SMTP_PORT
KW_MAIL_INBOX_URL=http://127.0.0.1:$INBOX_PORT/
ENV
    mv "$envfile.tmp" "$envfile"
    log "wrote $envfile"
    ;;
  stop) stop_one stripe; stop_one smtp; rm -f "$envfile" ;;
  status)
    for n in stripe smtp; do p="$(live_pid "$n")"; if [ -n "$p" ]; then echo "$n: running (pid $p)"; else echo "$n: stopped"; fi; done
    if [ -f "$envfile" ]; then cat "$envfile"; fi
    ;;
  reset)
    [ -f "$envfile" ] || { log "no $envfile: start the fakes first"; exit 1; }
    . "$envfile"
    curl -fsS -X POST "http://127.0.0.1:$KW_STRIPE_PORT/_test/reset" >/dev/null && log "fake Stripe state emptied"
    curl -fsS -X DELETE "${KW_MAIL_INBOX_URL}messages" >/dev/null && log "inbox emptied"
    ;;
  *) log "usage: scripts/fakes.sh [start|stop|status|reset]"; exit 2 ;;
esac
