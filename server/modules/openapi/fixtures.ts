// Makes one record of every id kind the registry names, inside one territory, through the API as an
// admin would (roadmap items, which only the planner creates, are written directly). The access
// tests make a set in a territory the caller does not cover; the fuzzer makes a set to aim at.
// It also fills ids into example bodies: a field named planterId gets the planter made here.
import { ReminderOutbox, RoadmapItem } from '../../db/models/index.js';
import type { IdKind } from './registry.js';

type Answer = { status: number; body: any };
/** What the fixtures need from an HTTP client signed in as an admin (Supertest agents fit). */
export interface AdminApi {
  get(url: string): PromiseLike<Answer>;
  post(url: string, body?: object): PromiseLike<Answer>;
  put?(url: string, body?: object): PromiseLike<Answer>;
  /** multipart upload of one small file; omitted → no attachment fixture */
  upload?(url: string, fields: Record<string, string>, file: { name: string; bytes: Buffer }): PromiseLike<Answer>;
}

export interface Fixtures {
  territoryId: number;
  ids: Partial<Record<IdKind, number>>;
  /** The planter's first toolbar, for bodies that name one. */
  toolbarId?: number;
  season: number;
  /** Kinds that could not be made, with the reason (reported by the tests, never hidden). */
  missing: Partial<Record<IdKind, string>>;
}

// The smallest valid PNG (1×1 transparent pixel).
export const TINY_PNG = Buffer.from(
  '89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8ffff3f0005fe02fea7d6a5d60000000049454e44ae426082',
  'hex',
);

async function create(api: AdminApi, missing: Fixtures['missing'], kind: IdKind, url: string, body: object, pick: (b: any) => number | undefined) {
  const res = await api.post(url, body);
  const id = res.status < 300 ? pick(res.body) : undefined;
  if (!id) missing[kind] = `POST ${url} answered ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`;
  return id;
}

/** One of each kind in `territoryId`, made by `api` (an admin). `tag` keeps names unique. */
export async function makeOneOfEach(api: AdminApi, territoryId: number, tag: string, season = new Date().getUTCFullYear() + 1): Promise<Fixtures> {
  const missing: Fixtures['missing'] = {};
  const ids: Fixtures['ids'] = {};
  const a = (ids.account = await create(api, missing, 'account', '/api/accounts', { name: `Fixture Farms ${tag}`, territoryId, town: 'Testville', state: 'KS', lat: 39.5, lng: -98.1, acresByCrop: { corn: 900, soybean: 600 } }, (b) => b.account?.id));
  if (!a) return { territoryId, ids, missing, season };
  ids.contact = await create(api, missing, 'contact', `/api/accounts/${a}/contacts`, { name: `Contact ${tag}`, email: `contact-${tag}@example.test`, reminderOptIn: true }, (b) => b.contact?.id);
  ids.farmSite = await create(api, missing, 'farmSite', `/api/accounts/${a}/farm-sites`, { name: `Home yard ${tag}`, lat: 39.51, lng: -98.12 }, (b) => b.farmSite?.id);
  ids.tractor = await create(api, missing, 'tractor', `/api/accounts/${a}/tractors`, { name: `Tractor ${tag}`, hydraulicFlowGpm: 40, hydraulicPressurePsi: 3000, remoteValves: 4 }, (b) => b.tractor?.id);
  let toolbarId: number | undefined;
  ids.planter = await create(
    api,
    missing,
    'planter',
    `/api/accounts/${a}/planters`,
    { name: `8-row planter ${tag}`, rows: 8, rowSpacingIn: 30, frameType: 'rigid', foldType: 'none', seedSupplyType: 'row-hoppers', toolbars: [{ name: 'Main bar', sizeFt: 20, firstRow: 1, lastRow: 8 }] },
    (b) => {
      toolbarId = b.planter?.toolbars?.[0]?.id;
      return b.planter?.id;
    },
  );
  ids.component = await create(
    api,
    missing,
    'component',
    '/api/components',
    { category: 'row-cleaner', name: `Fixture part ${tag}`, partNumber: `FX-${tag}`.slice(0, 40), priceUsd: 120, labourHours: 0.5, expectedLifeYears: 10, unit: 'row' },
    (b) => b.component?.id,
  );
  if (ids.planter && ids.component) {
    ids.install = await create(api, missing, 'install', `/api/planters/${ids.planter}/installs`, { componentId: ids.component, scope: 'all-rows' }, (b) => b.install?.id);
    ids.replacement = await create(api, missing, 'replacement', `/api/accounts/${a}/replacements`, { planterId: ids.planter, season: season + 3, kind: 'toolbar' }, (b) => b.replacement?.id);
    // Only the planner makes roadmap items; write one directly so that its routes can be aimed at.
    const item = await RoadmapItem.create({
      accountId: a,
      planterId: ids.planter,
      componentId: ids.component,
      season,
      quantity: 8,
      partsUsd: 960,
      labourHours: 4,
      labourUsd: 480,
      probabilityOverride: null,
      goalIds: [],
      explanation: `Fixture item ${tag}`,
      specialistId: null,
      installWeek: null,
      stageChangedAt: null,
    });
    ids.roadmapItem = item.id;
    ids.quote = await create(api, missing, 'quote', `/api/accounts/${a}/quotes`, { season }, (b) => b.quote?.id);
  } else {
    missing.install = missing.replacement = missing.roadmapItem = missing.quote = 'needs a planter and a component';
  }
  ids.goal = await create(api, missing, 'goal', `/api/accounts/${a}/goals`, { kind: 'planting-speed', label: `Plant faster ${tag}`, targetSeason: season + 1, priority: 2 }, (b) => b.goal?.id);
  ids.roadmapVersion = await create(api, missing, 'roadmapVersion', `/api/accounts/${a}/roadmap/versions`, { name: `Version ${tag}` }, (b) => b.version?.id);
  ids.visit = await create(api, missing, 'visit', '/api/visits', { accountId: a, purpose: 'pre-season-checkup' }, (b) => b.visit?.id);
  // A campaign needs a planting window for its region and crop in the season calendar.
  const regionKey = `fx-${tag}`.toLowerCase().replace(/[^a-z0-9-]/g, '').slice(0, 40);
  const calendar = await api.put?.('/api/season-calendar', { entries: [{ regionKey, regionLabel: `Fixture region ${tag}`, crop: 'corn', windowStart: '04-15', windowEnd: '05-20' }] });
  if (calendar && calendar.status !== 200) missing.campaign = `PUT /api/season-calendar answered ${calendar.status} ${JSON.stringify(calendar.body).slice(0, 200)}`;
  ids.campaign = await create(
    api,
    missing,
    'campaign',
    '/api/campaigns',
    {
      name: `Campaign ${tag}`,
      season,
      regionKey,
      crop: 'corn',
      offsetsDays: [30],
      audience: { territoryIds: [territoryId] },
      subject: 'Pre-season check-up',
      body: 'Time to book the planter check-up.',
    },
    (b) => b.campaign?.id,
  );
  ids.user = await create(api, missing, 'user', '/api/admin/users', { email: `fixture-${tag}@test.rowpath.test`, name: `Fixture ${tag}`, role: 'specialist', password: 'fixture-password-1', territoryIds: [territoryId] }, (b) => b.user?.id);
  if (api.upload) {
    const res = await api.upload('/api/attachments', { ownerType: 'account', ownerId: String(a) }, { name: 'yard.png', bytes: TINY_PNG });
    if (res.status === 201 && res.body.attachment?.id) ids.attachment = res.body.attachment.id;
    else missing.attachment = `upload answered ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`;
  } else missing.attachment = 'no upload client given';
  // Outbox messages are made by the reminder jobs; write one failed message for the campaign directly.
  if (ids.campaign && ids.contact) {
    const message = await ReminderOutbox.create({
      campaignId: ids.campaign,
      contactId: ids.contact,
      accountId: a,
      offsetDays: 30,
      sendOn: `${season}-03-15`,
      toEmail: `contact-${tag}@example.test`,
      subject: 'Pre-season check-up',
      text: 'Time to book the planter check-up.',
      html: '<p>Time to book the planter check-up.</p>',
      messageId: `<fixture-${tag}@rowpath.test>`,
      unsubscribeUrl: 'http://127.0.0.1/unsubscribe',
      status: 'failed',
      nextAttemptAt: new Date(),
      claimedBy: null,
      lastError: 'fixture',
      smtpResponse: null,
      sentAt: null,
    });
    ids.outboxMessage = message.id;
  } else missing.outboxMessage = 'needs a campaign and a contact';
  missing.sentMail = 'sent mail is what the SMTP stand-in received, not made by an API call';
  return { territoryId, ids, toolbarId, missing, season };
}

// Body fields that name a record, and the fixture that fills them.
const FIELD_KIND: Record<string, IdKind> = {
  accountId: 'account',
  ownerId: 'account',
  planterId: 'planter',
  componentId: 'component',
  contactId: 'contact',
  requestedByContactId: 'contact',
  farmSiteId: 'farmSite',
  tractorId: 'tractor',
  itemId: 'roadmapItem',
  visitId: 'visit',
};

/** A copy of `value` with id fields pointing at the fixtures (territories, toolbars, items too). */
export function bindIds(value: unknown, f: Fixtures): unknown {
  if (Array.isArray(value)) return value.map((v) => bindIds(v, f));
  if (!value || typeof value !== 'object') return value;
  const out: Record<string, unknown> = {};
  for (const [key, v] of Object.entries(value)) {
    const kind = FIELD_KIND[key];
    if (kind && typeof v === 'number' && f.ids[kind]) out[key] = f.ids[kind];
    else if (key === 'territoryId' && typeof v === 'number') out[key] = f.territoryId;
    else if (key === 'territoryIds' && Array.isArray(v)) out[key] = v.length ? [f.territoryId] : v;
    else if (key === 'toolbarId' && typeof v === 'number' && f.toolbarId) out[key] = f.toolbarId;
    else if ((key === 'roadmapItemIds' || key === 'goalIds') && Array.isArray(v)) out[key] = v.length && f.ids.roadmapItem && key === 'roadmapItemIds' ? [f.ids.roadmapItem] : [];
    else if (key === 'visitIds' && Array.isArray(v)) out[key] = v.length && f.ids.visit ? [f.ids.visit] : v;
    else if (key === 'specialistId' && typeof v === 'number') out[key] = null;
    else if (key === 'ownerType' && typeof v === 'string') out[key] = 'account';
    else out[key] = bindIds(v, f);
  }
  return out;
}
