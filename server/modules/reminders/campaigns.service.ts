// Reminder campaigns. Admin: every campaign. Manager and specialist: campaigns aimed at one of
// their territories; they may change or run one only when all its territories are theirs.
// Growers have no access (the router refuses them).
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { isoDateUtc, reminderSchedule, windowStartIso } from '../../../shared/calc/season-calendar.js';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { CampaignInput, CampaignListQuery, CampaignUpdate, OutboxStatus, PreviewInput, TestSendInput } from '../../../shared/schemas/reminders.js';
import { canSeeAccount } from '../../auth/access.js';
import { Account, AuditEvent, Contact, ReminderCampaign, ReminderCampaignTerritory, ReminderOutbox, Territory } from '../../db/models/index.js';
import { AppError, notFound, validationError } from '../../http/errors.js';
import { createMailTransport, describeMailError, type TransportTarget } from '../../mail/transport.js';
import { assertVersion, mapLockError } from '../fleet/fleet-access.js';
import { kickReminderSender } from '../../jobs/scheduler.js';
import { campaignForAudience, enqueueCampaign, type EnqueueResult } from '../../jobs/enqueue.js';
import { audienceContacts, audienceFit, composeMessage, loadMergeContext, previewOffset, type LinkSettings } from './audience.js';
import { resolveWindow } from './calendar.service.js';

const STAFF_ONLY = () => new AppError('forbidden', 403, 'Reminder campaigns are for dealership staff.');

function isStaff(user: SessionUser) {
  return user.role === 'admin' || user.role === 'manager' || user.role === 'specialist';
}

/** Campaign ids a user may see: all for admin, those touching their territories for manager and specialist. */
async function visibleCampaignIds(user: SessionUser): Promise<number[] | null> {
  if (user.role === 'admin') return null;
  if (!isStaff(user)) throw STAFF_ONLY();
  const rows = await ReminderCampaignTerritory.findAll({ where: { territoryId: user.territoryIds.length ? user.territoryIds : [-1] }, attributes: ['campaignId'] });
  return [...new Set(rows.map((r) => r.campaignId))];
}

/** Loads a campaign the user may see (404 otherwise); 'edit' also needs every territory to be theirs (403). */
export async function campaignFor(user: SessionUser, id: number, mode: 'read' | 'edit', transaction?: Transaction) {
  if (!isStaff(user)) throw STAFF_ONLY();
  const campaign = await ReminderCampaign.findByPk(id, { transaction, lock: mode === 'edit' && transaction ? transaction.LOCK.UPDATE : undefined });
  if (!campaign) throw notFound('That campaign');
  const territoryIds = (await ReminderCampaignTerritory.findAll({ where: { campaignId: id }, transaction })).map((t) => t.territoryId).sort((a, b) => a - b);
  if (user.role !== 'admin') {
    if (!territoryIds.some((t) => user.territoryIds.includes(t))) throw notFound('That campaign');
    if (mode === 'edit' && !territoryIds.every((t) => user.territoryIds.includes(t))) {
      throw new AppError('forbidden', 403, 'This campaign also reaches territories that are not yours; ask an admin to change it.');
    }
  }
  return { campaign, territoryIds };
}

async function outboxCounts(campaignIds: number[], user: SessionUser): Promise<Map<number, Record<OutboxStatus, number>>> {
  const out = new Map<number, Record<OutboxStatus, number>>();
  for (const id of campaignIds) out.set(id, { pending: 0, sending: 0, sent: 0, failed: 0, cancelled: 0, held: 0 });
  if (!campaignIds.length) return out;
  const scope = user.role === 'admin' ? '' : ' AND a.territory_id IN (:territories)';
  const rows = await ReminderCampaign.sequelize!.query<{ campaignId: number; status: OutboxStatus; n: number }>(
    `SELECT o.campaign_id AS campaignId, o.status, COUNT(*) AS n FROM reminder_outbox o JOIN accounts a ON a.id = o.account_id
     WHERE o.campaign_id IN (:ids)${scope} GROUP BY o.campaign_id, o.status`,
    { type: QueryTypes.SELECT, replacements: { ids: campaignIds, territories: user.territoryIds.length ? user.territoryIds : [-1] } },
  );
  for (const r of rows) out.get(r.campaignId)![r.status] = Number(r.n);
  return out;
}

/** A campaign as the API shows it: its fields, the window it follows, each reminder's date and the outbox counts. */
async function serialise(campaign: ReminderCampaign, territoryIds: number[], counts: Record<OutboxStatus, number>, todayIso = isoDateUtc(new Date())) {
  const window = await resolveWindow(campaign.regionKey, campaign.crop);
  const windowStartDate = window ? windowStartIso(campaign.season, window.windowStart) : null;
  return {
    id: campaign.id,
    name: campaign.name,
    season: campaign.season,
    regionKey: campaign.regionKey,
    crop: campaign.crop,
    offsetsDays: campaign.offsetsDays,
    audience: { territoryIds, ...campaign.audience },
    subject: campaign.subject,
    body: campaign.body,
    status: campaign.status,
    version: campaign.version,
    createdBy: campaign.createdBy,
    updatedBy: campaign.updatedBy,
    createdAt: campaign.createdAt.toISOString(),
    updatedAt: campaign.updatedAt.toISOString(),
    window: window
      ? {
          regionLabel: window.regionLabel,
          windowStart: window.windowStart,
          windowEnd: window.windowEnd,
          windowStartDate,
          windowEndDate: windowStartIso(campaign.season, window.windowEnd),
          source: window.source,
          sourceText: window.sourceText,
          isDefault: window.isDefault,
        }
      : null,
    schedule: windowStartDate ? reminderSchedule(windowStartDate, campaign.offsetsDays, todayIso) : [],
    outbox: counts,
  };
}
export type CampaignView = Awaited<ReturnType<typeof serialise>>;

export async function listCampaigns(user: SessionUser, q: CampaignListQuery) {
  const visible = await visibleCampaignIds(user);
  const where: Record<string | symbol, unknown> = {};
  if (visible) where.id = visible.length ? visible : [-1];
  if (q.season) where.season = q.season;
  if (q.status) where.status = q.status;
  const { rows, count } = await ReminderCampaign.findAndCountAll({ where, order: [['season', 'DESC'], ['name', 'ASC'], ['id', 'ASC']], limit: q.pageSize, offset: (q.page - 1) * q.pageSize });
  const ids = rows.map((r) => r.id);
  const territories = await ReminderCampaignTerritory.findAll({ where: { campaignId: ids.length ? ids : [-1] } });
  const counts = await outboxCounts(ids, user);
  const items = [];
  for (const c of rows) items.push(await serialise(c, territories.filter((t) => t.campaignId === c.id).map((t) => t.territoryId).sort((a, b) => a - b), counts.get(c.id)!));
  return { items, total: count };
}

export async function getCampaign(user: SessionUser, id: number) {
  const { campaign, territoryIds } = await campaignFor(user, id, 'read');
  return serialise(campaign, territoryIds, (await outboxCounts([id], user)).get(id)!);
}

/** Territories must exist (400) and, for non-admins, be their own (403). */
async function checkTerritories(user: SessionUser, territoryIds: number[], transaction: Transaction) {
  const found = await Territory.count({ where: { id: territoryIds }, transaction });
  if (found !== new Set(territoryIds).size) throw validationError({ 'audience.territoryIds': 'One of those territories does not exist' });
  if (user.role !== 'admin' && !territoryIds.every((t) => user.territoryIds.includes(t))) {
    throw new AppError('forbidden', 403, 'You can aim a campaign only at your own territories.');
  }
}

async function checkWindow(regionKey: string, crop: string, transaction: Transaction) {
  if (!(await resolveWindow(regionKey, crop, transaction))) {
    throw validationError({ regionKey: `The season calendar has no ${crop} planting window for region "${regionKey}". Add it in the season calendar first` });
  }
}

async function auditCampaign(transaction: Transaction, user: SessionUser, campaign: ReminderCampaign, action: 'create' | 'update', changes: Record<string, unknown> | null) {
  await AuditEvent.create(
    { at: new Date(), accountId: null, userId: user.id, entity: 'reminderCampaign', entityId: campaign.id, action, summary: `${action === 'create' ? 'Created' : 'Changed'} reminder campaign "${campaign.name}"`, changes },
    { transaction },
  );
}

export async function createCampaign(sequelize: Sequelize, user: SessionUser, input: CampaignInput) {
  if (!isStaff(user)) throw STAFF_ONLY();
  const id = await sequelize.transaction(async (transaction) => {
    const territoryIds = [...new Set(input.audience.territoryIds)];
    await checkTerritories(user, territoryIds, transaction);
    await checkWindow(input.regionKey, input.crop, transaction);
    const { territoryIds: _t, ...audience } = input.audience;
    const campaign = await ReminderCampaign.create(
      { name: input.name, season: input.season, regionKey: input.regionKey, crop: input.crop, offsetsDays: input.offsetsDays, audience, subject: input.subject, body: input.body, status: input.status, createdBy: user.id, updatedBy: user.id },
      { transaction },
    );
    await ReminderCampaignTerritory.bulkCreate(territoryIds.map((territoryId) => ({ campaignId: campaign.id, territoryId })), { transaction });
    await auditCampaign(transaction, user, campaign, 'create', null);
    return campaign.id;
  });
  return getCampaign(user, id);
}

export async function updateCampaign(sequelize: Sequelize, user: SessionUser, id: number, input: CampaignUpdate) {
  await sequelize
    .transaction(async (transaction) => {
      const { campaign, territoryIds } = await campaignFor(user, id, 'edit', transaction);
      assertVersion(campaign.version, input.version);
      const changes: Record<string, unknown> = {};
      if (input.audience) {
        const next = [...new Set(input.audience.territoryIds)];
        await checkTerritories(user, next, transaction);
        if (next.join() !== territoryIds.join()) {
          await ReminderCampaignTerritory.destroy({ where: { campaignId: id }, transaction });
          await ReminderCampaignTerritory.bulkCreate(next.map((territoryId) => ({ campaignId: id, territoryId })), { transaction });
        }
        const { territoryIds: _t, ...audience } = input.audience;
        changes.audience = { territoryIds: next, ...audience };
        campaign.audience = audience;
      }
      if ((input.season !== undefined && input.season !== campaign.season) && (await ReminderOutbox.count({ where: { campaignId: id }, transaction }))) {
        throw new AppError('conflict', 409, 'Messages of this campaign are already in the outbox, so its season cannot change. Create a campaign for the new season instead.');
      }
      if (input.regionKey !== undefined || input.crop !== undefined) await checkWindow(input.regionKey ?? campaign.regionKey, input.crop ?? campaign.crop, transaction);
      for (const key of ['name', 'season', 'regionKey', 'crop', 'offsetsDays', 'subject', 'body', 'status'] as const) {
        if (input[key] !== undefined && JSON.stringify(input[key]) !== JSON.stringify(campaign[key])) {
          changes[key] = input[key];
          campaign.set(key, input[key] as never);
        }
      }
      // A paused campaign holds its queued messages; resuming releases them.
      if (changes.status === 'paused') {
        await ReminderOutbox.update({ status: 'held' }, { where: { campaignId: id, status: 'pending' }, transaction });
      } else if (changes.status) {
        await ReminderOutbox.update({ status: 'pending' }, { where: { campaignId: id, status: 'held' }, transaction });
      }
      campaign.updatedBy = user.id;
      campaign.changed('audience', true);
      await campaign.save({ transaction });
      await auditCampaign(transaction, user, campaign, 'update', changes);
    })
    .catch(mapLockError);
  return getCampaign(user, id);
}

/** Enqueues what is due today for one campaign (not when paused) and wakes the sender. */
export async function runCampaign(sequelize: Sequelize, user: SessionUser, id: number, links: LinkSettings): Promise<EnqueueResult> {
  const { campaign } = await campaignFor(user, id, 'edit');
  if (campaign.status === 'paused') throw new AppError('paused', 409, 'This campaign is paused. Set it to active (or draft) before running it.');
  const result = await enqueueCampaign(sequelize, campaign, links, isoDateUtc(new Date()));
  if (result.enqueued) kickReminderSender();
  return result;
}

/** A contact the user may see, of an account in the campaign's territories (404 otherwise). */
async function contactForCampaign(user: SessionUser, contactId: number, territoryIds: number[]) {
  const contact = await Contact.findByPk(contactId);
  const account = contact ? await Account.findByPk(contact.accountId, { attributes: ['id', 'name', 'territoryId'] }) : null;
  if (!contact || !account || !canSeeAccount(user, account)) throw notFound('That contact');
  if (!territoryIds.includes(account.territoryId)) throw validationError({ contactId: 'That contact is outside the campaign’s territories' });
  return { contact, account };
}

async function composeFor(sequelize: Sequelize, user: SessionUser, id: number, input: Pick<PreviewInput, 'contactId' | 'subject' | 'body'>, links: LinkSettings) {
  const { campaign, territoryIds } = await campaignFor(user, id, 'read');
  const { contact, account } = await contactForCampaign(user, input.contactId, territoryIds);
  const window = await resolveWindow(campaign.regionKey, campaign.crop);
  if (!window) throw validationError({ regionKey: `The season calendar has no ${campaign.crop} planting window for region "${campaign.regionKey}"` });
  const windowStartDate = windowStartIso(campaign.season, window.windowStart);
  const { offsetDays, sendOn } = previewOffset(windowStartDate, campaign.offsetsDays, isoDateUtc(new Date()));
  const forAudience = await campaignForAudience(campaign);
  const context = (await loadMergeContext(sequelize, [account.id], campaign.season)).get(account.id)!;
  // Preview and test links carry the test flag: following them changes nothing.
  const message = composeMessage({
    campaign: forAudience,
    template: { subject: input.subject ?? campaign.subject, body: input.body ?? campaign.body },
    contact: { contactId: contact.id, contactName: contact.name },
    accountName: account.name,
    context,
    windowStartDate,
    offsetDays,
    links,
    test: true,
  });
  const fit = await audienceFit(sequelize, forAudience, contact.id);
  return { campaign, contact, account, message, offsetDays, sendOn, fit };
}

export async function previewCampaign(sequelize: Sequelize, user: SessionUser, id: number, input: PreviewInput, links: LinkSettings) {
  const { contact, account, message, offsetDays, sendOn, fit } = await composeFor(sequelize, user, id, input, links);
  return {
    subject: message.subject,
    text: message.text,
    html: message.html,
    to: contact.email,
    contact: { id: contact.id, name: contact.name, email: contact.email },
    account: { id: account.id, name: account.name },
    offsetDays,
    sendOn,
    inAudience: fit.inAudience,
    notInAudienceBecause: fit.reasons,
  };
}

/** Sends one grower's message, marked as a test, to the signed-in user (or `to`); nothing is recorded in the outbox. */
export async function testSendCampaign(sequelize: Sequelize, user: SessionUser, id: number, input: TestSendInput, links: LinkSettings, target: TransportTarget) {
  const { message, contact } = await composeFor(sequelize, user, id, input, links);
  const to = input.to ?? user.email;
  const transport = createMailTransport({ ...target, maxConnections: 1 });
  try {
    const info = await transport.sendMail({
      from: links.mailFrom,
      to,
      subject: `[Test] ${message.subject}`,
      text: message.text,
      html: message.html,
      messageId: message.messageId,
      headers: { 'X-Rowpath-Test': `preview for contact ${contact.id}` },
    });
    return { sent: true, to, messageId: message.messageId, smtpResponse: String((info as { response?: string }).response ?? '') };
  } catch (err) {
    // A permanent refusal of the recipient (5xx on the envelope) is about the address the user
    // typed, not the mail server's health: say so on the field.
    const e = err as { code?: string; responseCode?: number };
    if (e.code === 'EENVELOPE' && (e.responseCode ?? 0) >= 500) {
      throw new AppError('validation', 400, 'Some fields need attention.', { fields: { to: `The mail server refused this address: ${describeMailError(err)}` } });
    }
    throw new AppError('smtp_unavailable', 502, `The test message could not be handed to the mail server: ${describeMailError(err)}`);
  } finally {
    transport.close();
  }
}

export async function campaignAudience(sequelize: Sequelize, user: SessionUser, id: number, page: number, pageSize: number) {
  const { campaign } = await campaignFor(user, id, 'read');
  const forAudience = await campaignForAudience(campaign);
  const { rows, total } = await audienceContacts(sequelize, forAudience, { scopeTerritoryIds: user.role === 'admin' ? null : user.territoryIds, page, pageSize });
  return { items: rows.map(({ queued: _q, ...r }) => r), total };
}

