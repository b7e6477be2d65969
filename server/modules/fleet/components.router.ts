import { Router } from 'express';
import { Op, type Order, type Sequelize, type WhereOptions } from 'sequelize';
import { idParamSchema } from '../../../shared/schemas/accounts.js';
import { componentListQuerySchema, componentSchema, versionField, type ComponentInput, type ComponentListQuery } from '../../../shared/schemas/fleet.js';
import { requireRole } from '../../auth/guards.js';
import { Component, Install } from '../../db/models/index.js';
import { AppError, notFound } from '../../http/errors.js';
import { parsed, validate } from '../../http/validate.js';
import { assertVersion, audit, mapLockError } from './fleet-access.js';
import { plain } from './plain.js';
import { COMPONENT_NUMBERS } from './planters.service.js';
import { likeContains } from '../../db/like.js';

const updateSchema = componentSchema.partial().extend({ version: versionField });

/** The component catalog: staff read it; admins and managers change it. */
export function componentsRouter(sequelize: Sequelize) {
  const router = Router();
  router.get('/', requireRole('admin', 'manager', 'specialist'), validate('query', componentListQuerySchema), async (_req, res) => {
    const q = parsed<ComponentListQuery>(res, 'query');
    const where: WhereOptions[] = [];
    if (q.category) where.push({ category: q.category });
    if (q.active) where.push({ active: q.active === 'true' });
    if (q.q) {
      const like = likeContains(q.q);
      where.push({ [Op.or]: [{ name: { [Op.like]: like } }, { partNumber: { [Op.like]: like } }, { maker: { [Op.like]: like } }] });
    }
    const desc = q.sort.startsWith('-');
    const order: Order = [[q.sort.replace(/^-/, ''), desc ? 'DESC' : 'ASC'], ['name', 'ASC']];
    const { rows, count } = await Component.findAndCountAll({ where: { [Op.and]: where }, order, limit: q.pageSize, offset: (q.page - 1) * q.pageSize });
    res.json({ items: rows.map((c) => plain(c, COMPONENT_NUMBERS)), total: count });
  });

  router.get('/:id', requireRole('admin', 'manager', 'specialist'), validate('params', idParamSchema), async (_req, res) => {
    const c = await Component.findByPk(parsed<{ id: number }>(res, 'params').id);
    if (!c) throw notFound('That component');
    res.json({ component: plain(c, COMPONENT_NUMBERS) });
  });

  router.post('/', requireRole('admin', 'manager'), validate('body', componentSchema), async (req, res) => {
    const input = parsed<ComponentInput>(res, 'body');
    const c = await sequelize.transaction(async (transaction) => {
      const created = await Component.create(input, { transaction });
      await audit(transaction, { accountId: null, userId: req.user!.id, entity: 'component', entityId: created.id, action: 'create', summary: `Added ${input.partNumber} ${input.name} to the catalog` });
      return created;
    });
    res.status(201).json({ component: plain(c, COMPONENT_NUMBERS) });
  });

  router.patch('/:id', requireRole('admin', 'manager'), validate('params', idParamSchema), validate('body', updateSchema), async (req, res) => {
    const { id } = parsed<{ id: number }>(res, 'params');
    const { version, ...input } = parsed<Partial<ComponentInput> & { version: number }>(res, 'body');
    const c = await sequelize
      .transaction(async (transaction) => {
        const existing = await Component.findByPk(id, { transaction });
        if (!existing) throw notFound('That component');
        assertVersion(existing.version, version);
        existing.set(input);
        await existing.save({ transaction });
        await audit(transaction, { accountId: null, userId: req.user!.id, entity: 'component', entityId: id, action: 'update', summary: `Changed ${existing.partNumber} in the catalog` });
        return existing;
      })
      .catch(mapLockError);
    res.json({ component: plain(c, COMPONENT_NUMBERS) });
  });

  router.delete('/:id', requireRole('admin', 'manager'), validate('params', idParamSchema), async (_req, res) => {
    const { id } = parsed<{ id: number }>(res, 'params');
    const c = await Component.findByPk(id);
    if (!c) throw notFound('That component');
    if (await Install.count({ where: { componentId: id } }))
      throw new AppError('in_use', 409, 'Planters carry this component, so it cannot be deleted. Mark it inactive instead.');
    await c.destroy();
    res.status(204).end();
  });
  return router;
}
