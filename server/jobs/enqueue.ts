// Enqueue: for each campaign, the reminder due today goes into the outbox once per contact.
// The outbox's unique key (contact, campaign, offset) and INSERT IGNORE make this safe to run
// from any number of app instances, any number of times: a message already there is left alone.
// Two instances inserting the same keys at once can deadlock in InnoDB; the loser runs again.
import { QueryTypes, type Sequelize } from 'sequelize';
import { dueReminder, isoDateUtc, windowStartIso } from '../../shared/calc/season-calendar.js';
import type { CampaignStatus } from '../../shared/schemas/reminders.js';
import { ReminderCampaign, ReminderCampaignTerritory } from '../db/models/index.js';
import { audienceContacts, composeMessage, loadMergeContext, type CampaignForAudience, type LinkSettings } from '../modules/reminders/audience.js';
import { resolveWindow } from '../modules/reminders/calendar.service.js';
import { retryOnDeadlock } from '../db/retry.js';

export interface EnqueueResult {
  campaignId: number;
  campaignName: string;
  /** The reminder due today, or null when none is. */
  offsetDays: number | null;
  sendOn: string | null;
  windowStartDate: string | null;
  /** Contacts in the audience today. */
  audience: number;
  /** Messages put in the outbox by this run. */
  enqueued: number;
  /** Contacts who already had this reminder in the outbox. */
  alreadyQueued: number;
  /** Why nothing was enqueued, in words, when that is the case. */
  note: string | null;
}

export async function campaignForAudience(campaign: ReminderCampaign): Promise<CampaignForAudience> {
  const territories = await ReminderCampaignTerritory.findAll({ where: { campaignId: campaign.id }, attributes: ['territoryId'] });
  return {
    id: campaign.id,
    name: campaign.name,
    season: campaign.season,
    crop: campaign.crop,
    territoryIds: territories.map((t) => t.territoryId).sort((a, b) => a - b),
    audience: campaign.audience,
    subject: campaign.subject,
    body: campaign.body,
  };
}

const COLUMNS = [
  'campaign_id', 'contact_id', 'account_id', 'offset_days', 'send_on', 'to_email', 'subject', 'text', 'html', 'message_id', 'unsubscribe_url',
  'status', 'attempts', 'next_attempt_at', 'created_at', 'updated_at',
];

/** Enqueues the reminder due today for one campaign. */
export async function enqueueCampaign(sequelize: Sequelize, campaign: ReminderCampaign, links: LinkSettings, todayIso: string, now = new Date()): Promise<EnqueueResult> {
  const result: EnqueueResult = { campaignId: campaign.id, campaignName: campaign.name, offsetDays: null, sendOn: null, windowStartDate: null, audience: 0, enqueued: 0, alreadyQueued: 0, note: null };
  const window = await resolveWindow(campaign.regionKey, campaign.crop);
  if (!window) return { ...result, note: `The season calendar has no ${campaign.crop} window for region ${campaign.regionKey}.` };
  const windowStartDate = windowStartIso(campaign.season, window.windowStart);
  result.windowStartDate = windowStartDate;
  const due = dueReminder(windowStartDate, campaign.offsetsDays, todayIso);
  if (!due) return { ...result, note: `No reminder is due on ${todayIso} (window opens ${windowStartDate}).` };
  result.offsetDays = due.offsetDays;
  result.sendOn = due.sendOn;

  const forAudience = await campaignForAudience(campaign);
  const { rows } = await audienceContacts(sequelize, forAudience, { offsetDays: due.offsetDays });
  result.audience = rows.length;
  // In contact order, so instances enqueueing at once take the key locks in the same order.
  const fresh = rows.filter((r) => !r.queued).sort((a, b) => a.contactId - b.contactId);
  result.alreadyQueued = rows.length - fresh.length;
  if (!fresh.length) return { ...result, note: rows.length ? 'Everyone in the audience already has this reminder.' : 'Nobody is in the audience.' };

  const contexts = await loadMergeContext(sequelize, fresh.map((r) => r.accountId), campaign.season);
  // Rendered now, stored with the row: what is sent is what was enqueued, and sending stays fast.
  for (let i = 0; i < fresh.length; i += 200) {
    const values: unknown[] = [];
    const part = fresh.slice(i, i + 200);
    for (const contact of part) {
      const m = composeMessage({ campaign: forAudience, contact, accountName: contact.accountName, context: contexts.get(contact.accountId)!, windowStartDate, offsetDays: due.offsetDays, links });
      values.push(campaign.id, contact.contactId, contact.accountId, due.offsetDays, due.sendOn, contact.email, m.subject.slice(0, 255), m.text, m.html, m.messageId, m.unsubscribeUrl, 'pending', 0, now, now, now);
    }
    const placeholders = part.map(() => `(${COLUMNS.map(() => '?').join(', ')})`).join(', ');
    // One statement in autocommit: a deadlock victim is rolled back whole, so running it again is safe.
    const [, affected] = (await retryOnDeadlock(() =>
      sequelize.query(`INSERT IGNORE INTO reminder_outbox (${COLUMNS.join(', ')}) VALUES ${placeholders}`, {
        type: QueryTypes.INSERT,
        replacements: values,
      }),
    )) as unknown as [unknown, number];
    result.enqueued += Number(affected);
  }
  // Rows another instance inserted between our audience read and our insert were ignored.
  result.alreadyQueued = rows.length - result.enqueued;
  return result;
}

/** Enqueues what is due today for every campaign with one of the given statuses (the scheduler: active). */
export async function enqueueDue(
  sequelize: Sequelize,
  links: LinkSettings,
  opts: { today?: string; statuses?: CampaignStatus[]; campaignIds?: number[]; now?: Date } = {},
): Promise<EnqueueResult[]> {
  const now = opts.now ?? new Date();
  const today = opts.today ?? isoDateUtc(now);
  const where: Record<string, unknown> = { status: opts.statuses ?? ['active'] };
  if (opts.campaignIds) where.id = opts.campaignIds;
  const campaigns = await ReminderCampaign.findAll({ where, order: [['id', 'ASC']] });
  const results: EnqueueResult[] = [];
  for (const campaign of campaigns) results.push(await enqueueCampaign(sequelize, campaign, links, today, now));
  return results;
}
