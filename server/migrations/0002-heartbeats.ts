import type { MigrationContext } from '../db/umzug';

// Node credentials, heartbeat storage (time-partitioned), roll-ups, health and outages.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE node_tokens (
      id serial PRIMARY KEY,
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      token_hash text NOT NULL UNIQUE,
      created_at timestamptz NOT NULL DEFAULT now(),
      revoked_at timestamptz
    );
    CREATE INDEX node_tokens_node_idx ON node_tokens (node_id) WHERE revoked_at IS NULL;

    -- Duplicate reports are caught here: a unique index on the partitioned table would have to
    -- include received_at, so a resent report (new receive time) would slip through.
    CREATE TABLE heartbeat_seqs (
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      seq bigint NOT NULL,
      received_at timestamptz NOT NULL,
      PRIMARY KEY (node_id, seq)
    );
    CREATE INDEX heartbeat_seqs_received_idx ON heartbeat_seqs (received_at);

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
      latency_ms double precision
    ) PARTITION BY RANGE (received_at);
    CREATE INDEX heartbeats_node_time_idx ON heartbeats (node_id, received_at);
    CREATE TABLE heartbeats_default PARTITION OF heartbeats DEFAULT;

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
      peer_mac text
    ) PARTITION BY RANGE (received_at);
    CREATE INDEX heartbeat_radios_node_time_idx ON heartbeat_radios (node_id, received_at);
    CREATE TABLE heartbeat_radios_default PARTITION OF heartbeat_radios DEFAULT;

    CREATE TABLE heartbeat_rollups (
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      bucket_s integer NOT NULL CHECK (bucket_s IN (300, 3600)),
      bucket_start timestamptz NOT NULL,
      reports integer NOT NULL,
      expected_reports integer NOT NULL,
      availability_pct double precision NOT NULL CHECK (availability_pct BETWEEN 0 AND 100),
      signal_min_dbm double precision, signal_avg_dbm double precision, signal_max_dbm double precision,
      noise_min_dbm double precision, noise_avg_dbm double precision, noise_max_dbm double precision,
      snr_min_db double precision, snr_avg_db double precision, snr_max_db double precision,
      throughput_min_mbps double precision, throughput_avg_mbps double precision, throughput_max_mbps double precision,
      latency_min_ms double precision, latency_avg_ms double precision, latency_max_ms double precision,
      PRIMARY KEY (node_id, bucket_s, bucket_start)
    );
    CREATE INDEX heartbeat_rollups_time_idx ON heartbeat_rollups (bucket_s, bucket_start);

    ALTER TABLE nodes
      ADD COLUMN last_seq bigint,
      ADD COLUMN last_report jsonb,
      ADD COLUMN health_streak integer NOT NULL DEFAULT 0,
      ADD COLUMN health_reason text,
      ADD COLUMN thresholds jsonb,
      ADD COLUMN drift jsonb;

    CREATE TABLE node_transitions (
      id bigserial PRIMARY KEY,
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      from_state text NOT NULL,
      to_state text NOT NULL,
      reason text,
      at timestamptz NOT NULL
    );
    CREATE INDEX node_transitions_node_idx ON node_transitions (node_id, at);

    CREATE TABLE outages (
      id serial PRIMARY KEY,
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      started_at timestamptz NOT NULL,
      ended_at timestamptz,
      acknowledged_at timestamptz,
      acknowledged_by integer REFERENCES users (id) ON DELETE SET NULL,
      notes text CHECK (length(notes) <= 4000),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (ended_at IS NULL OR ended_at >= started_at)
    );
    -- At most one open outage per node.
    CREATE UNIQUE INDEX outages_one_open_idx ON outages (node_id) WHERE ended_at IS NULL;
    CREATE INDEX outages_started_idx ON outages (started_at);

    CREATE TABLE job_state (
      name text PRIMARY KEY,
      last_run_at timestamptz,
      watching_since timestamptz
    );

    ALTER TABLE network_settings
      ADD COLUMN thresholds jsonb NOT NULL DEFAULT '{}'::jsonb;

    -- socket.io's PostgreSQL adapter keeps payloads too large for NOTIFY here
    CREATE TABLE socket_io_attachments (
      id bigserial UNIQUE,
      created_at timestamptz DEFAULT now(),
      payload bytea
    );
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE network_settings DROP COLUMN IF EXISTS thresholds;
    DROP TABLE IF EXISTS socket_io_attachments, job_state, outages, node_transitions, heartbeat_rollups, heartbeat_radios, heartbeats, heartbeat_seqs, node_tokens CASCADE;
    ALTER TABLE nodes DROP COLUMN IF EXISTS last_seq, DROP COLUMN IF EXISTS last_report, DROP COLUMN IF EXISTS health_streak,
      DROP COLUMN IF EXISTS health_reason, DROP COLUMN IF EXISTS thresholds, DROP COLUMN IF EXISTS drift;
  `);
}
