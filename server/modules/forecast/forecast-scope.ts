import type { SessionUser } from '../../../shared/schemas/auth.js';
import { AppError, forbidden } from '../../http/errors.js';

/**
 * Which roadmap items a user's figures are made of. `territoryIds` null means every territory;
 * an empty list means none. Deny by default: a role not named here gets 403.
 */
export interface ItemScope {
  territoryIds: number[] | null;
  specialistId: number | null;
}

/**
 * Admin: everything, narrowed by the filters asked for. Manager: their territories only (the
 * territory filter is forced inside them; another territory is 403). Specialist: only the items
 * they own (the specialist filter is forced to themself; another specialist is 403).
 */
export function itemScope(user: SessionUser, asked: { territoryId?: number; specialistId?: number }): ItemScope {
  switch (user.role) {
    case 'admin':
      return { territoryIds: asked.territoryId ? [asked.territoryId] : null, specialistId: asked.specialistId ?? null };
    case 'manager':
      if (asked.territoryId && !user.territoryIds.includes(asked.territoryId)) {
        throw new AppError('forbidden', 403, 'You can see the figures of your own territories only.');
      }
      return { territoryIds: asked.territoryId ? [asked.territoryId] : [...user.territoryIds], specialistId: asked.specialistId ?? null };
    case 'specialist':
      if (asked.specialistId && asked.specialistId !== user.id) {
        throw new AppError('forbidden', 403, 'You can see your own figures only.');
      }
      return { territoryIds: asked.territoryId ? [asked.territoryId] : null, specialistId: user.id };
    default:
      throw forbidden();
  }
}

/** The items a user may see at all, whatever filters they ask for (used for shop capacity). */
export function visibleItems(user: SessionUser): ItemScope {
  return itemScope(user, {});
}
