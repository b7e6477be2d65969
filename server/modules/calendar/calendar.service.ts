// iCalendar feeds of visits, one secret URL per user. A specialist's feed holds the visits
// assigned to them; a grower's only their own account's; a manager's their territories'; an
// admin's all. The token is the only credential a calendar program can carry, so it is long and
// random, and rotating it cuts off every copy of the old URL at once.
import { randomBytes } from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';
import { ROWPATH_PRODID, writeCalendar, type IcalEvent } from '../../../shared/calc/ical.js';
import type { Role } from '../../../shared/schemas/auth.js';
import { VISIT_PURPOSE_LABELS, type VisitPurpose, type VisitStatus } from '../../../shared/schemas/visits.js';

const TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;
/** The feed covers half a year back and a bit over a year ahead: enough for any calendar view. */
const FEED_PAST_DAYS = 183;
const FEED_FUTURE_DAYS = 400;
const FEED_MAX_EVENTS = 5000;
export const FEED_REFRESH_MIN = 60;

const newToken = () => randomBytes(32).toString('base64url');

export type FeedScope = 'specialist' | 'grower' | 'territories' | 'all';
export const feedScopeOf = (role: Role): FeedScope => (role === 'specialist' ? 'specialist' : role === 'grower' ? 'grower' : role === 'manager' ? 'territories' : 'all');

/** The user's token, made on first use. Two first calls at once still end with one token. */
export async function calendarToken(sequelize: Sequelize, userId: number): Promise<{ token: string; createdAt: Date }> {
  const now = new Date();
  await sequelize.query('INSERT IGNORE INTO calendar_tokens (user_id, token, created_at, updated_at) VALUES (?, ?, ?, ?)', { replacements: [userId, newToken(), now, now] });
  const [row] = await sequelize.query<{ token: string; createdAt: Date }>('SELECT token, created_at AS createdAt FROM calendar_tokens WHERE user_id = ?', {
    type: QueryTypes.SELECT,
    replacements: [userId],
  });
  return { token: row.token, createdAt: new Date(row.createdAt) };
}

/** A fresh token; the old URL stops working at once. */
export async function rotateCalendarToken(sequelize: Sequelize, userId: number): Promise<{ token: string; createdAt: Date }> {
  const now = new Date();
  const token = newToken();
  await sequelize.query(
    'INSERT INTO calendar_tokens (user_id, token, created_at, updated_at) VALUES (?, ?, ?, ?) ON DUPLICATE KEY UPDATE token = VALUES(token), created_at = VALUES(created_at), updated_at = VALUES(updated_at), last_used_at = NULL',
    { replacements: [userId, token, now, now] },
  );
  return { token, createdAt: now };
}

interface FeedOwner {
  userId: number;
  name: string;
  role: Role;
  accountId: number | null;
  accountName: string | null;
}

interface FeedRow {
  id: number;
  purpose: VisitPurpose;
  status: VisitStatus;
  startsAt: Date | string;
  durationMin: number;
  notes: string | null;
  checklist: unknown;
  version: number;
  updatedAt: Date | string;
  accountName: string;
  address: string | null;
  town: string | null;
  state: string | null;
  lat: number | null;
  lng: number | null;
  specialistName: string | null;
  planterName: string | null;
}

const STATUS: Record<VisitStatus, IcalEvent['status']> = { requested: 'TENTATIVE', planned: 'CONFIRMED', done: 'CONFIRMED', cancelled: 'CANCELLED' };
const STATUS_WORD: Record<VisitStatus, string> = { requested: 'requested (time not confirmed)', planned: 'planned', done: 'done', cancelled: 'cancelled' };

function checklistOf(value: unknown): { label: string; done: boolean }[] {
  const list = typeof value === 'string' ? safeJson(value) : value;
  return Array.isArray(list) ? list.filter((i) => i && typeof i.label === 'string') : [];
}
function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return null;
  }
}

/**
 * The feed for a token, or null when the token is unknown or its user is disabled. Growers get
 * no internal notes: a feed URL is shared more loosely than a signed-in session.
 */
export async function calendarFeed(sequelize: Sequelize, token: string, uidDomain: string, now = new Date()): Promise<string | null> {
  if (!TOKEN_PATTERN.test(token)) return null;
  const [owner] = await sequelize.query<FeedOwner>(
    `SELECT u.id AS userId, u.name, u.role, u.account_id AS accountId, acc.name AS accountName
       FROM calendar_tokens t JOIN users u ON u.id = t.user_id LEFT JOIN accounts acc ON acc.id = u.account_id
      WHERE t.token = ? AND u.disabled = 0`,
    { type: QueryTypes.SELECT, replacements: [token] },
  );
  if (!owner) return null;

  let who = '1 = 0';
  const replacements: Record<string, unknown> = {
    from: new Date(now.getTime() - FEED_PAST_DAYS * 86_400_000),
    to: new Date(now.getTime() + FEED_FUTURE_DAYS * 86_400_000),
    limit: FEED_MAX_EVENTS,
  };
  if (owner.role === 'specialist') {
    who = 'v.specialist_id = :userId';
    replacements.userId = owner.userId;
  } else if (owner.role === 'grower') {
    who = 'v.account_id = :accountId';
    replacements.accountId = owner.accountId ?? -1;
  } else if (owner.role === 'manager') {
    who = 'a.territory_id IN (SELECT ut.territory_id FROM user_territories ut WHERE ut.user_id = :userId)';
    replacements.userId = owner.userId;
  } else if (owner.role === 'admin') who = '1 = 1';

  const rows = await sequelize.query<FeedRow>(
    `SELECT v.id, v.purpose, v.status, v.starts_at AS startsAt, v.duration_min AS durationMin, v.notes, v.checklist, v.version, v.updated_at AS updatedAt,
            a.name AS accountName, a.address, a.town, a.state, a.lat, a.lng, s.name AS specialistName, p.name AS planterName
       FROM visits v
       JOIN accounts a ON a.id = v.account_id
       LEFT JOIN users s ON s.id = v.specialist_id
       LEFT JOIN planters p ON p.id = v.planter_id
      WHERE v.starts_at IS NOT NULL AND v.starts_at >= :from AND v.starts_at < :to AND ${who}
      ORDER BY v.starts_at, v.id
      LIMIT :limit`,
    { type: QueryTypes.SELECT, replacements },
  );
  await sequelize.query('UPDATE calendar_tokens SET last_used_at = ? WHERE token = ?', { replacements: [now, token] });

  const grower = owner.role === 'grower';
  const events: IcalEvent[] = rows.map((r) => {
    const start = new Date(r.startsAt);
    const label = VISIT_PURPOSE_LABELS[r.purpose] ?? r.purpose;
    const checklist = checklistOf(r.checklist);
    const lines = grower
      ? [`Specialist: ${r.specialistName ?? 'to be assigned'}`]
      : [`Account: ${r.accountName}`, ...(r.specialistName ? [`Specialist: ${r.specialistName}`] : [])];
    if (r.planterName) lines.push(`Planter: ${r.planterName}`);
    lines.push(`Status: ${STATUS_WORD[r.status]}`);
    if (checklist.length) lines.push(`Checklist: ${checklist.map((i) => `${i.done ? '[x]' : '[ ]'} ${i.label}`).join('; ')}`);
    if (!grower && r.notes) lines.push(`Notes: ${r.notes}`);
    return {
      uid: `visit-${r.id}@${uidDomain}`,
      stamp: now,
      start,
      end: new Date(start.getTime() + Math.max(1, r.durationMin) * 60_000),
      summary: grower ? `${label} with ${r.specialistName ?? 'your specialist'}` : `${label}: ${r.accountName}`,
      description: lines.join('\n'),
      location: [r.address, r.town, r.state].filter(Boolean).join(', ') || undefined,
      geo: r.lat !== null && r.lng !== null ? { lat: Number(r.lat), lng: Number(r.lng) } : undefined,
      status: STATUS[r.status],
      sequence: r.version,
      lastModified: new Date(r.updatedAt),
      categories: [label],
    };
  });
  return writeCalendar({
    prodId: ROWPATH_PRODID,
    name: `Rowpath visits: ${grower ? (owner.accountName ?? owner.name) : owner.name}`,
    refreshIntervalMin: FEED_REFRESH_MIN,
    events,
  });
}
