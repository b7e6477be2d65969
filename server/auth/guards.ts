import type { RequestHandler } from 'express';
import type { Role, SessionUser } from '../../shared/schemas/auth.js';
import { AppError } from '../http/errors.js';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // Passport's req.user is the session user Rowpath loads on every request.
    interface User extends SessionUser {}
  }
}

export const requireAuth: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(new AppError('unauthenticated', 401, 'Sign in to continue.'));
  next();
};

/** Deny by default: only the roles named may pass. */
export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(new AppError('unauthenticated', 401, 'Sign in to continue.'));
    if (!roles.includes(req.user.role)) return next(new AppError('forbidden', 403, 'Your role does not allow this.'));
    next();
  };
}
