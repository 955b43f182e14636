import { Sequelize } from 'sequelize';

/** One Sequelize instance per process (or per test app), connected to PostgreSQL. */
export function createSequelize(databaseUrl: string, poolMax = 10): Sequelize {
  return new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: false,
    pool: { max: poolMax, min: 0, idle: 10_000, acquire: 10_000 },
    define: { underscored: true, timestamps: true },
    dialectOptions: { connectionTimeoutMillis: 5_000, application_name: 'parapet' },
  });
}
