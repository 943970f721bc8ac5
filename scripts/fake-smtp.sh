#!/usr/bin/env bash
# Gatewell's fake SMTP server for development and tests, one per purpose like scripts/pg.sh: listens on
# 127.0.0.1 only and keeps every message as JSON in .var/fake-smtp/<instance>/messages (delivers none).
# Usage: scripts/fake-smtp.sh start|stop|status|clear|port|dir [dev|test|test-NAME]
# Ports: dev GATEWELL_SMTP_PORT (2525, lib/env.ts's default); test instances GATEWELL_SMTP_TEST_PORT,
# by default GATEWELL_E2E_PORT + 20000, so that side-by-side test runs never share a server.
# Idempotent: start on a running server does nothing; a stale pid file is removed.
set -euo pipefail

cmd=${1:-start}
instance=${2:-dev}
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
case "$instance" in
  dev) port=${GATEWELL_SMTP_PORT:-2525} ;;
  test | test-*) port=${GATEWELL_SMTP_TEST_PORT:-$((${GATEWELL_E2E_PORT:-4311} + 20000))} ;;
  *) echo "fake-smtp.sh: unknown instance '$instance' (dev, test or test-NAME)" >&2; exit 2 ;;
esac
dir="$root/.var/fake-smtp/$instance"
pidfile="$dir/server.pid"

log() { printf 'fake-smtp.sh[%s]: %s\n' "$instance" "$*" >&2; }

pid_alive() { [ -f "$pidfile" ] && kill -0 "$(cat "$pidfile")" 2>/dev/null; }

# The greeting line of whatever listens on the port, or nothing.
banner() { timeout 3 bash -c "exec 3<>/dev/tcp/127.0.0.1/$port && head -n 1 <&3" 2>/dev/null || true; }

start() {
  mkdir -p "$dir/messages"
  if pid_alive && banner | grep -q 'Gatewell fake SMTP'; then
    log "already running on 127.0.0.1:$port"; return
  fi
  [ -f "$pidfile" ] && { log "removing stale pid file"; rm -f "$pidfile"; }
  if [ -n "$(banner)" ]; then
    log "127.0.0.1:$port is taken by another server; set GATEWELL_SMTP_PORT or GATEWELL_SMTP_TEST_PORT"; exit 1
  fi
  cd "$root"
  setsid nohup node --import tsx scripts/fake-smtp/server.ts --port "$port" --dir "$dir" >"$dir/server.log" 2>&1 </dev/null &
  echo $! >"$pidfile"
  for _ in $(seq 1 60); do
    banner | grep -q 'Gatewell fake SMTP' && { log "started on 127.0.0.1:$port"; return; }
    pid_alive || break
    sleep 0.25
  done
  log "did not start; see $dir/server.log"; tail -n 20 "$dir/server.log" >&2; exit 1
}

stop() {
  if pid_alive; then kill "$(cat "$pidfile")"; rm -f "$pidfile"; log "stopped"; else log "not running"; fi
}

case "$cmd" in
  start) start ;;
  stop) stop ;;
  status) if pid_alive; then echo running; else echo stopped; exit 3; fi ;;
  clear) mkdir -p "$dir/messages" && find "$dir/messages" -name '*.json' -delete && log "messages cleared" ;;
  port) echo "$port" ;;
  dir) echo "$dir" ;;
  *) echo "fake-smtp.sh: unknown command '$cmd' (start, stop, status, clear, port, dir)" >&2; exit 2 ;;
esac
