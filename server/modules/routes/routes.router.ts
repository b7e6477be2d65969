import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { z } from 'zod';
import type { PlanProgress } from '../../../shared/calc/week-planner.js';
import {
  optimizeRouteSchema,
  weekPlanCommitSchema,
  weekPlanSchema,
  weekRoutesQuerySchema,
  type OptimizeRouteInput,
  type WeekPlanCommitInput,
  type WeekPlanInput,
  type WeekRoutesQuery,
} from '../../../shared/schemas/visits.js';
import { requireRole } from '../../auth/guards.js';
import { AppError } from '../../http/errors.js';
import { parsed, validate } from '../../http/validate.js';
import { optimizeStops } from './optimize.service.js';
import { assignmentsOf, commitAssignments, currentWeekRoutes, prepareWeekPlan, runWeekPlan } from './week-plans.service.js';

const staff = requireRole('admin', 'manager', 'specialist');
const commitQuerySchema = z.object({ commit: z.enum(['true', 'false'], { error: 'commit is true or false' }).optional() });
/** Progress events closer together than this fraction are dropped: the page needs a bar, not a log. */
const PROGRESS_STEP = 0.02;

/** Route optimisation and week plans. Staff only (growers see visits, not plans). */
export function routesRouter(sequelize: Sequelize, log: (msg: string, err?: unknown) => void = () => undefined) {
  const router = Router();

  router.post('/routes/optimize', staff, validate('body', optimizeRouteSchema), async (_req, res) => {
    res.json(await optimizeStops(parsed<OptimizeRouteInput>(res, 'body')));
  });

  // Planning 40 visits takes well under a second, so the plain call answers with the result.
  router.post('/week-plans', staff, validate('query', commitQuerySchema), validate('body', weekPlanSchema), async (req, res) => {
    const prepared = await prepareWeekPlan(req.user!, parsed<WeekPlanInput>(res, 'body'));
    const plan = runWeekPlan(prepared);
    if (parsed<{ commit?: string }>(res, 'query').commit !== 'true') return void res.json(plan);
    const assignments = assignmentsOf(plan);
    const committed = assignments.length ? await commitAssignments(sequelize, req.user!, { specialistId: plan.specialistId, assignments }) : [];
    res.json({ ...plan, committed });
  });

  router.post('/week-plans/commit', staff, validate('body', weekPlanCommitSchema), async (req, res) => {
    res.json({ visits: await commitAssignments(sequelize, req.user!, parsed<WeekPlanCommitInput>(res, 'body')) });
  });

  router.get('/week-plans/current', staff, validate('query', weekRoutesQuerySchema), async (req, res) => {
    res.json(await currentWeekRoutes(req.user!, parsed<WeekRoutesQuery>(res, 'query')));
  });

  // Server-sent events: `progress` events ({ phase, fraction }), then one `result` (the plan) or
  // `error` ({ error: { code, message } }). Input problems answer 400 as JSON before the stream opens.
  router.post('/week-plans/stream', staff, validate('body', weekPlanSchema), async (req, res) => {
    if (!(req.get('accept') ?? '').includes('text/event-stream')) {
      throw new AppError('not_acceptable', 406, 'Send Accept: text/event-stream to follow the plan as it is made, or use POST /api/week-plans for the result alone.');
    }
    const prepared = await prepareWeekPlan(req.user!, parsed<WeekPlanInput>(res, 'body'));
    res.status(200).set({ 'Content-Type': 'text/event-stream; charset=utf-8', 'Cache-Control': 'no-store', 'X-Accel-Buffering': 'no' });
    res.flushHeaders();
    const send = (event: string, data: unknown) => res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
    let last: PlanProgress = { phase: 'placing', fraction: -1 };
    try {
      const plan = runWeekPlan(prepared, (progress) => {
        if (progress.phase === last.phase && progress.fraction - last.fraction < PROGRESS_STEP && progress.phase !== 'done') return;
        last = progress;
        send('progress', { phase: progress.phase, fraction: Math.round(progress.fraction * 1000) / 1000 });
      });
      send('result', plan);
    } catch (err) {
      log(`POST /api/week-plans/stream failed`, err);
      send('error', { error: { code: 'internal', message: 'Something went wrong on our side. It has been logged.' } });
    }
    res.end();
  });

  return router;
}
