#!/usr/bin/env bash
# Shared by scripts/backup.sh and scripts/restore.sh. Sourced, not run.
# Picks how PostgreSQL's client tools reach the database: DATABASE_OWNER_URL, else DATABASE_URL, when set
# (as the user it names; the schema's owner can read and restore every table, the app's role cannot
# restore), else the project's own cluster from scripts/pg.sh (its socket, as the postgres user; as root
# through runuser).

root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
pgbin=/usr/lib/postgresql/15/bin
[ -x "$pgbin/pg_dump" ] || { echo "PostgreSQL 15 client tools are missing ($pgbin); run scripts/pg.sh start once" >&2; exit 1; }

# Sets conn_mode (url|cluster), db (the database of the connection), for a URL conn_url, and for a
# cluster port and sock.
pick_connection() {
  local instance=$1
  conn_url=${DATABASE_OWNER_URL:-${DATABASE_URL:-}}
  if [ -n "$conn_url" ]; then
    conn_mode=url
    db=$(node -e 'console.log(decodeURIComponent(new URL(process.argv[1]).pathname.slice(1)))' "$conn_url")
  else
    conn_mode=cluster
    local url
    url=$(bash "$root/scripts/pg.sh" url "$instance")
    port=$(node -e 'console.log(new URL(process.argv[1]).port)' "$url")
    db=$(node -e 'console.log(new URL(process.argv[1]).pathname.slice(1))' "$url")
    sock="$root/.pgrun"
    "$pgbin/pg_isready" -q -h "$sock" -p "$port" \
      || { echo "no PostgreSQL is answering on port $port ($instance); start it with: bash scripts/pg.sh start $instance" >&2; exit 1; }
  fi
}

# The connection string (url mode) for one database of the same server.
url_for() {
  node -e 'const u = new URL(process.argv[1]); u.pathname = "/" + encodeURIComponent(process.argv[2]); console.log(u.href)' "$conn_url" "$1"
}

# Runs one client tool ($1) against database $2 with the remaining arguments.
pg_tool() {
  local tool=$1 database=$2
  shift 2
  if [ "$conn_mode" = url ]; then
    "$pgbin/$tool" --dbname="$(url_for "$database")" "$@"
  elif [ "$(id -u)" = 0 ]; then
    runuser -u postgres -- "$pgbin/$tool" -h "$sock" -p "$port" -U postgres --dbname="$database" "$@"
  else
    "$pgbin/$tool" -h "$sock" -p "$port" -U postgres --dbname="$database" "$@"
  fi
}

# One SQL statement on database $1, answer unaligned without headers.
pg_sql() { pg_tool psql "$1" -v ON_ERROR_STOP=1 -qAt -c "$2"; }
