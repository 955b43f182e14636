import type { MigrationContext } from '../db/umzug';

// Planning records: uploaded site surveys, per-node address plans, and a generic change history.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE site_surveys (
      id serial PRIMARY KEY,
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      file_name text CHECK (length(file_name) <= 200),
      uploaded_by integer REFERENCES users (id) ON DELETE SET NULL,
      row_count integer NOT NULL CHECK (row_count >= 0),
      -- The accepted rows as parsed (ssid, band, channel, channelWidthMHz, signalDbm).
      rows jsonb NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX site_surveys_node_idx ON site_surveys (node_id, created_at DESC);

    CREATE TABLE node_address_plans (
      node_id integer PRIMARY KEY REFERENCES nodes (id) ON DELETE CASCADE,
      cidr cidr NOT NULL CHECK (family(cidr) = 4),
      gateway inet NOT NULL,
      dhcp_start inet,
      dhcp_end inet,
      static_addresses inet[] NOT NULL DEFAULT '{}',
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((dhcp_start IS NULL) = (dhcp_end IS NULL))
    );

    -- Who changed what, when: generic so the audit trail can build on it.
    CREATE TABLE change_history (
      id bigserial PRIMARY KEY,
      table_name text NOT NULL CHECK (length(table_name) BETWEEN 1 AND 63),
      record_id text NOT NULL,
      action text NOT NULL CHECK (action IN ('create', 'update', 'delete')),
      changed_by integer REFERENCES users (id) ON DELETE SET NULL,
      changed_at timestamptz NOT NULL DEFAULT now(),
      reason text CHECK (length(reason) <= 500),
      before jsonb,
      after jsonb
    );
    CREATE INDEX change_history_record_idx ON change_history (table_name, record_id, changed_at DESC);
    CREATE INDEX change_history_time_idx ON change_history (changed_at DESC);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`DROP TABLE IF EXISTS change_history, node_address_plans, site_surveys CASCADE;`);
}
