import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkCalendar, unescapeText, type IcalComponent } from '../../shared/calc/ical.js';
import { User, Visit } from '../../server/db/models/index.js';
import { client, makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';

let t: TestApp;
let territoryId: number;

beforeAll(async () => {
  t = await testApp();
  territoryId = (await makeTerritory()).id;
});
afterAll(async () => t.close());

// Feeds cover about half a year back and a year ahead of now, so the visits sit near today.
const daysFromNow = (days: number, hourUtc: number) => {
  const d = new Date();
  d.setUTCDate(d.getUTCDate() + days);
  d.setUTCHours(hourUtc, 0, 0, 0);
  return d;
};

async function visit(accountId: number, specialistId: number | null, fields: Partial<{ status: 'requested' | 'planned' | 'done' | 'cancelled'; startsAt: Date | null; notes: string; purpose: string }> = {}) {
  return Visit.create({
    accountId,
    specialistId,
    planterId: null,
    purpose: (fields.purpose ?? 'pre-season-checkup') as never,
    status: fields.status ?? 'planned',
    startsAt: fields.startsAt === undefined ? daysFromNow(7, 15) : fields.startsAt,
    durationMin: 90,
    windowStartMin: null,
    windowEndMin: null,
    notes: fields.notes ?? null,
    checklist: [{ label: 'Meters, chains, closing wheels', done: false }],
    roadmapItemIds: [],
    requestedByContactId: null,
  });
}

const events = (calendar: IcalComponent) => calendar.children.filter((c) => c.name === 'VEVENT');
const prop = (event: IcalComponent, name: string) => event.properties.find((p) => p.name === name)?.value;

describe('calendar feeds', () => {
  it("when a grower subscribes, then the feed lists only their own account's visits, passes the RFC 5545 checks and leaves out staff notes", async () => {
    const specialist = await makeUser('specialist', { territoryIds: [territoryId] });
    const mine = await makeAccount(territoryId, { name: 'Hesketh, Lowe; & Sons' });
    const neighbour = await makeAccount(territoryId);
    const own = await visit(mine.id, specialist.id, { notes: 'Internal: quote the bar upgrade' });
    const request = await visit(mine.id, specialist.id, { status: 'requested', startsAt: daysFromNow(14, 16), purpose: 'roadmap-review' });
    const cancelled = await visit(mine.id, specialist.id, { status: 'cancelled', startsAt: daysFromNow(21, 16) });
    await visit(mine.id, specialist.id, { status: 'requested', startsAt: null });
    const theirs = await visit(neighbour.id, specialist.id);

    const grower = await signedIn(t.app, await makeUser('grower', { accountId: mine.id }));
    const links = await grower.get('/api/me/calendar-links');
    expect(links.status).toBe(200);
    expect(links.body).toMatchObject({ scope: 'grower', path: expect.stringMatching(/^\/api\/calendar\/[A-Za-z0-9_-]{43}\.ics$/) });
    expect(links.body.feedUrl.endsWith(links.body.path)).toBe(true);
    expect(links.body.webcalUrl).toMatch(/^webcal:\/\//);

    const feed = await client(t.app).get(links.body.path);
    expect(feed.status).toBe(200);
    expect(feed.headers['content-type']).toMatch(/^text\/calendar; charset=utf-8/);
    const { problems, calendar } = checkCalendar(feed.text);
    expect(problems).toEqual([]);
    const list = events(calendar!);
    const uid = (id: number) => list.find((e) => prop(e, 'UID')!.startsWith(`visit-${id}@`));
    expect(list.map((e) => Number(/^visit-(\d+)@/.exec(prop(e, 'UID')!)![1])).sort((a, b) => a - b)).toEqual([own.id, request.id, cancelled.id].sort((a, b) => a - b));
    expect(uid(theirs.id)).toBeUndefined();
    const first = uid(own.id)!;
    expect(prop(first, 'DTSTART')).toBe(new Date(own.startsAt!).toISOString().replace(/[-:]/g, '').replace(/\.\d{3}/, ''));
    expect(prop(first, 'STATUS')).toBe('CONFIRMED');
    expect(unescapeText(prop(first, 'SUMMARY')!)).toBe(`Pre-season check-up with ${specialist.name}`);
    expect(feed.text).not.toContain('Internal');
    expect(prop(uid(request.id)!, 'STATUS')).toBe('TENTATIVE');
    expect(prop(uid(cancelled.id)!, 'STATUS')).toBe('CANCELLED');
    expect(unescapeText(prop(calendar!, 'X-WR-CALNAME')!)).toBe('Rowpath visits: Hesketh, Lowe; & Sons');
    expect(prop(calendar!, 'PRODID')).toMatch(/Rowpath/);
  });

  it("when a specialist subscribes, then the feed holds only visits assigned to them, with the account and notes", async () => {
    const me = await makeUser('specialist', { territoryIds: [territoryId] });
    const colleague = await makeUser('specialist', { territoryIds: [territoryId] });
    const account = await makeAccount(territoryId, { name: 'Tegtmeier Grain' });
    const mineVisit = await visit(account.id, me.id, { notes: 'Check downforce springs' });
    const theirs = await visit(account.id, colleague.id, { startsAt: daysFromNow(8, 15) });
    const far = await visit(account.id, me.id, { startsAt: daysFromNow(800, 15) });
    const c = await signedIn(t.app, me);
    const { path } = (await c.get('/api/me/calendar-links')).body;
    const feed = await client(t.app).get(path);
    const { problems, calendar } = checkCalendar(feed.text);
    expect(problems).toEqual([]);
    const ids = events(calendar!).map((e) => Number(/^visit-(\d+)@/.exec(prop(e, 'UID')!)![1]));
    expect(ids).toEqual([mineVisit.id]);
    expect(ids).not.toContain(theirs.id);
    expect(ids).not.toContain(far.id);
    const description = unescapeText(prop(events(calendar!)[0], 'DESCRIPTION')!);
    expect(description).toContain('Account: Tegtmeier Grain');
    expect(description).toContain('Notes: Check downforce springs');
    expect(description).toContain('[ ] Meters, chains, closing wheels');
  });

  it('when the link is asked for twice, then it is the same; after rotating, the old URL is 404 and the new one works', async () => {
    const user = await makeUser('specialist', { territoryIds: [territoryId] });
    const c = await signedIn(t.app, user);
    const first = (await c.get('/api/me/calendar-links')).body;
    const again = (await c.get('/api/me/calendar-links')).body;
    expect(again.path).toBe(first.path);
    const rotated = await c.post('/api/me/calendar-links/rotate');
    expect(rotated.status).toBe(200);
    expect(rotated.body.path).not.toBe(first.path);
    const anonymous = client(t.app);
    expect((await anonymous.get(first.path)).status).toBe(404);
    expect((await anonymous.get(rotated.body.path)).status).toBe(200);
    expect((await c.get('/api/me/calendar-links')).body.path).toBe(rotated.body.path);
  });

  it('when a token is unknown, malformed or its user is disabled, then the feed is 404; links need a session', async () => {
    const user = await makeUser('specialist', { territoryIds: [territoryId] });
    const c = await signedIn(t.app, user);
    const { path } = (await c.get('/api/me/calendar-links')).body;
    const anonymous = client(t.app);
    expect((await anonymous.get('/api/calendar/not-a-token.ics')).status).toBe(404);
    expect((await anonymous.get(`/api/calendar/${'A'.repeat(43)}.ics`)).status).toBe(404);
    // Tokens compare exactly: the same letters in another case are another token.
    const token = /calendar\/(.*)\.ics$/.exec(path)![1];
    const swapped = token.replace(/[a-zA-Z]/, (ch: string) => (ch === ch.toLowerCase() ? ch.toUpperCase() : ch.toLowerCase()));
    expect((await anonymous.get(`/api/calendar/${swapped}.ics`)).status).toBe(404);
    await User.update({ disabled: true }, { where: { id: user.id } });
    expect((await anonymous.get(path)).status).toBe(404);
    expect((await anonymous.get('/api/me/calendar-links')).status).toBe(401);
    await anonymous.refreshCsrf();
    expect((await anonymous.post('/api/me/calendar-links/rotate')).status).toBe(401);
  });

  it('when a manager subscribes, then the feed covers their territories only', async () => {
    const other = (await makeTerritory()).id;
    const manager = await makeUser('manager', { territoryIds: [other] });
    const inside = await visit((await makeAccount(other)).id, null);
    const outside = await visit((await makeAccount(territoryId)).id, null);
    const c = await signedIn(t.app, manager);
    const links = (await c.get('/api/me/calendar-links')).body;
    expect(links.scope).toBe('territories');
    const { problems, calendar } = checkCalendar((await client(t.app).get(links.path)).text);
    expect(problems).toEqual([]);
    const ids = events(calendar!).map((e) => Number(/^visit-(\d+)@/.exec(prop(e, 'UID')!)![1]));
    expect(ids).toEqual([inside.id]);
    expect(ids).not.toContain(outside.id);
  });
});
