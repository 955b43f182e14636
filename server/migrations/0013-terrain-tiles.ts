import type { MigrationContext } from '../db/umzug';

// Elevation tiles (SRTM .hgt) uploaded by admins; link budgets read their ground profile from them.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE terrain_tiles (
      name text PRIMARY KEY CHECK (name ~ '^[NS][0-9]{2}[EW][0-9]{3}$'),
      south integer NOT NULL CHECK (south BETWEEN -90 AND 89),
      west integer NOT NULL CHECK (west BETWEEN -180 AND 179),
      samples_per_side integer NOT NULL CHECK (samples_per_side IN (1201, 3601)),
      data bytea NOT NULL CHECK (octet_length(data) = samples_per_side * samples_per_side * 2),
      uploaded_by integer REFERENCES users (id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('DROP TABLE IF EXISTS terrain_tiles;');
}
