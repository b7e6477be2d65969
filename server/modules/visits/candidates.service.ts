// Visits worth planning in a given week: open requests, accounts whose pre-season check-up is
// due, and accounts whose roadmap review is overdue. Three set queries, no per-account loop.
import { Op, QueryTypes, type Sequelize } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import { DEFAULT_DURATION_MIN, type CandidatesQuery, type VisitCandidate } from '../../../shared/schemas/visits.js';
import { accountScope } from '../../auth/access.js';
import { Visit } from '../../db/models/index.js';
import { getSettings } from '../settings/settings.service.js';
import { addDays, fromLocal, timeZoneOf } from './local-time.js';
import { accountScopeSql } from './scope.js';
import { toView, visitIncludes } from './visits.service.js';

/** A roadmap with undecided items for the coming season wants a review at least this often. */
export const REVIEW_INTERVAL_DAYS = 180;
/** Roadmap stages still waiting for the grower's decision. */
const UNDECIDED_STAGES = ['idea', 'proposed', 'quoted'];

/** The planting season a date plans for: from July on, next spring's. */
export function comingSeason(dateIso: string): number {
  const [year, month] = dateIso.split('-').map(Number);
  return month >= 7 ? year + 1 : year;
}

/** Pre-season check-ups count from 1 July before the date (after the last planting season). */
export function checkupSeasonStart(dateIso: string): string {
  const [year, month] = dateIso.split('-').map(Number);
  return `${month >= 7 ? year : year - 1}-07-01`;
}

interface AccountRow {
  id: number;
  name: string;
  town: string | null;
  lat: number | null;
  lng: number | null;
  specialistId: number | null;
  lastDoneAt: Date | string | null;
}

const iso = (v: Date | string | null) => (v === null ? null : new Date(v).toISOString());
const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

/** Staff. The specialist's own candidates by default; a manager or admin may name a specialist or see all. */
export async function listCandidates(sequelize: Sequelize, user: SessionUser, query: CandidatesQuery): Promise<{ weekStart: string; season: number; checkupsSince: string; items: VisitCandidate[] }> {
  const timeZone = timeZoneOf(await getSettings());
  const specialistId = query.specialistId ?? (user.role === 'specialist' ? user.id : undefined);
  const season = comingSeason(query.weekStart);
  const checkupsSince = checkupSeasonStart(query.weekStart);
  const scope = accountScopeSql(user, 'a');
  const replacements = {
    ...scope.replacements,
    specialistId: specialistId ?? null,
    checkupSince: fromLocal(checkupsSince, 0, timeZone),
    reviewSince: fromLocal(addDays(query.weekStart, -REVIEW_INTERVAL_DAYS), 0, timeZone),
    season,
    undecided: UNDECIDED_STAGES,
  };
  const bySpecialist = specialistId ? 'AND a.specialist_id = :specialistId' : '';

  const requested = await Visit.findAll({
    where: {
      status: 'requested',
      ...(specialistId ? { [Op.or]: [{ specialistId }, { specialistId: null, '$account.specialist_id$': specialistId }] } : {}),
    },
    include: visitIncludes(accountScope(user)),
    order: [['id', 'ASC']],
  });

  const checkups = await sequelize.query<AccountRow>(
    `SELECT a.id, a.name, a.town, a.lat, a.lng, a.specialist_id AS specialistId,
            (SELECT MAX(d.starts_at) FROM visits d WHERE d.account_id = a.id AND d.purpose = 'pre-season-checkup' AND d.status = 'done') AS lastDoneAt
       FROM accounts a
      WHERE ${scope.sql} AND a.status = 'active' ${bySpecialist}
        AND NOT EXISTS (SELECT 1 FROM visits v WHERE v.account_id = a.id AND v.purpose = 'pre-season-checkup'
                         AND (v.status IN ('requested', 'planned') OR (v.status = 'done' AND v.starts_at >= :checkupSince)))
      ORDER BY a.name, a.id`,
    { type: QueryTypes.SELECT, replacements },
  );

  const reviews = await sequelize.query<AccountRow>(
    `SELECT a.id, a.name, a.town, a.lat, a.lng, a.specialist_id AS specialistId,
            (SELECT MAX(d.starts_at) FROM visits d WHERE d.account_id = a.id AND d.purpose = 'roadmap-review' AND d.status = 'done') AS lastDoneAt
       FROM accounts a
      WHERE ${scope.sql} AND a.status = 'active' ${bySpecialist}
        AND EXISTS (SELECT 1 FROM roadmap_items r WHERE r.account_id = a.id AND r.season = :season AND r.stage IN (:undecided))
        AND NOT EXISTS (SELECT 1 FROM visits v WHERE v.account_id = a.id AND v.purpose = 'roadmap-review'
                         AND (v.status IN ('requested', 'planned') OR (v.status = 'done' AND v.starts_at >= :reviewSince)))
      ORDER BY a.name, a.id`,
    { type: QueryTypes.SELECT, replacements },
  );

  const items: VisitCandidate[] = [
    ...requested.map((row): VisitCandidate => {
      const v = toView(row);
      return {
        kind: 'requested',
        visitId: v.id,
        version: v.version,
        accountId: v.accountId,
        accountName: v.accountName,
        town: v.town,
        lat: v.lat,
        lng: v.lng,
        specialistId: v.specialistId,
        purpose: v.purpose,
        durationMin: v.durationMin,
        windowStartMin: v.windowStartMin,
        windowEndMin: v.windowEndMin,
        fixed: v.fixed,
        startsAt: v.startsAt,
        reason: v.requestedByContactId ? 'Requested by the grower' : 'Requested, not yet planned',
        lastDoneAt: null,
      };
    }),
    ...checkups.map((a) => fromAccount(a, 'checkup-due', 'pre-season-checkup', a.lastDoneAt ? `No pre-season check-up since ${checkupsSince}` : 'Never had a pre-season check-up')),
    ...reviews.map((a) =>
      fromAccount(a, 'review-overdue', 'roadmap-review', a.lastDoneAt ? `${season} roadmap items undecided; last review over ${REVIEW_INTERVAL_DAYS} days ago` : `${season} roadmap items undecided and never reviewed`),
    ),
  ];
  return { weekStart: query.weekStart, season, checkupsSince, items };
}

function fromAccount(a: AccountRow, kind: VisitCandidate['kind'], purpose: VisitCandidate['purpose'], reason: string): VisitCandidate {
  return {
    kind,
    visitId: null,
    version: null,
    accountId: a.id,
    accountName: a.name,
    town: a.town,
    lat: num(a.lat),
    lng: num(a.lng),
    specialistId: a.specialistId,
    purpose,
    durationMin: DEFAULT_DURATION_MIN[purpose],
    windowStartMin: null,
    windowEndMin: null,
    fixed: false,
    startsAt: null,
    reason,
    lastDoneAt: iso(a.lastDoneAt),
  };
}
