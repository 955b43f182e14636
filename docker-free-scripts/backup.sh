#!/usr/bin/env bash
# Saves the dev database (the cluster start.sh runs) with pg_dump's custom format.
# Usage: docker-free-scripts/backup.sh [FILE]   (default backups/parapet-<UTC time>.dump)
set -euo pipefail

if [[ ${1:-} == -h || ${1:-} == --help ]]; then
  sed -n '2,3p' "${BASH_SOURCE[0]}" | sed 's/^# //'
  exit 0
fi
# A FILE given by the caller is relative to the caller's folder, not the checkout.
target=${1:+$(realpath -m -- "$1")}
# shellcheck source=lib/init.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/init.sh" .data

PG_BIN=$(pg_find_bindir) || die "PostgreSQL is not installed here; run docker-free-scripts/start.sh first"
port=$(pg_dev_running_port)

if [[ -z $target ]]; then
  mkdir -p "$PARAPET_ROOT/backups"
  # Dumps hold people's data: never let them slip into a commit.
  [[ -f $PARAPET_ROOT/backups/.gitignore ]] || echo '*' >"$PARAPET_ROOT/backups/.gitignore"
  target="$PARAPET_ROOT/backups/parapet-$(date -u +%Y%m%dT%H%M%SZ).dump"
fi
[[ -e $target ]] && die "$target already exists; choose another file name"
mkdir -p "$(dirname "$target")"

# Write to a side file and rename, so an interrupted dump never looks like a finished one.
if ! (umask 077 && "$PG_BIN/pg_dump" --format=custom --host=127.0.0.1 --port="$port" \
  --username=parapet --dbname=parapet --file="$target.partial"); then
  rm -f "$target.partial"
  die "pg_dump failed; nothing was saved"
fi
mv "$target.partial" "$target"
say "saved the database parapet (127.0.0.1:$port) to:"
echo "$target"
