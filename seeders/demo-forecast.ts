// Revenue quotas for the demo dealership's two territories (invented figures), seasons 2027 and
// 2028. Called from the demo seed; safe to call twice (it overwrites the same rows).
import { QueryTypes, type Sequelize } from 'sequelize';

export const DEMO_QUOTAS: { territory: string; season: number; quotaUsd: number }[] = [
  { territory: 'Republican Bend', season: 2027, quotaUsd: 420_000 },
  { territory: 'Republican Bend', season: 2028, quotaUsd: 465_000 },
  { territory: 'Solomon Valley', season: 2027, quotaUsd: 385_000 },
  { territory: 'Solomon Valley', season: 2028, quotaUsd: 410_000 },
];

export async function seedDemoQuotas(sequelize: Sequelize) {
  const territories = await sequelize.query<{ id: number; name: string }>('SELECT id, name FROM territories WHERE name IN (:names)', {
    type: QueryTypes.SELECT,
    replacements: { names: [...new Set(DEMO_QUOTAS.map((q) => q.territory))] },
  });
  const idOf = new Map(territories.map((t) => [t.name, Number(t.id)]));
  for (const q of DEMO_QUOTAS) {
    const territoryId = idOf.get(q.territory);
    if (!territoryId) throw new Error(`Demo territory "${q.territory}" is missing: seed the demo dealership first.`);
    await sequelize.query(
      `INSERT INTO quotas (territory_id, season, quota_usd, updated_by, created_at, updated_at)
       VALUES (:territoryId, :season, :quotaUsd, NULL, UTC_TIMESTAMP(3), UTC_TIMESTAMP(3))
       ON DUPLICATE KEY UPDATE quota_usd = VALUES(quota_usd), updated_at = VALUES(updated_at)`,
      { replacements: { territoryId, season: q.season, quotaUsd: q.quotaUsd.toFixed(2) } },
    );
  }
}
