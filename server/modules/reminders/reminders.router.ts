// Pre-season reminders under /api. Mounted before the app-wide CSRF check because the grower's
// e-mail links (unsubscribe, book) post without a session: their signed token is the permission.
// Every other route here applies the same CSRF check itself, then its role guard.
import express, { Router, type Request, type RequestHandler, type Response } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamSchema } from '../../../shared/schemas/accounts.js';
import {
  audienceQuerySchema,
  bookingRequestSchema,
  campaignListQuerySchema,
  campaignSchema,
  campaignUpdateSchema,
  outboxQuerySchema,
  previewSchema,
  reminderPreferencesSchema,
  seasonCalendarPutSchema,
  seasonCalendarQuerySchema,
  sentMailQuerySchema,
  testSendSchema,
  type CampaignInput,
  type CampaignListQuery,
  type CampaignUpdate,
  type OutboxQuery,
  type PreviewInput,
  type ReminderPreferencesInput,
  type SeasonCalendarPut,
  type SentMailQuery,
  type TestSendInput,
} from '../../../shared/schemas/reminders.js';
import { requireAuth, requireRole } from '../../auth/guards.js';
import type { Config } from '../../config.js';
import { AppError, fieldsFromZod } from '../../http/errors.js';
import { parsed, validate } from '../../http/validate.js';
import { transportTarget } from '../../mail/transport.js';
import type { LinkSettings } from './audience.js';
import { getCalendar, putCalendar } from './calendar.service.js';
import { campaignAudience, createCampaign, getCampaign, listCampaigns, previewCampaign, runCampaign, testSendCampaign, updateCampaign } from './campaigns.service.js';
import { bookCheckup, bookingContext, unsubscribe } from './links.service.js';
import { getOutboxMessage, getSentMail, listOutbox, listSentMail, retryOutboxMessage } from './outbox.service.js';
import { bookedPage, bookingPage, errorPage, unsubscribedPage } from './pages.js';
import { getPreferences, putPreferences } from './preferences.service.js';

type Id = { id: number };

function wantsJson(req: Request) {
  return req.accepts(['html', 'json']) === 'json';
}

function tokenOf(req: Request): string {
  const token = (typeof req.query.token === 'string' ? req.query.token : undefined) ?? (typeof req.body?.token === 'string' ? req.body.token : undefined);
  if (!token || token.length < 10 || token.length > 2000) throw new AppError('invalid_token', 400, 'This link is not complete; use the link exactly as it came in the e-mail.');
  return token;
}

/** Link routes answer a person with a page and a program with JSON, errors included. */
function linkRoute(handler: (req: Request, res: Response) => Promise<void>): RequestHandler {
  return async (req, res) => {
    try {
      await handler(req, res);
    } catch (err) {
      if (!(err instanceof AppError)) throw err;
      if (wantsJson(req)) res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.details ? { details: err.details } : {}) } });
      else res.status(err.status).type('html').send(errorPage(err.message));
    }
  };
}

/**
 * Routes and who may call them: campaigns, previews, runs and the outbox — admin, manager and
 * specialist (per territory); the season calendar — staff read, admin and manager change; sent
 * mail — admin; reminder preferences — grower; unsubscribe and booking links — anyone holding a
 * valid signed token.
 */
export function remindersRouter(sequelize: Sequelize, config: Config, csrf: RequestHandler) {
  const router = Router();
  const links: LinkSettings = { publicUrl: config.PUBLIC_URL, secret: config.sessionSecret, mailFrom: config.MAIL_FROM };
  const target = transportTarget(config);
  const staff = [csrf, requireRole('admin', 'manager', 'specialist')];
  const form = express.urlencoded({ extended: false, limit: '10kb' });

  // ---------- links in e-mails: no session, no CSRF token ----------
  const doUnsubscribe = linkRoute(async (req, res) => {
    const outcome = await unsubscribe(sequelize, config.sessionSecret, tokenOf(req));
    if (wantsJson(req)) res.json({ unsubscribed: !outcome.test, changed: outcome.changed, test: outcome.test, email: outcome.email });
    else res.type('html').send(unsubscribedPage(outcome));
  });
  router.get('/reminders/unsubscribe', doUnsubscribe);
  router.post('/reminders/unsubscribe', form, doUnsubscribe);

  router.get(
    '/reminders/book',
    linkRoute(async (req, res) => {
      const token = tokenOf(req);
      const context = await bookingContext(config.sessionSecret, token);
      if (wantsJson(req)) res.json({ booking: context });
      else res.type('html').send(bookingPage(token, context));
    }),
  );
  router.post(
    '/reminders/book',
    form,
    linkRoute(async (req, res) => {
      const token = tokenOf(req);
      const body = bookingRequestSchema.safeParse(req.body ?? {});
      if (!body.success) throw new AppError('validation', 400, 'Some fields need attention.', { fields: fieldsFromZod(body.error) });
      const outcome = await bookCheckup(sequelize, config.sessionSecret, token, body.data);
      const status = outcome.created ? 201 : 200;
      if (wantsJson(req)) res.status(status).json({ created: outcome.created, test: outcome.test, visit: outcome.visit });
      else res.status(status).type('html').send(bookedPage(outcome));
    }),
  );

  // ---------- season calendar ----------
  router.get('/season-calendar', ...staff, validate('query', seasonCalendarQuerySchema), async (_req, res) => {
    res.json({ entries: await getCalendar(parsed<{ season?: number }>(res, 'query').season) });
  });
  router.put('/season-calendar', csrf, requireRole('admin', 'manager'), validate('query', seasonCalendarQuerySchema), validate('body', seasonCalendarPutSchema), async (req, res) => {
    res.json({ entries: await putCalendar(req.user!, parsed<SeasonCalendarPut>(res, 'body').entries, parsed<{ season?: number }>(res, 'query').season) });
  });

  // ---------- campaigns ----------
  router.get('/campaigns', ...staff, validate('query', campaignListQuerySchema), async (req, res) => {
    res.json(await listCampaigns(req.user!, parsed<CampaignListQuery>(res, 'query')));
  });
  router.post('/campaigns', ...staff, validate('body', campaignSchema), async (req, res) => {
    res.status(201).json({ campaign: await createCampaign(sequelize, req.user!, parsed<CampaignInput>(res, 'body')) });
  });
  router.get('/campaigns/:id', ...staff, validate('params', idParamSchema), async (req, res) => {
    res.json({ campaign: await getCampaign(req.user!, parsed<Id>(res, 'params').id) });
  });
  router.patch('/campaigns/:id', ...staff, validate('params', idParamSchema), validate('body', campaignUpdateSchema), async (req, res) => {
    res.json({ campaign: await updateCampaign(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<CampaignUpdate>(res, 'body')) });
  });
  router.get('/campaigns/:id/audience', ...staff, validate('params', idParamSchema), validate('query', audienceQuerySchema), async (req, res) => {
    const q = parsed<{ page: number; pageSize: number }>(res, 'query');
    res.json(await campaignAudience(sequelize, req.user!, parsed<Id>(res, 'params').id, q.page, q.pageSize));
  });
  router.post('/campaigns/:id/preview', ...staff, validate('params', idParamSchema), validate('body', previewSchema), async (req, res) => {
    res.json({ preview: await previewCampaign(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<PreviewInput>(res, 'body'), links) });
  });
  router.post('/campaigns/:id/test-send', ...staff, validate('params', idParamSchema), validate('body', testSendSchema), async (req, res) => {
    res.json(await testSendCampaign(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<TestSendInput>(res, 'body'), links, target));
  });
  router.post('/campaigns/:id/run', ...staff, validate('params', idParamSchema), async (req, res) => {
    res.json({ run: await runCampaign(sequelize, req.user!, parsed<Id>(res, 'params').id, links) });
  });

  // ---------- outbox ----------
  router.get('/outbox', ...staff, validate('query', outboxQuerySchema), async (req, res) => {
    res.json(await listOutbox(sequelize, req.user!, parsed<OutboxQuery>(res, 'query')));
  });
  router.get('/outbox/:id', ...staff, validate('params', idParamSchema), async (req, res) => {
    res.json({ message: await getOutboxMessage(sequelize, req.user!, parsed<Id>(res, 'params').id) });
  });
  router.post('/outbox/:id/retry', ...staff, validate('params', idParamSchema), async (req, res) => {
    res.json({ message: await retryOutboxMessage(sequelize, req.user!, parsed<Id>(res, 'params').id) });
  });

  // ---------- sent mail: what the local SMTP stand-in received ----------
  router.get('/sent-mail', csrf, requireRole('admin'), validate('query', sentMailQuerySchema), async (_req, res) => {
    res.json(await listSentMail(parsed<SentMailQuery>(res, 'query')));
  });
  router.get('/sent-mail/:id', csrf, requireRole('admin'), validate('params', idParamSchema), async (_req, res) => {
    res.json({ message: await getSentMail(parsed<Id>(res, 'params').id) });
  });

  // ---------- the grower's own preferences ----------
  router.get('/me/reminder-preferences', csrf, requireAuth, async (req, res) => {
    res.json(await getPreferences(req.user!));
  });
  router.put('/me/reminder-preferences', csrf, requireAuth, validate('body', reminderPreferencesSchema), async (req, res) => {
    res.json(await putPreferences(sequelize, req.user!, parsed<ReminderPreferencesInput>(res, 'body')));
  });
  return router;
}
