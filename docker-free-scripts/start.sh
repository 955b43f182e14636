#!/usr/bin/env bash
# Runs Parapet on this machine: installs what is missing, starts PostgreSQL on 127.0.0.1,
# the mail fake and the app, and stays in the foreground watching them: whichever stops is
# started again (with a growing pause when it keeps stopping, each restart logged).
# Ctrl-C, or SIGTERM or SIGHUP to this script's pid alone, stops what this run started and exits.
# PARAPET_DATA (default .data in the checkout) is the folder for its cluster, logs and pid files.
set -euo pipefail

# shellcheck source=lib/init.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/init.sh" "${PARAPET_DATA:-.data}"

take_run_lock "$PARAPET_DATA_DIR/start.lock" "docker-free-scripts/start.sh"

# --reset-demo (or PARAPET_RESET_DEMO=1): drop the demo's data and load it fresh; nothing else is touched.
RESET_DEMO=${PARAPET_RESET_DEMO:-}
for arg in "$@"; do
  case $arg in
    --reset-demo) RESET_DEMO=1 ;;
    *) die "unknown option '$arg': the only option is --reset-demo (drop the demo's data and load it fresh)" ;;
  esac
done

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
SLEEP_PID=""

# Runs once, on any way out (the end of a step that failed, Ctrl-C, SIGTERM or SIGHUP to this pid):
# stops the step in progress, then the app, the simulator, the mail fake and the PostgreSQL cluster
# this run started (fast shutdown), each waited for, and exits. A cluster that was already running
# when this run began is left running. A second signal while it works is ignored, and nothing in
# here may stop it halfway (no `set -e`; a closed terminal does not end it with SIGPIPE).
cleanup() {
  local rc=$?
  trap - EXIT
  trap '' INT TERM HUP PIPE
  set +e
  say "stopping what this run started"
  stop_step
  if [[ -n $SLEEP_PID ]]; then kill "$SLEEP_PID" 2>/dev/null && wait "$SLEEP_PID" 2>/dev/null; fi
  stop_service "$APP_PIDFILE" app
  stop_service "$SIM_PIDFILE" simulator
  stop_service "$MAIL_PIDFILE" "mail fake"
  if [[ -n $STARTED_PG_DATA ]]; then
    say "stopping PostgreSQL (pg_ctl stop -m fast)"
    pg_stop_cluster "$STARTED_PG_DATA" fast
    rm -f "$PG_OWNER_PIDFILE"
  fi
  rm -f "$PARAPET_DATA_DIR/start.pid"
  say "stopped"
  exit "$rc"
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM
trap 'exit 129' HUP

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
# The demo loads its inventory and about five weeks of history on a first start; progress as it goes.
# A load stopped halfway (Ctrl-C or SIGTERM while it ran) leaves this marker: the demo is then loaded
# afresh, since its inventory alone would otherwise count as "already loaded" and the past stay half written.
SEED_MARKER="$PARAPET_DATA_DIR/demo-load-incomplete"
if [[ -f $SEED_MARKER && -z $RESET_DEMO ]]; then
  say "the last demo load was stopped before it finished; loading the demo afresh"
  RESET_DEMO=1
fi
say "loading the demo${RESET_DEMO:+ afresh} (log: $PARAPET_LOG_DIR/seed.log)"
touch "$SEED_MARKER"
if ! run_step >(tee "$PARAPET_LOG_DIR/seed.log" | sed -u 's/^/[parapet]   seed: /' >&2) env PARAPET_RESET_DEMO="${RESET_DEMO:+1}" npm run --silent seed; then
  die "loading the demo failed (full log: $PARAPET_LOG_DIR/seed.log)"
fi
rm -f "$SEED_MARKER"
build_client
build_server

# --- mail fake and app ---
maildev_start "$MAIL_PIDFILE" "$PARAPET_LOG_DIR/maildev.log" "$MAIL_SMTP_PORT" "$MAIL_WEB_PORT"

APP_URL="http://$HOST:$PORT"
if port_busy "$PORT" "$HOST"; then
  die "port $PORT on $HOST is taken by another program; choose another with PORT=..."
fi
# The compiled server (npm run build:server): no TypeScript transpiling at start or restart.
APP_CMD=(node --enable-source-maps dist-server/index.js)
spawn_service "$APP_PIDFILE" "$PARAPET_LOG_DIR/app.log" "${APP_CMD[@]}"
APP_PID=$SPAWNED_PID
say "starting the app (log: $PARAPET_LOG_DIR/app.log)"
wait_until "the app at $APP_URL/api/health" 120 "$APP_PID" "$PARAPET_LOG_DIR/app.log" health_ok "$APP_URL"

SIM_CMD=()
if package_has_script simulate; then
  # Its node tokens go in this run's data folder, not in the checkout another run may share.
  SIM_CMD=(env PARAPET_URL="$APP_URL" SIMULATOR_TOKENS="$PARAPET_DATA_DIR/simulator-tokens.json" npm run simulate)
  spawn_service "$SIM_PIDFILE" "$PARAPET_LOG_DIR/simulator.log" "${SIM_CMD[@]}"
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

# --- supervision: stay in the foreground until Ctrl-C, starting again whatever stops ---
# A service that stops is started again after a pause that doubles while it keeps stopping
# (1 s up to 60 s) and resets once it has run for 2 minutes. Restarts append to its log.
SUPERVISE_LOG="$PARAPET_LOG_DIR/supervisor.log"
declare -A pause_s=() up_since=() down_since=()
note() { printf '%s %s\n' "$(date -u +%Y-%m-%dT%H:%M:%SZ)" "$*" >>"$SUPERVISE_LOG"; say "$*"; }

respawn() { # PIDFILE LOG COMMAND...: like spawn_service, but appending to the log
  local pidfile=$1 log=$2; shift 2
  setsid "$@" >>"$log" 2>&1 </dev/null 9>&- &
  pidfile_write "$pidfile" "$!"
  SPAWNED_PID=$!
}

# NAME is down: after its pause, run RESTART (a function); true when it was restarted.
restart_after_pause() {
  local name=$1 restart=$2 now=$SECONDS
  if [[ -z ${down_since[$name]:-} ]]; then
    down_since[$name]=$now
    note "$name stopped; starting it again in ${pause_s[$name]:-1} s"
  fi
  ((now - down_since[$name] >= ${pause_s[$name]:-1})) || return 1
  if "$restart"; then
    note "$name started again"
    up_since[$name]=$SECONDS
  else
    note "$name did not start; trying again"
  fi
  unset 'down_since[$name]'
  local next=$((${pause_s[$name]:-1} * 2))
  pause_s[$name]=$((next > 60 ? 60 : next))
}

steady() { # NAME has run for 2 minutes: its next failure waits 1 s again
  local name=$1
  if [[ -n ${up_since[$name]:-} ]] && ((SECONDS - up_since[$name] >= 120)); then
    pause_s[$name]=1
    unset 'up_since[$name]'
  fi
}

restart_app() {
  if port_busy "$PORT" "$HOST"; then return 1; fi
  respawn "$APP_PIDFILE" "$PARAPET_LOG_DIR/app.log" "${APP_CMD[@]}"
  APP_PID=$SPAWNED_PID
}
restart_mail() {
  (maildev_start "$MAIL_PIDFILE" "$PARAPET_LOG_DIR/maildev.log" "$MAIL_SMTP_PORT" "$MAIL_WEB_PORT") && pidfile_live_pid "$MAIL_PIDFILE" >/dev/null
}
restart_pg() {
  (pg_start_cluster "$PG_DATA" "$PG_PORT" "$PG_LOG") || return 1
  if [[ -z $STARTED_PG_DATA ]]; then
    STARTED_PG_DATA=$PG_DATA
    pidfile_write "$PG_OWNER_PIDFILE" "$$"
  fi
}
restart_sim() {
  health_ok "$APP_URL" || return 1 # it signs in at start: wait for the app
  respawn "$SIM_PIDFILE" "$PARAPET_LOG_DIR/simulator.log" "${SIM_CMD[@]}"
}
pg_down_checks=0

while :; do
  sleep 1 &
  SLEEP_PID=$!
  wait "$SLEEP_PID" || true
  SLEEP_PID=""
  if kill -0 "$APP_PID" 2>/dev/null; then
    steady app
  else
    if [[ -z ${down_since[app]:-} ]]; then
      wait "$APP_PID" 2>/dev/null && rc=0 || rc=$?
      note "the app (pid $APP_PID) exited with status $rc; last lines of $PARAPET_LOG_DIR/app.log:"
      tail -n 5 "$PARAPET_LOG_DIR/app.log" | sed 's/^/    /' | tee -a "$SUPERVISE_LOG" >&2 || true
    fi
    restart_after_pause app restart_app || true
  fi
  if pidfile_live_pid "$MAIL_PIDFILE" >/dev/null; then
    steady mail-fake
  else
    restart_after_pause mail-fake restart_mail || true
  fi
  if ((${#SIM_CMD[@]})); then
    if pidfile_live_pid "$SIM_PIDFILE" >/dev/null; then steady simulator; else restart_after_pause simulator restart_sim || true; fi
  fi
  # `pg_ctl restart` leaves the cluster down for a moment: only a cluster that has not answered
  # for 5 checks in a row is started here, so this never races an administrator's own restart.
  # (pg_isready: 0 accepting, 1 rejecting while it starts or stops, 2 no answer.)
  pg_ready=0
  "$PG_BIN/pg_isready" -q -h 127.0.0.1 -p "$PG_PORT" || pg_ready=$?
  if ((pg_ready <= 1)); then
    pg_down_checks=0
    steady PostgreSQL
  elif ((++pg_down_checks >= 5)); then
    if restart_after_pause PostgreSQL restart_pg; then pg_down_checks=0; fi
  fi
done
