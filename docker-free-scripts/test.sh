#!/usr/bin/env bash
# Runs Parapet's whole test suite on this machine: installs what is missing, starts a throwaway
# PostgreSQL cluster and mail fake on their own loopback ports, builds the client, runs vitest
# and ends with the line `N passed, N failed[, N skipped]`. Extra arguments go to vitest
# (e.g. docker-free-scripts/test.sh tests/unit/radio/pathLoss.test.ts).
set -euo pipefail

# shellcheck source=lib/init.sh
source "$(dirname "${BASH_SOURCE[0]}")/lib/init.sh" .test-data

take_run_lock "$PARAPET_DATA_DIR/test.lock" "docker-free-scripts/test.sh"

ARTIFACTS_DIR="$PARAPET_ROOT/test-artifacts"
RESULTS_JSON="$ARTIFACTS_DIR/vitest-results.json"
CLUSTER_RECORD="$PARAPET_DATA_DIR/cluster-dir"
MAIL_PIDFILE="$PARAPET_DATA_DIR/maildev.pid"
TEST_TMP=""

# Stop the throwaway services and delete the cluster; quiet and idempotent so it can run
# before the closing summary line and again from the EXIT trap.
cleanup() {
  stop_service "$MAIL_PIDFILE" "mail fake"
  if [[ -n $TEST_TMP ]]; then
    pg_stop_cluster "$TEST_TMP/pg" immediate
    rm -rf "$TEST_TMP"
    rm -f "$CLUSTER_RECORD"
    TEST_TMP=""
  fi
}
on_exit() {
  local rc=$?
  trap - EXIT INT TERM
  stop_step
  cleanup
  rm -f "$PARAPET_DATA_DIR/test.pid"
  exit "$rc"
}
trap on_exit EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

require_node
ensure_postgres_server
if [[ ! -x /usr/bin/chromium ]]; then apt_install chromium; fi
apt_install curl wget busybox shellcheck
(apt_install fonts-liberation) || say "fonts-liberation could not be installed; screenshots will use fallback fonts"
ensure_node_modules

# A run that was killed leaves its cluster and mail fake behind: clear them first.
stop_service "$MAIL_PIDFILE" "mail fake"
if [[ -f $CLUSTER_RECORD ]]; then
  previous=$(<"$CLUSTER_RECORD")
  if [[ $previous == */parapet-test.* && -d $previous ]]; then
    say "removing the test cluster left by an earlier run ($previous)"
    pg_stop_cluster "$previous/pg" immediate
    rm -rf "$previous"
  fi
  rm -f "$CLUSTER_RECORD"
fi

# --- throwaway PostgreSQL, reachable by the cluster owner (postgres when root) ---
TEST_TMP=$(mktemp -d "${TMPDIR:-/tmp}/parapet-test.XXXXXX")
echo "$TEST_TMP" >"$CLUSTER_RECORD"
if ! pg_owned_dir "$TEST_TMP"; then
  rm -rf "$TEST_TMP"
  TEST_TMP=$(mktemp -d /var/tmp/parapet-test.XXXXXX)
  echo "$TEST_TMP" >"$CLUSTER_RECORD"
  pg_owned_dir "$TEST_TMP" || die "no temporary folder that the cluster owner can write"
fi
PG_PORT=${PARAPET_TEST_PG_PORT:-5499}
if port_busy "$PG_PORT"; then
  PG_PORT=$(free_port_from "$PG_PORT")
  say "port ${PARAPET_TEST_PG_PORT:-5499} is taken; the test cluster uses $PG_PORT"
fi
pg_init_cluster "$TEST_TMP/pg" parapet_test,parapet_e2e
# Durability is pointless for a cluster deleted after the run; turning it off saves minutes.
pg_start_cluster "$TEST_TMP/pg" "$PG_PORT" "$TEST_TMP/postgres.log" \
  "fsync = off" "synchronous_commit = off" "full_page_writes = off"
pg_ensure_role_and_databases "$TEST_TMP/pg" "$PG_PORT" parapet_test parapet_e2e

export DATABASE_URL E2E_DATABASE_URL
DATABASE_URL=$(pg_url "$PG_PORT" parapet_test)
E2E_DATABASE_URL=$(pg_url "$PG_PORT" parapet_e2e)
run_logged "npm run migrate (parapet_test)" "$PARAPET_LOG_DIR/migrate-test.log" npm run migrate
run_logged "npm run migrate (parapet_e2e)" "$PARAPET_LOG_DIR/migrate-e2e.log" \
  env DATABASE_URL="$E2E_DATABASE_URL" npm run migrate
run_logged "npm run seed (parapet_e2e)" "$PARAPET_LOG_DIR/seed-e2e.log" \
  env DATABASE_URL="$E2E_DATABASE_URL" PARAPET_DEMO_HISTORY=0 npm run seed

# --- throwaway mail fake ---
SMTP_PORT=$(free_port_from "${PARAPET_TEST_SMTP_PORT:-1125}")
MAIL_WEB_PORT=$(free_port_from "${PARAPET_TEST_MAIL_WEB_PORT:-1180}")
maildev_start "$MAIL_PIDFILE" "$PARAPET_LOG_DIR/maildev.log" "$SMTP_PORT" "$MAIL_WEB_PORT"
export SMTP_HOST=127.0.0.1 SMTP_PORT
export MAILDEV_WEB_URL="http://127.0.0.1:$MAIL_WEB_PORT"

export CHROMIUM_PATH=${CHROMIUM_PATH:-/usr/bin/chromium}
export TEST_ARTIFACTS_DIR="$ARTIFACTS_DIR"
SESSION_SECRET=$(random_hex 32)
export SESSION_SECRET
export PARAPET_DEMO_PASSWORD=${PARAPET_DEMO_PASSWORD:-parapet-demo}

build_client

# Static checks first: a type error, a lint warning, an unformatted file or a shell-script warning
# fails the run like a failing test.
run_logged "tsc --noEmit (type check)" "$PARAPET_LOG_DIR/typecheck.log" npx tsc --noEmit -p tsconfig.json
# PARAPET_SKIP_LINT=1 skips ESLint and Prettier for a quick targeted run; CI never sets it.
if [[ ${PARAPET_SKIP_LINT:-0} != 1 ]]; then
  run_logged "eslint (zero warnings)" "$PARAPET_LOG_DIR/eslint.log" npx eslint . --max-warnings 0
  run_logged "prettier --check (formatting)" "$PARAPET_LOG_DIR/prettier.log" npx prettier --check '**/*.{ts,tsx,js,mjs}'
fi
run_logged "shellcheck (every shell script)" "$PARAPET_LOG_DIR/shellcheck.log" \
  shellcheck -x -P SCRIPTDIR -P SCRIPTDIR/lib -S style \
  "$PARAPET_ROOT"/docker-free-scripts/*.sh "$PARAPET_ROOT"/docker-free-scripts/lib/*.sh "$PARAPET_ROOT"/.ci/run

mkdir -p "$ARTIFACTS_DIR"
rm -f "$RESULTS_JSON"
say "running vitest $*"
vitest_rc=0
npx vitest run --reporter=default --reporter=json --outputFile="$RESULTS_JSON" "$@" </dev/null 9>&- || vitest_rc=$?

cleanup
node "$PARAPET_ROOT/docker-free-scripts/summarize-vitest.mjs" "$RESULTS_JSON" "$vitest_rc"
