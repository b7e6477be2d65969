// The season calendar: planting-window start per region and crop. Published defaults come from
// shared/calc/season-calendar.ts with their source; the dealership may set its own dates, which
// are stored in season_windows and win over the default until reset.
import type { Transaction } from 'sequelize';
import { defaultPlantingWindow, PLANTING_WINDOW_DEFAULTS, windowStartIso } from '../../../shared/calc/season-calendar.js';
import type { Crop } from '../../../shared/schemas/accounts.js';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { SeasonWindowInput } from '../../../shared/schemas/reminders.js';
import { SeasonWindow } from '../../db/models/index.js';
import { validationError } from '../../http/errors.js';

export interface CalendarEntry {
  regionKey: string;
  regionLabel: string;
  crop: string;
  windowStart: string;
  windowEnd: string;
  source: string | null;
  sourceText: string | null;
  /** true when the published default is in use (no dealership override). */
  isDefault: boolean;
  /** The published default for this region and crop, when there is one. */
  published: { windowStart: string; windowEnd: string; source: string; sourceText: string } | null;
  /** With ?season=: the window's first and last day that season. */
  windowStartDate?: string;
  windowEndDate?: string;
  updatedAt: string | null;
}

function published(regionKey: string, crop: string) {
  const d = defaultPlantingWindow(regionKey, crop as Crop);
  return d ? { windowStart: d.windowStart, windowEnd: d.windowEnd, source: d.source, sourceText: d.sourceText } : null;
}

/** Defaults merged with the dealership's overrides, sorted by region then crop. Staff may read it. */
export async function getCalendar(season?: number, transaction?: Transaction): Promise<CalendarEntry[]> {
  const stored = await SeasonWindow.findAll({ transaction });
  const byKey = new Map<string, CalendarEntry>();
  for (const d of PLANTING_WINDOW_DEFAULTS) {
    byKey.set(`${d.regionKey}|${d.crop}`, {
      regionKey: d.regionKey,
      regionLabel: d.regionLabel,
      crop: d.crop,
      windowStart: d.windowStart,
      windowEnd: d.windowEnd,
      source: d.source,
      sourceText: d.sourceText,
      isDefault: true,
      published: published(d.regionKey, d.crop),
      updatedAt: null,
    });
  }
  for (const s of stored) {
    byKey.set(`${s.regionKey}|${s.crop}`, {
      regionKey: s.regionKey,
      regionLabel: s.regionLabel,
      crop: s.crop,
      windowStart: s.windowStart,
      windowEnd: s.windowEnd,
      source: s.source,
      sourceText: s.sourceText,
      isDefault: false,
      published: published(s.regionKey, s.crop),
      updatedAt: s.updatedAt.toISOString(),
    });
  }
  const entries = [...byKey.values()].sort((a, b) => a.regionKey.localeCompare(b.regionKey) || a.crop.localeCompare(b.crop));
  if (season) for (const e of entries) Object.assign(e, { windowStartDate: windowStartIso(season, e.windowStart), windowEndDate: windowStartIso(season, e.windowEnd) });
  return entries;
}

/** The window in force for a region and crop, or null when the calendar has none. */
export async function resolveWindow(regionKey: string, crop: string, transaction?: Transaction): Promise<CalendarEntry | null> {
  const entries = await getCalendar(undefined, transaction);
  return entries.find((e) => e.regionKey === regionKey && e.crop === crop) ?? null;
}

/** Sets or resets entries; admin and manager only (checked by the router). Returns the whole calendar. */
export async function putCalendar(user: SessionUser, entries: SeasonWindowInput[], season?: number): Promise<CalendarEntry[]> {
  const sequelize = SeasonWindow.sequelize!;
  await sequelize.transaction(async (transaction) => {
    for (const [i, e] of entries.entries()) {
      const def = defaultPlantingWindow(e.regionKey, e.crop);
      if (e.reset) {
        await SeasonWindow.destroy({ where: { regionKey: e.regionKey, crop: e.crop }, transaction });
        continue;
      }
      const existing = await SeasonWindow.findOne({ where: { regionKey: e.regionKey, crop: e.crop }, transaction, lock: transaction.LOCK.UPDATE });
      const regionLabel = e.regionLabel ?? existing?.regionLabel ?? def?.regionLabel ?? PLANTING_WINDOW_DEFAULTS.find((d) => d.regionKey === e.regionKey)?.regionLabel;
      if (!regionLabel) throw validationError({ [`entries.${i}.regionLabel`]: 'Name the new region (e.g. South-central Nebraska)' });
      // The dealership's own dates carry its own note; the published source stays visible beside them.
      const fields = {
        regionLabel,
        windowStart: e.windowStart!,
        windowEnd: e.windowEnd!,
        source: e.source ?? `Set by ${user.name}`,
        sourceText: e.sourceText ?? null,
        updatedBy: user.id,
      };
      if (existing) await existing.update(fields, { transaction });
      else await SeasonWindow.create({ regionKey: e.regionKey, crop: e.crop, ...fields }, { transaction });
    }
  });
  return getCalendar(season);
}
