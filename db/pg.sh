#!/usr/bin/env bash
# Project-local PostgreSQL for dev/test: TCP on 127.0.0.1 only, non-default port,
# trust auth (loopback only). Works as root (runs server as the 'postgres' OS user)
# and as a non-root user (runs as that user). Idempotent.
# Usage: db/pg.sh start [db ...] | stop | status | url [db] | destroy
#        db/pg.sh replica start | stop | status | url [db] | promote | destroy
# Replica mode: a streaming read replica of the cluster above (pg_basebackup -R -X stream), on REPLICA_PORT
# (default PGPORT+10), data under REPLICA_BASE (default <the cluster's folder>-replica). initdb's defaults
# already allow replication from 127.0.0.1 (trust), wal_level=replica and max_wal_senders=10.
set -euo pipefail

PROJECT_DIR="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
PGPORT="${PGPORT:-54329}"
DEFAULT_DB="${PGDB:-pacewright}"
# The data dir lives OUTSIDE the project: the postgres user must be able to traverse
# every parent directory, which a root-owned 0700 checkout (e.g. under /root) forbids.
# The key (hash of the project path) keeps two clones from sharing one cluster.
KEY="$(basename "$PROJECT_DIR")-$(printf %s "$PROJECT_DIR" | sha1sum | cut -c1-8)"
PGBASE="${PGBASE:-/var/tmp/pg-$(id -un)-$KEY}"
PGDATA="$PGBASE/data"
PGLOG="$PGBASE/postgres.log"

find_bin() {   # newest /usr/lib/postgresql/<ver>/bin that has pg_ctl ('' if none)
  local d
  for d in /usr/lib/postgresql/*/bin; do
    if [ -x "$d/pg_ctl" ]; then echo "$d"; fi
  done | sort -V | tail -n1
}
PGBIN="$(find_bin)"
if [ -z "$PGBIN" ] || [ ! -x "$PGBIN/pg_ctl" ]; then
  [ "$(id -u)" -eq 0 ] || { echo "pg.sh: PostgreSQL is not installed (need root to apt-get install it)" >&2; exit 1; }
  echo "pg.sh: installing postgresql with apt-get" >&2
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq --no-install-recommends postgresql >/dev/null
  PGBIN="$(find_bin)"
  [ -n "$PGBIN" ] || { echo "pg.sh: apt-get install postgresql gave no pg_ctl" >&2; exit 1; }
fi

if [ "$(id -u)" -eq 0 ]; then
  RUNAS=postgres  # initdb and postgres refuse to run as root
  as_pg() { (cd / && runuser -u postgres -- "$@"); }   # cd /: avoid "could not change directory" warnings
else
  RUNAS="$(id -un)"
  as_pg() { (cd / && "$@"); }
fi

# Running = postmaster.pid names a live, non-zombie process called "postgres".
# (pg_ctl status/stop trust the PID alone; after a kill or a machine restart it can
# belong to an unrelated process, which pg_ctl stop would then signal.)
is_running() {
  local stat data="${1:-$PGDATA}"
  [ -f "$data/postmaster.pid" ] || return 1
  stat="$(cat "/proc/$(head -n1 "$data/postmaster.pid")/stat" 2>/dev/null)" || return 1
  case "$stat" in *"(postgres) "[RSD]*) return 0 ;; *) return 1 ;; esac
}

do_start() {
  install -d -m 700 -o "$RUNAS" "$PGBASE"
  if [ ! -s "$PGDATA/PG_VERSION" ]; then
    rm -rf "$PGDATA"   # leftovers of an interrupted initdb
    loc=C; locale -a 2>/dev/null | grep -qix 'c\.utf-\?8' && loc=C.UTF-8
    # --no-sync: a dev/test cluster (fsync is off below too); skipping the flush saves seconds on a busy disk.
    as_pg "$PGBIN/initdb" --no-sync -D "$PGDATA" -U postgres -A trust -E UTF8 --locale="$loc" >"$PGBASE/initdb.log" 2>&1 \
      || { cat "$PGBASE/initdb.log" >&2; exit 1; }
    cat >>"$PGDATA/postgresql.conf" <<CONF
# --- added by db/pg.sh (dev/test cluster) ---
listen_addresses = '127.0.0.1'
unix_socket_directories = ''
fsync = off
synchronous_commit = off
full_page_writes = off
CONF
  fi
  if ! is_running; then
    rm -f "$PGDATA/postmaster.pid"   # stale: else postgres may refuse ("lock file already exists")
    as_pg "$PGBIN/pg_ctl" -D "$PGDATA" -l "$PGLOG" -o "-p $PGPORT" -w -t 60 start >/dev/null \
      || { tail -n 20 "$PGLOG" >&2; exit 1; }
  fi
  for db in "${@:-$DEFAULT_DB}"; do
    if [ -z "$("$PGBIN/psql" -X -h 127.0.0.1 -p "$PGPORT" -U postgres -d postgres -tAc \
          "select 1 from pg_database where datname = '$db'")" ]; then
      "$PGBIN/createdb" -h 127.0.0.1 -p "$PGPORT" -U postgres "$db"
    fi
  done
  echo "pg.sh: running on 127.0.0.1:$PGPORT (data $PGDATA)"
}

do_stop() {
  if is_running; then
    as_pg "$PGBIN/pg_ctl" -D "$PGDATA" -m fast -w stop >/dev/null
  fi
  echo "pg.sh: stopped"
}

REPLICA_PORT="${REPLICA_PORT:-$((PGPORT + 10))}"
REPLICA_BASE="${REPLICA_BASE:-$PGBASE-replica}"
REPLICA_DATA="$REPLICA_BASE/data"

do_replica() {
  case "${1:-}" in
    start)
      is_running || { echo "pg.sh: start the primary first (db/pg.sh start)" >&2; exit 1; }
      install -d -m 700 -o "$RUNAS" "$REPLICA_BASE"
      if [ ! -s "$REPLICA_DATA/PG_VERSION" ]; then
        rm -rf "$REPLICA_DATA"   # leftovers of an interrupted copy
        # -R writes primary_conninfo and standby.signal; -X stream copies the WAL needed to start.
        as_pg "$PGBIN/pg_basebackup" -h 127.0.0.1 -p "$PGPORT" -U postgres -D "$REPLICA_DATA" -R -X stream -c fast \
          >"$REPLICA_BASE/basebackup.log" 2>&1 || { cat "$REPLICA_BASE/basebackup.log" >&2; exit 1; }
      fi
      if ! is_running "$REPLICA_DATA"; then
        rm -f "$REPLICA_DATA/postmaster.pid"
        as_pg "$PGBIN/pg_ctl" -D "$REPLICA_DATA" -l "$REPLICA_BASE/postgres.log" -o "-p $REPLICA_PORT" -w -t 60 start >/dev/null \
          || { tail -n 20 "$REPLICA_BASE/postgres.log" >&2; exit 1; }
      fi
      echo "pg.sh: replica of 127.0.0.1:$PGPORT running on 127.0.0.1:$REPLICA_PORT (data $REPLICA_DATA)"
      ;;
    stop)
      if is_running "$REPLICA_DATA"; then as_pg "$PGBIN/pg_ctl" -D "$REPLICA_DATA" -m fast -w stop >/dev/null; fi
      echo "pg.sh: replica stopped"
      ;;
    status) if is_running "$REPLICA_DATA"; then echo running; else echo stopped; exit 3; fi ;;
    url) echo "postgres://postgres@127.0.0.1:$REPLICA_PORT/${2:-$DEFAULT_DB}" ;;
    # The replica becomes a primary of its own (it stops following; the app then reads the primary again).
    promote) as_pg "$PGBIN/pg_ctl" -D "$REPLICA_DATA" -w promote >/dev/null; echo "pg.sh: replica promoted" ;;
    destroy)
      if is_running "$REPLICA_DATA"; then as_pg "$PGBIN/pg_ctl" -D "$REPLICA_DATA" -m fast -w stop >/dev/null; fi
      rm -rf "$REPLICA_BASE"; echo "pg.sh: removed $REPLICA_BASE"
      ;;
    *) echo "usage: $0 replica start|stop|status|url [db]|promote|destroy" >&2; exit 2 ;;
  esac
}

case "${1:-}" in
  replica) shift; do_replica "$@" ;;
  start) shift; do_start "$@" ;;
  stop) do_stop ;;
  status) if is_running; then echo running; else echo stopped; exit 3; fi ;;
  url) echo "postgres://postgres@127.0.0.1:$PGPORT/${2:-$DEFAULT_DB}" ;;
  destroy) do_stop; rm -rf "$PGBASE"; echo "pg.sh: removed $PGBASE" ;;
  *) echo "usage: $0 start [db ...]|stop|status|url [db]|destroy|replica …" >&2; exit 2 ;;
esac
