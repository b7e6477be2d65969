import { z } from 'zod';
import { roles } from './auth.js';

const territoryIds = z.array(z.number().int().positive(), { error: 'Choose territories from the list' }).max(50);

export const createUserSchema = z
  .object({
    email: z.string({ error: 'Enter an e-mail address' }).trim().toLowerCase().email('Enter a valid e-mail address').max(191),
    name: z.string({ error: 'Enter a name' }).trim().min(1, 'Enter a name').max(120),
    role: z.enum(roles, { error: 'Choose a role: admin, manager, specialist or grower' }),
    password: z.string({ error: 'Enter a password' }).min(10, 'Use at least 10 characters').max(200),
    territoryIds: territoryIds.default([]),
    accountId: z.number().int().positive().nullable().optional(),
  })
  .superRefine((u, ctx) => {
    if (u.role === 'grower' && !u.accountId) ctx.addIssue({ code: 'custom', path: ['accountId'], message: 'A grower must be linked to their account' });
    if ((u.role === 'manager' || u.role === 'specialist') && u.territoryIds.length === 0)
      ctx.addIssue({ code: 'custom', path: ['territoryIds'], message: 'Choose at least one territory' });
  });
export type CreateUserInput = z.infer<typeof createUserSchema>;

export const updateUserSchema = z
  .object({
    name: z.string().trim().min(1, 'Enter a name').max(120).optional(),
    role: z.enum(roles, { error: 'Choose a role: admin, manager, specialist or grower' }).optional(),
    territoryIds: territoryIds.optional(),
    accountId: z.number().int().positive().nullable().optional(),
    disabled: z.boolean({ error: 'Disabled must be true or false' }).optional(),
  })
  .strict();
export type UpdateUserInput = z.infer<typeof updateUserSchema>;
