import { Router } from 'express';
import { accountListQuerySchema, idParamSchema, type AccountListQuery } from '../../../shared/schemas/accounts.js';
import { accountScope } from '../../auth/access.js';
import { requireAuth } from '../../auth/guards.js';
import { notFound } from '../../http/errors.js';
import { parsed, validate } from '../../http/validate.js';
import { findAccount, listAccounts } from './accounts.repository.js';

/** Grower accounts. Every signed-in role, limited to the accounts its scope allows. */
export function accountsRouter() {
  const router = Router();
  router.use(requireAuth);

  router.get('/', validate('query', accountListQuerySchema), async (req, res) => {
    res.json(await listAccounts(accountScope(req.user!), parsed<AccountListQuery>(res, 'query')));
  });

  router.get('/:id', validate('params', idParamSchema), async (req, res) => {
    // Outside the user's scope reads as missing: no hint that the record exists.
    const account = await findAccount(accountScope(req.user!), parsed<{ id: number }>(res, 'params').id);
    if (!account) throw notFound('That account');
    res.json({ account });
  });
  return router;
}
