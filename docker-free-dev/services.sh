#!/usr/bin/env bash
# Brings up, reports or stops Roundmark's local services on loopback, without Docker:
#   PostgreSQL 15 (Debian), the S3-compatible object store, the SMTP fake.
# Usage: docker-free-dev/services.sh [up|db|status|down|stop NAME]   (default: up). Running "up" twice changes nothing.
source "$(dirname "$0")/lib.sh"

as_pg() { if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }

pg_data_home() {
  if [ "$(id -u)" = 0 ]; then echo "$PG_HOME"; else echo "$DATA/pg-cluster"; fi
}

pg_up() {
  local home; home=$(pg_data_home)
  local pgdata="$home/data"
  if [ "$(id -u)" = 0 ]; then
    mkdir -p "$home"; chown postgres:postgres "$home"; chmod 700 "$home"
    ln -sfn "$home" "$DATA/pg"
  else
    mkdir -p "$home"; ln -sfn "$home" "$DATA/pg"
  fi
  if [ ! -f "$pgdata/PG_VERSION" ]; then
    as_pg "$PG_BIN/initdb" -D "$pgdata" -U postgres --auth-local=trust --auth-host=scram-sha-256 -E UTF8 --locale=C.UTF-8 \
      >"$home/initdb.log" 2>&1 || { tail -20 "$home/initdb.log" >&2; fail "initdb failed (log above)"; }
  fi
  if as_pg "$PG_BIN/pg_ctl" -D "$pgdata" status >/dev/null 2>&1; then
    :
  else
    if port_busy "$ROUNDMARK_PG_PORT"; then
      fail "port $ROUNDMARK_PG_PORT is already taken by another program, so PostgreSQL cannot start. Stop it or set ROUNDMARK_PG_PORT to a free port."
    fi
    as_pg "$PG_BIN/pg_ctl" -D "$pgdata" -l "$home/postgres.log" -w -t 60 \
      -o "-c listen_addresses=127.0.0.1 -p $ROUNDMARK_PG_PORT -k $home" start >/dev/null \
      || { tail -20 "$home/postgres.log" >&2; fail "PostgreSQL did not start (last log lines above)"; }
  fi
  # Our role and database; the role may create databases so tests get a throwaway one.
  local psql=("$PG_BIN/psql" -h "$home" -p "$ROUNDMARK_PG_PORT" -U postgres -v ON_ERROR_STOP=1 -qtA)
  if [ "$(as_pg "${psql[@]}" -c "select 1 from pg_roles where rolname='roundmark'")" != 1 ]; then
    as_pg "${psql[@]}" -c "create role roundmark login createdb password 'roundmark-local'" >/dev/null
  fi
  if [ "$(as_pg "${psql[@]}" -c "select 1 from pg_database where datname='roundmark'")" != 1 ]; then
    as_pg "${psql[@]}" -c "create database roundmark owner roundmark" >/dev/null
  fi
}

pg_down() {
  local pgdata; pgdata="$(pg_data_home)/data"
  [ -f "$pgdata/PG_VERSION" ] && as_pg "$PG_BIN/pg_ctl" -D "$pgdata" -m fast stop >/dev/null 2>&1 || true
}

# Starts a Node service script in the background unless its pid file shows it running.
node_up() {
  local name=$1 port=$2 script=$3
  local pidf="$RUN/$name.pid" log="$RUN/$name.log"
  if pid_alive "$pidf" && port_busy "$port"; then return 0; fi
  if port_busy "$port"; then
    fail "port $port is already taken by another program, so the $name cannot start. Stop it or change the port in docker-free-dev/local.env."
  fi
  # exec: the pid written is node's own, so "down" stops the service itself.
  (cd "$ROOT" && exec nohup node "$script" >"$log" 2>&1) &
  echo $! >"$pidf"
  if ! wait_port "$port" 20; then
    tail -20 "$log" >&2
    fail "the $name did not start on port $port (last log lines above)"
  fi
}

node_down() {
  local pidf="$RUN/$1.pid"
  if pid_alive "$pidf"; then kill "$(cat "$pidf")" 2>/dev/null || true; fi
  rm -f "$pidf"
}

status() {
  local pgstate="stopped" s3state="stopped" mailstate="stopped"
  port_busy "$ROUNDMARK_PG_PORT" && pgstate="up"
  port_busy "$ROUNDMARK_S3_PORT" && s3state="up"
  port_busy "$ROUNDMARK_SMTP_PORT" && mailstate="up"
  printf '%-13s %-8s %s\n' "postgresql" "$pgstate" "postgres://127.0.0.1:$ROUNDMARK_PG_PORT (data $(readlink -f "$DATA/pg" 2>/dev/null || echo none))"
  printf '%-13s %-8s %s\n' "object store" "$s3state" "$S3_ENDPOINT bucket $S3_BUCKET (data .data/s3)"
  printf '%-13s %-8s %s\n' "mail fake" "$mailstate" "$SMTP_URL (messages in .data/mail)"
  printf '%-13s %-8s %s\n' "payments fake" "$(port_busy "$ROUNDMARK_PAY_PORT" && echo up || echo stopped)" "$PAYMENTS_API_URL (state in .data/payments)"
}

case "${1:-up}" in
  up)
    pg_up
    node_up "object store" "$ROUNDMARK_S3_PORT" docker-free-dev/object-store.mjs
    node_up "mail fake" "$ROUNDMARK_SMTP_PORT" docker-free-dev/mail-fake.mjs
    node_up "payments fake" "$ROUNDMARK_PAY_PORT" docker-free-dev/payments-fake.mjs
    status ;;
  db) pg_up; status ;;
  status) status ;;
  down)
    node_down "payments fake"; node_down "mail fake"; node_down "object store"; pg_down; status ;;
  # One service only (the fault tests stop one and bring it back with "up").
  stop)
    case "${2:-}" in
      postgresql) pg_down ;;
      object-store) node_down "object store" ;;
      mail) node_down "mail fake" ;;
      payments) node_down "payments fake" ;;
      *) fail "usage: $0 stop postgresql|object-store|mail|payments" ;;
    esac ;;
  *) fail "usage: $0 [up|db|status|down|stop NAME]" ;;
esac
