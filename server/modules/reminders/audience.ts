// Who a campaign reaches, and what each message says. The audience is a contact with an e-mail
// address who has opted in and never unsubscribed, on an account that is not inactive, in one
// of the campaign's territories — narrowed by crop, this season's roadmap items and the date of
// the last pre-season check-up when the campaign asks for it.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { PRE_SEASON_CHECKLIST, renderTemplate, type MergeValues, type RenderedMessage } from '../../../shared/calc/merge-template.js';
import { daysBetween, reminderSendDate } from '../../../shared/calc/season-calendar.js';
import type { StoredAudience } from '../../db/models/reminders.js';
import { signReminderToken } from './tokens.js';

export interface CampaignForAudience {
  id: number;
  name: string;
  season: number;
  crop: string;
  territoryIds: number[];
  audience: StoredAudience;
  subject: string;
  body: string;
}

export interface AudienceContact {
  contactId: number;
  contactName: string;
  email: string;
  accountId: number;
  accountName: string;
  territoryId: number;
  specialistId: number | null;
}

/** Roadmap items still to be done this season count; declined and installed ones do not. */
const OPEN_ITEM = "r.stage NOT IN ('declined', 'installed')";

function criteria(c: CampaignForAudience) {
  const where = [
    'a.territory_id IN (:territoryIds)',
    "a.status <> 'inactive'",
    "c.email IS NOT NULL AND c.email <> ''",
    'c.reminder_opt_in = 1',
    'c.unsubscribed_at IS NULL',
  ];
  if (c.audience.growsCrop) where.push('COALESCE(CAST(JSON_UNQUOTE(JSON_EXTRACT(a.acres_by_crop, :cropPath)) AS DECIMAL(12,2)), 0) > 0');
  if (c.audience.hasRoadmapItems) where.push(`EXISTS (SELECT 1 FROM roadmap_items r WHERE r.account_id = a.id AND r.season = :season AND ${OPEN_ITEM})`);
  if (c.audience.noCheckupSince) {
    where.push(
      "NOT EXISTS (SELECT 1 FROM visits v WHERE v.account_id = a.id AND v.purpose = 'pre-season-checkup' AND v.status = 'done' AND COALESCE(v.starts_at, v.updated_at) >= :noCheckupSince)",
    );
  }
  const replacements = {
    territoryIds: c.territoryIds.length ? c.territoryIds : [-1],
    cropPath: `$.${c.crop}`,
    season: c.season,
    noCheckupSince: c.audience.noCheckupSince,
    campaignId: c.id,
  };
  return { where, replacements };
}

const SELECT_CONTACT = `c.id AS contactId, c.name AS contactName, c.email AS email, a.id AS accountId, a.name AS accountName, a.territory_id AS territoryId, a.specialist_id AS specialistId`;

/**
 * The campaign's audience, optionally limited to the territories a user may see. With
 * `offsetDays`, each row says whether that reminder is already in the outbox for the contact.
 */
export async function audienceContacts(
  sequelize: Sequelize,
  campaign: CampaignForAudience,
  opts: { scopeTerritoryIds?: number[] | null; offsetDays?: number; page?: number; pageSize?: number; transaction?: Transaction } = {},
): Promise<{ rows: (AudienceContact & { queued: boolean })[]; total: number }> {
  const { where, replacements } = criteria(campaign);
  const params: Record<string, unknown> = { ...replacements, offsetDays: opts.offsetDays ?? -1 };
  if (opts.scopeTerritoryIds) {
    where.push('a.territory_id IN (:scope)');
    params.scope = opts.scopeTerritoryIds.length ? opts.scopeTerritoryIds : [-1];
  }
  const from = `FROM contacts c JOIN accounts a ON a.id = c.account_id WHERE ${where.join(' AND ')}`;
  const queued = `EXISTS (SELECT 1 FROM reminder_outbox o WHERE o.contact_id = c.id AND o.campaign_id = :campaignId AND o.offset_days = :offsetDays)`;
  let limit = '';
  if (opts.pageSize) {
    limit = ' LIMIT :limit OFFSET :skip';
    params.limit = opts.pageSize;
    params.skip = ((opts.page ?? 1) - 1) * opts.pageSize;
  }
  const rows = await sequelize.query<AudienceContact & { queued: number | boolean }>(`SELECT ${SELECT_CONTACT}, ${queued} AS queued ${from} ORDER BY a.name, c.name, c.id${limit}`, {
    type: QueryTypes.SELECT,
    replacements: params,
    transaction: opts.transaction,
  });
  const total = opts.pageSize
    ? Number((await sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n ${from}`, { type: QueryTypes.SELECT, replacements: params, transaction: opts.transaction }))[0].n)
    : rows.length;
  return { rows: rows.map((r) => ({ ...r, queued: Boolean(Number(r.queued)) })), total };
}

/** Why one contact is or is not in a campaign's audience, in words for the preview. */
export async function audienceFit(sequelize: Sequelize, campaign: CampaignForAudience, contactId: number): Promise<{ inAudience: boolean; reasons: string[] }> {
  const [row] = await sequelize.query<{
    email: string | null;
    optIn: number;
    unsubscribedAt: Date | null;
    status: string;
    territoryId: number;
    cropAcres: number | null;
    openItems: number;
    lastCheckup: Date | null;
  }>(
    `SELECT c.email, c.reminder_opt_in AS optIn, c.unsubscribed_at AS unsubscribedAt, a.status, a.territory_id AS territoryId,
       CAST(JSON_UNQUOTE(JSON_EXTRACT(a.acres_by_crop, :cropPath)) AS DECIMAL(12,2)) AS cropAcres,
       (SELECT COUNT(*) FROM roadmap_items r WHERE r.account_id = a.id AND r.season = :season AND ${OPEN_ITEM}) AS openItems,
       (SELECT MAX(COALESCE(v.starts_at, v.updated_at)) FROM visits v WHERE v.account_id = a.id AND v.purpose = 'pre-season-checkup' AND v.status = 'done') AS lastCheckup
     FROM contacts c JOIN accounts a ON a.id = c.account_id WHERE c.id = :contactId`,
    { type: QueryTypes.SELECT, replacements: { cropPath: `$.${campaign.crop}`, season: campaign.season, contactId } },
  );
  if (!row) return { inAudience: false, reasons: ['The contact no longer exists.'] };
  const reasons: string[] = [];
  if (!campaign.territoryIds.includes(row.territoryId)) reasons.push('The account is outside the campaign’s territories.');
  if (row.status === 'inactive') reasons.push('The account is inactive.');
  if (!row.email) reasons.push('The contact has no e-mail address.');
  if (!Number(row.optIn)) reasons.push('The contact has not opted in to reminders.');
  if (row.unsubscribedAt) reasons.push(`The contact unsubscribed on ${new Date(row.unsubscribedAt).toISOString().slice(0, 10)}.`);
  if (campaign.audience.growsCrop && !(Number(row.cropAcres) > 0)) reasons.push(`The account has no ${campaign.crop} acres on record.`);
  if (campaign.audience.hasRoadmapItems && !Number(row.openItems)) reasons.push(`The account has no roadmap items for ${campaign.season}.`);
  if (campaign.audience.noCheckupSince && row.lastCheckup && new Date(row.lastCheckup).toISOString().slice(0, 10) >= campaign.audience.noCheckupSince) {
    reasons.push(`A pre-season check-up was done on ${new Date(row.lastCheckup).toISOString().slice(0, 10)}.`);
  }
  return { inAudience: reasons.length === 0, reasons };
}

export interface AccountMergeContext {
  planters: string[];
  roadmapItems: string[];
  roadmapItemIds: number[];
  specialist: { name: string; email: string } | null;
}

function chunks<T>(items: T[], size: number): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += size) out.push(items.slice(i, i + size));
  return out;
}

/** Planters, this season's open roadmap items and the specialist of many accounts, in a few queries. */
export async function loadMergeContext(sequelize: Sequelize, accountIds: number[], season: number, transaction?: Transaction): Promise<Map<number, AccountMergeContext>> {
  const out = new Map<number, AccountMergeContext>();
  const ids = [...new Set(accountIds)];
  for (const id of ids) out.set(id, { planters: [], roadmapItems: [], roadmapItemIds: [], specialist: null });
  for (const part of chunks(ids, 1000)) {
    const planters = await sequelize.query<{ accountId: number; name: string; rows: number; rowSpacingIn: number }>(
      'SELECT account_id AS accountId, name, `rows`, row_spacing_in AS rowSpacingIn FROM planters WHERE account_id IN (:ids) ORDER BY name, id',
      { type: QueryTypes.SELECT, replacements: { ids: part }, transaction },
    );
    for (const p of planters) out.get(p.accountId)!.planters.push(`${p.name} — ${p.rows} rows at ${Number(p.rowSpacingIn)} in`);
    const items = await sequelize.query<{ id: number; accountId: number; quantity: number; componentName: string; planterName: string }>(
      `SELECT r.id, r.account_id AS accountId, r.quantity, co.name AS componentName, p.name AS planterName
       FROM roadmap_items r JOIN components co ON co.id = r.component_id JOIN planters p ON p.id = r.planter_id
       WHERE r.account_id IN (:ids) AND r.season = :season AND ${OPEN_ITEM} ORDER BY r.id`,
      { type: QueryTypes.SELECT, replacements: { ids: part, season }, transaction },
    );
    for (const i of items) {
      const ctx = out.get(i.accountId)!;
      ctx.roadmapItems.push(`${i.componentName} × ${i.quantity} on the ${i.planterName}`);
      ctx.roadmapItemIds.push(i.id);
    }
    const specialists = await sequelize.query<{ accountId: number; name: string; email: string }>(
      'SELECT a.id AS accountId, u.name, u.email FROM accounts a JOIN users u ON u.id = a.specialist_id WHERE a.id IN (:ids)',
      { type: QueryTypes.SELECT, replacements: { ids: part }, transaction },
    );
    for (const s of specialists) out.get(s.accountId)!.specialist = { name: s.name, email: s.email };
  }
  return out;
}

export interface LinkSettings {
  publicUrl: string;
  secret: string;
  mailFrom: string;
}

export interface ComposedMessage extends RenderedMessage {
  unsubscribeUrl: string;
  bookingUrl: string;
  messageId: string;
}

const LONG_DATE = new Intl.DateTimeFormat('en-US', { month: 'long', day: 'numeric', year: 'numeric', timeZone: 'UTC' });

/** The domain of the From address, for Message-IDs. */
export function mailDomain(mailFrom: string): string {
  return /@([A-Za-z0-9.-]+)/.exec(mailFrom)?.[1] ?? 'rowpath.local';
}

/**
 * One grower's message. The Message-ID is fixed by contact, campaign and offset: a message
 * handed to SMTP twice (a sender that died before recording it) is recognisably the same one.
 */
export function composeMessage(args: {
  campaign: CampaignForAudience;
  template?: { subject: string; body: string };
  contact: Pick<AudienceContact, 'contactId' | 'contactName'>;
  accountName: string;
  context: AccountMergeContext;
  windowStartDate: string;
  offsetDays: number;
  links: LinkSettings;
  test?: boolean;
}): ComposedMessage {
  const { campaign, contact, links } = args;
  // Booking links stay good until 60 days after the window opens; unsubscribe links never expire.
  const expiresAt = Math.floor(Date.parse(`${args.windowStartDate}T00:00:00Z`) / 1000) + 60 * 86_400;
  const unsubscribeToken = signReminderToken(links.secret, { purpose: 'unsubscribe', contactId: contact.contactId, campaignId: campaign.id, test: args.test });
  const bookingToken = signReminderToken(links.secret, { purpose: 'book', contactId: contact.contactId, campaignId: campaign.id, test: args.test, expiresAt });
  const unsubscribeUrl = `${links.publicUrl}/api/reminders/unsubscribe?token=${unsubscribeToken}`;
  const bookingUrl = `${links.publicUrl}/api/reminders/book?token=${bookingToken}`;
  const values: MergeValues = {
    'grower.name': contact.contactName,
    'grower.firstName': contact.contactName.split(/\s+/)[0] ?? contact.contactName,
    'account.name': args.accountName,
    'specialist.name': args.context.specialist?.name ?? 'your specialist',
    'specialist.email': args.context.specialist?.email ?? '',
    season: String(campaign.season),
    crop: campaign.crop,
    windowStart: LONG_DATE.format(new Date(`${args.windowStartDate}T00:00:00Z`)),
    daysBefore: String(args.offsetDays),
    planters: args.context.planters,
    roadmapItems: args.context.roadmapItems,
    checklist: PRE_SEASON_CHECKLIST,
    bookingLink: bookingUrl,
    unsubscribeLink: unsubscribeUrl,
  };
  const rendered = renderTemplate(args.template ?? { subject: campaign.subject, body: campaign.body }, values);
  const messageId = args.test
    ? `<reminder-test.${campaign.id}.${contact.contactId}.${Date.now().toString(36)}${Math.random().toString(36).slice(2, 8)}@${mailDomain(links.mailFrom)}>`
    : `<reminder.${campaign.id}.${contact.contactId}.${args.offsetDays}@${mailDomain(links.mailFrom)}>`;
  return { ...rendered, unsubscribeUrl, bookingUrl, messageId };
}

/** The offset a preview speaks for: the one due now, else the next to come, else the last. */
export function previewOffset(windowStartDate: string, offsetsDays: number[], todayIso: string): { offsetDays: number; sendOn: string } {
  const sorted = [...offsetsDays].sort((a, b) => b - a);
  const next = sorted.filter((o) => daysBetween(todayIso, reminderSendDate(windowStartDate, o)) >= 0);
  const due = sorted.filter((o) => daysBetween(reminderSendDate(windowStartDate, o), todayIso) >= 0).pop();
  const offsetDays = due !== undefined && daysBetween(todayIso, windowStartDate) >= 0 ? due : (next[0] ?? sorted[sorted.length - 1]);
  return { offsetDays, sendOn: reminderSendDate(windowStartDate, offsetDays) };
}
