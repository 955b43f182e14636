#!/usr/bin/env bash
# Replaces the dev database (the cluster start.sh runs) with a dump made by backup.sh.
# Usage: docker-free-scripts/restore.sh [--yes] FILE
set -euo pipefail

usage() { sed -n '2,3p' "${BASH_SOURCE[0]}" | sed 's/^# //'; }
assume_yes=""
dump=""
for arg in "$@"; do
  case $arg in
    -y | --yes) assume_yes=1 ;;
    -h | --help) usage; exit 0 ;;
    -*) usage >&2; echo "unknown option: $arg" >&2; exit 2 ;;
    *) [[ -z $dump ]] || { usage >&2; exit 2; }; dump=$(realpath -m -- "$arg") ;;
  esac
done
[[ -n $dump ]] || { usage >&2; exit 2; }
# shellcheck source=lib/init.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/init.sh" .data

[[ -f $dump ]] || die "no such file: $dump"
PG_BIN=$(pg_find_bindir) || die "PostgreSQL is not installed here; run docker-free-scripts/start.sh first"
"$PG_BIN/pg_restore" --list "$dump" >/dev/null 2>&1 || die "$dump is not a dump made by backup.sh (pg_dump custom format)"
port=$(pg_dev_running_port)

if [[ -z $assume_yes ]]; then
  printf 'This replaces ALL data in the database parapet on 127.0.0.1:%s with\n  %s\n' "$port" "$dump" >&2
  if pid=$(pidfile_live_pid "$PARAPET_DATA_DIR/app.pid"); then
    printf 'The app is running (pid %s); people signed in now may see errors until the restore ends.\n' "$pid" >&2
  fi
  answer=""
  read -r -p 'Type yes to go on: ' answer || true
  [[ $answer == yes ]] || die "not restored (answer was not 'yes'; use --yes to skip this question)"
fi

# One transaction: a restore that fails part-way leaves the database as it was.
if ! "$PG_BIN/pg_restore" --clean --if-exists --no-owner --single-transaction --exit-on-error \
  --host=127.0.0.1 --port="$port" --username=parapet --dbname=parapet "$dump"; then
  die "pg_restore failed; the database was left as it was"
fi
say "restored the database parapet (127.0.0.1:$port) from $dump"
