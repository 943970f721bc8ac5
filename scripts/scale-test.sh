#!/usr/bin/env bash
# A year of data, from one command: its own PostgreSQL cluster (test-year on 127.0.0.1:54590, override with
# GATEWELL_PG_TEST_PORT) with a fresh database, migrated, the demo users seeded, then filled by
# scripts/scale-fill.ts (5,000 plates of 384 wells by default; its options through GATEWELL_SCALE_FILL_ARGS,
# e.g. "--plates 500"); a production build in .next-load/ (GATEWELL_LOAD_REUSE_BUILD=1 serves the one there);
# scripts/serve.mjs on 127.0.0.1:4350 with one web process per core, no mail sender and no job worker; then
# scripts/load-test.ts with 50 readers signed in as the accounts that may read everything (admin, approvers),
# walking plates, compound profiles, the audit trail and later plate-list pages, and no imports.
# Arguments go to the load test. The server and the cluster are stopped afterwards, and the cluster's data
# folder removed unless GATEWELL_SCALE_KEEP=1; GATEWELL_SCALE_REUSE_DATA=1 skips reset and fill and reads
# the data kept by an earlier run. Exits with the load test's status: 0 targets met, 1 missed, 2 could not run.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"

instance=test-year
load_setup "$instance" 54590 "${GATEWELL_SCALE_PORT:-4350}"
export GATEWELL_JOB_WORKER=off
probes=.var/scale/probes.json

server_pid=
stop_all() {
  if [ -n "$server_pid" ] && kill -0 "$server_pid" 2>/dev/null; then
    say "stopping the server"
    kill "$server_pid" 2>/dev/null || true
    wait "$server_pid" 2>/dev/null || true
  fi
  bash scripts/pg.sh stop "$instance" || true
  if [ -z "${GATEWELL_SCALE_KEEP:-}" ]; then
    say "removing the scale cluster's data (.pgdata/$instance; GATEWELL_SCALE_KEEP=1 keeps it)"
    rm -rf ".pgdata/$instance"
  fi
}
trap stop_all EXIT

ensure_node_modules
if health_ok; then
  say "something already answers on $APP_URL; stop it first"
  exit 2
fi
mkdir -p .var/scale

if [ -n "${GATEWELL_SCALE_REUSE_DATA:-}" ] && [ -f "$probes" ]; then
  say "reusing the filled database of $instance (GATEWELL_SCALE_REUSE_DATA)"
  bash scripts/pg.sh start "$instance"
  migrate
else
  say "PostgreSQL $instance on 127.0.0.1:$GATEWELL_PG_TEST_PORT with a fresh database ($(df -h --output=avail . | tail -n 1 | tr -d ' ') free on this disk)"
  bash scripts/pg.sh reset "$instance"
  say "migrating and seeding the demo users"
  migrate
  npx sequelize-cli db:seed --seed 20261201000100-demo-users.js >/dev/null
  say "filling (log in .var/scale/fill.log)"
  # The fill writes as the app's role: every grant, trigger and constraint the app meets holds for it too.
  # shellcheck disable=SC2086
  env -u DATABASE_OWNER_URL node --conditions=react-server --import tsx scripts/scale-fill.ts --probes "$probes" ${GATEWELL_SCALE_FILL_ARGS:-} | tee .var/scale/fill.log
fi
# A database a year old has been vacuumed and analysed by autovacuum; the owner does it now (the app's role may not).
say "vacuum and analyse as the owner"
/usr/lib/postgresql/15/bin/psql "$DATABASE_OWNER_URL" -qc 'vacuum (analyze)'
unset DATABASE_OWNER_URL

load_build

processes=${GATEWELL_WEB_PROCESSES:-$(nproc 2>/dev/null || echo 1)}
say "serving on $APP_URL with $processes web process(es) (log in .var/scale/server.log)"
node scripts/serve.mjs --port "$port" --hostname 127.0.0.1 --processes "$processes" >.var/scale/server.log 2>&1 &
server_pid=$!
wait_healthy "$server_pid" .var/scale/server.log

# PostgreSQL's CPU too: the postmaster of this cluster and its backends (the first line of its pid file).
db_pid=$(head -n 1 ".pgdata/$instance/postmaster.pid" 2>/dev/null || true)
set +e
node --import tsx scripts/load-test.ts --url "$APP_URL" --server-pid "$server_pid" ${db_pid:+--db-pid "$db_pid"} --readers 50 --importers 0 \
  --plates 20 --probes "$probes" --reader-accounts admin,approver,approver2 "$@"
status=$?
set -e
exit $status
