import type { MigrationContext } from '../db/umzug';

// One stored row per report: a report's radios move into a jsonb column of its heartbeat row (as the
// node sent them, camelCase keys), and the duplicate guard is the heartbeat rows themselves, found through
// heartbeats_report_idx (node, boot id or '', seq). heartbeat_seqs and heartbeat_radios go; the view
// heartbeat_radio_rows gives readers one row per radio as before.
//
// The table is rebuilt rather than updated in place (an UPDATE of every row would leave a dead copy of
// each): the old table and its partitions are renamed, a new one gets the same daily bounds, and the rows
// are copied once with their radios gathered; the indexes are built after the copy.
const RADIO_COLUMNS = `iface text, role text, band text, channel int, "channelWidthMHz" int, ssid text, "signalDbm" float8, "noiseDbm" float8,
  "txRateMbps" float8, "rxRateMbps" float8, clients int, "peerMac" text`;

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP VIEW IF EXISTS heartbeat_radio_rows;
    ALTER TABLE heartbeats RENAME TO heartbeats_0015;
    ALTER INDEX heartbeats_node_time_idx RENAME TO heartbeats_0015_node_time_idx;
    DO $$
    DECLARE p record;
    BEGIN
      FOR p IN SELECT c.relname AS name FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid WHERE i.inhparent = 'heartbeats_0015'::regclass LOOP
        EXECUTE format('ALTER TABLE %I RENAME TO %I', p.name, p.name || '_0015');
      END LOOP;
    END $$;

    CREATE TABLE heartbeats (
      node_id integer NOT NULL,
      seq bigint NOT NULL,
      received_at timestamptz NOT NULL,
      sent_at timestamptz,
      uptime_s double precision,
      load1 double precision,
      mem_free_kb double precision,
      firmware text,
      throughput_mbps double precision,
      latency_ms double precision,
      boot_id text,
      radios jsonb NOT NULL DEFAULT '[]'::jsonb
    ) PARTITION BY RANGE (received_at);
    DO $$
    DECLARE p record;
    BEGIN
      FOR p IN SELECT c.relname AS name, pg_get_expr(c.relpartbound, c.oid) AS bound
                 FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid WHERE i.inhparent = 'heartbeats_0015'::regclass LOOP
        EXECUTE format('CREATE TABLE %I PARTITION OF heartbeats %s', left(p.name, -5), p.bound);
      END LOOP;
    END $$;
    CREATE TABLE IF NOT EXISTS heartbeats_default PARTITION OF heartbeats DEFAULT;

    INSERT INTO heartbeats (node_id, seq, received_at, sent_at, uptime_s, load1, mem_free_kb, firmware, throughput_mbps, latency_ms, boot_id, radios)
    SELECT h.node_id, h.seq, h.received_at, h.sent_at, h.uptime_s, h.load1, h.mem_free_kb, h.firmware, h.throughput_mbps, h.latency_ms, h.boot_id,
           coalesce(r.radios, '[]'::jsonb)
      FROM heartbeats_0015 h
      LEFT JOIN (
        SELECT node_id, coalesce(boot_id, '') AS boot, seq, received_at,
               jsonb_agg(jsonb_strip_nulls(jsonb_build_object('iface', iface, 'role', role, 'band', band, 'channel', channel,
                 'channelWidthMHz', channel_width_mhz, 'ssid', ssid, 'signalDbm', signal_dbm, 'noiseDbm', noise_dbm,
                 'txRateMbps', tx_rate_mbps, 'rxRateMbps', rx_rate_mbps, 'clients', clients, 'peerMac', peer_mac)) ORDER BY iface) AS radios
          FROM heartbeat_radios GROUP BY 1, 2, 3, 4
      ) r ON r.node_id = h.node_id AND r.boot = coalesce(h.boot_id, '') AND r.seq = h.seq AND r.received_at = h.received_at;

    CREATE INDEX heartbeats_node_time_idx ON heartbeats (node_id, received_at);
    CREATE INDEX heartbeats_report_idx ON heartbeats (node_id, (coalesce(boot_id, '')), seq);
    DROP TABLE heartbeats_0015, heartbeat_radios, heartbeat_seqs CASCADE;

    CREATE VIEW heartbeat_radio_rows AS
      SELECT h.node_id, h.seq, h.boot_id, h.received_at, x.iface, x.role, x.band, x.channel, x."channelWidthMHz" AS channel_width_mhz, x.ssid,
             x."signalDbm" AS signal_dbm, x."noiseDbm" AS noise_dbm, x."txRateMbps" AS tx_rate_mbps, x."rxRateMbps" AS rx_rate_mbps,
             x.clients, x."peerMac" AS peer_mac
        FROM heartbeats h CROSS JOIN LATERAL jsonb_to_recordset(h.radios) AS x(${RADIO_COLUMNS});
    ANALYZE heartbeats;
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE heartbeat_seqs (
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      seq bigint NOT NULL,
      received_at timestamptz NOT NULL,
      boot_id text NOT NULL DEFAULT '' CHECK (length(boot_id) <= 64),
      PRIMARY KEY (node_id, boot_id, seq)
    );
    CREATE TABLE heartbeat_radios (
      node_id integer NOT NULL,
      seq bigint NOT NULL,
      received_at timestamptz NOT NULL,
      iface text NOT NULL,
      role text,
      band text,
      channel integer,
      channel_width_mhz integer,
      ssid text,
      signal_dbm double precision,
      noise_dbm double precision,
      tx_rate_mbps double precision,
      rx_rate_mbps double precision,
      clients integer,
      peer_mac text,
      boot_id text
    ) PARTITION BY RANGE (received_at);
    DO $$
    DECLARE p record;
    BEGIN
      FOR p IN SELECT c.relname AS name, pg_get_expr(c.relpartbound, c.oid) AS bound
                 FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid WHERE i.inhparent = 'heartbeats'::regclass LOOP
        EXECUTE format('CREATE TABLE %I PARTITION OF heartbeat_radios %s', 'heartbeat_radios' || substr(p.name, 11), p.bound);
      END LOOP;
    END $$;
    CREATE TABLE IF NOT EXISTS heartbeat_radios_default PARTITION OF heartbeat_radios DEFAULT;
    INSERT INTO heartbeat_radios (node_id, seq, received_at, iface, role, band, channel, channel_width_mhz, ssid,
                                  signal_dbm, noise_dbm, tx_rate_mbps, rx_rate_mbps, clients, peer_mac, boot_id)
    SELECT node_id, seq, received_at, iface, role, band, channel, channel_width_mhz, ssid,
           signal_dbm, noise_dbm, tx_rate_mbps, rx_rate_mbps, clients, peer_mac, boot_id
      FROM heartbeat_radio_rows WHERE iface IS NOT NULL;
    CREATE INDEX heartbeat_radios_node_time_idx ON heartbeat_radios (node_id, received_at);
    INSERT INTO heartbeat_seqs (node_id, boot_id, seq, received_at)
    SELECT node_id, coalesce(boot_id, ''), seq, min(received_at) FROM heartbeats h
     WHERE EXISTS (SELECT 1 FROM nodes n WHERE n.id = h.node_id) GROUP BY 1, 2, 3;
    CREATE INDEX heartbeat_seqs_received_idx ON heartbeat_seqs (received_at);
    DROP VIEW heartbeat_radio_rows;
    DROP INDEX heartbeats_report_idx;
    ALTER TABLE heartbeats DROP COLUMN radios;
  `);
}
