import { describe, expect, it } from 'vitest';
import { reminderSchedule, windowStartIso } from '@shared/calc/season-calendar';
import { parseOutboxParams, toOutboxParams, outboxHref } from '@/features/reminders/api/outbox-params';
import { changedCampaignFields, checkCampaignForm, formValuesFromCampaign, placeServerFields, type CampaignFormValues } from '@/features/reminders/model/campaign-form';
import { formatOffsets, parseOffsetsText } from '@/features/reminders/model/offsets';
import { estimateRun } from '@/features/reminders/model/run-estimate';
import { comingSeason, dateInputFromMonthDay, formatIsoDay, formatMonthDay, monthDayFromDateInput } from '@/features/reminders/model/season';

const good: CampaignFormValues = {
  name: 'Pre-season check-up — corn 2027',
  season: '2027',
  regionKey: 'ks-north-central',
  crop: 'corn',
  offsetsText: '60, 30, 10',
  status: 'active',
  territoryIds: [1, 2],
  growsCrop: true,
  hasRoadmapItems: false,
  noCheckupSince: '2026-09-01',
  subject: '{{grower.firstName}}, time to book your planter check-up',
  body: 'Hello {{grower.firstName}},\n\n{{checklist}}\n\n{{bookingLink}}',
};

describe('reading the offsets box', () => {
  it('when days are typed with commas, words or "and", then they read as whole days', () => {
    expect(parseOffsetsText('60, 30, 10')).toEqual([60, 30, 10]);
    expect(parseOffsetsText('60 30 and 10 days')).toEqual([60, 30, 10]);
    expect(parseOffsetsText('  ')).toEqual([]);
  });

  it('when a part is not a whole number, then the box reads as unreadable rather than dropping it', () => {
    expect(parseOffsetsText('60, thirty')).toBeNull();
    expect(parseOffsetsText('7.5')).toBeNull();
    expect(parseOffsetsText('-10')).toBeNull();
  });

  it('when stored offsets fill the box, then they read back the same', () => {
    expect(parseOffsetsText(formatOffsets([45, 15]))).toEqual([45, 15]);
  });
});

describe('checking the campaign form with the shared schema', () => {
  it('when the form is complete, then it becomes the API body with offsets latest-first and the audience nested', () => {
    const r = checkCampaignForm({ ...good, offsetsText: '10, 60, 30' });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.input.offsetsDays).toEqual([60, 30, 10]);
    expect(r.input.season).toBe(2027);
    expect(r.input.audience).toEqual({ territoryIds: [1, 2], growsCrop: true, hasRoadmapItems: false, noCheckupSince: '2026-09-01' });
  });

  it('when the check-up date is left empty, then the audience has no check-up limit', () => {
    const r = checkCampaignForm({ ...good, noCheckupSince: '' });
    expect(r.ok && r.input.audience.noCheckupSince).toBeNull();
  });

  it('when the template names an unknown field, then the message lands on the body box', () => {
    const r = checkCampaignForm({ ...good, body: 'Hi {{grower.nickname}}' });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors.body).toMatch(/Unknown merge field \{\{grower\.nickname\}\}/);
  });

  it('when offsets repeat, exceed a year or are missing, then the message lands on the offsets box', () => {
    for (const offsetsText of ['30, 30', '400', '']) {
      const r = checkCampaignForm({ ...good, offsetsText });
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.errors.offsetsText, offsetsText).toBeTruthy();
    }
  });

  it('when the offsets box holds words and other fields are wrong too, then every box gets its message', () => {
    const r = checkCampaignForm({ ...good, offsetsText: 'sixty', name: ' ', territoryIds: [] });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors.offsetsText).toMatch(/whole numbers/);
    expect(r.errors.name).toBe('Name the campaign');
    expect(r.errors.territoryIds).toBe('Choose at least one territory');
  });

  it('when the season is not a year, then the season box says so', () => {
    const r = checkCampaignForm({ ...good, season: '27x' });
    expect(!r.ok && r.errors.season).toBeTruthy();
  });

  it('when the server answers with field paths, then each lands on its box and the rest is said above the form', () => {
    const placed = placeServerFields({ 'audience.territoryIds': 'One of those territories does not exist', regionKey: 'No window', body: 'Unknown merge field {{x}}', version: 'Reload' });
    expect(placed.errors).toEqual({ territoryIds: 'One of those territories does not exist', regionKey: 'No window', body: 'Unknown merge field {{x}}' });
    expect(placed.unplaced).toEqual(['Reload']);
  });

  it('when a saved campaign is edited, then only the changed fields are sent, the audience whole', () => {
    const before = checkCampaignForm(good);
    const after = checkCampaignForm({ ...good, subject: 'New {{season}}', hasRoadmapItems: true });
    expect(before.ok && after.ok).toBe(true);
    if (!before.ok || !after.ok) return;
    expect(changedCampaignFields(before.input, after.input)).toEqual({ subject: 'New {{season}}', audience: { ...before.input.audience, hasRoadmapItems: true } });
    expect(changedCampaignFields(before.input, before.input)).toEqual({});
  });

  it('when a stored campaign fills the form, then saving it unchanged gives the same body back', () => {
    const stored = { name: 'Soy', season: 2027, regionKey: 'ks-north-central', crop: 'soybean', offsetsDays: [45, 15], status: 'draft' as const, audience: { territoryIds: [3], growsCrop: true, hasRoadmapItems: false, noCheckupSince: null }, subject: 'S {{season}}', body: 'B' };
    const r = checkCampaignForm(formValuesFromCampaign(stored));
    expect(r.ok && { ...r.input }).toEqual({ ...stored });
  });
});

describe('season days in date boxes', () => {
  it('when a window day fills a date box, then it shows in the season being looked at, and reads back as month-day', () => {
    expect(dateInputFromMonthDay(2027, '04-15')).toBe('2027-04-15');
    expect(monthDayFromDateInput('2027-04-15')).toBe('04-15');
    expect(monthDayFromDateInput('')).toBe('');
    expect(dateInputFromMonthDay(2027, '02-30')).toBe('');
  });

  it('when days are shown, then they read as words and never shift with the browser zone', () => {
    expect(formatMonthDay('04-15')).toBe('Apr 15');
    expect(formatIsoDay('2026-11-26')).toBe('Nov 26, 2026');
    expect(formatIsoDay('2027-02-14', true)).toBe('Sun, Feb 14, 2027');
  });

  it('when it is after midsummer, then the coming season is next year; before, this year', () => {
    expect(comingSeason('2026-12-01')).toBe(2027);
    expect(comingSeason('2026-07-01')).toBe(2027);
    expect(comingSeason('2027-03-10')).toBe(2027);
  });

  it('when the demo corn campaign is dated on Dec 1, 2026, then its reminders fall on Feb 14, Mar 16 and Apr 5 (Kansas corn window opens Apr 15: USDA-NASS Handbook 628 via K-State)', () => {
    const rows = reminderSchedule(windowStartIso(2027, '04-15'), [60, 30, 10], '2026-12-01');
    expect(rows.map((r) => r.sendOn)).toEqual(['2027-02-14', '2027-03-16', '2027-04-05']);
    expect(rows.every((r) => r.state === 'upcoming')).toBe(true);
  });
});

describe('counting what Run now would enqueue', () => {
  it('when some of the audience already have today’s reminder, then only the others are counted', () => {
    const queued = [
      { contactId: 1, offsetDays: 140 },
      { contactId: 2, offsetDays: 60 }, // another reminder of the campaign: does not count
      { contactId: 9, offsetDays: 140 }, // no longer in the audience (unsubscribed): does not count
    ];
    expect(estimateRun([1, 2, 3, 4], queued, 140)).toEqual({ audience: 4, alreadyQueued: 1, wouldEnqueue: 3 });
  });

  it('when no reminder is due, then nothing would be enqueued', () => {
    expect(estimateRun([1, 2], [], null)).toEqual({ audience: 2, alreadyQueued: 0, wouldEnqueue: 0 });
  });

  it('when the audience lists a contact twice (two pages read while it changed), then they count once', () => {
    expect(estimateRun([5, 5, 6], [], 30).wouldEnqueue).toBe(2);
  });
});

describe('outbox filters in the address', () => {
  it('when the address holds a status and a campaign, then they are the filters; odd values fall back', () => {
    expect(parseOutboxParams(new URLSearchParams('status=failed&campaignId=3&page=2'))).toMatchObject({ status: 'failed', campaignId: 3, page: 2 });
    expect(parseOutboxParams(new URLSearchParams('status=lost&campaignId=-1&page=x'))).toMatchObject({ status: undefined, campaignId: undefined, page: 1 });
  });

  it('when filters are written back, then defaults are left out and a campaign link is short', () => {
    expect(toOutboxParams({ page: 1 }).toString()).toBe('');
    expect(outboxHref({ campaignId: 4, status: 'sent' })).toBe('/reminders/outbox?status=sent&campaignId=4');
  });
});
