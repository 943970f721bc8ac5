#!/usr/bin/env bash
# Gatewell with demo data on http://127.0.0.1:4310 — installs what is missing, starts PostgreSQL,
# migrates, seeds, builds and serves. Safe to run again.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"

ensure_node_modules
ensure_session_secret
bash scripts/pg.sh start dev
# Without SMTP settings of its own, the demo sends its mail to the local fake SMTP server (kept in .var/fake-smtp/dev).
if [ -z "${SMTP_HOST:-}" ]; then
  bash scripts/fake-smtp.sh start dev
  SMTP_PORT=$(bash scripts/fake-smtp.sh port dev)
  export SMTP_PORT
fi
# The app connects as its own role; migrations and seeders run as the schema's owner (scripts/pg.sh).
DATABASE_URL=$(bash scripts/pg.sh url dev)
DATABASE_OWNER_URL=$(bash scripts/pg.sh owner-url dev)
export DATABASE_URL DATABASE_OWNER_URL
export PORT=${PORT:-4310}
export APP_URL=${APP_URL:-http://127.0.0.1:$PORT}

say "migrating and seeding the demo database"
migrate
seed
# The servers get the app's role only.
unset DATABASE_OWNER_URL

say "building"
mkdir -p .var
npx next build >.var/build.log 2>&1 || { tail -n 40 .var/build.log; say "the build failed; the whole log is in .var/build.log"; exit 1; }

# scripts/serve.mjs serves the build with one web process per core (at most 4; GATEWELL_WEB_PROCESSES=N
# sets another number), all on the one port.
# Fits and forecasts are jobs on the queue in PostgreSQL. By default the web server takes them itself;
# GATEWELL_WORKERS=N starts N separate worker processes instead (logs in .var/worker-N.log), as a
# team install runs them on other machines (docs/operations.md, "Topology").
workers=${GATEWELL_WORKERS:-0}
if [ "$workers" -gt 0 ] 2>/dev/null; then
  export GATEWELL_JOB_WORKER=off
  for i in $(seq "$workers"); do
    node --conditions=react-server --import tsx scripts/worker.ts >".var/worker-$i.log" 2>&1 &
  done
  trap 'kill $(jobs -p) 2>/dev/null || true' EXIT INT TERM
  say "serving Gatewell on $APP_URL with $workers worker process(es) (Ctrl-C stops them; PostgreSQL keeps running: scripts/pg.sh stop dev)"
  node scripts/serve.mjs --port "$PORT" --hostname 127.0.0.1
  exit $?
fi

say "serving Gatewell on $APP_URL (Ctrl-C stops it; PostgreSQL keeps running: scripts/pg.sh stop dev)"
exec node scripts/serve.mjs --port "$PORT" --hostname 127.0.0.1
