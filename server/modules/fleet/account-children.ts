// Contacts, farm sites and tractors share one shape: created under an account, changed with the
// version the client loaded, deleted with an audit line. One factory serves all three.
import { Router } from 'express';
import type { Model, ModelStatic, Sequelize } from 'sequelize';
import type { z } from 'zod';
import { idParamSchema } from '../../../shared/schemas/accounts.js';
import { versionField as idVersion } from '../../../shared/schemas/fleet.js';
import { requireAuth } from '../../auth/guards.js';
import { notFound } from '../../http/errors.js';
import { parsed, validate } from '../../http/validate.js';
import { accountFor, assertVersion, audit, diff, mapLockError } from './fleet-access.js';
import { plain } from './plain.js';

interface ChildOptions<S extends z.ZodType> {
  /** URL segment: /api/accounts/:id/<segment> to create, /api/<segment>/:id to change. */
  segment: string;
  entity: string;
  model: ModelStatic<Model & { id: number; accountId: number; version: number }>;
  schema: S;
  numberFields?: string[];
  label: (row: Record<string, unknown>) => string;
}

export function accountChildRouter<S extends z.ZodObject>(sequelize: Sequelize, o: ChildOptions<S>) {
  const router = Router();
  const view = (row: Model) => plain(row, o.numberFields);
  const updateSchema = o.schema.partial().extend({ version: (o.schema.shape as Record<string, z.ZodType>).version ?? idVersion });

  router.post(`/accounts/:id/${o.segment}`, requireAuth, validate('params', idParamSchema), validate('body', o.schema), async (req, res) => {
    const accountId = parsed<{ id: number }>(res, 'params').id;
    const input = parsed<Record<string, unknown>>(res, 'body');
    const row = await sequelize.transaction(async (transaction) => {
      await accountFor(req.user!, accountId, 'edit', transaction);
      const created = await o.model.create({ ...input, accountId } as never, { transaction });
      await audit(transaction, { accountId, userId: req.user!.id, entity: o.entity, entityId: created.id, action: 'create', summary: `Added ${o.entity} ${o.label(input)}` });
      return created;
    });
    res.status(201).json({ [o.entity]: view(row) });
  });

  router.patch(`/${o.segment}/:id`, requireAuth, validate('params', idParamSchema), validate('body', updateSchema), async (req, res) => {
    const { id } = parsed<{ id: number }>(res, 'params');
    const { version, ...input } = parsed<Record<string, unknown> & { version?: number }>(res, 'body');
    const row = await sequelize
      .transaction(async (transaction) => {
        const existing = await o.model.findByPk(id, { transaction });
        if (!existing) throw notFound(`That ${o.entity}`);
        await accountFor(req.user!, existing.accountId, 'edit', transaction);
        assertVersion(existing.version, version);
        const changes = diff(view(existing), input);
        existing.set(input as never);
        await existing.save({ transaction });
        await audit(transaction, { accountId: existing.accountId, userId: req.user!.id, entity: o.entity, entityId: id, action: 'update', summary: `Changed ${o.entity} ${o.label(view(existing))}`, changes });
        return existing;
      })
      .catch(mapLockError);
    res.json({ [o.entity]: view(row) });
  });

  router.delete(`/${o.segment}/:id`, requireAuth, validate('params', idParamSchema), async (req, res) => {
    const { id } = parsed<{ id: number }>(res, 'params');
    await sequelize.transaction(async (transaction) => {
      const existing = await o.model.findByPk(id, { transaction });
      if (!existing) throw notFound(`That ${o.entity}`);
      await accountFor(req.user!, existing.accountId, 'edit', transaction);
      await existing.destroy({ transaction });
      await audit(transaction, { accountId: existing.accountId, userId: req.user!.id, entity: o.entity, entityId: id, action: 'delete', summary: `Removed ${o.entity} ${o.label(view(existing))}` });
    });
    res.status(204).end();
  });
  return router;
}
