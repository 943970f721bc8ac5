#!/usr/bin/env bash
# Gatewell's load test from one command on a fresh machine: its own PostgreSQL cluster (test-load on
# 127.0.0.1:54340) with a fresh database and the demo data, a production build in .next-load/, scripts/serve.mjs
# on 127.0.0.1:4340 (GATEWELL_WEB_PROCESSES web processes, default one per core) without the mail sender and a job worker process beside it, then scripts/load-test.ts; the server and the cluster are
# stopped afterwards. Arguments go to the load test, e.g. `bash scripts/load-test.sh --report-only`.
# GATEWELL_LOAD_REUSE_BUILD=1 serves the build already in .next-load/ instead of building again.
# Exits with the load test's status: 0 targets met, 1 missed, 2 could not run.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"

instance=test-load
export GATEWELL_PG_TEST_PORT=${GATEWELL_PG_TEST_PORT:-54340}
port=${GATEWELL_LOAD_PORT:-4340}
# The app connects as its own role; migrations and seeders run as the schema's owner (scripts/pg.sh).
DATABASE_URL=$(bash scripts/pg.sh url "$instance")
DATABASE_OWNER_URL=$(bash scripts/pg.sh owner-url "$instance")
export DATABASE_URL DATABASE_OWNER_URL
export SESSION_SECRET=${LOAD_SESSION_SECRET:-gatewell-load-secret-0123456789-abcdefghij}
export APP_URL=http://127.0.0.1:$port
export GATEWELL_DIST_DIR=.next-load
export GATEWELL_MAIL_SENDER=off

server_pid=
worker_pid=
stop_all() {
  if [ -n "$server_pid" ] && kill -0 "$server_pid" 2>/dev/null; then
    say "stopping the server"
    kill "$server_pid" 2>/dev/null || true
    wait "$server_pid" 2>/dev/null || true
  fi
  if [ -n "$worker_pid" ] && kill -0 "$worker_pid" 2>/dev/null; then
    kill "$worker_pid" 2>/dev/null || true
    wait "$worker_pid" 2>/dev/null || true
  fi
  bash scripts/pg.sh stop "$instance" || true
}
trap stop_all EXIT

# Answers 0 once GET /api/health says ok (node's fetch: a fresh machine may have no curl).
health_ok() {
  node -e "fetch(process.argv[1]).then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))" "$APP_URL/api/health"
}

ensure_node_modules
if health_ok; then
  say "something already answers on $APP_URL; stop it first"
  exit 2
fi

say "PostgreSQL $instance on 127.0.0.1:$GATEWELL_PG_TEST_PORT with a fresh database"
bash scripts/pg.sh reset "$instance"
say "migrating and seeding the demo data"
migrate
seed
# The servers get the app's role only.
unset DATABASE_OWNER_URL

mkdir -p .var
if [ -n "${GATEWELL_LOAD_REUSE_BUILD:-}" ] && [ -f "$GATEWELL_DIST_DIR/BUILD_ID" ]; then
  say "reusing the build in $GATEWELL_DIST_DIR/ (GATEWELL_LOAD_REUSE_BUILD)"
else
  say "production build into $GATEWELL_DIST_DIR/ (log in .var/load-build.log)"
  # next build adds its dist folder to tsconfig.json's include list; put the file back as it was.
  cp tsconfig.json .var/load-tsconfig.json
  npx next build >.var/load-build.log 2>&1 || { cp .var/load-tsconfig.json tsconfig.json; tail -n 40 .var/load-build.log; say "the build failed"; exit 2; }
  cp .var/load-tsconfig.json tsconfig.json
fi

# The team topology (docs/operations.md, "Topology"): the web server only enqueues fits and forecasts, and one
# worker process takes them (GATEWELL_LOAD_WORKERS=0 leaves the jobs to the web server instead).
if [ "${GATEWELL_LOAD_WORKERS:-1}" -gt 0 ]; then
  export GATEWELL_JOB_WORKER=off
  say "starting a job worker (log in .var/load-worker.log)"
  node --conditions=react-server --import tsx scripts/worker.ts ${GATEWELL_LOAD_WORKER_NICE:+--nice "$GATEWELL_LOAD_WORKER_NICE"} ${GATEWELL_LOAD_WORKER_SCHEDULING:+--scheduling "$GATEWELL_LOAD_WORKER_SCHEDULING"} >.var/load-worker.log 2>&1 &
  worker_pid=$!
fi
processes=${GATEWELL_WEB_PROCESSES:-$(nproc 2>/dev/null || echo 1)}
say "serving on $APP_URL with $processes web process(es) (log in .var/load-server.log)"
node scripts/serve.mjs --port "$port" --hostname 127.0.0.1 --processes "$processes" >.var/load-server.log 2>&1 &
server_pid=$!
for _ in $(seq 120); do
  health_ok && break
  kill -0 "$server_pid" 2>/dev/null || { tail -n 20 .var/load-server.log; say "the server stopped"; exit 2; }
  sleep 0.5
done
health_ok || { say "no healthy answer from $APP_URL/api/health within 60 s"; exit 2; }

set +e
node --import tsx scripts/load-test.ts --url "$APP_URL" --server-pid "$server_pid" ${worker_pid:+--worker-pid "$worker_pid"} "$@"
status=$?
set -e
exit $status
