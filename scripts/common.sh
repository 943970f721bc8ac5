#!/usr/bin/env bash
# Shared steps of Gatewell's start and test commands. Sourced, not run.

root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$root"

say() { printf '\033[1m▸ %s\033[0m\n' "$*" >&2; }

# Node packages: install from the lock when node_modules is missing or older than the lock.
ensure_node_modules() {
  if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    say "installing Node packages (npm ci)"
    npm ci --no-audit --no-fund --loglevel=error
  fi
}

# Debian's Chromium for end-to-end tests and screenshots (a browser download cannot work here).
ensure_chromium() {
  [ -x /usr/bin/chromium ] && return
  say "installing Debian's chromium"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq >/dev/null
  apt-get install -y -qq chromium >/dev/null
}

# A session secret for this machine, generated once into the git-ignored .env.local.
ensure_session_secret() {
  if ! grep -q '^SESSION_SECRET=' .env.local 2>/dev/null; then
    say "writing a generated SESSION_SECRET to .env.local"
    printf 'SESSION_SECRET=%s\n' "$(node -e "console.log(require('node:crypto').randomBytes(32).toString('base64url'))")" >>.env.local
  fi
  SESSION_SECRET=$(grep '^SESSION_SECRET=' .env.local | head -n 1 | cut -d= -f2-)
  export SESSION_SECRET
}

migrate() {
  npx sequelize-cli db:migrate >/dev/null
}

seed() {
  npx sequelize-cli db:seed:all >/dev/null
}

# The set-up the two load scripts share (scripts/load-test.sh, scripts/scale-test.sh): PostgreSQL cluster
# $1 on 127.0.0.1:GATEWELL_PG_TEST_PORT (default $2) with the app's URL (DATABASE_URL) and the schema
# owner's (DATABASE_OWNER_URL, for migrations and seeders), the load runs' session secret
# (LOAD_SESSION_SECRET overrides it), the server on 127.0.0.1:$3 (sets `port` and APP_URL), the production
# build in .next-load/ and no mail sender.
load_setup() {
  export GATEWELL_PG_TEST_PORT=${GATEWELL_PG_TEST_PORT:-$2}
  port=$3
  DATABASE_URL=$(bash scripts/pg.sh url "$1")
  DATABASE_OWNER_URL=$(bash scripts/pg.sh owner-url "$1")
  export DATABASE_URL DATABASE_OWNER_URL
  export SESSION_SECRET=${LOAD_SESSION_SECRET:-gatewell-load-secret-0123456789-abcdefghij}
  export APP_URL=http://127.0.0.1:$port
  export GATEWELL_DIST_DIR=.next-load
  export GATEWELL_MAIL_SENDER=off
}

# Answers 0 once GET $APP_URL/api/health says ok (node's fetch: a fresh machine may have no curl).
health_ok() {
  node -e "fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))" "$APP_URL/api/health"
}

# The production build in $GATEWELL_DIST_DIR (log in .var/load-build.log), or the one there with
# GATEWELL_LOAD_REUSE_BUILD=1. Exits 2 when the build fails.
load_build() {
  mkdir -p .var
  if [ -n "${GATEWELL_LOAD_REUSE_BUILD:-}" ] && [ -f "$GATEWELL_DIST_DIR/BUILD_ID" ]; then
    say "reusing the build in $GATEWELL_DIST_DIR/ (GATEWELL_LOAD_REUSE_BUILD)"
    return
  fi
  say "production build into $GATEWELL_DIST_DIR/ (log in .var/load-build.log)"
  # next build adds its dist folder to tsconfig.json's include list; put the file back as it was.
  cp tsconfig.json .var/load-tsconfig.json
  npx next build >.var/load-build.log 2>&1 || { cp .var/load-tsconfig.json tsconfig.json; tail -n 40 .var/load-build.log; say "the build failed"; exit 2; }
  cp .var/load-tsconfig.json tsconfig.json
}

# Waits up to 60 s for a healthy answer from the server of process $1 (its log in $2); exits 2 without one.
wait_healthy() {
  for _ in $(seq 120); do
    health_ok && return
    kill -0 "$1" 2>/dev/null || { tail -n 20 "$2"; say "the server stopped"; exit 2; }
    sleep 0.5
  done
  health_ok || { say "no healthy answer from $APP_URL/api/health within 60 s"; exit 2; }
}
