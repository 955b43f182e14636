import type { MigrationContext } from '../db/umzug';

// What the air says: each radio's last reported MAC (written only when it changes, never bumping
// updated_at, so inventory caches keyed on it stay valid), and MACs seen moving between nodes.
// What a host did during an outage: the steps they marked on the recovery page.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE radios
      ADD COLUMN mac text CHECK (mac ~ '^[0-9a-f]{2}(:[0-9a-f]{2}){5}$'),
      ADD COLUMN mac_reported_at timestamptz;
    CREATE INDEX radios_mac_idx ON radios (mac) WHERE mac IS NOT NULL;

    CREATE TABLE radio_mac_moves (
      id serial PRIMARY KEY,
      mac text NOT NULL CHECK (mac ~ '^[0-9a-f]{2}(:[0-9a-f]{2}){5}$'),
      from_node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      from_iface text NOT NULL,
      to_node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      to_iface text NOT NULL,
      at timestamptz NOT NULL,
      CHECK (from_node_id <> to_node_id)
    );
    CREATE INDEX radio_mac_moves_at_idx ON radio_mac_moves (at);
    CREATE INDEX radio_mac_moves_to_idx ON radio_mac_moves (to_node_id);
    CREATE INDEX radio_mac_moves_from_idx ON radio_mac_moves (from_node_id);

    CREATE TABLE outage_host_steps (
      id bigserial PRIMARY KEY,
      outage_id integer NOT NULL REFERENCES outages (id) ON DELETE CASCADE,
      step text NOT NULL CHECK (step IN ('checked-power', 'replugged-injector', 'restarted-router', 'cannot-reach', 'other')),
      note text CHECK (length(note) <= 500),
      by_user_id integer REFERENCES users (id) ON DELETE SET NULL,
      at timestamptz NOT NULL
    );
    CREATE INDEX outage_host_steps_outage_idx ON outage_host_steps (outage_id, at);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TABLE IF EXISTS outage_host_steps, radio_mac_moves;
    DROP INDEX IF EXISTS radios_mac_idx;
    ALTER TABLE radios DROP COLUMN IF EXISTS mac_reported_at, DROP COLUMN IF EXISTS mac;
  `);
}
