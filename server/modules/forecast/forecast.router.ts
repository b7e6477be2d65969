import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import {
  forecastExportQuerySchema,
  forecastItemsQuerySchema,
  forecastQuerySchema,
  quotaListQuerySchema,
  quotaSchema,
  shopCapacityQuerySchema,
  shopWeekParamsSchema,
  shopWeekSchema,
  type ForecastExportQuery,
  type ForecastItemsQuery,
  type ForecastQuery,
  type QuotaInput,
  type QuotaListQuery,
  type ShopCapacityQuery,
  type ShopWeekInput,
} from '../../../shared/schemas/forecast.js';
import { requireRole } from '../../auth/guards.js';
import { parsed, validate } from '../../http/validate.js';
import { forecast, forecastCsv, forecastItems } from './forecast.service.js';
import { listQuotas, putQuota } from './quotas.service.js';
import { putShopWeek, shopCapacity } from './shop-capacity.service.js';
import { watchForecastSources } from './forecast-cache.js';

/**
 * Forecast, quotas and shop capacity under /api. Growers are refused everywhere (403). Forecast and
 * shop capacity: admin, manager (their territories), specialist (their own items). Quotas and a
 * week's technician hours: admin and managers.
 */
export function forecastRouter(sequelize: Sequelize) {
  watchForecastSources();
  const router = Router();
  const staff = requireRole('admin', 'manager', 'specialist');
  const managers = requireRole('admin', 'manager');

  router.get('/forecast', staff, validate('query', forecastQuerySchema), async (req, res) => {
    res.json(await forecast(sequelize, req.user!, parsed<ForecastQuery>(res, 'query')));
  });
  router.get('/forecast/items', staff, validate('query', forecastItemsQuerySchema), async (req, res) => {
    res.json(await forecastItems(sequelize, req.user!, parsed<ForecastItemsQuery>(res, 'query')));
  });
  router.get('/forecast/export.csv', staff, validate('query', forecastExportQuerySchema), async (req, res) => {
    const { filename, csv } = await forecastCsv(sequelize, req.user!, parsed<ForecastExportQuery>(res, 'query'));
    res.set('Content-Type', 'text/csv; charset=utf-8').set('Content-Disposition', `attachment; filename="${filename}"`).send(csv);
  });

  router.get('/quotas', managers, validate('query', quotaListQuerySchema), async (req, res) => {
    res.json(await listQuotas(sequelize, req.user!, parsed<QuotaListQuery>(res, 'query').season));
  });
  router.put('/quotas', managers, validate('body', quotaSchema), async (req, res) => {
    res.json({ quota: await putQuota(sequelize, req.user!, parsed<QuotaInput>(res, 'body')) });
  });

  router.get('/shop-capacity', staff, validate('query', shopCapacityQuerySchema), async (req, res) => {
    res.json(await shopCapacity(sequelize, req.user!, parsed<ShopCapacityQuery>(res, 'query')));
  });
  router.put('/shop-capacity/weeks/:weekStart', managers, validate('params', shopWeekParamsSchema), validate('body', shopWeekSchema), async (req, res) => {
    const { weekStart } = parsed<{ weekStart: string }>(res, 'params');
    res.json({ week: await putShopWeek(sequelize, req.user!, weekStart, parsed<ShopWeekInput>(res, 'body').technicianHours) });
  });
  return router;
}
