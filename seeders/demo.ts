// The demo scenario: an invented dealership, Kestrel Ridge Farm Supply, serving north-central
// Kansas from a yard near the Solomon River. Every grower, person and farm here is invented; town
// names and coordinates are real places so that maps and routes behave like the real region.
import bcrypt from 'bcryptjs';
import type { Sequelize } from 'sequelize';
import type { AcresByCrop } from '../shared/schemas/accounts.js';
import type { Role } from '../shared/schemas/auth.js';
import { Account, Component, Territory, User, UserTerritory } from '../server/db/models/index.js';
import { CATALOG } from './demo-catalog.js';
import { seedDemoRoadmaps } from './demo-roadmap.js';
import { seedDemoVisits } from './demo-visits.js';
import { seedDemoReminders } from './demo-reminders.js';
import { seedDemoQuotas } from './demo-forecast.js';
import { catalogIds, emptyFleet, generateFleet, insertFleet, mulberry32, nextIds } from './fleet-generator.js';

export const DEMO_PASSWORD = 'rowpath-demo';
export const DEALERSHIP = {
  name: 'Kestrel Ridge Farm Supply',
  address: '2150 Quarry Road',
  town: 'Beloit',
  state: 'KS',
  lat: 39.4561,
  lng: -98.1062,
};

export const DEMO_USERS: { email: string; name: string; role: Role; territories: string[] }[] = [
  { email: 'admin@rowpath.test', name: 'Marisol Keddington', role: 'admin', territories: [] },
  { email: 'manager@rowpath.test', name: 'Torvald Ashgrove', role: 'manager', territories: ['Republican Bend', 'Solomon Valley'] },
  { email: 'specialist@rowpath.test', name: 'Jonah Peltier-Rusk', role: 'specialist', territories: ['Republican Bend'] },
  { email: 'specialist2@rowpath.test', name: 'Wren Okafor-Hale', role: 'specialist', territories: ['Solomon Valley'] },
  { email: 'grower@rowpath.test', name: 'Dale Hesketh', role: 'grower', territories: [] },
];

const TERRITORIES = [
  { name: 'Republican Bend', region: 'North-central Kansas: Jewell, Republic, Smith and north Mitchell counties' },
  { name: 'Solomon Valley', region: 'North-central Kansas: Mitchell, Osborne, Lincoln, Ottawa and Cloud counties' },
];

// Real towns of the region (approximate centres) where invented farms are placed nearby.
const TOWNS: { town: string; lat: number; lng: number; territory: string }[] = [
  { town: 'Mankato', lat: 39.787, lng: -98.21, territory: 'Republican Bend' },
  { town: 'Jewell', lat: 39.671, lng: -98.153, territory: 'Republican Bend' },
  { town: 'Belleville', lat: 39.824, lng: -97.633, territory: 'Republican Bend' },
  { town: 'Scandia', lat: 39.795, lng: -97.784, territory: 'Republican Bend' },
  { town: 'Smith Center', lat: 39.779, lng: -98.785, territory: 'Republican Bend' },
  { town: 'Burr Oak', lat: 39.87, lng: -98.305, territory: 'Republican Bend' },
  { town: 'Formoso', lat: 39.779, lng: -97.993, territory: 'Republican Bend' },
  { town: 'Randall', lat: 39.64, lng: -98.045, territory: 'Republican Bend' },
  { town: 'Concordia', lat: 39.571, lng: -97.662, territory: 'Solomon Valley' },
  { town: 'Glasco', lat: 39.361, lng: -97.837, territory: 'Solomon Valley' },
  { town: 'Cawker City', lat: 39.509, lng: -98.434, territory: 'Solomon Valley' },
  { town: 'Downs', lat: 39.498, lng: -98.542, territory: 'Solomon Valley' },
  { town: 'Osborne', lat: 39.439, lng: -98.697, territory: 'Solomon Valley' },
  { town: 'Tipton', lat: 39.339, lng: -98.47, territory: 'Solomon Valley' },
  { town: 'Lincoln', lat: 39.041, lng: -98.145, territory: 'Solomon Valley' },
  { town: 'Minneapolis', lat: 39.122, lng: -97.707, territory: 'Solomon Valley' },
  { town: 'Delphos', lat: 39.274, lng: -97.767, territory: 'Solomon Valley' },
];

const SURNAMES = [
  'Hesketh', 'Brannigan', 'Oldfield', 'Vanterpool', 'Sorensby', 'Kittredge', 'Marchbanks', 'Pruett-Lowe', 'Halvorsen',
  'Quillen', 'Dunmore', 'Ostrander', 'Tillotson', 'Achterberg', 'Wendling', 'Corrigan', 'Ashby-Nunn', 'Feldkamp',
  'Rasmuson', 'Tegtmeier', 'Wollenberg', 'Ingersby', 'Mattocks', 'Radabaugh', 'Strohmeyer', 'Yoxall', 'Penwarden',
  'Lindgraf', 'Cottingham', 'Bruckner-Day', 'Esterly', 'Harwick', 'Klemmensen', 'Nordquist', 'Overbey', 'Scheufler',
  'Thorsby', 'Umbarger', 'Vossberg', 'Zeigenbein',
];
const SUFFIXES = ['Farms', 'Acres', 'Family Farms', 'Grain', 'Land & Cattle', 'Ag Partners', 'Brothers Farms', 'Ridge Farms'];

export async function seedDemo(sequelize: Sequelize) {
  const rand = mulberry32(20261201);
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 10);
  await sequelize.transaction(async (transaction) => {
    const territories = await Territory.bulkCreate(TERRITORIES, { transaction });
    const territoryId = new Map(territories.map((t) => [t.name, t.id]));
    const users = new Map<string, User>();
    for (const u of DEMO_USERS) {
      const user = await User.create({ email: u.email, name: u.name, role: u.role, passwordHash, accountId: null, lastSignInAt: null }, { transaction });
      users.set(u.email, user);
      if (u.territories.length) {
        await UserTerritory.bulkCreate(u.territories.map((t) => ({ userId: user.id, territoryId: territoryId.get(t)! })), { transaction });
      }
    }
    const specialistFor = (territory: string) =>
      users.get(territory === 'Republican Bend' ? 'specialist@rowpath.test' : 'specialist2@rowpath.test')!.id;

    const accounts = SURNAMES.map((surname, i) => {
      const town = TOWNS[i % TOWNS.length];
      // Farms within ~12 km of their town.
      const lat = town.lat + (rand() - 0.5) * 0.2;
      const lng = town.lng + (rand() - 0.5) * 0.26;
      const totalAcres = Math.round((800 + rand() * 5200) / 10) * 10;
      const cornShare = 0.35 + rand() * 0.25;
      const soyShare = 0.2 + rand() * 0.2;
      const sorghumShare = rand() < 0.5 ? 0.1 : 0;
      const acresByCrop: AcresByCrop = {
        corn: Math.round(totalAcres * cornShare),
        soybean: Math.round(totalAcres * soyShare),
        ...(sorghumShare ? { sorghum: Math.round(totalAcres * sorghumShare) } : {}),
        wheat: Math.round(totalAcres * (1 - cornShare - soyShare - sorghumShare)),
      };
      return {
        name: `${surname} ${SUFFIXES[i % SUFFIXES.length]}`,
        status: (i % 13 === 5 ? 'prospect' : i % 17 === 9 ? 'inactive' : 'active') as 'active' | 'prospect' | 'inactive',
        territoryId: territoryId.get(town.territory)!,
        specialistId: specialistFor(town.territory),
        address: `${1000 + Math.floor(rand() * 8999)} ${['Rd', 'Ln', 'Ave'][i % 3]} ${String.fromCharCode(65 + (i % 26))}`,
        town: town.town,
        state: 'KS',
        lat: Number(lat.toFixed(6)),
        lng: Number(lng.toFixed(6)),
        acresByCrop,
        notes: null,
      };
    });
    const created = await Account.bulkCreate(accounts, { transaction });
    // The demo grower runs the first account (Hesketh Farms, near Mankato, Republican Bend).
    await users.get('grower@rowpath.test')!.update({ accountId: created[0].id }, { transaction });

    await Component.bulkCreate(CATALOG, { transaction });
    const parts = await catalogIds(transaction);
    const ids = await nextIds(sequelize);
    const fleet = emptyFleet();
    created.forEach((account, i) =>
      generateFleet(rand, { id: account.id, name: account.name, lat: Number(account.lat), lng: Number(account.lng), surname: SURNAMES[i] }, parts, ids, fleet),
    );
    await insertFleet(fleet, transaction);
  });
  // Roadmaps are planned by the same service the app uses, each in its own transaction.
  await seedDemoRoadmaps(sequelize);
  await seedDemoVisits(sequelize);
  await seedDemoReminders(sequelize);
  await seedDemoQuotas(sequelize);
}
