import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { IncomingMessage } from 'node:http';
import bcrypt from 'bcryptjs';
import type { Express, RequestHandler } from 'express';
import session from 'express-session';
import connectSessionSequelize from 'connect-session-sequelize';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { SessionUser } from '../../shared/schemas/auth.js';
import type { Config } from '../config.js';
import { User } from '../db/models/index.js';
import { plainSelect } from '../db/plain-select.js';
import { AppError } from '../http/errors.js';
import type { SecurityLog } from './security-log.js';

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
    startedAt?: number;
    lastSeenAt?: number;
  }
}

export const SESSION_COOKIE = 'rowpath.sid';
// A real bcrypt hash of a random string, compared when the e-mail is unknown so that unknown
// and known accounts take the same time to refuse.
const DUMMY_HASH = bcrypt.hashSync(randomBytes(12).toString('hex'), 10);

type SessionUserRow = { id: number; email: string; name: string; role: SessionUser['role']; disabled: number | boolean; accountId: number | null; territoryIds: string | null };

const USER_COLUMNS =
  'u.id, u.email, u.name, u.role, u.disabled, u.account_id AS accountId, (SELECT GROUP_CONCAT(ut.territory_id ORDER BY ut.territory_id) FROM user_territories ut WHERE ut.user_id = u.id) AS territoryIds';

function toSessionUser(row: SessionUserRow | undefined): SessionUser | null {
  if (!row || row.id === null || row.disabled) return null;
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    territoryIds: row.territoryIds ? row.territoryIds.split(',').map(Number) : [],
    accountId: row.accountId,
  };
}

/**
 * The signed-in user with their territories: one plain query (no model instances), so that a list
 * page does not pay more for who is asking than for its rows.
 */
export async function loadSessionUser(id: number): Promise<SessionUser | null> {
  const [row] = await User.sequelize!.query<SessionUserRow>(
    `SELECT ${USER_COLUMNS} FROM users u WHERE u.id = ?`,
    { replacements: [id], type: QueryTypes.SELECT },
  );
  return toSessionUser(row);
}

export async function verifyPassword(email: string, password: string): Promise<User | null> {
  const user = await User.findOne({ where: { email } });
  const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
  return user && ok && !user.disabled ? user : null;
}

export function newCsrfToken() {
  return randomBytes(24).toString('base64url');
}

/** Sessions in MariaDB, Passport on top, idle and absolute lifetimes, and the CSRF check. */
export function installSessions(app: Express, sequelize: Sequelize, config: Config, securityLog: SecurityLog) {
  const SequelizeStore = connectSessionSequelize(session.Store);
  const idleMs = config.SESSION_IDLE_MINUTES * 60_000;
  const maxMs = config.SESSION_MAX_HOURS * 3_600_000;
  // Every signed-in request reads its session and then its user. Both come from one plain query
  // by the session's primary key (the user id is kept in a column beside the data); the user is
  // handed to Passport's deserializer below through `loadedUsers`, by session id. Writes, deletes
  // and the expiry sweep stay with the package.
  const loadedUsers = new Map<string, { user: SessionUser | null; atMs: number }>();
  class SessionStore extends SequelizeStore {
    override get(sid: string, fn: (err: unknown, data?: session.SessionData | null) => void) {
      plainSelect<SessionUserRow & { data: string | null }>(
        sequelize,
        `SELECT s.data, ${USER_COLUMNS} FROM sessions s LEFT JOIN users u ON u.id = s.user_id WHERE s.sid = ?`,
        [sid],
      )
        .then(([row]) => {
          if (!row?.data) return null;
          const data = JSON.parse(row.data) as session.SessionData & { passport?: { user?: number } };
          if (data.passport?.user !== undefined && row.id === data.passport.user) {
            // A session that never reaches the deserializer (an expired one, say) leaves its entry:
            // entries older than a few seconds are dropped as new ones arrive.
            if (loadedUsers.size > 500) for (const [key, v] of loadedUsers) if (Date.now() - v.atMs > 5_000) loadedUsers.delete(key);
            loadedUsers.set(sid, { user: toSessionUser(row), atMs: Date.now() });
          }
          return data;
        })
        .then((data) => fn(null, data), fn);
    }
  }
  const store = new SessionStore({
    db: sequelize,
    table: 'Session',
    // Expired rows are swept every 15 minutes; each request checks the lifetimes itself.
    checkExpirationInterval: 15 * 60_000,
    disableTouch: true,
    extendDefaultFields: (defaults: Record<string, unknown>, s: { passport?: { user?: number } }) => ({
      ...defaults,
      userId: s.passport?.user ?? null,
    }),
  } as unknown as ConstructorParameters<typeof SessionStore>[0]);

  if (config.TRUST_PROXY) app.set('trust proxy', config.TRUST_PROXY);
  app.use(
    session({
      name: SESSION_COOKIE,
      secret: config.sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      // The cookie is sent again whenever the session changes, which lastSeenAt (below) makes happen
      // at least once a minute of activity, so its expiry stays within a minute of rolling; the idle
      // limit itself is enforced here on the server. Not re-signing it on every answer saves an
      // HMAC and a header per request.
      rolling: false,
      cookie: { httpOnly: true, sameSite: 'lax', secure: config.COOKIE_SECURE, maxAge: idleMs },
    }),
  );

  // Idle and absolute lifetimes are enforced here, on the server, whatever the cookie says.
  // lastSeenAt is written at most once a minute so that reads do not each cost a session write.
  const lifetimes: RequestHandler = (req, _res, next) => {
    const s = req.session;
    if (!s || !(s as unknown as { passport?: { user?: number } }).passport?.user) return next();
    const now = Date.now();
    const expired = (s.startedAt && now - s.startedAt > maxMs) || (s.lastSeenAt && now - s.lastSeenAt > idleMs);
    if (expired) {
      const userId = (s as unknown as { passport: { user: number } }).passport.user;
      securityLog('session_expired', { userId, ip: req.ip });
      return s.regenerate((err) => next(err));
    }
    if (!s.lastSeenAt || now - s.lastSeenAt > Math.min(60_000, idleMs / 30)) s.lastSeenAt = now;
    next();
  };
  app.use(lifetimes);

  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      verifyPassword(email, password)
        .then((u) => (u ? loadSessionUser(u.id) : null))
        .then((u) => done(null, u ?? false), done);
    }),
  );
  passport.serializeUser((user, done) => done(null, (user as { id: number }).id));
  passport.deserializeUser((req: IncomingMessage, id: number, done: (err: unknown, user?: SessionUser | false) => void) => {
    // A disabled or deleted user is simply not signed in any more.
    const sid = (req as IncomingMessage & { sessionID: string }).sessionID;
    const loaded = loadedUsers.get(sid);
    loadedUsers.delete(sid);
    if (loaded && (loaded.user === null || loaded.user.id === id)) return done(null, loaded.user ?? false);
    loadSessionUser(id).then((u) => done(null, u ?? false), done);
  });
  app.use(passport.session());

  const csrf: RequestHandler = (req, _res, next) => {
    if (['GET', 'HEAD', 'OPTIONS'].includes(req.method)) return next();
    const sent = req.get('x-csrf-token') ?? '';
    const expected = req.session?.csrfToken ?? '';
    const ok = sent.length > 0 && sent.length === expected.length && timingSafeEqual(Buffer.from(sent), Buffer.from(expected));
    if (!ok) {
      securityLog('csrf_refused', { userId: req.user?.id ?? null, ip: req.ip, detail: `${req.method} ${req.path}` });
      return next(new AppError('csrf', 403, 'The form has expired. Reload the page and try again.'));
    }
    next();
  };
  return { store, csrf };
}
