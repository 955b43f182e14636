import type { MigrationContext } from '../db/umzug';

// A report is identified by (boot id, seq): a router that reboots counts from 1 again. Reports
// without a boot id keep the empty one, so (node, seq) identifies them as before.
export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE heartbeat_seqs ADD COLUMN boot_id text NOT NULL DEFAULT '' CHECK (length(boot_id) <= 64);
    ALTER TABLE heartbeat_seqs DROP CONSTRAINT heartbeat_seqs_pkey;
    ALTER TABLE heartbeat_seqs ADD PRIMARY KEY (node_id, boot_id, seq);
    ALTER TABLE heartbeats ADD COLUMN boot_id text;
    ALTER TABLE heartbeat_radios ADD COLUMN boot_id text;
    ALTER TABLE nodes ADD COLUMN last_boot_id text CHECK (length(last_boot_id) <= 64);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE nodes DROP COLUMN IF EXISTS last_boot_id;
    ALTER TABLE heartbeat_radios DROP COLUMN IF EXISTS boot_id;
    ALTER TABLE heartbeats DROP COLUMN IF EXISTS boot_id;
    DELETE FROM heartbeat_seqs WHERE boot_id <> '';
    ALTER TABLE heartbeat_seqs DROP CONSTRAINT heartbeat_seqs_pkey;
    ALTER TABLE heartbeat_seqs ADD PRIMARY KEY (node_id, seq);
    ALTER TABLE heartbeat_seqs DROP COLUMN boot_id;
  `);
}
