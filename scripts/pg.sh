#!/usr/bin/env bash
# Local PostgreSQL lifecycle for Dragoman: start | stop | status | url.
# Env (all optional):
#   PGPORT       TCP port on 127.0.0.1 (default 54329; never 5432, which belongs to the system cluster)
#   PGDATA_DIR   cluster folder, absolute or relative to the checkout (default .data/pg)
#   PG_DATABASES space-separated databases to create when missing (default "dragoman")
#   PG_THROWAWAY 1 = a cluster whose data may be lost (the test cluster only): fsync, synchronous_commit
#                and full_page_writes off for speed. Unset (npm start, db:backup, ...): PostgreSQL's durable
#                defaults, so a write that was answered 2xx survives a crash of PostgreSQL or of the machine.
# Idempotent: starting a running cluster is a no-op; a start after kill -9 recovers.
set -euo pipefail
cd "$(dirname "$0")/.."
PORT="${PGPORT:-54329}"
if [ "$PORT" = 5432 ]; then echo "pg.sh: port 5432 is reserved for the system cluster; choose another PGPORT." >&2; exit 1; fi
case "${PGDATA_DIR:-.data/pg}" in /*) ROOT="${PGDATA_DIR}" ;; *) ROOT="$(pwd)/${PGDATA_DIR:-.data/pg}" ;; esac
DBS="${PG_DATABASES:-dragoman}"
DURABILITY=""
if [ "${PG_THROWAWAY:-0}" = 1 ]; then DURABILITY="-c fsync=off -c synchronous_commit=off -c full_page_writes=off"; fi

pgbin() { local d; for d in /usr/lib/postgresql/*/bin; do [ -x "$d/initdb" ] && { echo "$d"; return 0; }; done; return 1; }

ensure_installed() {
  if BIN="$(pgbin)"; then return 0; fi
  if [ "$(id -u)" != 0 ] || ! command -v apt-get >/dev/null; then
    echo "pg.sh: PostgreSQL is not installed and cannot be installed here: install Debian's 'postgresql' package (apt-get install postgresql) and run again." >&2
    exit 1
  fi
  echo "pg.sh: installing Debian's postgresql (one time)..." >&2
  if ! { apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends postgresql >/dev/null; }; then
    echo "pg.sh: apt-get could not install postgresql: check the package sources, or install it by hand, then run again." >&2
    exit 1
  fi
  BIN="$(pgbin)" || { echo "pg.sh: postgresql installed but initdb not found under /usr/lib/postgresql." >&2; exit 1; }
}

as_pg() { if [ "$(id -u)" = 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi; }

# The postgres user must traverse every parent of the cluster folder. When it cannot (a checkout under
# a 0700 home, say), fall back to a folder under /tmp named after the checkout, and remember the choice.
resolve_root() {
  mkdir -p "$ROOT"
  if [ "$(id -u)" = 0 ]; then
    chown postgres:postgres "$ROOT"
    if ! as_pg test -w "$ROOT"; then
      local alt; alt="/tmp/dragoman-pg-$(printf '%s' "$ROOT" | md5sum | cut -c1-10)"
      mkdir -p "$alt"; chown postgres:postgres "$alt"
      echo "pg.sh: user postgres cannot reach $ROOT; using $alt instead." >&2
      ROOT="$alt"
    fi
  fi
  DATA="$ROOT/data"; SOCK="$ROOT/run"; LOG="$ROOT/server.log"
  mkdir -p "$SOCK"; [ "$(id -u)" = 0 ] && chown postgres:postgres "$SOCK"
  return 0
}

paths_only() {
  DATA="$ROOT/data"; SOCK="$ROOT/run"; LOG="$ROOT/server.log"
  if [ ! -s "$DATA/PG_VERSION" ]; then
    local alt; alt="/tmp/dragoman-pg-$(printf '%s' "$ROOT" | md5sum | cut -c1-10)"
    if [ -s "$alt/data/PG_VERSION" ]; then ROOT="$alt"; DATA="$ROOT/data"; SOCK="$ROOT/run"; LOG="$ROOT/server.log"; fi
  fi
}

start() {
  ensure_installed
  resolve_root
  if [ ! -s "$DATA/PG_VERSION" ]; then
    as_pg "$BIN/initdb" -D "$DATA" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 -N >/dev/null
  fi
  local i
  # A postmaster killed with -9 lingers briefly and pg_ctl status may still say "running": loop.
  for i in $(seq 1 60); do
    "$BIN/pg_isready" -q -h 127.0.0.1 -p "$PORT" -U postgres && break
    if ! as_pg "$BIN/pg_ctl" -D "$DATA" status >/dev/null 2>&1; then
      if (exec 3<>"/dev/tcp/127.0.0.1/$PORT") 2>/dev/null; then
        echo "pg.sh: port $PORT on 127.0.0.1 is used by another program; set PGPORT to a free port." >&2; exit 1
      fi
      as_pg "$BIN/pg_ctl" -D "$DATA" -l "$LOG" -w -t 60 \
        -o "-c listen_addresses=127.0.0.1 -p $PORT -k $SOCK -c unix_socket_permissions=0777 $DURABILITY -c max_connections=200" \
        start >/dev/null 2>&1 || { tail -20 "$LOG" >&2; echo "pg.sh: PostgreSQL did not start (log above, $LOG)." >&2; exit 1; }
    fi
    sleep 0.5
  done
  "$BIN/pg_isready" -q -h 127.0.0.1 -p "$PORT" -U postgres || { tail -20 "$LOG" >&2; echo "pg.sh: PostgreSQL not ready after 30 s." >&2; exit 1; }
  local db
  for db in $DBS; do
    if [ "$("$BIN/psql" -h 127.0.0.1 -p "$PORT" -U postgres -d postgres -tAc "select 1 from pg_database where datname='$db'")" != 1 ]; then
      "$BIN/createdb" -h 127.0.0.1 -p "$PORT" -U postgres "$db"
    fi
  done
  echo "postgres://postgres@127.0.0.1:$PORT/"
}

stop() {
  BIN="$(pgbin)" || return 0
  paths_only
  [ -s "$DATA/PG_VERSION" ] || { echo "pg.sh: no cluster at $ROOT" >&2; return 0; }
  if as_pg "$BIN/pg_ctl" -D "$DATA" status >/dev/null 2>&1; then
    as_pg "$BIN/pg_ctl" -D "$DATA" -m fast -w stop >/dev/null
  fi
  echo "pg.sh: stopped ($ROOT)" >&2
}

status() {
  BIN="$(pgbin)" || { echo "not installed"; exit 3; }
  paths_only
  if "$BIN/pg_isready" -q -h 127.0.0.1 -p "$PORT" -U postgres; then echo "running on 127.0.0.1:$PORT ($ROOT)"; else echo "stopped"; exit 3; fi
}

case "${1:-start}" in
  start) start ;;
  stop) stop ;;
  status) status ;;
  *) echo "usage: pg.sh start|stop|status" >&2; exit 2 ;;
esac
