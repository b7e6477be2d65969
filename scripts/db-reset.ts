// `npm run db:reset`: drops every table, migrates afresh and loads the demo dealership again.
import { openDatabase } from '../server/boot.js';
import { loadConfig } from '../server/config.js';
import { migrateUp } from '../server/db/migrate.js';
import { seedDemo } from '../seeders/demo.js';

const config = loadConfig();
const db = await openDatabase(config);
try {
  console.log(`Rebuilding the demo data in ${db.describe}…`);
  await db.sequelize.getQueryInterface().dropAllTables();
  await migrateUp(db.sequelize);
  await seedDemo(db.sequelize);
  console.log('Demo data rebuilt.');
} finally {
  await db.close();
}
