import type { Sequelize } from 'sequelize';

export type SecurityEvent =
  | 'sign_in'
  | 'sign_in_failed'
  | 'sign_in_throttled'
  | 'sign_out'
  | 'csrf_refused'
  | 'access_refused'
  | 'session_expired'
  | 'user_disabled';

/** Appends to the security log (UTC timestamps). Never fails the request that triggered it. */
export function securityLogger(sequelize: Sequelize) {
  return (event: SecurityEvent, info: { userId?: number | null; email?: string | null; ip?: string | null; detail?: string }) => {
    sequelize
      .query('INSERT INTO security_events (at, event, user_id, email, ip, detail) VALUES (UTC_TIMESTAMP(3), ?, ?, ?, ?, ?)', {
        replacements: [event, info.userId ?? null, info.email?.slice(0, 191) ?? null, info.ip?.slice(0, 64) ?? null, info.detail?.slice(0, 255) ?? null],
      })
      .catch(() => undefined);
  };
}
export type SecurityLog = ReturnType<typeof securityLogger>;
