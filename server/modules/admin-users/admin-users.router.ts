import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamSchema } from '../../../shared/schemas/accounts.js';
import { createUserSchema, updateUserSchema, type CreateUserInput, type UpdateUserInput } from '../../../shared/schemas/users.js';
import { requireRole } from '../../auth/guards.js';
import type { SecurityLog } from '../../auth/security-log.js';
import { parsed, validate } from '../../http/validate.js';
import { createUser, listUsers, updateUser } from './admin-users.service.js';

/** User administration: admin only. */
export function adminUsersRouter(sequelize: Sequelize, securityLog: SecurityLog) {
  const router = Router();
  router.use(requireRole('admin'));
  router.get('/', async (_req, res) => {
    res.json({ items: await listUsers() });
  });
  router.post('/', validate('body', createUserSchema), async (_req, res) => {
    res.status(201).json({ user: await createUser(sequelize, parsed<CreateUserInput>(res, 'body')) });
  });
  router.patch('/:id', validate('params', idParamSchema), validate('body', updateUserSchema), async (req, res) => {
    const { id } = parsed<{ id: number }>(res, 'params');
    const input = parsed<UpdateUserInput>(res, 'body');
    const user = await updateUser(sequelize, id, input, req.user!.id);
    if (input.disabled) securityLog('user_disabled', { userId: id, ip: req.ip, detail: `by user ${req.user!.id}` });
    res.json({ user });
  });
  return router;
}
