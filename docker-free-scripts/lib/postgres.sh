# shellcheck shell=bash
# PostgreSQL clusters of our own from Debian's server packages, on 127.0.0.1 only.
# Sourced after lib/common.sh. PostgreSQL refuses to run as root, so as root every
# cluster command runs as the `postgres` user; as a normal user it runs as that user.

PG_BIN=${PG_BIN:-}

pg_find_bindir() {
  local d
  # Newest major version first (a glob alone would sort 9 after 15).
  for d in $(printf '%s\n' /usr/lib/postgresql/*/bin | sort -V -r); do
    if [[ -x $d/initdb && -x $d/pg_ctl && -x $d/postgres ]]; then
      echo "$d"
      return 0
    fi
  done
  return 1
}

# The server binaries (a psql client alone is not enough), installed when absent.
ensure_postgres_server() {
  PG_BIN=$(pg_find_bindir) || {
    apt_install postgresql
    PG_BIN=$(pg_find_bindir) || die "PostgreSQL server binaries (initdb, pg_ctl) not found under /usr/lib/postgresql/*/bin even though the postgresql package is installed; reinstall it: apt-get install --reinstall postgresql-15"
  }
  if is_root; then
    id postgres >/dev/null 2>&1 || die "running as root needs the 'postgres' user that Debian's postgresql package creates; it is missing"
    PG_SUPERUSER=postgres
  else
    PG_SUPERUSER=$(id -un)
  fi
}

# Run a cluster command as the cluster's owner, from / (postgres cannot enter root's cwd).
pg_as_owner() {
  if is_root; then
    (cd / && runuser -u postgres -- "$@")
  else
    "$@"
  fi
}

# Make DIR (and hand it to the cluster owner); true when the owner can write in it,
# which also proves it can traverse every parent folder.
pg_owned_dir() {
  local dir=$1
  mkdir -p "$dir"
  if is_root; then
    chown postgres:postgres "$dir"
    chmod 700 "$dir"
  fi
  pg_as_owner test -w "$dir"
}

# Write stdin to FILE as the cluster owner (-a appends).
pg_owner_write() { pg_as_owner tee "${@:2}" "$1" >/dev/null; }

# The fallback folder is named after the checkout (the default .data) or after the data folder itself
# (start.sh with PARAPET_DATA elsewhere), so two data folders never share a cluster.
data_hash() {
  local key=$PARAPET_ROOT
  [[ $PARAPET_DATA_DIR == "$PARAPET_ROOT/.data" ]] || key=$PARAPET_DATA_DIR
  printf '%s' "$key" | sha256sum | cut -c1-10
}

pg_dev_candidates() { printf '%s\n' "$PARAPET_DATA_DIR/pg" "/var/tmp/parapet-$(data_hash)/pg"; }

# The dev cluster's data folder: .data/pg in the checkout, or, when the postgres user cannot
# reach the checkout (root with a checkout under a 0700 home), a per-checkout folder in /var/tmp.
pg_dev_data_dir() {
  local candidates preferred fallback want owner dir
  mapfile -t candidates < <(pg_dev_candidates)
  preferred=${candidates[0]} fallback=${candidates[1]}
  if is_root; then want=postgres; else want=$(id -un); fi
  for dir in "$preferred" "$fallback"; do
    if [[ -f $dir/PG_VERSION ]]; then
      owner=$(stat -c %U "$dir")
      [[ $owner == "$want" ]] || die "the database cluster in $dir belongs to user '$owner'; run this script as $([[ $owner == postgres ]] && echo root || echo "$owner") (it runs as $(id -un))"
      pg_as_owner test -w "$dir" || die "the database cluster in $dir is no longer reachable by '$want' (folder permissions changed?)"
      echo "$dir"
      return 0
    fi
  done
  if pg_owned_dir "$preferred" 2>/dev/null; then
    echo "$preferred"
    return 0
  fi
  rmdir "$preferred" 2>/dev/null || true
  say "user '$want' cannot reach $preferred (a parent folder is closed to it); keeping the database in $fallback"
  mkdir -p "${fallback%/*}"
  if is_root; then chown postgres:postgres "${fallback%/*}" && chmod 700 "${fallback%/*}"; fi
  pg_owned_dir "$fallback" || die "user '$want' cannot write $fallback either"
  echo "$fallback"
}

# Unix sockets have a ~107 byte path limit; long checkout paths fall back to /tmp.
pg_socket_dir() { if ((${#1} < 90)); then echo "$1"; else echo /tmp; fi; }

# pid of the postmaster serving DATADIR when one really runs there. A postmaster.pid left by
# a crash or a reboot is removed (its pid may now belong to an unrelated process).
pg_running_pid() {
  local data=$1 pidfile="$1/postmaster.pid" pid cwd
  [[ -f $pidfile ]] || return 1
  pid=$(head -n 1 "$pidfile")
  if [[ $pid =~ ^[0-9]+$ ]]; then
    cwd=$(pg_as_owner readlink "/proc/$pid/cwd" 2>/dev/null || true)
    if [[ -n $cwd && $cwd == "$(realpath "$data")" ]]; then
      echo "$pid"
      return 0
    fi
  fi
  say "removing stale $pidfile (pid $pid is not running this cluster)"
  local sockdir lock
  sockdir=$(sed -n 5p "$pidfile" 2>/dev/null || true)
  lock="$sockdir/.s.PGSQL.$(sed -n 4p "$pidfile" 2>/dev/null).lock"
  rm -f "$pidfile"
  if [[ -n $sockdir && -f $lock && ! -S ${lock%.lock} ]]; then rm -f "$lock"; fi
  return 1
}

pg_running_port() { sed -n 4p "$1/postmaster.pid"; }

# Port of the running dev cluster (start.sh's); dies with advice when none answers.
pg_dev_running_port() {
  local port=${PARAPET_PG_PORT:-5433} dir
  while read -r dir; do
    if [[ -f $dir/postmaster.pid ]] && pg_running_pid "$dir" >/dev/null; then
      port=$(pg_running_port "$dir")
      break
    fi
  done < <(pg_dev_candidates)
  "$PG_BIN/pg_isready" -q -h 127.0.0.1 -p "$port" ||
    die "the dev database is not running (nothing answers on 127.0.0.1:$port); start it with docker-free-scripts/start.sh in another terminal, then try again"
  echo "$port"
}

# initdb once; every start rewrites parapet.conf so port and socket follow the environment.
# DATABASES: the only databases the app role may reach over TCP.
pg_init_cluster() {
  local data=$1 databases=$2
  if [[ -f $data/PG_VERSION ]]; then return 0; fi
  run_logged "creating PostgreSQL cluster in $data" "$PARAPET_LOG_DIR/initdb.log" \
    pg_as_owner "$PG_BIN/initdb" -D "$data" -U "$PG_SUPERUSER" --encoding=UTF8 --locale=C.UTF-8 \
    --auth-local=peer --auth-host=reject
  printf '%s\n' "local all $PG_SUPERUSER peer" "host $databases parapet 127.0.0.1/32 trust" |
    pg_owner_write "$data/pg_hba.conf"
  echo "include_if_exists = 'parapet.conf'" | pg_owner_write "$data/postgresql.conf" -a
}

# Start the cluster in DATA on 127.0.0.1:PORT; extra postgresql.conf lines may follow.
pg_start_cluster() {
  local data=$1 port=$2 log=$3; shift 3
  local sockdir conf
  sockdir=$(pg_socket_dir "$data")
  conf=$(printf "listen_addresses = '127.0.0.1'\nport = %s\nunix_socket_directories = '%s'\n" "$port" "${sockdir//\'/\'\'}")
  if (($#)); then conf+=$'\n'$(printf '%s\n' "$@"); fi
  printf '%s\n' "$conf" | pg_owner_write "$data/parapet.conf"
  if port_busy "$port"; then
    die "port $port on 127.0.0.1 is already taken by another program; choose another with PARAPET_PG_PORT / PARAPET_TEST_PG_PORT"
  fi
  touch "$log"
  if is_root; then chown postgres:postgres "$log"; fi
  say "starting PostgreSQL on 127.0.0.1:$port (data: $data, log: $log)"
  if ! pg_as_owner "$PG_BIN/pg_ctl" -D "$data" -l "$log" -w -t 90 start >>"$PARAPET_LOG_DIR/pg_ctl.log" 2>&1 9>&-; then
    show_log_tail "$PARAPET_LOG_DIR/pg_ctl.log" 10
    show_log_tail "$log"
    die "PostgreSQL did not start (log: $log)"
  fi
  wait_until "PostgreSQL on port $port" 60 "" "$log" "$PG_BIN/pg_isready" -q -h 127.0.0.1 -p "$port"
}

pg_stop_cluster() {
  local data=$1 mode=${2:-fast}
  pg_running_pid "$data" >/dev/null 2>&1 || return 0
  pg_as_owner "$PG_BIN/pg_ctl" -D "$data" -m "$mode" -w -t 60 stop >>"$PARAPET_LOG_DIR/pg_ctl.log" 2>&1 ||
    say "warning: PostgreSQL in $data did not stop cleanly (see $PARAPET_LOG_DIR/pg_ctl.log)"
}

# SQL as the cluster superuser over the unix socket (peer authentication).
pg_admin_sql() {
  local data=$1 port=$2 sql=$3
  pg_as_owner "$PG_BIN/psql" -X -q -A -t -v ON_ERROR_STOP=1 -h "$(pg_socket_dir "$data")" -p "$port" \
    -U "$PG_SUPERUSER" -d postgres -c "$sql"
}

# The app's login role `parapet` (no superuser) and its databases, created when missing.
pg_ensure_role_and_databases() {
  local data=$1 port=$2 db; shift 2
  if [[ $(pg_admin_sql "$data" "$port" "SELECT 1 FROM pg_roles WHERE rolname = 'parapet'") != 1 ]]; then
    pg_admin_sql "$data" "$port" "CREATE ROLE parapet LOGIN" >/dev/null
  fi
  for db in "$@"; do
    if [[ $(pg_admin_sql "$data" "$port" "SELECT 1 FROM pg_database WHERE datname = '$db'") != 1 ]]; then
      say "creating database $db"
      pg_admin_sql "$data" "$port" "CREATE DATABASE $db OWNER parapet ENCODING 'UTF8' TEMPLATE template0" >/dev/null
    fi
  done
}

pg_url() { echo "postgres://parapet@127.0.0.1:$1/$2"; }
