#!/usr/bin/env bash
# A throwaway PostgreSQL server for the audit-store tests and benchmark.
# Usage: scripts/postgres.sh start|stop|status|url
# Idempotent: `start` on a running server only prints the URL; `stop` on a stopped one is a no-op.
# Must run as root (initdb refuses root, so the server runs as the `postgres` system user).
set -euo pipefail

PG_PORT="${PG_PORT:-54329}"
PG_ROOT="${PG_ROOT:-/tmp/pg}"
PG_DATA="$PG_ROOT/data"
PG_LOG="$PG_ROOT/server.log"
PG_URL="postgres://postgres@127.0.0.1:${PG_PORT}/postgres"

find_bindir() {
  local d
  for d in /usr/lib/postgresql/*/bin; do
    if [ -x "$d/initdb" ] && [ -x "$d/pg_ctl" ]; then echo "$d"; return 0; fi
  done
  return 1
}

ensure_binaries() {
  if ! find_bindir >/dev/null; then
    echo "postgres.sh: server binaries missing; installing postgresql" >&2
    apt-get update
    DEBIAN_FRONTEND=noninteractive apt-get install -y postgresql
  fi
  if ! id postgres >/dev/null 2>&1; then
    useradd --system postgres
  fi
}

as_postgres() { runuser -u postgres -- "$@"; }

is_running() {
  local bin; bin="$(find_bindir)" || return 1
  [ -f "$PG_DATA/PG_VERSION" ] && as_postgres "$bin/pg_ctl" -D "$PG_DATA" status >/dev/null 2>&1
}

start() {
  ensure_binaries
  local bin; bin="$(find_bindir)"
  if is_running; then echo "$PG_URL"; return 0; fi
  mkdir -p "$PG_ROOT"
  chown postgres: "$PG_ROOT"
  chmod 700 "$PG_ROOT"
  if [ ! -f "$PG_DATA/PG_VERSION" ]; then
    as_postgres "$bin/initdb" -D "$PG_DATA" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >"$PG_ROOT/initdb.log" 2>&1 \
      || { cat "$PG_ROOT/initdb.log" >&2; exit 1; }
  fi
  as_postgres "$bin/pg_ctl" -D "$PG_DATA" -l "$PG_LOG" -w -t 30 \
    -o "-c listen_addresses=127.0.0.1 -p $PG_PORT -k $PG_ROOT" start >/dev/null \
    || { tail -n 40 "$PG_LOG" >&2; exit 1; }
  "$bin/pg_isready" -q -h 127.0.0.1 -p "$PG_PORT"
  echo "$PG_URL"
}

stop() {
  local bin; bin="$(find_bindir)" || return 0
  if is_running; then
    as_postgres "$bin/pg_ctl" -D "$PG_DATA" -m fast -w stop >/dev/null
  fi
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) if is_running; then echo "running: $PG_URL"; else echo "stopped"; exit 1; fi ;;
  url) echo "$PG_URL" ;;
  *) echo "usage: $0 start|stop|status|url" >&2; exit 2 ;;
esac
