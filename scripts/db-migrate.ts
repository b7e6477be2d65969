// `npm run db:migrate`: applies pending migrations to the configured database (DATABASE_URL, or
// the local MariaDB `npm start` uses) and stops. For rolling out a new version to several
// instances: migrate once, then start them.
import { openDatabase } from '../server/boot.js';
import { loadConfig } from '../server/config.js';
import { migrateUp } from '../server/db/migrate.js';

const config = loadConfig();
const db = await openDatabase(config);
try {
  const applied = await migrateUp(db.sequelize);
  console.log(applied.length ? `Applied ${applied.length} migration(s) to ${db.describe}: ${applied.map((m) => m.name).join(', ')}` : `${db.describe} is up to date.`);
} finally {
  await db.close();
}
