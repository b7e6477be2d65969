import { z } from 'zod';

export const roles = ['admin', 'manager', 'specialist', 'grower'] as const;
export type Role = (typeof roles)[number];

export const loginSchema = z.object({
  email: z.string({ error: 'Enter your e-mail address' }).trim().toLowerCase().email('Enter a valid e-mail address').max(191),
  password: z.string({ error: 'Enter your password' }).min(1, 'Enter your password').max(200),
});
export type LoginInput = z.infer<typeof loginSchema>;

export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  territoryIds: number[];
  accountId: number | null;
}
