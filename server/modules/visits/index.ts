// One mount for the visit-planning feature: visits, route optimisation and week plans, the map
// and the calendar feeds, all under /api.
import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { calendarRouter } from '../calendar/calendar.router.js';
import { mapRouter } from '../map/map.router.js';
import { routesRouter } from '../routes/routes.router.js';
import { visitsRouter } from './visits.router.js';

export function visitPlanningRouter(sequelize: Sequelize, log?: (msg: string, err?: unknown) => void) {
  const router = Router();
  router.use(visitsRouter(sequelize));
  router.use(routesRouter(sequelize, log));
  router.use(mapRouter(sequelize));
  router.use(calendarRouter(sequelize));
  return router;
}
