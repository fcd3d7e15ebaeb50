#!/usr/bin/env bash
# Private PostgreSQL cluster from Debian's packages, on loopback only.
#   scripts/pg.sh start|stop|status|destroy
# Env: PG_DATA_DIR (default .data/pg), PG_RUN_DIR (default .data/pg-run), PGPORT (default 54329),
#      PG_FSYNC=on|off (default on: this cluster holds people's records), PG_DATABASES (default "hoodline").
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT=$(pwd)
DATA=${PG_DATA_DIR:-$ROOT/.data/pg}
RUN=${PG_RUN_DIR:-$ROOT/.data/pg-run}
PORT=${PGPORT:-54329}
FSYNC=${PG_FSYNC:-on}
DBS=${PG_DATABASES:-hoodline}

PGBIN=""
for d in /usr/lib/postgresql/*/bin; do [ -x "$d/initdb" ] && PGBIN=$d; done
if [ -z "$PGBIN" ]; then
  echo "PostgreSQL server binaries not found. Install them with: sudo apt-get install -y postgresql" >&2
  exit 3
fi

if [ "$(id -u)" = 0 ]; then
  PGUSER_OS=postgres; id postgres >/dev/null 2>&1 || PGUSER_OS=nobody
  as_pg() { (cd / && runuser -u "$PGUSER_OS" -- "$@"); }   # initdb/pg_ctl refuse to run as root
else
  as_pg() { "$@"; }
fi

status() { [ -f "$DATA/PG_VERSION" ] && as_pg "$PGBIN/pg_ctl" -D "$DATA" status >/dev/null 2>&1; }

case "${1:-}" in
  start)
    mkdir -p "$DATA" "$RUN"; chmod 700 "$DATA"
    if [ "$(id -u)" = 0 ]; then
      chown "$PGUSER_OS" "$DATA" "$RUN"
      # The server user must be able to walk down to the data dir.
      p=$(dirname "$DATA"); while [ "$p" != / ]; do chmod o+x "$p" 2>/dev/null || true; p=$(dirname "$p"); done
    fi
    as_pg test -w "$DATA" -a -w "$RUN" || { echo "The server user cannot reach $DATA; set PG_DATA_DIR/PG_RUN_DIR elsewhere" >&2; exit 1; }
    if [ ! -f "$DATA/PG_VERSION" ]; then
      as_pg "$PGBIN/initdb" -D "$DATA" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 --no-instructions >"$RUN/initdb.log" 2>&1 \
        || { cat "$RUN/initdb.log" >&2; exit 1; }
      {
        echo "listen_addresses = '127.0.0.1'"
        echo "port = $PORT"
        echo "unix_socket_directories = '$RUN'"
        echo "max_connections = 200"
        if [ "$FSYNC" = off ]; then echo "fsync = off"; echo "synchronous_commit = off"; echo "full_page_writes = off"; fi
      } | as_pg tee -a "$DATA/postgresql.conf" >/dev/null
    fi
    if ! status; then
      as_pg "$PGBIN/pg_ctl" -D "$DATA" -l "$RUN/postgres.log" -w -t 30 -o "-p $PORT" start >/dev/null \
        || { echo "PostgreSQL did not start; see $RUN/postgres.log:" >&2; tail -n 20 "$RUN/postgres.log" >&2; exit 1; }
    fi
    for db in $DBS; do
      exists=$(psql -h 127.0.0.1 -p "$PORT" -U postgres -d postgres -tAc "select 1 from pg_database where datname='$db'")
      [ "$exists" = 1 ] || psql -h 127.0.0.1 -p "$PORT" -U postgres -d postgres -qc "create database \"$db\"" >/dev/null
    done
    ;;
  stop)
    if status; then as_pg "$PGBIN/pg_ctl" -D "$DATA" -m fast -w stop >/dev/null; fi
    ;;
  status)
    if status; then echo running; else echo stopped; exit 1; fi
    ;;
  destroy)
    if status; then as_pg "$PGBIN/pg_ctl" -D "$DATA" -m immediate -w stop >/dev/null || true; fi
    rm -rf "$DATA" "$RUN"
    ;;
  *) echo "usage: scripts/pg.sh start|stop|status|destroy" >&2; exit 2 ;;
esac
