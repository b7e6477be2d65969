import type { Sequelize } from 'sequelize';

export interface ThrottleLimits {
  maxPerAccount: number;
  maxPerIp: number;
  windowMinutes: number;
}

/** Counts failed sign-ins per account and per IP in MariaDB (shared by every app instance). */
export function loginThrottle(sequelize: Sequelize, limits: ThrottleLimits) {
  const windowSec = Math.round(limits.windowMinutes * 60);
  const keys = (email: string, ip: string) => [
    { key: `acct:${email}`.slice(0, 191), max: limits.maxPerAccount },
    { key: `ip:${ip}`.slice(0, 191), max: limits.maxPerIp },
  ];
  return {
    /** Seconds to wait when either counter is at its limit, else 0. */
    async retryAfterSec(email: string, ip: string): Promise<number> {
      const ks = keys(email, ip);
      const [rows] = await sequelize.query(
        `SELECT \`key\`, count, GREATEST(0, ? - TIMESTAMPDIFF(SECOND, window_started_at, UTC_TIMESTAMP())) AS remaining
           FROM login_failures WHERE \`key\` IN (?, ?)`,
        { replacements: [windowSec, ks[0].key, ks[1].key] },
      );
      let wait = 0;
      for (const row of rows as { key: string; count: number; remaining: number }[]) {
        const limit = ks.find((k) => k.key === row.key)!.max;
        if (row.remaining > 0 && row.count >= limit) wait = Math.max(wait, Number(row.remaining));
      }
      return wait;
    },
    async recordFailure(email: string, ip: string) {
      for (const { key } of keys(email, ip)) {
        // A window that has run out starts again at one failure.
        await sequelize.query(
          `INSERT INTO login_failures (\`key\`, count, window_started_at) VALUES (?, 1, UTC_TIMESTAMP())
           ON DUPLICATE KEY UPDATE
             count = IF(TIMESTAMPDIFF(SECOND, window_started_at, UTC_TIMESTAMP()) >= ?, 1, count + 1),
             window_started_at = IF(TIMESTAMPDIFF(SECOND, window_started_at, UTC_TIMESTAMP()) >= ?, UTC_TIMESTAMP(), window_started_at)`,
          { replacements: [key, windowSec, windowSec] },
        );
      }
    },
    async clearAccount(email: string) {
      await sequelize.query('DELETE FROM login_failures WHERE `key` = ?', { replacements: [`acct:${email}`.slice(0, 191)] });
    },
  };
}
