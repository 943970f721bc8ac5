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
# The app connects as its own role; migrations and seeders run as the schema's owner (scripts/pg.sh).
load_setup "$instance" 54340 "${GATEWELL_LOAD_PORT:-4340}"

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

load_build

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
wait_healthy "$server_pid" .var/load-server.log

set +e
node --import tsx scripts/load-test.ts --url "$APP_URL" --server-pid "$server_pid" ${worker_pid:+--worker-pid "$worker_pid"} "$@"
status=$?
set -e
exit $status
