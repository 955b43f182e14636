import { createSequelize } from './sequelize';
import { createMigrator } from './umzug';

// `npm run migrate` (up) and `npm run migrate:down` (one step back).
const direction = process.argv[2] ?? 'up';
const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set: point it at the PostgreSQL database to migrate.');
  process.exit(2);
}
const sequelize = createSequelize(url, 2);
const migrator = createMigrator(sequelize);
try {
  const done = direction === 'down' ? await migrator.down() : await migrator.up();
  console.log(done.length ? `migrations ${direction}: ${done.map((m) => m.name).join(', ')}` : `migrations: nothing to do`);
} catch (err) {
  console.error('migration failed:', err instanceof Error ? err.message : err);
  process.exitCode = 1;
} finally {
  await sequelize.close();
}
