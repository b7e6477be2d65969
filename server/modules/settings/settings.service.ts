import { Setting } from '../../db/models/index.js';

/**
 * Dealership-wide settings with their defaults. Stage probabilities and the shop rate are the
 * demo dealership's own choices (common practice ranges), for an admin to change.
 */
export const SETTING_DEFAULTS = {
  shopRateUsdPerHour: 125,
  stageProbabilities: { idea: 0.1, proposed: 0.25, quoted: 0.5, accepted: 0.9, ordered: 0.95, installed: 1, declined: 0 },
  valuation: 'straight-line' as 'straight-line' | 'remaining-value',
  circuityFactor: 1.2,
  avgSpeedKmh: 80,
  dayStartMin: 7 * 60,
  dayEndMin: 18 * 60,
  technicianHoursPerWeek: 80,
  quoteValidityDays: 30,
};
export type Settings = typeof SETTING_DEFAULTS;

export async function getSettings(): Promise<Settings> {
  const rows = await Setting.findAll({ raw: true });
  const stored = Object.fromEntries(rows.map((r) => [r.key, r.value]));
  return { ...SETTING_DEFAULTS, ...stored } as Settings;
}

export async function putSetting<K extends keyof Settings>(key: K, value: Settings[K]) {
  await Setting.upsert({ key, value });
}
