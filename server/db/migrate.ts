import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { QueryTypes, type QueryInterface, type Sequelize } from 'sequelize';
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

/**
 * Applies pending migrations. Instances that start together take turns: a named MariaDB lock, held
 * on one pinned connection, lets one migrate while the others wait and then find nothing to do.
 * (Named locks are per server: on a multi-primary cluster run `npm run db:migrate` once instead.)
 */
export async function migrateUp(sequelize: Sequelize, log = false) {
  return sequelize.transaction(async (transaction) => {
    const [row] = await sequelize.query<{ got: number | null }>("SELECT GET_LOCK('rowpath_migrations', 120) AS got", { type: QueryTypes.SELECT, transaction });
    if (Number(row?.got) !== 1) throw new Error('Another instance has been migrating the database for over two minutes; try again when it has finished.');
    try {
      return await migrator(sequelize, log).up();
    } finally {
      await sequelize.query("SELECT RELEASE_LOCK('rowpath_migrations')", { transaction });
    }
  });
}
