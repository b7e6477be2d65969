import { Router } from 'express';
import passport from 'passport';
import type { Sequelize } from 'sequelize';
import { loginSchema, type LoginInput, type SessionUser } from '../../../shared/schemas/auth.js';
import type { Config } from '../../config.js';
import type { SecurityLog } from '../../auth/security-log.js';
import { SESSION_COOKIE, newCsrfToken } from '../../auth/session.js';
import { loginThrottle } from '../../auth/throttle.js';
import { User } from '../../db/models/index.js';
import { AppError } from '../../http/errors.js';
import { parsed, validate } from '../../http/validate.js';

/** Sign-in, sign-out, the current user and the CSRF token. Open to everyone; the rest needs a session. */
export function authRouter(sequelize: Sequelize, config: Config, securityLog: SecurityLog) {
  const router = Router();
  const throttle = loginThrottle(sequelize, {
    maxPerAccount: config.LOGIN_MAX_FAILURES_PER_ACCOUNT,
    maxPerIp: config.LOGIN_MAX_FAILURES_PER_IP,
    windowMinutes: config.LOGIN_WINDOW_MINUTES,
  });

  router.get('/csrf', (req, res) => {
    if (!req.session.csrfToken) req.session.csrfToken = newCsrfToken();
    res.set('Cache-Control', 'no-store').json({ token: req.session.csrfToken });
  });

  router.post('/login', validate('body', loginSchema), async (req, res, next) => {
    const { email, password } = parsed<LoginInput>(res, 'body');
    const ip = req.ip ?? 'unknown';
    const wait = await throttle.retryAfterSec(email, ip);
    if (wait > 0) {
      securityLog('sign_in_throttled', { email, ip });
      res.set('Retry-After', String(wait));
      throw new AppError('too_many_attempts', 429, `Too many failed sign-ins. Try again in ${Math.ceil(wait / 60)} min.`, {
        retryAfterSec: wait,
      });
    }
    req.body = { email, password };
    passport.authenticate('local', (err: unknown, user: SessionUser | false) => {
      if (err) return next(err);
      if (!user) {
        securityLog('sign_in_failed', { email, ip });
        return throttle
          .recordFailure(email, ip)
          .then(() => next(new AppError('invalid_credentials', 401, 'That e-mail and password do not match an active account.')), next);
      }
      // Passport regenerates the session here: a new session id on every sign-in.
      req.login(user, (loginErr) => {
        if (loginErr) return next(loginErr);
        const now = Date.now();
        req.session.startedAt = now;
        req.session.lastSeenAt = now;
        req.session.csrfToken = newCsrfToken();
        Promise.all([throttle.clearAccount(email), User.update({ lastSignInAt: new Date() }, { where: { id: user.id } })])
          .then(() => {
            securityLog('sign_in', { userId: user.id, email, ip });
            req.session.save((saveErr) => (saveErr ? next(saveErr) : res.json({ user })));
          })
          .catch(next);
      });
    })(req, res, next);
  });

  router.post('/logout', (req, res, next) => {
    const userId = req.user?.id ?? null;
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy((destroyErr) => {
        if (destroyErr) return next(destroyErr);
        if (userId) securityLog('sign_out', { userId, ip: req.ip });
        res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: config.COOKIE_SECURE });
        res.status(204).end();
      });
    });
  });

  router.get('/me', (req, res) => {
    if (!req.user) throw new AppError('unauthenticated', 401, 'Sign in to continue.');
    res.set('Cache-Control', 'no-store').json({ user: req.user });
  });

  return router;
}
