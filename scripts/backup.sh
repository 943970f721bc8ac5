#!/usr/bin/env bash
# Gatewell backup: a pg_dump of the database in PostgreSQL's custom format, named with the time (UTC).
# Usage: scripts/backup.sh [dev|test|test-NAME] [--out FILE]
#   Without DATABASE_OWNER_URL or DATABASE_URL, dumps the project cluster of that instance (default dev)
#   as the postgres user; with one, dumps that database as its user (the owner's first). Writes
#   .var/backups/<database>-<time>.dump unless --out says otherwise, and prints the file's path.
#   Restore with scripts/restore.sh.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/pg-connect.sh"

instance=dev
out=
while [ $# -gt 0 ]; do
  case "$1" in
    --out) out=${2:?--out needs a file}; shift 2 ;;
    -h | --help) sed -n '2,8p' "$0"; exit 0 ;;
    -*) echo "backup.sh: unknown option '$1'" >&2; exit 2 ;;
    *) instance=$1; shift ;;
  esac
done

pick_connection "$instance"
if [ -z "$out" ]; then
  mkdir -p "$root/.var/backups"
  out="$root/.var/backups/$db-$(date -u +%Y%m%dT%H%M%SZ).dump"
fi
mkdir -p "$(dirname "$out")"
# The dump goes to a temporary file first: a failed run leaves no half backup under the final name.
partial="$out.partial"
trap 'rm -f "$partial"' EXIT
pg_tool pg_dump "$db" --format=custom --compress=6 --no-password >"$partial"
mv "$partial" "$out"
trap - EXIT
echo "$out"
