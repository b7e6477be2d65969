// Revenue quotas per territory and season, with attainment to date. Callers: admin (every
// territory) and managers (their own territories); anyone else is refused with 403.
import type { Sequelize } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { QuotaInput, QuotaRow } from '../../../shared/schemas/forecast.js';
import { AppError, forbidden, notFound } from '../../http/errors.js';
import { quotasForSeason, territoryExists, upsertQuota } from './forecast.repository.js';
import { cents, groupFigures } from './forecast.service.js';

function quotaTerritories(user: SessionUser): number[] | null {
  if (user.role === 'admin') return null;
  if (user.role === 'manager') return [...user.territoryIds];
  throw forbidden();
}

/** A share of the quota, to 4 decimals (0.4213 = 42.13 %); null when there is no quota above zero. */
const share = (usd: number, quotaUsd: number | null) => (quotaUsd && quotaUsd > 0 ? Math.round((usd / quotaUsd) * 10_000) / 10_000 : null);

/**
 * Attainment to date = actual (installed items of the season) ÷ quota; weighted attainment =
 * weighted revenue (every open stage × its probability, installed at its probability) ÷ quota.
 */
async function quotaRows(sequelize: Sequelize, season: number, territoryIds: number[] | null): Promise<QuotaRow[]> {
  const stored = await quotasForSeason(sequelize, season, territoryIds);
  if (!stored.length) return [];
  const figures = await groupFigures(sequelize, 'territory', { territoryIds: stored.map((s) => s.territoryId), specialistId: null }, { season });
  const byTerritory = new Map(figures.map((f) => [Number(f.key), f]));
  return stored.map((s) => {
    const f = byTerritory.get(s.territoryId);
    const actualUsd = cents(f?.actualUsd ?? 0);
    const weightedUsd = cents(f?.weightedUsd ?? 0);
    return {
      territoryId: s.territoryId,
      territoryName: s.territoryName,
      season,
      quotaUsd: s.quotaUsd,
      pipelineUsd: cents(f?.pipelineUsd ?? 0),
      weightedUsd,
      actualUsd,
      itemCount: f?.itemCount ?? 0,
      attainment: share(actualUsd, s.quotaUsd),
      weightedAttainment: share(weightedUsd, s.quotaUsd),
      updatedAt: s.updatedAt,
    };
  });
}

/** GET /api/quotas?season — every territory in scope, with or without a quota. */
export async function listQuotas(sequelize: Sequelize, user: SessionUser, season: number) {
  const territories = await quotaRows(sequelize, season, quotaTerritories(user));
  const sum = (pick: (r: QuotaRow) => number | null) => cents(territories.reduce((n, r) => n + (pick(r) ?? 0), 0));
  const quotaUsd = sum((r) => r.quotaUsd);
  const actualUsd = sum((r) => r.actualUsd);
  const weightedUsd = sum((r) => r.weightedUsd);
  return {
    season,
    territories,
    totals: {
      quotaUsd,
      pipelineUsd: sum((r) => r.pipelineUsd),
      weightedUsd,
      actualUsd,
      itemCount: territories.reduce((n, r) => n + r.itemCount, 0),
      attainment: share(actualUsd, quotaUsd),
      weightedAttainment: share(weightedUsd, quotaUsd),
    },
  };
}

/** PUT /api/quotas — sets one territory's quota for a season (admin, or a manager of that territory). */
export async function putQuota(sequelize: Sequelize, user: SessionUser, input: QuotaInput): Promise<QuotaRow> {
  if (user.role !== 'admin' && user.role !== 'manager') throw forbidden();
  if (!(await territoryExists(sequelize, input.territoryId))) throw notFound('That territory');
  if (user.role === 'manager' && !user.territoryIds.includes(input.territoryId)) {
    throw new AppError('forbidden', 403, 'You can set quotas for your own territories only.');
  }
  await upsertQuota(sequelize, { ...input, userId: user.id });
  const [row] = await quotaRows(sequelize, input.season, [input.territoryId]);
  return row;
}
