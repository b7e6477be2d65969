import { Router } from 'express';
import type { Sequelize } from 'sequelize';

/** Liveness with the database's state; open to everyone, mounted before sessions so it never needs one. */
export function healthRouter(sequelize: Sequelize) {
  const router = Router();
  router.get('/', async (_req, res) => {
    try {
      await sequelize.query('SELECT 1');
      res.set('Cache-Control', 'no-store').json({ status: 'ok', db: 'up' });
    } catch {
      res.status(503).set('Retry-After', '5').json({ status: 'unavailable', db: 'down' });
    }
  });
  return router;
}
