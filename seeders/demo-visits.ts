// Demo visits for the invented dealership, placed around the day the demo is loaded: last
// spring's pre-season check-ups (done), a few autumn troubleshooting calls, requested check-ups
// and roadmap reviews for the coming weeks, and two fixed appointments per specialist next week.
// Every time sits inside the default working hours (07:00–18:00 local) and no specialist is
// booked twice at once. Called from seeders/demo.ts after the accounts and fleets exist.
import type { Sequelize } from 'sequelize';
import { createRng } from '../shared/calc/route-optimizer.js';
import { DEFAULT_DURATION_MIN, type VisitPurpose, type VisitStatus } from '../shared/schemas/visits.js';
import { Account, Contact, User, Visit } from '../server/db/models/index.js';
import { addDays, DEFAULT_TIME_ZONE, fromLocal, toLocal } from '../server/modules/visits/local-time.js';

const CHECKUP_LIST = ['Seed meters: discs, brushes and vacuum seals', 'Drive chains, clutches and row drives', 'Seed tubes and seed sensors', 'Downforce system and springs', 'Closing wheels and bearings', 'Row cleaners and gauge wheels'];
const REVIEW_LIST = ["Walk through next season's roadmap items", 'Confirm budget and order dates'];
/** Start minutes (local) of the four visit slots of a spring check-up day. */
const SPRING_SLOTS = [480, 600, 780, 900];

type NewVisit = {
  accountId: number;
  specialistId: number | null;
  planterId: null;
  purpose: VisitPurpose;
  status: VisitStatus;
  startsAt: Date | null;
  durationMin: number;
  windowStartMin: number | null;
  windowEndMin: number | null;
  fixed: boolean;
  notes: string | null;
  checklist: { label: string; done: boolean }[];
  roadmapItemIds: number[];
  requestedByContactId: number | null;
};

const weekday = (dateIso: string) => new Date(`${dateIso}T12:00:00Z`).getUTCDay(); // 0 Sunday … 6 Saturday

/** The weekday on or before the date (Saturday and Sunday step back to Friday). */
const weekdayOnOrBefore = (dateIso: string) => (weekday(dateIso) === 0 ? addDays(dateIso, -2) : weekday(dateIso) === 6 ? addDays(dateIso, -1) : dateIso);

/**
 * Seeds the demo visits; returns how many were written. `now` fixes "today" (tests, repeatable
 * demos); `specialistIds` limits the seeding to those specialists (default: every active one).
 */
export async function seedDemoVisits(sequelize: Sequelize, options: { now?: Date; specialistIds?: number[] } = {}): Promise<{ created: number }> {
  const now = options.now ?? new Date();
  const timeZone = DEFAULT_TIME_ZONE;
  const random = createRng(20261201);
  const today = toLocal(now, timeZone).date;
  const [year, month] = today.split('-').map(Number);
  const springYear = month >= 7 ? year : year - 1;
  const nextMonday = addDays(today, ((8 - weekday(today)) % 7) || 7);

  const specialists = await User.findAll({
    where: { role: 'specialist', disabled: false, ...(options.specialistIds ? { id: options.specialistIds } : {}) },
    order: [['id', 'ASC']],
  });
  const accounts = await Account.findAll({ where: { status: 'active' }, order: [['id', 'ASC']] });
  const growerAccountIds = new Set((await User.findAll({ where: { role: 'grower' }, attributes: ['accountId'] })).map((u) => u.accountId));
  const contacts = await Contact.findAll({ attributes: ['id', 'accountId'], order: [['id', 'ASC']] });
  const firstContact = new Map<number, number>();
  for (const c of contacts) if (!firstContact.has(c.accountId)) firstContact.set(c.accountId, c.id);

  const rows: NewVisit[] = [];
  const visit = (v: Partial<NewVisit> & Pick<NewVisit, 'accountId' | 'specialistId' | 'purpose' | 'status'>): NewVisit => ({
    planterId: null,
    startsAt: null,
    durationMin: DEFAULT_DURATION_MIN[v.purpose],
    windowStartMin: null,
    windowEndMin: null,
    fixed: false,
    notes: null,
    checklist: [],
    roadmapItemIds: [],
    requestedByContactId: null,
    ...v,
  });

  for (const specialist of specialists) {
    const mine = accounts.filter((a) => a.specialistId === specialist.id);
    if (!mine.length) continue;

    // Last spring: most accounts had their check-up, four a day on weekdays from early March.
    let day = `${springYear}-03-02`;
    let slot = 0;
    const nextSpringSlot = () => {
      while (weekday(day) === 0 || weekday(day) === 6) day = addDays(day, 1);
      const startsAt = fromLocal(day, SPRING_SLOTS[slot], timeZone);
      slot = (slot + 1) % SPRING_SLOTS.length;
      if (slot === 0) day = addDays(day, 1);
      return startsAt;
    };
    mine.forEach((account, k) => {
      // The first account of the territory (the demo grower's, for the first specialist) always had one.
      if (k > 0 && random() < 0.25) return;
      rows.push(
        visit({
          accountId: account.id,
          specialistId: specialist.id,
          purpose: 'pre-season-checkup',
          status: 'done',
          startsAt: nextSpringSlot(),
          checklist: CHECKUP_LIST.map((label) => ({ label, done: true })),
          notes: random() < 0.3 ? 'Replaced worn seed discs on several rows; meters calibrated.' : null,
        }),
      );
    });

    // Six and seven weeks ago: a couple of troubleshooting calls.
    mine.slice(1, 3).forEach((account, k) => {
      rows.push(
        visit({
          accountId: account.id,
          specialistId: specialist.id,
          purpose: 'troubleshooting',
          status: 'done',
          startsAt: fromLocal(weekdayOnOrBefore(addDays(today, k === 0 ? -49 : -42)), 600, timeZone),
          notes: k === 0 ? 'Row 7 seed sensor intermittent: harness connector replaced.' : 'Downforce valve sticking on the left wing: cleaned and tested.',
        }),
      );
    });

    // Coming weeks: check-ups the growers asked for (some with a time window), and roadmap reviews.
    // Farms whose growers sign in to Rowpath are left without one: the pre-season reminder's
    // booking link is theirs to use (it only says "already requested" when a request is open).
    const requesting = mine.filter((a) => !growerAccountIds.has(a.id));
    requesting.slice(0, 8).forEach((account, k) => {
      const morning = k % 3 === 1;
      const afternoon = k % 3 === 2;
      rows.push(
        visit({
          accountId: account.id,
          specialistId: specialist.id,
          purpose: 'pre-season-checkup',
          status: 'requested',
          windowStartMin: morning ? 480 : afternoon ? 780 : null,
          windowEndMin: morning ? 720 : afternoon ? 1020 : null,
          requestedByContactId: k % 2 === 0 ? (firstContact.get(account.id) ?? null) : null,
          checklist: CHECKUP_LIST.map((label) => ({ label, done: false })),
          notes: morning ? 'Mornings suit the grower best.' : afternoon ? 'After lunch, please.' : null,
        }),
      );
    });
    requesting.slice(8, 11).forEach((account) => {
      rows.push(visit({ accountId: account.id, specialistId: specialist.id, purpose: 'roadmap-review', status: 'requested', checklist: REVIEW_LIST.map((label) => ({ label, done: false })) }));
    });

    // Next week: two fixed appointments, Tuesday 10:00 and Thursday 14:00.
    const fixedOn = [
      { account: mine[0], date: addDays(nextMonday, 1), minute: 600, purpose: 'roadmap-review' as const },
      { account: mine[Math.min(11, mine.length - 1)], date: addDays(nextMonday, 3), minute: 840, purpose: 'install' as const },
    ];
    for (const f of fixedOn) {
      rows.push(
        visit({
          accountId: f.account.id,
          specialistId: specialist.id,
          purpose: f.purpose,
          status: 'planned',
          fixed: true,
          startsAt: fromLocal(f.date, f.minute, timeZone),
          durationMin: f.purpose === 'install' ? 180 : 60,
          notes: f.purpose === 'install' ? 'Install electric row drives on the main bar; grower will have the planter in the shop.' : 'Grower asked to go over the 2-season plan at the kitchen table.',
        }),
      );
    }
  }

  await sequelize.transaction(async (transaction) => {
    await Visit.bulkCreate(rows, { transaction });
  });
  return { created: rows.length };
}
