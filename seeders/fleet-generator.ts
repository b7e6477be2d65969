// Generates invented fleets (contacts, farm sites, tractors, planters, toolbars, installs) with
// explicit ids, so the demo and the large benchmark set can insert them in bulk.
import type { Sequelize, Transaction } from 'sequelize';
import { Component, Contact, FarmSite, Install, Planter, Toolbar, Tractor } from '../server/db/models/index.js';
import { PLANTER_MAKERS } from './demo-catalog.js';

export type Rand = () => number;

export function mulberry32(seed: number): Rand {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const FIRST_NAMES = ['Arlo', 'Bettina', 'Corwin', 'Delphine', 'Emmett', 'Fern', 'Garrick', 'Hollis', 'Ines', 'Jory', 'Kaia', 'Lowell', 'Maren', 'Nils', 'Odette', 'Pruitt', 'Quincy', 'Rosalind', 'Sully', 'Tamsin'];
const TRACTOR_NAMES = ['Row-crop tractor', 'Big tractor', 'Planting tractor', 'Spare tractor'];
const pick = <T>(rand: Rand, list: readonly T[]) => list[Math.floor(rand() * list.length)];

export interface FleetIds {
  contact: number;
  site: number;
  tractor: number;
  planter: number;
  toolbar: number;
  install: number;
}

export interface FleetRows {
  contacts: object[];
  sites: object[];
  tractors: object[];
  planters: object[];
  toolbars: object[];
  installs: object[];
}

export const emptyFleet = (): FleetRows => ({ contacts: [], sites: [], tractors: [], planters: [], toolbars: [], installs: [] });

/**
 * Adds one account's fleet to `out`. `parts` maps part numbers to catalog ids. Planter sizes and
 * what sits on them vary with the PRNG: older mechanical set-ups, partial retrofits and a few
 * fully equipped high-speed planters, as a territory has.
 */
export function generateFleet(
  rand: Rand,
  account: { id: number; name: string; lat: number; lng: number; surname: string },
  parts: Map<string, number>,
  ids: FleetIds,
  out: FleetRows,
  opts: { planters?: number; installsPerPlanter?: number } = {},
) {
  const now = new Date();
  const stamp = { createdAt: now, updatedAt: now };
  const contactCount = 1 + Math.floor(rand() * 2);
  for (let c = 0; c < contactCount; c++) {
    const first = pick(rand, FIRST_NAMES);
    out.contacts.push({
      id: ids.contact++,
      accountId: account.id,
      name: `${first} ${account.surname}`,
      roleOnFarm: c === 0 ? 'Owner-operator' : pick(rand, ['Partner', 'Equipment lead', 'Office manager']),
      // The contact number keeps two contacts with one first name from sharing an address.
      email: `${first.toLowerCase()}.${account.surname.toLowerCase().replace(/[^a-z]/g, '')}${account.id}${c ? `-${c + 1}` : ''}@growers.rowpath.test`,
      phone: `785-555-${String(1000 + Math.floor(rand() * 8999))}`,
      reminderOptIn: rand() > 0.1,
      ...stamp,
    });
  }
  const siteId = ids.site++;
  out.sites.push({ id: siteId, accountId: account.id, name: 'Home yard', lat: account.lat, lng: account.lng, notes: null, ...stamp });

  const tractorCount = 1 + (rand() < 0.4 ? 1 : 0);
  const tractorIds: number[] = [];
  for (let t = 0; t < tractorCount; t++) {
    const id = ids.tractor++;
    tractorIds.push(id);
    const big = rand() < 0.5;
    out.tractors.push({
      id,
      accountId: account.id,
      name: TRACTOR_NAMES[t],
      modelYear: 2008 + Math.floor(rand() * 17),
      hydraulicFlowGpm: big ? 55 + Math.round(rand() * 5) * 5 : 30 + Math.round(rand() * 4) * 5,
      hydraulicPressurePsi: big ? 3000 : 2750,
      remoteValves: big ? 4 + Math.floor(rand() * 3) : 3,
      ptoHp: big ? 280 + Math.round(rand() * 12) * 10 : 150 + Math.round(rand() * 8) * 10,
      ...stamp,
    });
  }

  const planterCount = opts.planters ?? 1 + (rand() < 0.35 ? 1 : 0);
  for (let p = 0; p < planterCount; p++) {
    const planterId = ids.planter++;
    const layout = pick(rand, [
      { rows: 8, spacing: 30 },
      { rows: 12, spacing: 30 },
      { rows: 16, spacing: 30 },
      { rows: 16, spacing: 30 },
      { rows: 24, spacing: 30 },
      { rows: 24, spacing: 20 },
      { rows: 31, spacing: 15 },
    ]);
    const widthFt = (layout.rows * layout.spacing) / 12;
    const central = layout.rows >= 16 && rand() < 0.7;
    const liquid = rand() < 0.45;
    out.planters.push({
      id: planterId,
      accountId: account.id,
      tractorId: tractorIds[p % tractorIds.length],
      farmSiteId: siteId,
      name: `${layout.rows}-row ${layout.spacing === 15 ? 'split-row ' : ''}planter${p ? ' (second)' : ''}`,
      maker: pick(rand, PLANTER_MAKERS),
      modelYear: 2006 + Math.floor(rand() * 18),
      rows: layout.rows,
      rowSpacingIn: layout.spacing,
      frameType: layout.rows >= 16 ? pick(rand, ['three-section-flex', 'five-section-flex']) : layout.spacing === 15 ? 'split-row' : 'rigid',
      foldType: layout.rows >= 16 ? pick(rand, ['stack', 'front', 'rear-pivot']) : 'none',
      seedSupplyType: central ? 'central-fill' : 'row-hoppers',
      seedCapacityUnits: central ? 50 + Math.round(rand() * 4) * 10 : Math.round(layout.rows * 1.6),
      liquidTankCount: liquid ? 2 : 0,
      liquidTankGallons: liquid ? pick(rand, [150, 200, 300]) : 0,
      dryCapacityLb: rand() < 0.15 ? 3000 : 0,
      markers: rand() < 0.3,
      acresPerYear: Math.round((400 + rand() * 3600) / 10) * 10,
      ...stamp,
    });
    // A single toolbar, or two for the split-row planters (push and pull rows).
    const bars =
      layout.spacing === 15
        ? [
            { name: 'Front bar', firstRow: 1, lastRow: 16 },
            { name: 'Rear bar', firstRow: 17, lastRow: layout.rows },
          ]
        : [{ name: 'Main bar', firstRow: 1, lastRow: layout.rows }];
    const toolbarIds = bars.map((b, i) => {
      const id = ids.toolbar++;
      out.toolbars.push({ id, planterId, position: i + 1, name: b.name, sizeFt: Math.round(widthFt * 2) / 2, firstRow: b.firstRow, lastRow: b.lastRow, ...stamp });
      return id;
    });

    // What is on it: a base every planter has, then retrofits by chance.
    const installed: { part: string; scope: string; toolbarId?: number; rowFrom?: number; rowTo?: number }[] = [
      { part: rand() < 0.3 ? 'KR-SM-040' : 'KR-SM-110', scope: 'all-rows' },
      { part: rand() < 0.5 ? 'KR-CW-010' : 'KR-CW-030', scope: 'all-rows' },
      { part: 'KR-SS-050', scope: 'all-rows' },
    ];
    const extras: (typeof installed)[number][] = [
      { part: 'KR-RC-120', scope: 'all-rows' },
      { part: 'KR-DF-200', scope: 'all-rows' },
      { part: 'KR-SC-070', scope: 'all-rows' },
      { part: 'KR-DS-010', scope: 'planter' },
      { part: 'KR-HD-150', scope: 'toolbar', toolbarId: toolbarIds[0] },
      { part: 'KR-VF-040', scope: 'planter' },
      { part: 'KR-HC-160', scope: 'toolbar', toolbarId: toolbarIds[0] },
      { part: 'KR-DF-410', scope: 'rows', rowFrom: 1, rowTo: Math.ceil(layout.rows / 2) },
      { part: 'KR-IF-600', scope: 'all-rows' },
    ];
    const want = (opts.installsPerPlanter ?? 3 + Math.floor(rand() * 5)) - installed.length;
    for (const e of extras) if (installed.length - 3 < want && rand() < 0.55) installed.push(e);
    while (installed.length - 3 < want) installed.push(extras[Math.floor(rand() * extras.length)]);

    for (const item of installed) {
      const componentId = parts.get(item.part);
      if (!componentId) continue;
      const year = 2014 + Math.floor(rand() * 11);
      const quantity = item.scope === 'all-rows' ? layout.rows : item.scope === 'rows' ? item.rowTo! - item.rowFrom! + 1 : 1;
      out.installs.push({
        id: ids.install++,
        planterId,
        componentId,
        scope: item.scope,
        toolbarId: item.toolbarId ?? null,
        rowFrom: item.rowFrom ?? null,
        rowTo: item.rowTo ?? null,
        quantity,
        installDate: `${year}-0${1 + Math.floor(rand() * 4)}-1${Math.floor(rand() * 9)}`,
        pricePaidUsd: null,
        serialNumbers: [],
        workOrder: `WO-${year}-${String(Math.floor(rand() * 9000) + 1000)}`,
        status: 'installed',
        removedDate: null,
        removedReason: null,
        ...stamp,
      });
    }
  }
}

/** Inserts generated rows table by table, in batches, inside the caller's transaction. */
export async function insertFleet(rows: FleetRows, transaction?: Transaction, batch = 2000) {
  const write = async (model: { bulkCreate: (r: object[], o: object) => Promise<unknown> }, list: object[]) => {
    for (let i = 0; i < list.length; i += batch) await model.bulkCreate(list.slice(i, i + batch), { transaction, validate: false, hooks: false });
  };
  await write(Contact as never, rows.contacts);
  await write(FarmSite as never, rows.sites);
  await write(Tractor as never, rows.tractors);
  await write(Planter as never, rows.planters);
  await write(Toolbar as never, rows.toolbars);
  await write(Install as never, rows.installs);
}

export async function nextIds(sequelize: Sequelize): Promise<FleetIds> {
  const next = async (table: string) => {
    const [rows] = await sequelize.query(`SELECT COALESCE(MAX(id), 0) + 1 AS n FROM ${table}`);
    return Number((rows as { n: number }[])[0].n);
  };
  return {
    contact: await next('contacts'),
    site: await next('farm_sites'),
    tractor: await next('tractors'),
    planter: await next('planters'),
    toolbar: await next('toolbars'),
    install: await next('installs'),
  };
}

export async function catalogIds(transaction?: Transaction): Promise<Map<string, number>> {
  const rows = await Component.findAll({ attributes: ['id', 'partNumber'], transaction, raw: true });
  return new Map(rows.map((r) => [r.partNumber, r.id]));
}
