// The sender: claims due outbox rows, hands each to SMTP, and records the outcome.
//
// Claiming is a short transaction: `SELECT … FOR UPDATE SKIP LOCKED` (raw SQL — Sequelize drops
// skipLocked on MariaDB) picks rows no other sender holds, and an UPDATE marks them `sending` with
// a lease (next_attempt_at = now + lease). Several senders, in one process or on several app
// instances, therefore never claim the same row. A sender that dies mid-batch leaves its rows
// `sending`; when the lease runs out any sender claims them again. A message handed to SMTP just
// before the crash goes again with the same Message-ID, which the receiving side (the local
// stand-in, and mail clients) recognise as the same message.
//
// Failures: a permanent SMTP refusal (5xx) fails the row at once; anything else (server down,
// timeout, 4xx) returns it to `pending` with exponential backoff, until maxAttempts, when it
// fails for good. Failed rows and their last error are listed for the specialist in the outbox.
import { randomBytes } from 'node:crypto';
import { hostname } from 'node:os';
import { QueryTypes, Transaction, type Sequelize } from 'sequelize';
import { describeMailError, isPermanentMailError, type MailTransport } from '../mail/transport.js';
import { retryOnDeadlock } from '../db/retry.js';

export interface SenderOptions {
  sequelize: Sequelize;
  transport: MailTransport;
  from: string;
  /** Names the claiming sender in the outbox (claimed_by: the sender that last claimed the row). */
  workerId?: string;
  /** Rows claimed per transaction. */
  batchSize?: number;
  /** Messages in flight at once. */
  concurrency?: number;
  /** How long a claim holds before another sender may take the row over. Longer than any send. */
  leaseMs?: number;
  maxAttempts?: number;
  backoffBaseMs?: number;
  backoffMaxMs?: number;
  now?: () => Date;
  log?: (line: string, err?: unknown) => void;
}

export interface SendSummary {
  claimed: number;
  sent: number;
  retrying: number;
  failed: number;
  cancelled: number;
  held: number;
}

export const SENDER_DEFAULTS = {
  batchSize: 50,
  concurrency: 5,
  leaseMs: 5 * 60_000,
  maxAttempts: 8,
  backoffBaseMs: 60_000,
  backoffMaxMs: 6 * 3_600_000,
};

/** Delivered messages are recorded in groups of this many (and at the end of every batch). */
const MARK_EVERY = 10;

export function newWorkerId(): string {
  return `${hostname().slice(0, 40)}:${process.pid}:${randomBytes(3).toString('hex')}`;
}

/** Wait before retry number `attempts` (1 = after the first failure): base × 2^(attempts−1), capped. */
export function backoffDelayMs(attempts: number, baseMs: number, maxMs: number): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, attempts - 1));
}

export interface ClaimedMessage {
  id: number;
  toEmail: string;
  subject: string;
  text: string;
  html: string;
  messageId: string;
  unsubscribeUrl: string;
  attempts: number;
}

type Row = ClaimedMessage & { contactEmail: string | null; optIn: number; unsubscribedAt: Date | null; campaignStatus: string };

/**
 * Claims up to `batchSize` due rows for `workerId`. Rows whose contact has unsubscribed (or lost
 * their address) are cancelled, and rows of a paused campaign held, in the same transaction.
 */
export async function claimBatch(sequelize: Sequelize, workerId: string, opts: { batchSize: number; leaseMs: number; now: Date }): Promise<{ claimed: ClaimedMessage[]; cancelled: number; held: number }> {
  // READ COMMITTED: the locking read takes no gap locks, so enqueuers inserting meanwhile never wait on it.
  // A deadlock victim's transaction is rolled back whole, so it is simply run again.
  return retryOnDeadlock(() => sequelize.transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED }, async (transaction) => {
    const picked = await sequelize.query<{ id: number }>(
      "SELECT id FROM reminder_outbox WHERE status IN ('pending', 'sending') AND next_attempt_at <= ? LIMIT ? FOR UPDATE SKIP LOCKED",
      { type: QueryTypes.SELECT, replacements: [opts.now, opts.batchSize], transaction },
    );
    if (!picked.length) return { claimed: [], cancelled: 0, held: 0 };
    const ids = picked.map((r) => Number(r.id));
    const rows = await sequelize.query<Row>(
      `SELECT o.id, o.to_email AS toEmail, o.subject, o.text, o.html, o.message_id AS messageId, o.unsubscribe_url AS unsubscribeUrl, o.attempts,
              c.email AS contactEmail, c.reminder_opt_in AS optIn, c.unsubscribed_at AS unsubscribedAt, k.status AS campaignStatus
       FROM reminder_outbox o JOIN contacts c ON c.id = o.contact_id JOIN reminder_campaigns k ON k.id = o.campaign_id
       WHERE o.id IN (?)`,
      { type: QueryTypes.SELECT, replacements: [ids], transaction },
    );
    const optedOut = rows.filter((r) => !Number(r.optIn) || r.unsubscribedAt || !r.contactEmail);
    const held = rows.filter((r) => !optedOut.includes(r) && r.campaignStatus === 'paused');
    const sending = rows.filter((r) => !optedOut.includes(r) && !held.includes(r));
    const at = opts.now;
    if (optedOut.length) {
      await sequelize.query("UPDATE reminder_outbox SET status = 'cancelled', claimed_by = NULL, last_error = ?, updated_at = ? WHERE id IN (?)", {
        replacements: ['Not sent: the contact unsubscribed or has no e-mail address.', at, optedOut.map((r) => r.id)],
        transaction,
      });
    }
    if (held.length) {
      await sequelize.query("UPDATE reminder_outbox SET status = 'held', claimed_by = NULL, updated_at = ? WHERE id IN (?)", { replacements: [at, held.map((r) => r.id)], transaction });
    }
    if (sending.length) {
      await sequelize.query("UPDATE reminder_outbox SET status = 'sending', claimed_by = ?, attempts = attempts + 1, next_attempt_at = ?, updated_at = ? WHERE id IN (?)", {
        replacements: [workerId, new Date(at.getTime() + opts.leaseMs), at, sending.map((r) => r.id)],
        transaction,
      });
    }
    return {
      // The address the contact has now, in case it changed after enqueueing.
      claimed: sending.map((r) => ({ ...r, id: Number(r.id), toEmail: r.contactEmail ?? r.toEmail, attempts: Number(r.attempts) + 1 })),
      cancelled: optedOut.length,
      held: held.length,
    };
  }));
}

type Resolved = Required<Omit<SenderOptions, 'log'>> & { log: NonNullable<SenderOptions['log']> };
type SentMark = { id: number; toEmail: string; smtpResponse: string };

/**
 * Records delivered messages, several per statement: each commit costs a disk flush, and one per
 * message would halve the throughput. A sender that dies holding marks leaves those rows
 * `sending`; they go again after the lease with the same Message-ID (see the file comment).
 */
async function markSent(sequelize: Sequelize, marks: SentMark[], at: Date) {
  if (!marks.length) return;
  const cases = () => `CASE id ${marks.map(() => 'WHEN ? THEN ?').join(' ')} END`;
  const pairs = (field: keyof SentMark) => marks.flatMap((m) => [m.id, m[field]]);
  await sequelize.query(
    `UPDATE reminder_outbox SET status = 'sent', sent_at = ?, last_error = NULL, updated_at = ?, smtp_response = ${cases()}, to_email = ${cases()}
     WHERE id IN (?) AND status = 'sending'`,
    { replacements: [at, at, ...pairs('smtpResponse'), ...pairs('toEmail'), marks.map((m) => m.id)] },
  );
}

async function sendOne(opts: Resolved, m: ClaimedMessage, summary: SendSummary, sent: SentMark[]) {
  const { sequelize } = opts;
  try {
    const info = await opts.transport.sendMail({
      from: opts.from,
      to: m.toEmail,
      subject: m.subject,
      text: m.text,
      html: m.html,
      messageId: m.messageId,
      headers: {
        // One-click unsubscribe from the mail client itself (RFC 8058).
        'List-Unsubscribe': `<${m.unsubscribeUrl}>`,
        'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
        'X-Rowpath-Outbox-Id': String(m.id),
      },
    });
    sent.push({ id: m.id, toEmail: m.toEmail, smtpResponse: String((info as { response?: string }).response ?? '').slice(0, 255) });
    summary.sent++;
  } catch (err) {
    const at = opts.now();
    const error = describeMailError(err);
    if (isPermanentMailError(err) || m.attempts >= opts.maxAttempts) {
      await sequelize.query("UPDATE reminder_outbox SET status = 'failed', last_error = ?, updated_at = ? WHERE id = ? AND status = 'sending'", {
        replacements: [`${isPermanentMailError(err) ? 'Refused' : `Gave up after ${m.attempts} attempts`}: ${error}`.slice(0, 1000), at, m.id],
      });
      summary.failed++;
    } else {
      const retryAt = new Date(at.getTime() + backoffDelayMs(m.attempts, opts.backoffBaseMs, opts.backoffMaxMs));
      await sequelize.query("UPDATE reminder_outbox SET status = 'pending', last_error = ?, next_attempt_at = ?, updated_at = ? WHERE id = ? AND status = 'sending'", {
        replacements: [`Attempt ${m.attempts} failed: ${error}`.slice(0, 1000), retryAt, at, m.id],
      });
      summary.retrying++;
    }
  }
}

function resolved(opts: SenderOptions) {
  return {
    ...SENDER_DEFAULTS,
    workerId: newWorkerId(),
    now: () => new Date(),
    log: (line: string, err?: unknown) => console.error(line, err ?? ''),
    ...Object.fromEntries(Object.entries(opts).filter(([, v]) => v !== undefined)),
  } as Resolved;
}

/** Claims one batch and sends it. */
export async function sendOnce(options: SenderOptions): Promise<SendSummary> {
  const opts = resolved(options);
  const summary: SendSummary = { claimed: 0, sent: 0, retrying: 0, failed: 0, cancelled: 0, held: 0 };
  const batch = await claimBatch(opts.sequelize, opts.workerId, { batchSize: opts.batchSize, leaseMs: opts.leaseMs, now: opts.now() });
  summary.claimed = batch.claimed.length;
  summary.cancelled = batch.cancelled;
  summary.held = batch.held;
  const queue = [...batch.claimed];
  const sent: SentMark[] = [];
  const flush = () => markSent(opts.sequelize, sent.splice(0, sent.length), opts.now());
  const workers = Array.from({ length: Math.min(opts.concurrency, queue.length) }, async () => {
    for (let m = queue.shift(); m; m = queue.shift()) {
      await sendOne(opts, m, summary, sent);
      if (sent.length >= MARK_EVERY) await flush();
    }
  });
  await Promise.all(workers);
  await flush();
  return summary;
}

/** Sends batch after batch until nothing is due (or `shouldStop` says so). */
export async function drainOutbox(options: SenderOptions, shouldStop: () => boolean = () => false): Promise<SendSummary> {
  const total: SendSummary = { claimed: 0, sent: 0, retrying: 0, failed: 0, cancelled: 0, held: 0 };
  const opts = { ...options, workerId: options.workerId ?? newWorkerId() };
  while (!shouldStop()) {
    const s = await sendOnce(opts);
    for (const k of Object.keys(total) as (keyof SendSummary)[]) total[k] += s[k];
    if (s.claimed + s.cancelled + s.held === 0) break;
  }
  return total;
}
