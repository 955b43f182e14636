import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';

const migrationsDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../migrations');

export type MigrationContext = { sequelize: Sequelize };

/** Migrations are TypeScript files in server/migrations, applied in name order and recorded in SequelizeMeta. */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: { glob: ['*.ts', { cwd: migrationsDir, ignore: ['*.d.ts'] }] },
    context: { sequelize },
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  });
}
