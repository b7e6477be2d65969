import { roles, type Role } from '@shared/schemas/auth';

export { roles, type Role };

/** How each role is named on screen. */
export const roleLabels: Record<Role, string> = {
  admin: 'Administrator',
  manager: 'Territory manager',
  specialist: 'Planting specialist',
  grower: 'Grower',
};

/** Short names for tight places (table cells). */
export const roleShortLabels: Record<Role, string> = {
  admin: 'Admin',
  manager: 'Manager',
  specialist: 'Specialist',
  grower: 'Grower',
};
