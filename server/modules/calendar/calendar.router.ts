import { Router, type Request } from 'express';
import type { Sequelize } from 'sequelize';
import { requireAuth } from '../../auth/guards.js';
import { notFound } from '../../http/errors.js';
import { calendarFeed, calendarToken, feedScopeOf, FEED_REFRESH_MIN, rotateCalendarToken } from './calendar.service.js';

function links(req: Request, token: string, createdAt: Date, role: Parameters<typeof feedScopeOf>[0]) {
  const path = `/api/calendar/${token}.ics`;
  const host = req.get('host') ?? '127.0.0.1';
  return { feedUrl: `${req.protocol}://${host}${path}`, webcalUrl: `webcal://${host}${path}`, path, scope: feedScopeOf(role), refreshMinutes: FEED_REFRESH_MIN, createdAt: createdAt.toISOString() };
}

/**
 * GET /api/calendar/:token.ics needs no session: the token is the credential (calendar programs
 * cannot sign in). Unknown tokens and disabled users get 404. The link routes are the signed-in
 * user's own.
 */
export function calendarRouter(sequelize: Sequelize) {
  const router = Router();
  router.get('/calendar/:token.ics', async (req, res) => {
    const domain = (req.hostname || 'rowpath').replace(/[^A-Za-z0-9.-]/g, '') || 'rowpath';
    const text = await calendarFeed(sequelize, String(req.params.token), domain);
    if (text === null) throw notFound('That calendar feed');
    res.set({ 'Content-Type': 'text/calendar; charset=utf-8', 'Content-Disposition': 'inline; filename="rowpath-visits.ics"' });
    res.send(text);
  });
  router.get('/me/calendar-links', requireAuth, async (req, res) => {
    const { token, createdAt } = await calendarToken(sequelize, req.user!.id);
    res.json(links(req, token, createdAt, req.user!.role));
  });
  router.post('/me/calendar-links/rotate', requireAuth, async (req, res) => {
    const { token, createdAt } = await rotateCalendarToken(sequelize, req.user!.id);
    res.json(links(req, token, createdAt, req.user!.role));
  });
  return router;
}
