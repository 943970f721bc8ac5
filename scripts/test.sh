#!/usr/bin/env bash
# Every Gatewell test on a fresh machine: installs what is missing, starts its own PostgreSQL test
# cluster, then Prettier's check, lint (with the boundary rules), type check, Vitest (unit +
# integration on the real database) and Playwright (end-to-end in Debian's Chromium against a
# production build). Ends with "N passed, N failed".
set -uo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
set -e

ensure_node_modules
ensure_chromium
instance=${GATEWELL_TEST_INSTANCE:-test}
export instance
bash scripts/pg.sh reset "$instance"
# The app connects as its own role; migrations and seeders run as the schema's owner (scripts/pg.sh).
DATABASE_URL=$(bash scripts/pg.sh url "$instance")
DATABASE_OWNER_URL=$(bash scripts/pg.sh owner-url "$instance")
export DATABASE_URL DATABASE_OWNER_URL
export SESSION_SECRET=${TEST_SESSION_SECRET:-gatewell-test-secret-0123456789-abcdefghij}
export GATEWELL_E2E_PORT=${GATEWELL_E2E_PORT:-4311}
export APP_URL=http://127.0.0.1:$GATEWELL_E2E_PORT
export GATEWELL_DIST_DIR=${GATEWELL_DIST_DIR:-.next-test}
# Mail goes to this run's own fake SMTP server (port GATEWELL_SMTP_TEST_PORT, by default the e2e port + 20000).
export GATEWELL_SMTP_TEST_PORT=${GATEWELL_SMTP_TEST_PORT:-$((GATEWELL_E2E_PORT + 20000))}
export SMTP_HOST=127.0.0.1 SMTP_PORT=$GATEWELL_SMTP_TEST_PORT SMTP_SECURE=false
FAKE_SMTP_DIR=$(bash scripts/fake-smtp.sh dir "$instance")
export FAKE_SMTP_DIR
bash scripts/fake-smtp.sh start "$instance"
bash scripts/fake-smtp.sh clear "$instance"
set +e

rm -rf test-output && mkdir -p test-output/screenshots
status=0
failed_steps=()
# Each step is announced with the minutes and seconds since the run began, so slow steps show.
step() {
  local name=$1; shift
  say "$name ($((SECONDS / 60))m$((SECONDS % 60))s)"
  "$@" || { status=1; failed_steps+=("$name"); say "FAILED: $name"; }
}

step "format (prettier --check)" npx prettier --check . --log-level warn
step "lint (eslint, boundary rules)" npx eslint . --max-warnings=0
step "type check (tsc)" npx tsc --noEmit -p .
step "migrating the test database" migrate

# The production build reads no database (every route is dynamic), so it runs beside Vitest, which runs
# one test file at a time and leaves the second core mostly idle; its result is checked before Playwright.
say "production build, beside vitest (output in test-output/build.log)"
(npx next build >test-output/build.log 2>&1; echo $? >test-output/build.status) &
build_pid=$!
step "unit and integration tests (vitest)" npx vitest run

# End-to-end tests start from a fresh database with the demo data.
step "resetting the test database for end-to-end tests" bash -c 'bash scripts/pg.sh reset "$instance" && npx sequelize-cli db:migrate >/dev/null && npx sequelize-cli db:seed:all >/dev/null'
wait "$build_pid"
step "production build (finished)" bash -c '[ "$(cat test-output/build.status 2>/dev/null)" = 0 ] || { tail -n 40 test-output/build.log; exit 1; }'
step "end-to-end tests (playwright)" npx playwright test

[ ${#failed_steps[@]} -eq 0 ] || printf 'failed steps: %s\n' "${failed_steps[*]}"
node scripts/test-summary.mjs "${failed_steps[@]}"
exit $status
