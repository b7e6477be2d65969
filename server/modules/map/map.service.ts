// Territory map markers: one row per account in scope with its visit and roadmap figures, in a
// single grouped query (no query per account).
import { QueryTypes, type Sequelize } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { MapMarker, MapQuery } from '../../../shared/schemas/visits.js';
import { getSettings } from '../settings/settings.service.js';
import { comingSeason } from '../visits/candidates.service.js';
import { timeZoneOf, toLocal } from '../visits/local-time.js';
import { accountScopeSql } from '../visits/scope.js';

/** Rowpath's marker scheme (days since the last done visit). */
export const OVERDUE_AFTER_DAYS = 365;
export const DUE_SOON_AFTER_DAYS = 180;

interface MarkerRow {
  id: number;
  name: string;
  lat: number;
  lng: number;
  town: string | null;
  status: MapMarker['status'];
  territoryId: number;
  specialistId: number | null;
  daysSinceLastVisit: number | null;
  openRequests: number | null;
  nextVisitAt: Date | string | null;
  roadmapDueUsd: number | null;
}

export function visitStateOf(m: { openRequests: number; daysSinceLastVisit: number | null }): MapMarker['visitState'] {
  if (m.openRequests > 0) return 'request';
  if (m.daysSinceLastVisit === null || m.daysSinceLastVisit > OVERDUE_AFTER_DAYS) return 'overdue';
  if (m.daysSinceLastVisit > DUE_SOON_AFTER_DAYS) return 'due-soon';
  return 'ok';
}

/** Anyone signed in: markers for the accounts they may see that have a location. */
export async function mapAccounts(sequelize: Sequelize, user: SessionUser, query: MapQuery, now = new Date()) {
  const timeZone = timeZoneOf(await getSettings());
  const season = query.season ?? comingSeason(toLocal(now, timeZone).date);
  const scope = accountScopeSql(user, 'a');
  const filters = [scope.sql];
  if (query.territoryId) filters.push('a.territory_id = :territoryId');
  if (query.specialistId) filters.push('a.specialist_id = :specialistId');
  const replacements = { ...scope.replacements, season, now, territoryId: query.territoryId ?? null, specialistId: query.specialistId ?? null };

  // Roadmap value is summed in its own derived table: joined row by row with visits it would be
  // counted once per visit.
  const rows = await sequelize.query<MarkerRow>(
    `SELECT a.id, a.name, a.lat, a.lng, a.town, a.status, a.territory_id AS territoryId, a.specialist_id AS specialistId,
            DATEDIFF(:now, MAX(CASE WHEN v.status = 'done' THEN v.starts_at END)) AS daysSinceLastVisit,
            SUM(CASE WHEN v.status = 'requested' THEN 1 ELSE 0 END) AS openRequests,
            MIN(CASE WHEN v.status = 'planned' AND v.starts_at >= :now THEN v.starts_at END) AS nextVisitAt,
            MAX(r.due_usd) AS roadmapDueUsd
       FROM accounts a
       LEFT JOIN visits v ON v.account_id = a.id
       LEFT JOIN (SELECT account_id, SUM(parts_usd + labour_usd) AS due_usd
                    FROM roadmap_items WHERE season = :season AND stage <> 'declined'
                   GROUP BY account_id) r ON r.account_id = a.id
      WHERE a.lat IS NOT NULL AND a.lng IS NOT NULL AND ${filters.join(' AND ')}
      GROUP BY a.id
      ORDER BY a.name, a.id`,
    { type: QueryTypes.SELECT, replacements },
  );
  const [{ missing }] = await sequelize.query<{ missing: number }>(
    `SELECT COUNT(*) AS missing FROM accounts a WHERE (a.lat IS NULL OR a.lng IS NULL) AND ${filters.join(' AND ')}`,
    { type: QueryTypes.SELECT, replacements },
  );

  const items: MapMarker[] = rows.map((r) => {
    const openRequests = Number(r.openRequests ?? 0);
    const daysSinceLastVisit = r.daysSinceLastVisit === null ? null : Number(r.daysSinceLastVisit);
    return {
      id: r.id,
      name: r.name,
      lat: Number(r.lat),
      lng: Number(r.lng),
      town: r.town,
      status: r.status,
      territoryId: r.territoryId,
      specialistId: r.specialistId,
      daysSinceLastVisit,
      roadmapDueThisSeasonUsd: Math.round(Number(r.roadmapDueUsd ?? 0) * 100) / 100,
      openRequests,
      nextVisitAt: r.nextVisitAt ? new Date(r.nextVisitAt).toISOString() : null,
      visitState: visitStateOf({ openRequests, daysSinceLastVisit }),
    };
  });
  return { season, items, withoutLocation: Number(missing) };
}
