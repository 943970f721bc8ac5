#!/usr/bin/env bash
# Every Gatewell test on a fresh machine: installs what is missing, starts its own PostgreSQL test
# clusters, then Prettier's check, lint (with the boundary rules), type check, Vitest (unit +
# integration on the real database) and Playwright (end-to-end in Debian's Chromium against a
# production build). Ends with "N passed, N failed".
#
# Vitest and the end-to-end tests run side by side, each with its own PostgreSQL cluster and fake SMTP
# server: Vitest on cluster "test" (GATEWELL_PG_TEST_PORT, 54331), Playwright on "test-e2e" (the next
# port). Their fault tests stop and restart their own cluster only. GATEWELL_TEST_SERIAL=1 runs them one
# after the other instead (Vitest's output then shows as it runs rather than after Playwright's).
set -uo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
set -e

ensure_node_modules
ensure_chromium
instance=${GATEWELL_TEST_INSTANCE:-test}
e2e_instance=$instance-e2e
vitest_pg_port=${GATEWELL_PG_TEST_PORT:-54331}
e2e_pg_port=${GATEWELL_PG_E2E_PORT:-$((vitest_pg_port + 1))}
export SESSION_SECRET=${TEST_SESSION_SECRET:-gatewell-test-secret-0123456789-abcdefghij}
export GATEWELL_E2E_PORT=${GATEWELL_E2E_PORT:-4311}
export APP_URL=http://127.0.0.1:$GATEWELL_E2E_PORT
export GATEWELL_DIST_DIR=${GATEWELL_DIST_DIR:-.next-test}
export SMTP_HOST=127.0.0.1 SMTP_SECURE=false
smtp_base=${GATEWELL_SMTP_TEST_PORT:-$((GATEWELL_E2E_PORT + 20000))}

# The environment of one side: its instance (cluster and fake SMTP server), PostgreSQL port and SMTP port.
# Mail goes to that side's own fake SMTP server; the app connects as its own role, migrations and seeders
# run as the schema's owner (scripts/pg.sh).
use_side() {
  export GATEWELL_TEST_INSTANCE=$1 GATEWELL_PG_TEST_PORT=$2 GATEWELL_SMTP_TEST_PORT=$3 SMTP_PORT=$3
  DATABASE_URL=$(bash scripts/pg.sh url "$1")
  DATABASE_OWNER_URL=$(bash scripts/pg.sh owner-url "$1")
  FAKE_SMTP_DIR=$(bash scripts/fake-smtp.sh dir "$1")
  export DATABASE_URL DATABASE_OWNER_URL FAKE_SMTP_DIR
}
start_side() {
  use_side "$@"
  bash scripts/pg.sh reset "$1"
  bash scripts/fake-smtp.sh start "$1"
  bash scripts/fake-smtp.sh clear "$1"
}
start_side "$e2e_instance" "$e2e_pg_port" "$((smtp_base + 1))"
start_side "$instance" "$vitest_pg_port" "$smtp_base"
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

end_to_end() {
  use_side "$e2e_instance" "$e2e_pg_port" "$((smtp_base + 1))"
  # End-to-end tests start from a fresh database with the demo data.
  step "the end-to-end database with the demo data" bash -c 'npx sequelize-cli db:migrate >/dev/null && npx sequelize-cli db:seed:all >/dev/null'
  wait "$build_pid"
  step "production build (finished)" bash -c '[ "$(cat test-output/build.status 2>/dev/null)" = 0 ] || { tail -n 40 test-output/build.log; exit 1; }'
  step "end-to-end tests (playwright)" npx playwright test
}

if [ -n "${GATEWELL_TEST_SERIAL:-}" ]; then
  step "unit and integration tests (vitest)" npx vitest run
  end_to_end
else
  say "unit and integration tests (vitest) beside the build and the end-to-end tests (output in test-output/vitest.log)"
  (npx vitest run >test-output/vitest.log 2>&1; echo $? >test-output/vitest.status) &
  vitest_pid=$!
  # The job worker at normal priority: in the idle class it would wait for Vitest's CPU (playwright.config.ts).
  GATEWELL_E2E_WORKER_ARGS='--scheduling nice --nice 0' end_to_end
  wait "$vitest_pid"
  say "unit and integration tests (vitest), its output:"
  cat test-output/vitest.log
  step "unit and integration tests (vitest)" bash -c '[ "$(cat test-output/vitest.status 2>/dev/null)" = 0 ]'
fi

[ ${#failed_steps[@]} -eq 0 ] || printf 'failed steps: %s\n' "${failed_steps[*]}"
node scripts/test-summary.mjs "${failed_steps[@]}"
exit $status
