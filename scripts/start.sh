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
DATABASE_URL=$(bash scripts/pg.sh url dev)
export DATABASE_URL
export PORT=${PORT:-4310}
export APP_URL=${APP_URL:-http://127.0.0.1:$PORT}

say "migrating and seeding the demo database"
migrate
seed

say "building"
mkdir -p .var
npx next build >.var/build.log 2>&1 || { tail -n 40 .var/build.log; say "the build failed; the whole log is in .var/build.log"; exit 1; }

say "serving Gatewell on $APP_URL (Ctrl-C stops it; PostgreSQL keeps running: scripts/pg.sh stop dev)"
exec npx next start --port "$PORT" --hostname 127.0.0.1
