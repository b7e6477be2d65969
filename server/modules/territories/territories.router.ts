import { Router } from 'express';
import { Op } from 'sequelize';
import { requireRole } from '../../auth/guards.js';
import { Account, Territory } from '../../db/models/index.js';
import { fn, col } from 'sequelize';

/** Territories with their account counts: admin sees all, managers and specialists their own. */
export function territoriesRouter() {
  const router = Router();
  router.get('/', requireRole('admin', 'manager', 'specialist'), async (req, res) => {
    const user = req.user!;
    const where = user.role === 'admin' ? {} : { id: { [Op.in]: user.territoryIds.length ? user.territoryIds : [-1] } };
    const [territories, counts] = await Promise.all([
      Territory.findAll({ where, order: [['name', 'ASC']], raw: true }),
      Account.findAll({ attributes: ['territoryId', [fn('COUNT', col('id')), 'n']], group: ['territoryId'], raw: true }) as unknown as Promise<
        { territoryId: number; n: number }[]
      >,
    ]);
    const byTerritory = new Map(counts.map((c) => [c.territoryId, Number(c.n)]));
    res.json({ items: territories.map((t) => ({ id: t.id, name: t.name, region: t.region, accountCount: byTerritory.get(t.id) ?? 0 })) });
  });
  return router;
}
