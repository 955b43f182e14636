import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { freePort } from './mailFake';

const run = promisify(execFile);

/** Bash with the project's own cluster helpers loaded (docker-free-scripts/lib). */
async function lib(script: string, ...args: string[]) {
  const { stdout } = await run(
    'bash',
    ['-c', `set -euo pipefail; source docker-free-scripts/lib/init.sh .test-data/drills; ensure_postgres_server; ${script}`, 'drill', ...args],
    {
      encoding: 'utf8',
      timeout: 120_000,
    },
  );
  return stdout.trim();
}

/**
 * A PostgreSQL cluster of the drill's own on a free loopback port, so restarting it disturbs no
 * other test; made and removed with the same helpers start.sh and test.sh use.
 */
export async function startDrillCluster() {
  const port = await freePort();
  const dir = await lib(
    'd=$(mktemp -d /tmp/parapet-drill.XXXXXX); pg_owned_dir "$d" || ' +
      '{ rm -rf "$d"; d=$(mktemp -d /var/tmp/parapet-drill.XXXXXX); pg_owned_dir "$d"; }; echo "$d"',
  );
  await lib(
    'pg_init_cluster "$1/pg" parapet_drill >&2 && ' +
      'pg_start_cluster "$1/pg" "$2" "$1/postgres.log" "fsync = off" "synchronous_commit = on" >&2 && ' +
      'pg_ensure_role_and_databases "$1/pg" "$2" parapet_drill >&2',
    dir,
    String(port),
  );
  return {
    url: `postgres://parapet@127.0.0.1:${port}/parapet_drill`,
    port,
    /** As a package upgrade does: fast shutdown (open connections are cut), then start again. */
    restart: () => lib('pg_as_owner "$PG_BIN/pg_ctl" -D "$1/pg" -m fast -w -t 60 restart -l "$1/postgres.log" >/dev/null', dir),
    remove: () => lib('pg_stop_cluster "$1/pg" immediate; rm -rf "$1"', dir),
  };
}
