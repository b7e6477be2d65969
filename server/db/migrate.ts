import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';

const here = path.dirname(fileURLToPath(import.meta.url));

export type MigrationContext = { queryInterface: QueryInterface; sequelize: Sequelize };

/** Umzug over the migration files in server/db/migrations, recorded in `schema_migrations`. */
export function migrator(sequelize: Sequelize, log = false) {
  return new Umzug<MigrationContext>({
    migrations: {
      glob: ['migrations/*.ts', { cwd: here }],
      resolve: ({ name, path: file }) => ({
        name,
        up: async ({ context }) => (await import(file!)).up(context),
        down: async ({ context }) => (await import(file!)).down(context),
      }),
    },
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: log ? console : undefined,
  });
}

export async function migrateUp(sequelize: Sequelize, log = false) {
  return migrator(sequelize, log).up();
}
