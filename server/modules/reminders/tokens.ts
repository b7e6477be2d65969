// Signed links in reminder e-mails. A grower follows them without signing in, so the link itself
// is the permission: a payload (what, whom) and an HMAC-SHA256 over it keyed with the session
// secret. Changing one character of either makes the link refuse. Rotating SESSION_SECRET
// invalidates every link already sent.
import { createHmac, timingSafeEqual } from 'node:crypto';

export type TokenPurpose = 'unsubscribe' | 'book';

export interface ReminderTokenPayload {
  purpose: TokenPurpose;
  contactId: number;
  campaignId: number;
  /** A test send's links show their page but change nothing. */
  test?: boolean;
  /** Seconds since 1970; absent means the link does not expire (unsubscribe links never do). */
  expiresAt?: number;
}

const VERSION = 'r1';

function mac(secret: string, body: string): Buffer {
  // The purpose-specific prefix keeps these signatures apart from any other use of the secret.
  return createHmac('sha256', secret).update(`rowpath.reminder-link.${VERSION}.${body}`).digest();
}

export function signReminderToken(secret: string, payload: ReminderTokenPayload): string {
  const compact = { p: payload.purpose === 'unsubscribe' ? 'u' : 'b', c: payload.contactId, k: payload.campaignId, ...(payload.test ? { t: 1 } : {}), ...(payload.expiresAt ? { x: payload.expiresAt } : {}) };
  const body = Buffer.from(JSON.stringify(compact)).toString('base64url');
  return `${VERSION}.${body}.${mac(secret, body).toString('base64url')}`;
}

export type TokenCheck = { ok: true; payload: ReminderTokenPayload } | { ok: false; reason: 'malformed' | 'bad-signature' | 'wrong-purpose' | 'expired' };

/** Checks signature, purpose and expiry; never throws. */
export function verifyReminderToken(secret: string, token: string, purpose: TokenPurpose, nowMs = Date.now()): TokenCheck {
  const parts = token.split('.');
  if (parts.length !== 3 || parts[0] !== VERSION || !/^[A-Za-z0-9_-]+$/.test(parts[1]) || !/^[A-Za-z0-9_-]+$/.test(parts[2])) return { ok: false, reason: 'malformed' };
  const expected = mac(secret, parts[1]);
  const given = Buffer.from(parts[2], 'base64url');
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return { ok: false, reason: 'bad-signature' };
  let raw: { p?: unknown; c?: unknown; k?: unknown; t?: unknown; x?: unknown };
  try {
    raw = JSON.parse(Buffer.from(parts[1], 'base64url').toString('utf8'));
  } catch {
    return { ok: false, reason: 'malformed' };
  }
  if (!Number.isInteger(raw.c) || !Number.isInteger(raw.k) || (raw.p !== 'u' && raw.p !== 'b')) return { ok: false, reason: 'malformed' };
  const payload: ReminderTokenPayload = {
    purpose: raw.p === 'u' ? 'unsubscribe' : 'book',
    contactId: raw.c as number,
    campaignId: raw.k as number,
    ...(raw.t === 1 ? { test: true } : {}),
    ...(typeof raw.x === 'number' ? { expiresAt: raw.x } : {}),
  };
  if (payload.purpose !== purpose) return { ok: false, reason: 'wrong-purpose' };
  if (payload.expiresAt && payload.expiresAt * 1000 < nowMs) return { ok: false, reason: 'expired' };
  return { ok: true, payload };
}
