import type { MigrationContext } from '../db/umzug';

// Install photos (files on disk under random names; the rows say whose they are) and an index for
// monthly availability reports, which look up outages by when they ended.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE photos (
      id serial PRIMARY KEY,
      site_id integer NOT NULL REFERENCES sites (id) ON DELETE CASCADE,
      storage_key text NOT NULL CHECK (storage_key ~ '^[0-9a-f]{32}$'),
      content_type text NOT NULL CHECK (content_type IN ('image/jpeg', 'image/png', 'image/webp')),
      size_bytes integer NOT NULL CHECK (size_bytes > 0),
      width_px integer CHECK (width_px > 0),
      height_px integer CHECK (height_px > 0),
      has_thumbnail boolean NOT NULL DEFAULT false,
      caption text CHECK (length(caption) <= 200),
      uploaded_by integer REFERENCES users (id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX photos_storage_key ON photos (storage_key);
    CREATE INDEX photos_site_idx ON photos (site_id, created_at DESC);
    CREATE INDEX outages_ended_idx ON outages (ended_at);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP INDEX IF EXISTS outages_ended_idx;
    DROP TABLE IF EXISTS photos;
  `);
}
