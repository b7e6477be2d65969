// What the links in a reminder do, for a grower who is not signed in: the signed token is the
// only permission. Unsubscribing is one click and final for every reminder to that address;
// booking asks the account's specialist for a pre-season check-up visit.
import { Op, type Sequelize } from 'sequelize';
import { PRE_SEASON_CHECKLIST } from '../../../shared/calc/merge-template.js';
import type { BookingRequest } from '../../../shared/schemas/reminders.js';
import { DEFAULT_DURATION_MIN } from '../../../shared/schemas/visits.js';
import { Account, AuditEvent, Contact, ReminderCampaign, ReminderOutbox, User, Visit } from '../../db/models/index.js';
import { AppError } from '../../http/errors.js';
import { loadMergeContext } from './audience.js';
import { verifyReminderToken, type ReminderTokenPayload, type TokenPurpose } from './tokens.js';

export function invalidLink(reason: string): AppError {
  const expired = reason === 'expired';
  return new AppError(
    expired ? 'link_expired' : 'invalid_token',
    expired ? 410 : 400,
    expired ? 'This link has expired. Ask your specialist for a check-up directly.' : 'This link is not valid. It may have been changed or cut short; use the link exactly as it came in the e-mail.',
  );
}

/** The token's payload, or an error saying why the link is refused. */
export function checkToken(secret: string, token: string, purpose: TokenPurpose): ReminderTokenPayload {
  const check = verifyReminderToken(secret, token, purpose);
  if (!check.ok) throw invalidLink(check.reason);
  return check.payload;
}

async function contactOf(payload: ReminderTokenPayload) {
  const contact = await Contact.findByPk(payload.contactId);
  if (!contact) throw new AppError('not_found', 404, 'This link belongs to a contact who is no longer on record.');
  return contact;
}

export interface UnsubscribeOutcome {
  email: string | null;
  name: string;
  /** false when the contact had already unsubscribed (the click is harmless either way). */
  changed: boolean;
  test: boolean;
}

/** Unsubscribes the contact from every reminder and cancels what waits in the outbox for them. */
export async function unsubscribe(sequelize: Sequelize, secret: string, token: string): Promise<UnsubscribeOutcome> {
  const payload = checkToken(secret, token, 'unsubscribe');
  const contact = await contactOf(payload);
  if (payload.test) return { email: contact.email, name: contact.name, changed: false, test: true };
  const changed = await sequelize.transaction(async (transaction) => {
    const fresh = await Contact.findByPk(contact.id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!fresh) return false;
    const already = fresh.unsubscribedAt !== null && !fresh.reminderOptIn;
    if (!already) {
      fresh.reminderOptIn = false;
      if (!fresh.unsubscribedAt) fresh.unsubscribedAt = new Date();
      await fresh.save({ transaction });
      await AuditEvent.create(
        { at: new Date(), accountId: fresh.accountId, userId: null, entity: 'contact', entityId: fresh.id, action: 'update', summary: `${fresh.name} unsubscribed from reminders by the e-mail link`, changes: { reminderOptIn: [true, false] } },
        { transaction },
      );
    }
    await ReminderOutbox.update(
      { status: 'cancelled', lastError: 'Not sent: the contact unsubscribed.' },
      { where: { contactId: fresh.id, status: { [Op.in]: ['pending', 'held'] } }, transaction },
    );
    return !already;
  });
  return { email: contact.email, name: contact.name, changed, test: false };
}

export interface BookingContext {
  contactName: string;
  accountName: string;
  specialistName: string | null;
  campaignName: string | null;
  season: number | null;
  test: boolean;
  /** An open check-up request or planned check-up already on record for the account. */
  existingVisitId: number | null;
}

async function bookingBasics(token: string, secret: string) {
  const payload = checkToken(secret, token, 'book');
  const contact = await contactOf(payload);
  const account = await Account.findByPk(contact.accountId);
  if (!account) throw new AppError('not_found', 404, 'This link belongs to an account that is no longer on record.');
  const campaign = await ReminderCampaign.findByPk(payload.campaignId);
  const specialist = account.specialistId ? await User.findByPk(account.specialistId, { attributes: ['id', 'name'] }) : null;
  return { payload, contact, account, campaign, specialist };
}

async function openCheckup(accountId: number) {
  return Visit.findOne({ where: { accountId, purpose: 'pre-season-checkup', status: { [Op.in]: ['requested', 'planned'] } }, order: [['id', 'DESC']] });
}

/** What the booking page shows before the grower confirms. Changes nothing. */
export async function bookingContext(secret: string, token: string): Promise<BookingContext> {
  const { payload, contact, account, campaign, specialist } = await bookingBasics(token, secret);
  const existing = await openCheckup(account.id);
  return {
    contactName: contact.name,
    accountName: account.name,
    specialistName: specialist?.name ?? null,
    campaignName: campaign?.name ?? null,
    season: campaign?.season ?? null,
    test: Boolean(payload.test),
    existingVisitId: existing?.id ?? null,
  };
}

export interface BookingOutcome {
  created: boolean;
  test: boolean;
  visit: { id: number; accountId: number; specialistId: number | null; purpose: string; status: string; requestedByContactId: number | null; notes: string | null } | null;
  context: BookingContext;
}

/**
 * Records a check-up request: a visit with status 'requested', purpose 'pre-season-checkup', for
 * the account's specialist, with the check-up checklist and this season's roadmap items. A second
 * click finds the open request and adds nothing.
 */
export async function bookCheckup(sequelize: Sequelize, secret: string, token: string, input: BookingRequest): Promise<BookingOutcome> {
  const { payload, contact, account, campaign, specialist } = await bookingBasics(token, secret);
  const context: BookingContext = {
    contactName: contact.name,
    accountName: account.name,
    specialistName: specialist?.name ?? null,
    campaignName: campaign?.name ?? null,
    season: campaign?.season ?? null,
    test: Boolean(payload.test),
    existingVisitId: null,
  };
  if (payload.test) return { created: false, test: true, visit: null, context };
  const season = campaign?.season ?? new Date().getUTCFullYear();
  const roadmap = (await loadMergeContext(sequelize, [account.id], season)).get(account.id)!;
  const { visit, created } = await sequelize.transaction(async (transaction) => {
    // Lock the account row so that two clicks at once make one request.
    await Account.findByPk(account.id, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id'] });
    const existing = await Visit.findOne({ where: { accountId: account.id, purpose: 'pre-season-checkup', status: { [Op.in]: ['requested', 'planned'] } }, transaction });
    if (existing) return { visit: existing, created: false };
    const notes = [
      `Requested by ${contact.name}${contact.email ? ` (${contact.email})` : ''} from the reminder${campaign ? ` "${campaign.name}"` : ''}.`,
      input.preferredDate ? `Preferred date: ${input.preferredDate}.` : null,
      input.notes ? `Note from the grower: ${input.notes}` : null,
    ]
      .filter(Boolean)
      .join('\n');
    const v = await Visit.create(
      {
        accountId: account.id,
        specialistId: account.specialistId,
        planterId: null,
        purpose: 'pre-season-checkup',
        status: 'requested',
        startsAt: null,
        // As long as any other check-up (a request from the grower's Visits page, the week plan's due check-ups).
        durationMin: DEFAULT_DURATION_MIN['pre-season-checkup'],
        windowStartMin: null,
        windowEndMin: null,
        notes,
        checklist: PRE_SEASON_CHECKLIST.map((label) => ({ label, done: false })),
        roadmapItemIds: roadmap.roadmapItemIds,
        requestedByContactId: contact.id,
      },
      { transaction },
    );
    await AuditEvent.create(
      { at: new Date(), accountId: account.id, userId: null, entity: 'visit', entityId: v.id, action: 'create', summary: `${contact.name} asked for a pre-season check-up by the e-mail link`, changes: null },
      { transaction },
    );
    return { visit: v, created: true };
  });
  context.existingVisitId = visit.id;
  return {
    created,
    test: false,
    visit: { id: visit.id, accountId: visit.accountId, specialistId: visit.specialistId, purpose: visit.purpose, status: visit.status, requestedByContactId: visit.requestedByContactId, notes: visit.notes },
    context,
  };
}
