import fs from 'node:fs';
import path from 'node:path';
import express, { type Express } from 'express';
import helmet from 'helmet';
import passport from 'passport';
import type { Sequelize } from 'sequelize';
import type { Config } from './config.js';
import { securityLogger } from './auth/security-log.js';
import { installSessions } from './auth/session.js';
import { errorHandler, unknownRoute } from './http/errors.js';
import { accountsRouter } from './modules/accounts/accounts.router.js';
import { attachmentsRouter } from './modules/attachments/attachments.router.js';
import { csvRouter } from './modules/csv/csv.router.js';
import { componentsRouter } from './modules/fleet/components.router.js';
import { fleetRouter } from './modules/fleet/fleet.router.js';
import { roadmapRouter } from './modules/roadmap/roadmap.router.js';
import { sizingRouter } from './modules/sizing/sizing.router.js';
import { forecastRouter } from './modules/forecast/forecast.router.js';
import { adminUsersRouter } from './modules/admin-users/admin-users.router.js';
import { authRouter } from './modules/auth/auth.router.js';
import { healthRouter } from './modules/health/health.router.js';
import { remindersRouter } from './modules/reminders/reminders.router.js';
import { territoriesRouter } from './modules/territories/territories.router.js';
import { visitPlanningRouter } from './modules/visits/index.js';
import { openapiRouter } from './modules/openapi/openapi.router.js';

export interface AppDeps {
  sequelize: Sequelize;
  config: Config;
  /** Folder with the built client; omitted in API-only tests. */
  clientDir?: string;
  log?: (msg: string, err?: unknown) => void;
}

/** Builds the Express app without listening, so tests can drive it with Supertest. */
export function createApp({ sequelize, config, clientDir, log = defaultLog }: AppDeps): Express {
  const app = express();
  app.disable('x-powered-by');
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'"],
          'connect-src': ["'self'"],
          'object-src': ["'none'"],
          'frame-ancestors': ["'none'"],
          'base-uri': ["'self'"],
          'form-action': ["'self'"],
          'upgrade-insecure-requests': config.COOKIE_SECURE ? [] : null,
        },
      },
      strictTransportSecurity: config.COOKIE_SECURE ? undefined : false,
    }),
  );
  const securityLog = securityLogger(sequelize);
  // API answers are never cached (Cache-Control: no-store below), so an ETag would only cost a
  // hash of every body.
  app.set('etag', false);

  // The built client's files need no session: served before the session is read, so that a page
  // load's scripts, fonts and map tiles cost no database round trips.
  const hasClient = Boolean(clientDir && fs.existsSync(path.join(clientDir, 'index.html')));
  if (hasClient) {
    const files = express.static(clientDir!, { index: false, maxAge: '1h', setHeaders: immutableAssets });
    // API paths never name a file: no disk lookup for them.
    app.use((req, res, next) => (req.path.startsWith('/api/') ? next() : files(req, res, next)));
  }

  app.use('/api/health', healthRouter(sequelize));
  app.use('/api', express.json({ limit: '1mb' }));
  app.use('/api', (_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });
  const { csrf } = installSessions(app, sequelize, config, securityLog);
  app.use(passport.initialize());
  app.use('/api', remindersRouter(sequelize, config, csrf)); // before csrf: signed e-mail links post without a session; its other routes check csrf themselves
  app.use('/api', csrf);
  app.use('/api/auth', authRouter(sequelize, config, securityLog));
  app.use('/api/territories', territoriesRouter());
  app.use('/api', csvRouter(sequelize)); // before /api/accounts: export.csv is not an account id
  app.use('/api/accounts', accountsRouter(sequelize));
  app.use('/api/components', componentsRouter(sequelize));
  app.use('/api', fleetRouter(sequelize));
  app.use('/api', attachmentsRouter(sequelize, config));
  app.use('/api', sizingRouter());
  app.use('/api', roadmapRouter(sequelize));
  app.use('/api', forecastRouter(sequelize));
  app.use('/api/admin/users', adminUsersRouter(sequelize, securityLog));
  app.use('/api', visitPlanningRouter(sequelize, log));
  app.use('/api', openapiRouter());
  app.use('/api', unknownRoute);

  if (hasClient) {
    // The client routes itself: any other GET gets the app's page.
    app.get('/{*splat}', (_req, res) => res.sendFile('index.html', { root: clientDir }));
  }
  app.use(errorHandler(log, securityLog));
  return app;
}

function immutableAssets(res: express.Response, file: string) {
  if (file.includes(`${path.sep}assets${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
}

function defaultLog(msg: string, err?: unknown) {
  console.error(`[${new Date().toISOString()}] ${msg}`, err ?? '');
}
