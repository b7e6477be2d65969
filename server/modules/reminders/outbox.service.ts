// The outbox as staff see it (admin: all; manager and specialist: their territories' growers),
// and the local SMTP stand-in's mailbox (admin only).
import { Op, QueryTypes, type Sequelize } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import { outboxStatuses, type OutboxQuery, type OutboxStatus, type SentMailQuery } from '../../../shared/schemas/reminders.js';
import { Contact, ReceivedMail, ReminderOutbox } from '../../db/models/index.js';
import { AppError, notFound } from '../../http/errors.js';
import { likeContains } from '../../db/like.js';

function scope(user: SessionUser): { sql: string; territories: number[] } {
  if (user.role === 'admin') return { sql: '', territories: [] };
  if (user.role !== 'manager' && user.role !== 'specialist') throw new AppError('forbidden', 403, 'The outbox is for dealership staff.');
  return { sql: ' AND a.territory_id IN (:territories)', territories: user.territoryIds.length ? user.territoryIds : [-1] };
}

const ROW = `o.id, o.campaign_id AS campaignId, k.name AS campaignName, o.contact_id AS contactId, c.name AS contactName, o.account_id AS accountId,
  a.name AS accountName, o.to_email AS toEmail, o.offset_days AS offsetDays, o.send_on AS sendOn, o.subject, o.status, o.attempts,
  o.next_attempt_at AS nextAttemptAt, o.last_error AS lastError, o.sent_at AS sentAt, o.message_id AS messageId, o.created_at AS createdAt, o.updated_at AS updatedAt`;
const FROM = 'FROM reminder_outbox o JOIN accounts a ON a.id = o.account_id JOIN contacts c ON c.id = o.contact_id JOIN reminder_campaigns k ON k.id = o.campaign_id';

type OutboxRow = {
  id: number;
  campaignId: number;
  campaignName: string;
  contactId: number;
  contactName: string;
  accountId: number;
  accountName: string;
  toEmail: string;
  offsetDays: number;
  sendOn: string | Date;
  subject: string;
  status: OutboxStatus;
  attempts: number;
  nextAttemptAt: Date | null;
  lastError: string | null;
  sentAt: Date | null;
  messageId: string;
  createdAt: Date;
  updatedAt: Date;
  text?: string;
  html?: string;
};

function shape(r: OutboxRow) {
  const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);
  return {
    ...r,
    id: Number(r.id),
    sendOn: typeof r.sendOn === 'string' ? r.sendOn : new Date(r.sendOn).toISOString().slice(0, 10),
    // The retry time only means something while a message waits.
    nextAttemptAt: r.status === 'pending' ? iso(r.nextAttemptAt) : null,
    sentAt: iso(r.sentAt),
    createdAt: iso(r.createdAt),
    updatedAt: iso(r.updatedAt),
  };
}

/** Outbox rows newest first, with counts per status over the same filters (except status). */
export async function listOutbox(sequelize: Sequelize, user: SessionUser, q: OutboxQuery) {
  const s = scope(user);
  const filters: string[] = [];
  const params: Record<string, unknown> = { territories: s.territories };
  if (q.campaignId) {
    filters.push('o.campaign_id = :campaignId');
    params.campaignId = q.campaignId;
  }
  if (q.accountId) {
    filters.push('o.account_id = :accountId');
    params.accountId = q.accountId;
  }
  const base = `${FROM} WHERE 1 = 1${s.sql}${filters.map((f) => ` AND ${f}`).join('')}`;
  const statusFilter = q.status ? ' AND o.status = :status' : '';
  params.status = q.status;
  params.limit = q.pageSize;
  params.skip = (q.page - 1) * q.pageSize;
  const rows = await sequelize.query<OutboxRow>(`SELECT ${ROW} ${base}${statusFilter} ORDER BY o.id DESC LIMIT :limit OFFSET :skip`, { type: QueryTypes.SELECT, replacements: params });
  const grouped = await sequelize.query<{ status: OutboxStatus; n: number }>(`SELECT o.status, COUNT(*) AS n ${base} GROUP BY o.status`, { type: QueryTypes.SELECT, replacements: params });
  const counts = Object.fromEntries(outboxStatuses.map((st) => [st, 0])) as Record<OutboxStatus, number>;
  for (const g of grouped) counts[g.status] = Number(g.n);
  const total = q.status ? counts[q.status] : Object.values(counts).reduce((a, b) => a + b, 0);
  return { items: rows.map(shape), total, counts };
}

/** One message with its text and HTML parts (404 outside the user's scope). */
export async function getOutboxMessage(sequelize: Sequelize, user: SessionUser, id: number) {
  const s = scope(user);
  const [row] = await sequelize.query<OutboxRow & { text: string; html: string }>(`SELECT ${ROW}, o.text, o.html ${FROM} WHERE o.id = :id${s.sql}`, {
    type: QueryTypes.SELECT,
    replacements: { id, territories: s.territories },
  });
  if (!row) throw notFound('That message');
  return shape(row);
}

/** A failed message back to pending, with its attempts reset; refused when the contact has unsubscribed since. */
export async function retryOutboxMessage(sequelize: Sequelize, user: SessionUser, id: number) {
  const message = await getOutboxMessage(sequelize, user, id);
  if (message.status !== 'failed') throw new AppError('not_failed', 409, 'Only a failed message can be sent again.');
  const contact = await Contact.findByPk(message.contactId);
  if (!contact || !contact.reminderOptIn || contact.unsubscribedAt || !contact.email) {
    throw new AppError('unsubscribed', 409, 'The contact has unsubscribed or has no e-mail address, so the message stays unsent.');
  }
  await ReminderOutbox.update({ status: 'pending', attempts: 0, nextAttemptAt: new Date(), claimedBy: null }, { where: { id, status: 'failed' } });
  return getOutboxMessage(sequelize, user, id);
}

// ---------- the local SMTP stand-in's mailbox ----------
export async function listSentMail(q: SentMailQuery) {
  const where = q.q ? { [Op.or]: [{ subject: { [Op.like]: likeContains(q.q) } }, { toHeader: { [Op.like]: likeContains(q.q) } }] } : {};
  const { rows, count } = await ReceivedMail.findAndCountAll({
    where,
    attributes: ['id', 'messageId', 'envelopeFrom', 'envelopeTo', 'fromHeader', 'toHeader', 'subject', 'sizeBytes', 'repeatCount', 'receivedAt'],
    order: [['id', 'DESC']],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  return {
    items: rows.map((r) => ({
      id: Number(r.id),
      messageId: r.messageId,
      from: r.fromHeader,
      to: r.toHeader,
      envelopeTo: r.envelopeTo,
      subject: r.subject,
      sizeBytes: r.sizeBytes,
      repeatCount: r.repeatCount,
      receivedAt: r.receivedAt.toISOString(),
    })),
    total: count,
  };
}

export async function getSentMail(id: number) {
  const r = await ReceivedMail.findByPk(id);
  if (!r) throw notFound('That message');
  return {
    id: Number(r.id),
    messageId: r.messageId,
    from: r.fromHeader,
    to: r.toHeader,
    envelopeFrom: r.envelopeFrom,
    envelopeTo: r.envelopeTo,
    subject: r.subject,
    text: r.text,
    html: r.html,
    headers: r.headers,
    sizeBytes: r.sizeBytes,
    repeatCount: r.repeatCount,
    receivedAt: r.receivedAt.toISOString(),
  };
}
