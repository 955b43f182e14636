import type { MigrationContext } from '../db/umzug';

// When a node was first heard from: availability is measured from then, not from when it was added.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE nodes ADD COLUMN first_seen_at timestamptz;
    CREATE INDEX outages_node_started_idx ON outages (node_id, started_at DESC);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP INDEX IF EXISTS outages_node_started_idx;
    ALTER TABLE nodes DROP COLUMN IF EXISTS first_seen_at;
  `);
}
