import type { MigrationContext } from '../db/umzug';

// Invitation and password-reset links (single use: each link is a row that is spent once), and the
// moment a person's data was erased (the row stays so the network's records keep their references).
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE account_tokens (
      id bigserial PRIMARY KEY,
      purpose text NOT NULL CHECK (purpose IN ('invitation', 'password-reset')),
      user_id integer NOT NULL REFERENCES users (id) ON DELETE CASCADE,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX account_tokens_user_idx ON account_tokens (user_id, purpose) WHERE used_at IS NULL;

    ALTER TABLE users ADD COLUMN erased_at timestamptz;
    ALTER TABLE users ADD CONSTRAINT users_erased_inactive CHECK (erased_at IS NULL OR (active = false AND password_hash IS NULL AND phone IS NULL));
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE users DROP CONSTRAINT IF EXISTS users_erased_inactive;
    ALTER TABLE users DROP COLUMN IF EXISTS erased_at;
    DROP TABLE IF EXISTS account_tokens;
  `);
}
