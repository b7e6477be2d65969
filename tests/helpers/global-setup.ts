// Starts a MariaDB of the tests' own (own port and data directory), gives it a fresh schema, and
// stops it when the run ends, whether the tests passed or not.
import type { TestProject } from 'vitest/node';
import { startLocalMariaDb, type LocalMariaDb } from '../../server/db/local-mariadb.js';
import { migrateUp } from '../../server/db/migrate.js';
import { createSequelize } from '../../server/db/sequelize.js';

let local: LocalMariaDb | null = null;

export default async function setup(project: TestProject) {
  let url = process.env.TEST_DATABASE_URL;
  if (!url) {
    const port = Number(process.env.TEST_DB_PORT ?? 3317);
    // One data directory per port, so that parallel runs on other ports never share a server.
    local = await startLocalMariaDb({
      baseDir: `.data/test-mariadb-${port}`,
      port,
      database: 'rowpath_test',
      log: () => undefined,
    });
    url = local.url;
  }
  const sequelize = createSequelize(url);
  await sequelize.getQueryInterface().dropAllTables();
  await migrateUp(sequelize);
  await sequelize.close();
  project.provide('databaseUrl', url);
  return async () => {
    await local?.stop();
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
  }
}
