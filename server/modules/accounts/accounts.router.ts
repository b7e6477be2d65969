import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { accountListQuerySchema, accountSchema, idParamSchema, type AccountInput, type AccountListQuery } from '../../../shared/schemas/accounts.js';
import { versionField } from '../../../shared/schemas/fleet.js';
import { accountScope } from '../../auth/access.js';
import { requireAuth } from '../../auth/guards.js';
import { notFound } from '../../http/errors.js';
import { parsed, validate } from '../../http/validate.js';
import { accountFor } from '../fleet/fleet-access.js';
import { watchListTotals } from '../fleet/list-totals.js';
import { accountAudit, findAccountWithFleet, listAccounts } from './accounts.repository.js';
import { createAccount, deleteAccount, updateAccount } from './accounts.service.js';

const accountUpdateSchema = accountSchema.partial().extend({ version: versionField });

/** Grower accounts. Every signed-in role, limited to the accounts its scope allows; growers read only. */
export function accountsRouter(sequelize: Sequelize) {
  watchListTotals();
  const router = Router();
  router.use(requireAuth);

  router.get('/', validate('query', accountListQuerySchema), async (req, res) => {
    res.json(await listAccounts(req.user!, parsed<AccountListQuery>(res, 'query')));
  });

  router.post('/', validate('body', accountSchema), async (req, res) => {
    res.status(201).json({ account: await createAccount(sequelize, req.user!, parsed<AccountInput>(res, 'body')) });
  });

  router.get('/:id', validate('params', idParamSchema), async (req, res) => {
    // Outside the user's scope reads as missing: no hint that the record exists.
    const account = await findAccountWithFleet(accountScope(req.user!), parsed<{ id: number }>(res, 'params').id);
    if (!account) throw notFound('That account');
    res.json({ account });
  });

  router.patch('/:id', validate('params', idParamSchema), validate('body', accountUpdateSchema), async (req, res) => {
    const { id } = parsed<{ id: number }>(res, 'params');
    await updateAccount(sequelize, req.user!, id, parsed<Partial<AccountInput> & { version: number }>(res, 'body'));
    res.json({ account: await findAccountWithFleet(accountScope(req.user!), id) });
  });

  router.delete('/:id', validate('params', idParamSchema), async (req, res) => {
    await deleteAccount(sequelize, req.user!, parsed<{ id: number }>(res, 'params').id);
    res.status(204).end();
  });

  router.get('/:id/audit', validate('params', idParamSchema), async (req, res) => {
    const { id } = parsed<{ id: number }>(res, 'params');
    await accountFor(req.user!, id, 'read');
    res.json({ items: await accountAudit(id) });
  });
  return router;
}
