import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamSchema } from '../../../shared/schemas/accounts.js';
import {
  budgetSchema,
  evaluateMovesSchema,
  goalSchema,
  planRequestSchema,
  quoteCreateSchema,
  replacementSchema,
  roadmapItemPatchSchema,
  rulesPutSchema,
  versionCreateSchema,
  type BudgetInput,
  type GoalInput,
  type ReplacementInput,
  type RoadmapItemPatch,
  type RuleInput,
} from '../../../shared/schemas/roadmap.js';
import { requireAuth, requireRole } from '../../auth/guards.js';
import { parsed, validate } from '../../http/validate.js';
import { z } from 'zod';
import { createGoal, createReplacement, deleteGoal, deleteReplacement, listGoals, putBudget, updateGoal } from './roadmap-inputs.service.js';
import { createQuote, decideQuote, getQuote, listQuotes, quotePdf } from './quotes.service.js';
import { evaluateMoves, getRoadmap, getVersion, listVersions, patchItem, replan, saveVersion } from './roadmap.service.js';
import { listRules, replaceRules } from './rules.service.js';

type Id = { id: number };
const goalPatchSchema = goalSchema.partial().extend({ version: z.number({ error: 'The record version is missing: reload and try again' }).int().min(0) });

/** Goals, roadmaps, versions, quotes and catalog rules. Reading follows the account's scope; changes need staff. */
export function roadmapRouter(sequelize: Sequelize) {
  const r = Router();
  const id = validate('params', idParamSchema);
  r.get('/accounts/:id/roadmap', requireAuth, id, async (req, res) => res.json(await getRoadmap(req.user!, parsed<Id>(res, 'params').id)));
  r.post('/accounts/:id/roadmap/plan', requireAuth, id, validate('body', planRequestSchema), async (req, res) =>
    res.json(await replan(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<{ horizonSeasons: number }>(res, 'body').horizonSeasons)),
  );
  r.post('/accounts/:id/roadmap/evaluate', requireAuth, id, validate('body', evaluateMovesSchema), async (req, res) =>
    res.json(await evaluateMoves(req.user!, parsed<Id>(res, 'params').id, parsed<{ moves: { itemId: number; season: number }[] }>(res, 'body').moves)),
  );
  r.patch('/roadmap-items/:id', requireAuth, id, validate('body', roadmapItemPatchSchema), async (req, res) =>
    res.json(await patchItem(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<RoadmapItemPatch>(res, 'body'))),
  );

  r.get('/accounts/:id/goals', requireAuth, id, async (req, res) => res.json({ items: await listGoals(req.user!, parsed<Id>(res, 'params').id) }));
  r.post('/accounts/:id/goals', requireAuth, id, validate('body', goalSchema), async (req, res) =>
    res.status(201).json({ goal: await createGoal(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<GoalInput>(res, 'body')) }),
  );
  r.patch('/goals/:id', requireAuth, id, validate('body', goalPatchSchema), async (req, res) =>
    res.json({ goal: await updateGoal(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<Partial<GoalInput> & { version: number }>(res, 'body')) }),
  );
  r.delete('/goals/:id', requireAuth, id, async (req, res) => {
    await deleteGoal(sequelize, req.user!, parsed<Id>(res, 'params').id);
    res.status(204).end();
  });
  r.put('/accounts/:id/budgets', requireAuth, id, validate('body', budgetSchema), async (req, res) =>
    res.json({ budget: await putBudget(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<BudgetInput>(res, 'body')) }),
  );
  r.post('/accounts/:id/replacements', requireAuth, id, validate('body', replacementSchema), async (req, res) =>
    res.status(201).json({ replacement: await createReplacement(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<ReplacementInput>(res, 'body')) }),
  );
  r.delete('/replacements/:id', requireAuth, id, async (req, res) => {
    await deleteReplacement(sequelize, req.user!, parsed<Id>(res, 'params').id);
    res.status(204).end();
  });

  r.get('/accounts/:id/roadmap/versions', requireAuth, id, async (req, res) => res.json({ items: await listVersions(req.user!, parsed<Id>(res, 'params').id) }));
  r.post('/accounts/:id/roadmap/versions', requireAuth, id, validate('body', versionCreateSchema), async (req, res) =>
    res.status(201).json({ version: await saveVersion(req.user!, parsed<Id>(res, 'params').id, parsed<{ name: string }>(res, 'body').name) }),
  );
  r.get('/roadmap-versions/:id', requireAuth, id, async (req, res) => res.json({ version: await getVersion(req.user!, parsed<Id>(res, 'params').id) }));

  r.get('/accounts/:id/quotes', requireAuth, id, async (req, res) => res.json({ items: await listQuotes(req.user!, parsed<Id>(res, 'params').id) }));
  r.post('/accounts/:id/quotes', requireAuth, id, validate('body', quoteCreateSchema), async (req, res) =>
    res.status(201).json({ quote: await createQuote(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<{ season: number }>(res, 'body').season) }),
  );
  r.get('/quotes/:id', requireAuth, id, async (req, res) => res.json({ quote: await getQuote(req.user!, parsed<Id>(res, 'params').id) }));
  r.get('/quotes/:id/pdf', requireAuth, id, async (req, res) => {
    const quoteId = parsed<Id>(res, 'params').id;
    const pdf = await quotePdf(req.user!, quoteId);
    res.set({ 'Content-Type': 'application/pdf', 'Content-Disposition': `attachment; filename="rowpath-quote-${quoteId}.pdf"` }).send(pdf);
  });
  r.post('/quotes/:id/accept', requireAuth, id, async (req, res) => res.json({ quote: await decideQuote(sequelize, req.user!, parsed<Id>(res, 'params').id, 'accepted') }));
  r.post('/quotes/:id/decline', requireAuth, id, async (req, res) => res.json({ quote: await decideQuote(sequelize, req.user!, parsed<Id>(res, 'params').id, 'declined') }));

  r.get('/component-rules', requireRole('admin', 'manager', 'specialist'), async (_req, res) => res.json({ items: await listRules() }));
  r.put('/component-rules', requireRole('admin', 'manager'), validate('body', rulesPutSchema), async (req, res) =>
    res.json(await replaceRules(sequelize, req.user!.id, parsed<{ rules: RuleInput[] }>(res, 'body').rules)),
  );
  return r;
}
