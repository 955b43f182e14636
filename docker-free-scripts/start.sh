#!/usr/bin/env bash
# Runs Parapet on this machine: installs what is missing, starts PostgreSQL on 127.0.0.1,
# the mail fake and the app, and stays in the foreground. Ctrl-C stops what this run started.
set -euo pipefail

# shellcheck source=lib/init.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/init.sh" .data

take_run_lock "$PARAPET_DATA_DIR/start.lock" "docker-free-scripts/start.sh"

export HOST=${HOST:-127.0.0.1}
export PORT=${PORT:-4300}
export PARAPET_DEMO_PASSWORD=${PARAPET_DEMO_PASSWORD:-parapet-demo}
# This is the demo: only here may people keep the published demo password as their own.
export PARAPET_DEMO=${PARAPET_DEMO:-true}
PG_PORT=${PARAPET_PG_PORT:-5433}
MAIL_SMTP_PORT=${PARAPET_SMTP_PORT:-1025}
MAIL_WEB_PORT=${PARAPET_MAIL_WEB_PORT:-1080}
APP_PIDFILE="$PARAPET_DATA_DIR/app.pid"
SIM_PIDFILE="$PARAPET_DATA_DIR/simulator.pid"
MAIL_PIDFILE="$PARAPET_DATA_DIR/maildev.pid"
PG_OWNER_PIDFILE="$PARAPET_DATA_DIR/pg-started-by.pid"
STARTED_PG_DATA=""

cleanup() {
  local rc=$?
  trap - EXIT INT TERM
  say "stopping what this run started"
  stop_service "$SIM_PIDFILE" simulator
  stop_service "$APP_PIDFILE" app
  stop_service "$MAIL_PIDFILE" "mail fake"
  if [[ -n $STARTED_PG_DATA ]]; then
    pg_stop_cluster "$STARTED_PG_DATA"
    rm -f "$PG_OWNER_PIDFILE"
  fi
  rm -f "$PARAPET_DATA_DIR/start.pid"
  exit "$rc"
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

started_at=$SECONDS
require_node
ensure_postgres_server
ensure_node_modules

# We hold the run lock, so any of our services still alive was left by a killed earlier run.
for leftover in "$SIM_PIDFILE" "$APP_PIDFILE" "$MAIL_PIDFILE"; do
  if pid=$(pidfile_live_pid "$leftover"); then
    say "stopping $(basename "$leftover" .pid) (pid $pid) left running by an earlier start"
    stop_service "$leftover"
  fi
done

# --- PostgreSQL ---
PG_DATA=$(pg_dev_data_dir)
PG_LOG="${PG_DATA%/*}/postgres.log"
if pg_pid=$(pg_running_pid "$PG_DATA"); then
  PG_PORT=$(pg_running_port "$PG_DATA")
  if [[ -f $PG_OWNER_PIDFILE ]] && ! pidfile_live_pid "$PG_OWNER_PIDFILE" >/dev/null; then
    say "PostgreSQL (pid $pg_pid, port $PG_PORT) was left running by an earlier start; using it and stopping it on exit"
    STARTED_PG_DATA=$PG_DATA
    pidfile_write "$PG_OWNER_PIDFILE" "$$"
  else
    say "PostgreSQL is already running (pid $pg_pid, port $PG_PORT); using it and leaving it running on exit"
  fi
else
  pg_init_cluster "$PG_DATA" parapet
  STARTED_PG_DATA=$PG_DATA
  pidfile_write "$PG_OWNER_PIDFILE" "$$"
  pg_start_cluster "$PG_DATA" "$PG_PORT" "$PG_LOG"
fi
pg_ensure_role_and_databases "$PG_DATA" "$PG_PORT" parapet
export DATABASE_URL
DATABASE_URL=$(pg_url "$PG_PORT" parapet)

# --- app settings ---
SECRET_FILE="$PARAPET_DATA_DIR/session-secret"
if [[ ! -s $SECRET_FILE ]]; then
  (umask 077 && random_hex 48 >"$SECRET_FILE")
fi
export SESSION_SECRET=${SESSION_SECRET:-$(<"$SECRET_FILE")}
export SMTP_HOST=127.0.0.1 SMTP_PORT=$MAIL_SMTP_PORT
export MAILDEV_WEB_URL="http://127.0.0.1:$MAIL_WEB_PORT"

run_logged "npm run migrate" "$PARAPET_LOG_DIR/migrate.log" npm run migrate
run_logged "npm run seed" "$PARAPET_LOG_DIR/seed.log" npm run seed
grep -v '^>\|^$' "$PARAPET_LOG_DIR/seed.log" | tail -n 5 | sed 's/^/[parapet]   seed: /' >&2 || true
build_client

# --- mail fake and app ---
maildev_start "$MAIL_PIDFILE" "$PARAPET_LOG_DIR/maildev.log" "$MAIL_SMTP_PORT" "$MAIL_WEB_PORT"
MAIL_PID=$SPAWNED_PID

APP_URL="http://$HOST:$PORT"
if port_busy "$PORT" "$HOST"; then
  die "port $PORT on $HOST is taken by another program; choose another with PORT=..."
fi
spawn_service "$APP_PIDFILE" "$PARAPET_LOG_DIR/app.log" npm start
APP_PID=$SPAWNED_PID
say "starting the app (log: $PARAPET_LOG_DIR/app.log)"
wait_until "the app at $APP_URL/api/health" 120 "$APP_PID" "$PARAPET_LOG_DIR/app.log" health_ok "$APP_URL"

if package_has_script simulate; then
  spawn_service "$SIM_PIDFILE" "$PARAPET_LOG_DIR/simulator.log" env PARAPET_URL="$APP_URL" npm run simulate
  say "node simulator started (log: $PARAPET_LOG_DIR/simulator.log)"
fi

cat <<EOF

  Parapet is running at   $APP_URL   (ready in $((SECONDS - started_at)) s)
  Mail inbox (fake):      $MAILDEV_WEB_URL
  Demo sign-ins (password: $PARAPET_DEMO_PASSWORD):
    admin@parapet.example      (admin)
    operator@parapet.example   (operator)
    host@parapet.example       (host)
  Database: $DATABASE_URL   Logs: $PARAPET_LOG_DIR
  Press Ctrl-C to stop.

EOF

# Stay in the foreground until Ctrl-C, or until the app or the mail fake stops by itself.
wait -n "$APP_PID" "$MAIL_PID" || true
if ! kill -0 "$APP_PID" 2>/dev/null; then
  show_log_tail "$PARAPET_LOG_DIR/app.log"
  die "the app stopped unexpectedly (log: $PARAPET_LOG_DIR/app.log)"
fi
show_log_tail "$PARAPET_LOG_DIR/maildev.log"
die "the mail fake stopped unexpectedly (log: $PARAPET_LOG_DIR/maildev.log)"
