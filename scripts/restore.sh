#!/usr/bin/env bash
# Gatewell restore: loads a dump made by scripts/backup.sh into a named database, in one transaction.
# Usage: scripts/restore.sh FILE DATABASE [dev|test|test-NAME] [--replace]
#   Creates DATABASE when missing (owned by the schema's owner: the URL's user, or gatewell_owner in the
#   project cluster). Refuses a database that already holds tables unless --replace is given, which drops
#   and re-creates it first. Connects like scripts/backup.sh: DATABASE_OWNER_URL's (else DATABASE_URL's)
#   server and user when set, else the instance's cluster (default dev).
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/pg-connect.sh"

instance=dev
replace=false
args=()
while [ $# -gt 0 ]; do
  case "$1" in
    --replace) replace=true; shift ;;
    -h | --help) sed -n '2,7p' "$0"; exit 0 ;;
    -*) echo "restore.sh: unknown option '$1'" >&2; exit 2 ;;
    *) args+=("$1"); shift ;;
  esac
done
[ ${#args[@]} -ge 2 ] || { echo "usage: scripts/restore.sh FILE DATABASE [dev|test|test-NAME] [--replace]" >&2; exit 2; }
file=${args[0]}
target=${args[1]}
[ ${#args[@]} -ge 3 ] && instance=${args[2]}
[ -f "$file" ] || { echo "restore.sh: no such file: $file" >&2; exit 1; }
[[ "$target" =~ ^[a-z_][a-z0-9_]*$ ]] || { echo "restore.sh: database name must be lower-case letters, digits and _: '$target'" >&2; exit 2; }
[ "$(head -c 5 "$file")" = PGDMP ] || { echo "restore.sh: $file is not a pg_dump custom-format file" >&2; exit 1; }

pick_connection "$instance"
owner=$( [ "$conn_mode" = url ] && node -e 'console.log(decodeURIComponent(new URL(process.argv[1]).username))' "$conn_url" || echo gatewell_owner )
exists=$(pg_sql postgres "select 1 from pg_database where datname = '$target'")
if [ "$exists" = 1 ]; then
  relations=$(pg_sql "$target" "select count(*) from pg_class c join pg_namespace n on n.oid = c.relnamespace
    where n.nspname not in ('pg_catalog', 'information_schema') and n.nspname not like 'pg_toast%' and c.relkind in ('r', 'p', 'v', 'm', 'S')")
  if [ "$relations" != 0 ]; then
    if [ "$replace" != true ]; then
      echo "restore.sh: database $target is not empty ($relations tables, views or sequences); nothing was changed. Add --replace to drop and re-create it." >&2
      exit 1
    fi
    echo "restore.sh: dropping and re-creating $target (--replace)" >&2
    pg_sql postgres "drop database \"$target\" with (force)"
    exists=
  fi
fi
[ "$exists" = 1 ] || pg_sql postgres "create database \"$target\" owner \"$owner\""
# One transaction: a dump that fails half-way leaves the database as empty as it was.
pg_tool pg_restore "$target" --single-transaction --exit-on-error --no-password <"$file"
echo "restored $file into $target" >&2
