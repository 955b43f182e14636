import type { MigrationContext } from '../db/umzug';

// Ingest's store statement as a function, so PostgreSQL plans it once per connection instead of once per
// call (planning the statement over every daily partition cost about 15 ms, more than running it), and a
// group of reports costs one round trip: the function takes the batch's node row locks itself (in id
// order), then stores. It is VOLATILE, so its store statement takes its snapshot after the locks are
// granted and sees every report of those nodes committed before (the exact dedupe below relies on it).
// Each item is one request: its node, receive time, reports (boot id '' when the node sent none, sentAt
// null when the node's clock was plainly wrong) and what the newest report does to the node. A guarded
// item moves its node only if the node is still as it was judged (seen_*); otherwise nothing about that
// node changes. An item whose report is not newer (advances false) only touches last_seen_at. A node
// appears in at most one item of a call. The function returns, per item k, the reports stored and
// whether the node row was updated.

/** The store function as this migration made it (0018 replaced its statement; its down puts this back). */
export const STORE_FUNCTION_0017 = `
    CREATE FUNCTION store_heartbeat_items(p_items jsonb, p_lock boolean) RETURNS TABLE (k int, stored int, updated boolean)
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
          seen_seq bigint, seen_state text, seen_streak int, seen_boot_id text)
      ),
      input AS (
        SELECT DISTINCT ON (i.node_id, r->>'bootId', (r->>'seq')::bigint)
               i.k, i.node_id, i.received_at, r->>'bootId' AS boot_id, (r->>'seq')::bigint AS seq, r
          FROM items i CROSS JOIN LATERAL jsonb_array_elements(i.reports) AS r
         WHERE EXISTS (SELECT 1 FROM nodes n WHERE n.id = i.node_id)
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
        SELECT i.* FROM input i JOIN nodes n ON n.id = i.node_id
         WHERE CASE WHEN n.stored_boot_id IS NOT NULL AND i.boot_id = n.stored_boot_id AND (n.stored_seq IS NULL OR i.seq > n.stored_seq) THEN true
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
        SELECT i.*, g.ok, CASE WHEN g.ok AND i.advances THEN i.boot_id ELSE coalesce(n.last_boot_id, '') END AS wm_boot
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
      )
      SELECT i.k, coalesce(s.n, 0)::int, coalesce(u.ok, false)
        FROM items i
        LEFT JOIN (SELECT x.k, count(*) AS n FROM kept x GROUP BY x.k) s ON s.k = i.k
        LEFT JOIN node u ON u.k = i.k
       ORDER BY i.k;
    END
    $fn$;
`;

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    -- The watermark: every stored report of this node whose boot id (or '') is stored_boot_id has a seq of at
    -- most stored_seq (NULL: none stored). NULL stored_boot_id: not known yet. Only store_heartbeat_items writes
    -- them, under the node's row lock; a report above the watermark needs no duplicate probe.
    ALTER TABLE nodes ADD COLUMN stored_boot_id text, ADD COLUMN stored_seq bigint;
    UPDATE nodes n SET stored_boot_id = coalesce(n.last_boot_id, ''),
      stored_seq = (SELECT max(h.seq) FROM heartbeats h WHERE h.node_id = n.id AND coalesce(h.boot_id, '') = coalesce(n.last_boot_id, ''));

    -- The two lookups across every daily partition, as functions of their own: a plan that names the partitioned
    -- table sets up a scan of every partition each time it runs, so the store statement keeps them out and
    -- calls these only for the reports that need them. STABLE: they read with the calling statement's snapshot.
    CREATE FUNCTION heartbeat_stored(p_node int, p_boot text, p_seq bigint) RETURNS boolean
    LANGUAGE plpgsql STABLE SET plan_cache_mode = force_generic_plan AS $fn$
    BEGIN
      RETURN EXISTS (SELECT 1 FROM heartbeats h WHERE h.node_id = p_node AND coalesce(h.boot_id, '') = p_boot AND h.seq = p_seq);
    END
    $fn$;
    CREATE FUNCTION heartbeat_max_seq(p_node int, p_boot text) RETURNS bigint
    LANGUAGE plpgsql STABLE SET plan_cache_mode = force_generic_plan AS $fn$
    BEGIN
      RETURN (SELECT max(h.seq) FROM heartbeats h WHERE h.node_id = p_node AND coalesce(h.boot_id, '') = p_boot);
    END
    $fn$;

    ${STORE_FUNCTION_0017}
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(
    'DROP FUNCTION store_heartbeat_items(jsonb, boolean); DROP FUNCTION heartbeat_stored(int, text, bigint); DROP FUNCTION heartbeat_max_seq(int, text); ALTER TABLE nodes DROP COLUMN stored_boot_id, DROP COLUMN stored_seq',
  );
}
