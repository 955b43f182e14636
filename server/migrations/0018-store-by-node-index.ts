import type { MigrationContext } from '../db/umzug';
import { STORE_FUNCTION_0017 } from './0017-store-function';

// The store function's statement looked up the watermark by joining every unfolded report to nodes. The planner
// guesses 100 items of 100 reports each for jsonb_to_recordset and jsonb_array_elements, so with a few thousand
// nodes it hashed the whole nodes table on every call, and force_generic_plan kept that plan for the connection's
// life: with 10,000 nodes a one-report call took about 6 ms, all of it in that scan. The watermark is now read
// with each item's node, one index probe per item, before its reports are unfolded.
// A state change that opens or closes no outage (unknown to online, online to degraded and back) no longer needs
// a transaction of its own: an item marked transition records it in node_transitions with the node's move, so a
// whole town coming online at once is stored in group commits instead of one locked transaction per node.
// An item whose guard failed (another instance moved the node) gets the node's current state back, so the caller
// judges it again and retries in the next group instead of taking a locked transaction.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP FUNCTION store_heartbeat_items(jsonb, boolean);
    CREATE FUNCTION store_heartbeat_items(p_items jsonb, p_lock boolean)
      RETURNS TABLE (k int, stored int, updated boolean, cur_state text, cur_streak int, cur_seq text, cur_boot_id text)
    LANGUAGE plpgsql VOLATILE
    -- One plan per connection, kept: planning over every daily partition costs more than running the statement.
    SET plan_cache_mode = force_generic_plan AS $fn$
    #variable_conflict use_column
    BEGIN
      IF p_lock THEN
        PERFORM 1 FROM nodes WHERE id IN (SELECT (e->>'node_id')::int FROM jsonb_array_elements(p_items) AS e) ORDER BY id FOR NO KEY UPDATE;
      END IF;
      RETURN QUERY
      WITH items AS (
        SELECT * FROM jsonb_to_recordset(p_items) AS i(k int, node_id int, received_at timestamptz, reports jsonb, advances boolean,
          newest_seq bigint, boot_id text, last_report jsonb, streak int, reason text, drift jsonb, state text, guarded boolean,
          seen_seq bigint, seen_state text, seen_streak int, seen_boot_id text, transition boolean)
      ),
      -- Each item's node is looked up here, once per item, before its reports are unfolded: the planner guesses
      -- 100 items and 100 reports per item, and a join of those 10,000 guessed rows to nodes would scan the
      -- whole table on every call (a plan kept for the connection's life).
      input AS (
        SELECT DISTINCT ON (i.node_id, r->>'bootId', (r->>'seq')::bigint)
               i.k, i.node_id, i.received_at, r->>'bootId' AS boot_id, (r->>'seq')::bigint AS seq, r,
               n.stored_boot_id AS wm_boot, n.stored_seq AS wm_seq
          FROM items i JOIN nodes n ON n.id = i.node_id CROSS JOIN LATERAL jsonb_array_elements(i.reports) AS r
         ORDER BY i.node_id, r->>'bootId', (r->>'seq')::bigint, i.k
      ),
      -- Exact dedupe without a second table: every writer of a node's reports holds that node's row lock from
      -- before this statement until commit (this function locks the batch's nodes first when p_lock; the locked
      -- path's caller holds FOR UPDATE). This statement's snapshot is taken after the lock is granted, so it sees
      -- every report of those nodes committed before, and DISTINCT ON above removes repeats within the statement.
      -- heartbeat_stored is one index probe per report (heartbeats_report_idx) in each daily partition.
      -- A report of the node's watermark boot with a seq above the watermark cannot have been stored before
      -- (see nodes.stored_seq below), so only the others cost an index probe across the daily partitions.
      kept AS (
        SELECT i.* FROM input i
         WHERE CASE WHEN i.wm_boot IS NOT NULL AND i.boot_id = i.wm_boot AND (i.wm_seq IS NULL OR i.seq > i.wm_seq) THEN true
                    ELSE NOT heartbeat_stored(i.node_id, i.boot_id, i.seq)
               END
      ),
      kept_max AS (SELECT x.k, x.boot_id, max(x.seq) AS seq FROM kept x GROUP BY x.k, x.boot_id),
      hb AS (
        INSERT INTO heartbeats (node_id, seq, boot_id, received_at, sent_at, uptime_s, load1, mem_free_kb, firmware, throughput_mbps, latency_ms, radios)
        SELECT i.node_id, i.seq, nullif(i.boot_id, ''), i.received_at, (i.r->>'sentAt')::timestamptz, (i.r->>'uptimeS')::float8,
               (i.r->>'load1')::float8, (i.r->>'memFreeKb')::float8, i.r->>'firmware', (i.r->>'throughputMbps')::float8, (i.r->>'latencyMs')::float8,
               coalesce(i.r->'radios', '[]'::jsonb)
          FROM kept i
      ),
      -- ok: the item may move its node (not guarded, or the node is still as it was judged). The boot the
      -- watermark speaks for afterwards is the node's last boot after this call.
      judged AS (
        SELECT i.*, g.ok, CASE WHEN g.ok AND i.advances THEN i.boot_id ELSE coalesce(n.last_boot_id, '') END AS wm_boot,
               n.state AS old_state, n.health_streak AS old_streak, n.last_seq AS old_seq, n.last_boot_id AS old_boot_id
          FROM items i JOIN nodes n ON n.id = i.node_id
         CROSS JOIN LATERAL (SELECT NOT i.guarded OR (n.last_seq IS NOT DISTINCT FROM i.seen_seq AND n.state = i.seen_state
                             AND n.health_streak = i.seen_streak AND n.last_boot_id IS NOT DISTINCT FROM nullif(i.seen_boot_id, '')) AS ok) g
      ),
      -- Every item's node row is written (the watermark must cover what was stored even when the guard says
      -- no), but its state moves only when ok.
      node AS (
        UPDATE nodes n SET
          last_seen_at = CASE WHEN j.ok THEN greatest(n.last_seen_at, j.received_at) ELSE n.last_seen_at END,
          first_seen_at = CASE WHEN j.ok AND j.advances THEN coalesce(n.first_seen_at, j.received_at) ELSE n.first_seen_at END,
          last_seq = CASE WHEN j.ok AND j.advances THEN j.newest_seq ELSE n.last_seq END,
          last_boot_id = CASE WHEN j.ok AND j.advances THEN nullif(j.boot_id, '') ELSE n.last_boot_id END,
          last_report = CASE WHEN j.ok AND j.advances THEN j.last_report ELSE n.last_report END,
          health_streak = CASE WHEN j.ok AND j.advances THEN j.streak ELSE n.health_streak END,
          health_reason = CASE WHEN j.ok AND j.advances THEN j.reason ELSE n.health_reason END,
          drift = CASE WHEN j.ok AND j.advances THEN j.drift ELSE n.drift END,
          state_since = CASE WHEN j.ok AND j.advances AND n.state <> j.state THEN j.received_at ELSE n.state_since END,
          state = CASE WHEN j.ok AND j.advances THEN j.state ELSE n.state END,
          stored_boot_id = j.wm_boot,
          -- The highest stored seq of wm_boot: what this call stored of it, and before it either the old
          -- watermark (same boot) or one index probe (the watermark moves to another boot, or was unknown).
          stored_seq = greatest(m.seq, CASE WHEN n.stored_boot_id IS NOT DISTINCT FROM j.wm_boot THEN n.stored_seq
                                            ELSE heartbeat_max_seq(n.id, j.wm_boot) END)
        FROM judged j LEFT JOIN kept_max m ON m.k = j.k AND m.boot_id = j.wm_boot
        WHERE n.id = j.node_id
        RETURNING j.k, j.ok
      ),
      -- A state change that opens or closes no outage (the caller says so: transition) is recorded here, with
      -- the node's move; the others take the caller's locked path, which records them with their outage.
      moved AS (
        INSERT INTO node_transitions (node_id, from_state, to_state, reason, at)
        SELECT j.node_id, j.old_state, j.state, j.reason, j.received_at FROM judged j
         WHERE j.transition AND j.ok AND j.advances AND j.state <> j.old_state
      )
      -- An item whose guard failed gets the node as it is (its row did not move), so the caller can judge again.
      SELECT i.k, coalesce(s.n, 0)::int, coalesce(u.ok, false),
             CASE WHEN u.ok THEN NULL ELSE j.old_state END, CASE WHEN u.ok THEN NULL ELSE j.old_streak END,
             CASE WHEN u.ok THEN NULL ELSE j.old_seq::text END, CASE WHEN u.ok THEN NULL ELSE j.old_boot_id END
        FROM items i
        LEFT JOIN (SELECT x.k, count(*) AS n FROM kept x GROUP BY x.k) s ON s.k = i.k
        LEFT JOIN node u ON u.k = i.k
        LEFT JOIN judged j ON j.k = i.k
       ORDER BY i.k;
    END
    $fn$;
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`DROP FUNCTION store_heartbeat_items(jsonb, boolean); ${STORE_FUNCTION_0017}`);
}
