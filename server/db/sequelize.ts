import { Sequelize } from 'sequelize';

/** One Sequelize instance per process, in UTC, with ids and counts as plain numbers. */
export function createSequelize(url: string, logging: boolean | ((sql: string) => void) = false): Sequelize {
  return new Sequelize(url, {
    dialect: 'mariadb',
    logging,
    timezone: '+00:00',
    dialectOptions: {
      bigIntAsNumber: true,
      insertIdAsNumber: true,
      decimalAsNumber: true,
      connectTimeout: 3000,
    },
    pool: { max: 20, min: 0, acquire: 5000, idle: 10_000 },
    define: { underscored: true },
  });
}
