import type { MigrationContext } from '../db/umzug';

// Nodes cut off behind an upstream failure: which root they hang off, what they were serving, and
// when the root came back (from then on they get the usual grace before an outage of their own).
// The outage keeps its blast radius as two counts so lists sort on it without a join.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE stranded_nodes (
      id serial PRIMARY KEY,
      node_id integer NOT NULL REFERENCES nodes (id) ON DELETE CASCADE,
      root_node_id integer REFERENCES nodes (id) ON DELETE SET NULL,
      outage_id integer REFERENCES outages (id) ON DELETE CASCADE,
      cause text NOT NULL CHECK (cause IN ('outage', 'partition', 'maintenance')),
      neighbourhood_id integer NOT NULL REFERENCES neighbourhoods (id) ON DELETE CASCADE,
      clients integer NOT NULL DEFAULT 0 CHECK (clients >= 0),
      stranded_at timestamptz NOT NULL,
      released_at timestamptz,
      ended_at timestamptz,
      CHECK ((cause = 'outage') = (outage_id IS NOT NULL)),
      CHECK (released_at IS NULL OR released_at >= stranded_at),
      CHECK (ended_at IS NULL OR ended_at >= stranded_at)
    );
    -- A node is stranded behind at most one root at a time.
    CREATE UNIQUE INDEX stranded_nodes_open_idx ON stranded_nodes (node_id) WHERE ended_at IS NULL;
    CREATE INDEX stranded_nodes_outage_idx ON stranded_nodes (outage_id);
    ALTER TABLE outages
      ADD COLUMN blast_node_count integer NOT NULL DEFAULT 0 CHECK (blast_node_count >= 0),
      ADD COLUMN blast_clients integer NOT NULL DEFAULT 0 CHECK (blast_clients >= 0);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE outages DROP COLUMN IF EXISTS blast_clients, DROP COLUMN IF EXISTS blast_node_count;
    DROP TABLE IF EXISTS stranded_nodes;
  `);
}
