# shellcheck shell=bash
# Shared helpers for the docker-free scripts. Sourced, never run; the caller sets
# `set -euo pipefail`, PARAPET_ROOT (the checkout, also the cwd) and PARAPET_LOG_DIR first.

: "${PARAPET_ROOT:?PARAPET_ROOT must be set before sourcing lib/common.sh}"

# Never fails: a closed terminal or log pipe must not stop a script halfway through its clean-up.
say() { printf '[parapet] %s\n' "$*" >&2 2>/dev/null || true; }
die() { printf '[parapet] ERROR: %s\n' "$*" >&2; exit 1; }

# Print the last lines of a log so a failed step explains itself without hunting for files.
show_log_tail() {
  local file=$1 lines=${2:-40}
  if [[ -s $file ]]; then
    printf '[parapet] --- last %s lines of %s ---\n' "$lines" "$file" >&2
    tail -n "$lines" "$file" >&2 || true
    printf '[parapet] --- end of %s ---\n' "$file" >&2
  fi
}

# A long step (npm ci, a build, the demo's seed) runs as a background child in a process group of
# its own, its output to OUT, and the script waits for it: bash runs a signal's trap only after a
# foreground command ends, but interrupts `wait` at once, so `kill <pid of the script>` is handled
# straight away and the clean-up stops the step's whole group (stop_step). The output is redirected
# on the step alone, never around this function, so the clean-up's own messages still reach the
# terminal. Fd 9 (the run lock) is closed in the step. A shell function cannot be given a session
# of its own; it runs in the foreground as before.
STEP_PID=""
run_step() { # OUT COMMAND...
  local out=$1 rc=0
  shift
  if [[ $(type -t "$1") != file ]]; then
    "$@" >"$out" 2>&1
    return
  fi
  setsid "$@" >"$out" 2>&1 </dev/null 9>&- &
  STEP_PID=$!
  wait "$STEP_PID" || rc=$?
  STEP_PID=""
  return "$rc"
}

# Stop the step run_step is waiting for, if any (its whole process group), and reap it.
stop_step() {
  [[ -n $STEP_PID ]] || return 0
  say "stopping the step in progress (pid $STEP_PID)"
  kill -TERM -- "-$STEP_PID" 2>/dev/null || kill -TERM "$STEP_PID" 2>/dev/null || true
  local i
  for ((i = 0; i < 50; i++)); do
    kill -0 "$STEP_PID" 2>/dev/null || break
    sleep 0.2
  done
  kill -KILL -- "-$STEP_PID" 2>/dev/null || true
  wait "$STEP_PID" 2>/dev/null || true
  STEP_PID=""
}

# Run a step with its output in a log; on failure show the log's tail and stop.
run_logged() {
  local what=$1 log=$2; shift 2
  say "$what (log: $log)"
  if ! run_step "$log" "$@"; then
    show_log_tail "$log"
    die "$what failed (full log: $log)"
  fi
}

is_root() { [[ $(id -u) -eq 0 ]]; }

# Commands that need root: direct as root, through sudo otherwise.
as_root() {
  if is_root; then
    "$@"
  elif command -v sudo >/dev/null 2>&1; then
    sudo "$@"
  else
    die "need root to run '$*' but this is user $(id -un) and sudo is not installed; run this script as root once, or install the packages yourself (apt-get install $*)"
  fi
}

deb_installed() {
  [[ $(dpkg-query -W -f='${db:Status-Abbrev}' "$1" 2>/dev/null) == ii* ]]
}

PARAPET_APT_UPDATED=${PARAPET_APT_UPDATED:-}
# Install the Debian packages that are missing; refresh the package lists once per run
# because a fresh machine may have none or stale ones.
apt_install() {
  local missing=() pkg
  for pkg in "$@"; do deb_installed "$pkg" || missing+=("$pkg"); done
  ((${#missing[@]})) || return 0
  say "installing Debian packages: ${missing[*]}"
  if ! is_root && ! command -v sudo >/dev/null 2>&1; then
    die "Debian packages missing: ${missing[*]}. This is user $(id -un) without sudo: as root run 'apt-get update && apt-get install -y ${missing[*]}', then run this script again"
  fi
  local log="${PARAPET_LOG_DIR:-/tmp}/apt.log"
  if [[ -z $PARAPET_APT_UPDATED ]]; then
    run_logged "apt-get update" "$log" as_root env DEBIAN_FRONTEND=noninteractive apt-get update
    PARAPET_APT_UPDATED=1
  fi
  run_logged "apt-get install ${missing[*]}" "$log" \
    as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y --no-install-recommends "${missing[@]}"
}

require_node() {
  command -v node >/dev/null 2>&1 || die "Node.js 20 is not installed (node not found on PATH); install Node 20 and its npm, then run this again"
  command -v npm >/dev/null 2>&1 || die "npm is not on PATH; install Node 20 with its npm"
  local major
  major=$(node -p 'process.versions.node.split(".")[0]')
  ((major >= 20)) || die "Node $(node -v) is too old: Parapet needs Node 20 (Debian's own nodejs package is older; install Node 20)"
  ((major == 20)) || say "note: Parapet is developed on Node 20; this machine has $(node -v)"
}

# npm ci when node_modules is missing or older than the committed lock file.
ensure_node_modules() {
  local lock="$PARAPET_ROOT/package-lock.json" stamp="$PARAPET_ROOT/node_modules/.package-lock.json"
  if [[ ! -f $stamp || $lock -nt $stamp ]]; then
    run_logged "npm ci (installing dependencies)" "$PARAPET_LOG_DIR/npm-ci.log" \
      npm ci --no-audit --no-fund
  fi
}

# Rebuild the client only when a source it is built from is newer than dist/.
build_client() {
  local marker="$PARAPET_ROOT/dist/index.html" sources=() s
  for s in src shared public index.html vite.config.ts package-lock.json tsconfig.json; do
    if [[ -e $PARAPET_ROOT/$s ]]; then sources+=("$PARAPET_ROOT/$s"); fi
  done
  if [[ -f $marker ]] && [[ -z $(find "${sources[@]}" -newer "$marker" -print -quit 2>/dev/null) ]]; then
    say "client build is up to date (dist/ newer than its sources)"
    return 0
  fi
  run_logged "npm run build" "$PARAPET_LOG_DIR/build.log" npm run build
  touch "$marker" 2>/dev/null || true
}

# Compile the server (npm run build:server) only when a source it is built from is newer than dist-server/.
build_server() {
  local marker="$PARAPET_ROOT/dist-server/index.js" sources=() s
  for s in server shared package.json package-lock.json vite.server.config.ts tsconfig.json; do
    if [[ -e $PARAPET_ROOT/$s ]]; then sources+=("$PARAPET_ROOT/$s"); fi
  done
  if [[ -f $marker ]] && [[ -z $(find "${sources[@]}" -newer "$marker" -print -quit 2>/dev/null) ]]; then
    say "server build is up to date (dist-server/ newer than its sources)"
    return 0
  fi
  run_logged "npm run build:server" "$PARAPET_LOG_DIR/build-server.log" npm run build:server
  touch "$marker" 2>/dev/null || true
}

package_has_script() {
  node -e 'const p=require(process.argv[1]); process.exit(p.scripts && p.scripts[process.argv[2]] ? 0 : 1)' \
    "$PARAPET_ROOT/package.json" "$1"
}

random_hex() { node -e 'process.stdout.write(require("crypto").randomBytes(+process.argv[1]).toString("hex"))' "${1:-32}"; }

# True when something accepts TCP connections on PORT (at HOST, default 127.0.0.1).
port_busy() { (exec 3<>"/dev/tcp/${2:-127.0.0.1}/$1") 2>/dev/null; }

# True when BASE_URL/api/health answers 200 {"status":"ok"}.
health_ok() {
  node -e 'fetch(process.argv[1] + "/api/health").then(async (r) => process.exit(r.status === 200 && (await r.json()).status === "ok" ? 0 : 1), () => process.exit(1))' "$1"
}

# First port at or above START that nothing listens on.
free_port_from() {
  local p=$1
  while port_busy "$p"; do p=$((p + 1)); ((p < $1 + 50)) || die "no free port between $1 and $p"; done
  echo "$p"
}

# --- pid files: "PID STARTTIME", so a pid reused after a reboot is not mistaken for ours ---

proc_starttime() { awk '{ sub(/^.*\) /, ""); print $20 }' "/proc/$1/stat" 2>/dev/null; }

pidfile_write() { printf '%s %s\n' "$2" "$(proc_starttime "$2")" >"$1"; }

# Print the pid recorded in FILE when that very process still runs; remove a stale file.
pidfile_live_pid() {
  local file=$1 pid start
  [[ -f $file ]] || return 1
  read -r pid start <"$file" || true
  if [[ $pid =~ ^[0-9]+$ ]] && [[ -n $start && $(proc_starttime "$pid") == "$start" ]]; then
    echo "$pid"
    return 0
  fi
  rm -f "$file"
  return 1
}

# Start a command in a session of its own (so Ctrl-C reaches only us and the whole
# group can be stopped at once), output to LOG, pid recorded in PIDFILE.
# Fd 9 (the run lock) is closed so a leftover child never holds the lock.
spawn_service() {
  local pidfile=$1 log=$2; shift 2
  setsid "$@" >"$log" 2>&1 </dev/null 9>&- &
  pidfile_write "$pidfile" "$!"
  # shellcheck disable=SC2034 # read by the caller
  SPAWNED_PID=$!
}

# Stop the process group recorded in PIDFILE: TERM, then KILL after a grace period.
stop_service() {
  local pidfile=$1 name=${2:-service} pid i
  pid=$(pidfile_live_pid "$pidfile") || { rm -f "$pidfile"; return 0; }
  say "stopping $name (pid $pid)"
  kill -TERM -- "-$pid" 2>/dev/null || kill -TERM "$pid" 2>/dev/null || true
  for ((i = 0; i < 50; i++)); do
    kill -0 "$pid" 2>/dev/null || break
    sleep 0.2
  done
  if kill -0 "$pid" 2>/dev/null; then
    say "$name did not stop in 10 s; killing it"
    kill -KILL -- "-$pid" 2>/dev/null || kill -KILL "$pid" 2>/dev/null || true
  fi
  # Reap it if it is our child, so no zombie keeps the pid alive.
  wait "$pid" 2>/dev/null || true
  rm -f "$pidfile"
}

# Wait until CHECK (a command) succeeds, up to SECONDS, while PID (if given) stays alive.
wait_until() {
  local what=$1 seconds=$2 pid=$3 log=$4; shift 4
  local deadline=$((SECONDS + seconds))
  until "$@" >/dev/null 2>&1; do
    if [[ -n $pid ]] && ! kill -0 "$pid" 2>/dev/null; then
      show_log_tail "$log"
      die "$what exited before it was ready (log: $log)"
    fi
    if ((SECONDS >= deadline)); then
      show_log_tail "$log"
      die "$what was not ready after ${seconds}s (log: $log)"
    fi
    sleep 0.3
  done
}

# Take an exclusive lock on FILE via fd 9 for the rest of this shell, or report who holds it.
take_run_lock() {
  local file=$1 what=$2
  exec 9>>"$file"
  if ! flock -n 9; then
    local holder
    holder=$(pidfile_live_pid "${file%.lock}.pid" 2>/dev/null || true)
    die "$what is already running${holder:+ (pid $holder)} in this checkout; stop it first (Ctrl-C in its terminal${holder:+ or kill $holder})"
  fi
  pidfile_write "${file%.lock}.pid" "$$"
}
