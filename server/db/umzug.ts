import { Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { MIGRATIONS } from '../migrations';

export type MigrationContext = { sequelize: Sequelize };

/** Migrations are listed in server/migrations/index.ts and recorded in SequelizeMeta once applied. */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: MIGRATIONS.map(({ name, up, down }) => ({ name, up, down })),
    context: { sequelize },
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  });
}
