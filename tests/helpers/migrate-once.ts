import { createSequelize } from '../../server/db/sequelize';
import { createMigrator } from '../../server/db/umzug';

/** Brings the API test database to the latest schema once per run. */
export default async function setup() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL must point at a throwaway PostgreSQL database (docker-free-scripts/test.sh sets it).');
  const sequelize = createSequelize(url, 2);
  try {
    await createMigrator(sequelize).up();
  } finally {
    await sequelize.close();
  }
}
