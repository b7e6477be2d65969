// `npm run seed:large`: 2,000 accounts, 6,000 planters and 60,000 installed components for the
// benchmarks, added to the configured database beside whatever is there (the demo included).
import { openDatabase } from '../server/boot.js';
import { loadConfig } from '../server/config.js';
import { Account, Component, Territory } from '../server/db/models/index.js';
import { CATALOG } from './demo-catalog.js';
import { catalogIds, emptyFleet, generateFleet, insertFleet, mulberry32, nextIds } from './fleet-generator.js';

export const LARGE = { accounts: 2000, plantersPerAccount: 3, installsPerPlanter: 10 };

export async function seedLarge(sequelize: import('sequelize').Sequelize, log = console.log) {
  const rand = mulberry32(424242);
  if ((await Component.count()) === 0) await Component.bulkCreate(CATALOG);
  const parts = await catalogIds();
  const territories: { id: number }[] = await Territory.findAll({ attributes: ['id'], raw: true });
  if (!territories.length) territories.push({ id: (await Territory.create({ name: 'Benchmark territory', region: 'Synthetic' })).id });
  const started = Date.now();
  const [maxRow] = await sequelize.query('SELECT COALESCE(MAX(id), 0) AS n FROM accounts');
  let accountId = Number((maxRow as { n: number }[])[0].n) + 1;
  const ids = await nextIds(sequelize);
  const chunk = 250;
  for (let done = 0; done < LARGE.accounts; done += chunk) {
    const accounts: Record<string, unknown>[] = [];
    const fleet = emptyFleet();
    for (let i = 0; i < chunk; i++) {
      const id = accountId++;
      const surname = `Bench${String(done + i).padStart(4, '0')}`;
      const lat = 38.9 + rand() * 1.1;
      const lng = -99.0 + rand() * 1.7;
      accounts.push({
        id,
        name: `${surname} ${['Farms', 'Acres', 'Grain', 'Ag Partners'][i % 4]}`,
        status: 'active' as const,
        territoryId: territories[(done + i) % territories.length].id,
        specialistId: null,
        address: null,
        town: ['Northfield', 'Southgate', 'Eastbrook', 'Westmere'][i % 4],
        state: 'KS',
        lat,
        lng,
        acresByCrop: { corn: 1000, soybean: 800 },
        notes: null,
      });
      generateFleet(rand, { id, name: surname, lat, lng, surname }, parts, ids, fleet, {
        planters: LARGE.plantersPerAccount,
        installsPerPlanter: LARGE.installsPerPlanter,
      });
    }
    await sequelize.transaction(async (transaction) => {
      await Account.bulkCreate(accounts as never[], { transaction, validate: false });
      await insertFleet(fleet, transaction);
    });
    log(`  ${done + chunk} / ${LARGE.accounts} accounts`);
  }
  log(`Large data set added in ${((Date.now() - started) / 1000).toFixed(1)} s.`);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const db = await openDatabase(loadConfig());
  try {
    console.log(`Adding the large benchmark data set to ${db.describe}…`);
    await seedLarge(db.sequelize);
  } finally {
    await db.close();
  }
}
