// `npx tsx seeders/large-roadmap.ts [count]`: roadmap items for the forecast benchmark, spread over
// the large data set's planters (seeders/large.ts), seasons 2026–2029, every stage, install weeks
// from November to April. Deterministic (fixed PRNG seed). Add the large data set first.
import { QueryTypes, type CreationAttributes, type Sequelize } from 'sequelize';
import { openDatabase } from '../server/boot.js';
import { loadConfig } from '../server/config.js';
import { RoadmapItem } from '../server/db/models/index.js';
import { getSettings } from '../server/modules/settings/settings.service.js';
import { mulberry32, type Rand } from './fleet-generator.js';

const SEASONS = [2026, 2027, 2028, 2029];
// Stage mix of a territory's roadmaps (invented): many ideas and proposals, fewer firm orders.
const STAGE_WEIGHTS: [string, number][] = [
  ['idea', 0.22],
  ['proposed', 0.2],
  ['quoted', 0.16],
  ['accepted', 0.12],
  ['ordered', 0.08],
  ['installed', 0.14],
  ['declined', 0.08],
];
// Install months between harvest and planting: November and December of the year before the
// season, then January to April of the season itself.
const INSTALL_MONTHS: { month: number; yearOffset: number }[] = [
  { month: 11, yearOffset: -1 },
  { month: 12, yearOffset: -1 },
  { month: 1, yearOffset: 0 },
  { month: 2, yearOffset: 0 },
  { month: 3, yearOffset: 0 },
  { month: 4, yearOffset: 0 },
];

function pickStage(rand: Rand): string {
  let r = rand();
  for (const [stage, w] of STAGE_WEIGHTS) {
    if ((r -= w) < 0) return stage;
  }
  return 'idea';
}

/** A Monday in the given month (the first to fourth Monday, by chance). */
function mondayIn(year: number, month: number, rand: Rand): string {
  const first = new Date(Date.UTC(year, month - 1, 1));
  const toMonday = (8 - first.getUTCDay()) % 7;
  const day = 1 + toMonday + 7 * Math.floor(rand() * 4);
  return new Date(Date.UTC(year, month - 1, day)).toISOString().slice(0, 10);
}

export async function seedLargeRoadmap(sequelize: Sequelize, count = 30000, log: (line: string) => void = console.log) {
  const rand = mulberry32(20270401);
  let planters = await sequelize.query<{ id: number; accountId: number; rows: number; territoryId: number }>(
    "SELECT p.id, p.account_id AS accountId, p.`rows`, a.territory_id AS territoryId FROM planters p JOIN accounts a ON a.id = p.account_id WHERE a.name LIKE 'Bench%' ORDER BY p.id",
    { type: QueryTypes.SELECT },
  );
  if (!planters.length) {
    planters = await sequelize.query('SELECT p.id, p.account_id AS accountId, p.`rows`, a.territory_id AS territoryId FROM planters p JOIN accounts a ON a.id = p.account_id ORDER BY p.id', {
      type: QueryTypes.SELECT,
    });
  }
  if (!planters.length) throw new Error('No planters to plan for: add the large data set first (seeders/large.ts).');
  const components = await sequelize.query<{ id: number; priceUsd: number; labourHours: number; unit: string }>(
    'SELECT id, price_usd AS priceUsd, labour_hours AS labourHours, unit FROM components WHERE active = 1 ORDER BY id',
    { type: QueryTypes.SELECT },
  );
  if (!components.length) throw new Error('The component catalog is empty.');
  // Specialists of each territory, so that the items spread over them as real roadmaps would.
  const specialistRows = await sequelize.query<{ userId: number; territoryId: number }>(
    "SELECT ut.user_id AS userId, ut.territory_id AS territoryId FROM user_territories ut JOIN users u ON u.id = ut.user_id WHERE u.role = 'specialist' AND u.disabled = 0",
    { type: QueryTypes.SELECT },
  );
  const specialists = new Map<number, number[]>();
  for (const s of specialistRows) specialists.set(s.territoryId, [...(specialists.get(s.territoryId) ?? []), s.userId]);
  const shopRateUsdPerHour = (await getSettings()).shopRateUsdPerHour;

  const started = Date.now();
  const now = new Date();
  const chunk = 2000;
  for (let done = 0; done < count; done += chunk) {
    const batch: CreationAttributes<RoadmapItem>[] = [];
    for (let i = done; i < Math.min(count, done + chunk); i++) {
      const planter = planters[i % planters.length];
      const part = components[Math.floor(rand() * components.length)];
      const quantity = part.unit === 'row' ? Number(planter.rows) : 1;
      const season = SEASONS[Math.floor(rand() * SEASONS.length)];
      const stage = pickStage(rand);
      // Ideas are often not scheduled yet; they then count in April of their season.
      const scheduled = stage !== 'idea' || rand() < 0.6;
      const when = INSTALL_MONTHS[Math.floor(rand() * INSTALL_MONTHS.length)];
      const labourHours = Math.round(Number(part.labourHours) * quantity * 100) / 100;
      const pool = specialists.get(Number(planter.territoryId)) ?? [];
      batch.push({
        accountId: Number(planter.accountId),
        planterId: Number(planter.id),
        componentId: Number(part.id),
        season,
        quantity,
        partsUsd: Math.round(Number(part.priceUsd) * quantity * 100) / 100,
        labourHours,
        labourUsd: Math.round(labourHours * shopRateUsdPerHour * 100) / 100,
        stage: stage as RoadmapItem['stage'],
        probabilityOverride: rand() < 0.05 ? Math.round(rand() * 1000) / 1000 : null,
        locked: rand() < 0.15,
        goalIds: [],
        explanation: null,
        specialistId: pool.length ? pool[Math.floor(rand() * pool.length)] : null,
        installWeek: scheduled ? mondayIn(season + when.yearOffset, when.month, rand) : null,
        stageChangedAt: now,
      });
    }
    await RoadmapItem.bulkCreate(batch, { validate: false, hooks: false });
  }
  log(`${count} roadmap items added in ${((Date.now() - started) / 1000).toFixed(1)} s.`);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const db = await openDatabase(loadConfig());
  try {
    await seedLargeRoadmap(db.sequelize, Number(process.argv[2] ?? 30000));
  } finally {
    await db.close();
  }
}
