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
