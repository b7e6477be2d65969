// The forecast page's URL filters, season pairing and money parsing (pure client helpers).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { quotaSchema } from '@shared/schemas/forecast';
import { forecastExportHref, joinSeasons, panelFilters } from '@/features/forecast/api/forecast';
import { currentSeason, pageGroupBys, parseForecastParams, toForecastParams, type ForecastFilters } from '@/features/forecast/api/forecast-params';
import { formatShare, parseUsdText } from '@/features/forecast/api/format';

const row = (key: string, weightedUsd: number, pipelineUsd = weightedUsd * 2) => ({ key, label: key, pipelineUsd, weightedUsd, actualUsd: 0, itemCount: 1 });

describe('forecast filters in the URL', () => {
  it('when the address is empty, then the page groups by season with no other filter', () => {
    expect(parseForecastParams(new URLSearchParams())).toEqual({ groupBy: 'season' });
  });

  it('when the address holds nonsense, then each odd value falls back to its default instead of failing', () => {
    const f = parseForecastParams(new URLSearchParams('groupBy=colour&season=27&from=2027-13&to=march&territoryId=-4&specialistId=abc&category=%20%20'));
    expect(f).toEqual({ groupBy: 'season' });
  });

  it('when the first month is after the last, then the last is dropped rather than sent to the server as a 400', () => {
    const f = parseForecastParams(new URLSearchParams('from=2027-05&to=2027-02'));
    expect(f.from).toBe('2027-05');
    expect(f.to).toBeUndefined();
  });

  it('when any valid filters are written to the URL and read back, then they are the same filters', () => {
    const month = fc.tuple(fc.integer({ min: 2000, max: 2100 }), fc.integer({ min: 1, max: 12 })).map(([y, m]) => `${y}-${String(m).padStart(2, '0')}`);
    const filters = fc.record(
      {
        groupBy: fc.constantFrom(...pageGroupBys),
        season: fc.integer({ min: 2000, max: 2100 }),
        from: month,
        to: month,
        territoryId: fc.integer({ min: 1, max: 99_999 }),
        specialistId: fc.integer({ min: 1, max: 99_999 }),
        category: fc.constantFrom('seed-meter', 'downforce', 'row-cleaner'),
      },
      { requiredKeys: ['groupBy'] },
    );
    fc.assert(
      fc.property(filters, (f) => {
        const valid: ForecastFilters = { ...f };
        if (valid.from && valid.to && valid.from > valid.to) delete valid.to;
        expect(parseForecastParams(toForecastParams(valid))).toEqual(valid);
      }),
    );
  });

  it('when the grouping is the default, then it is left out of the address', () => {
    expect(toForecastParams({ groupBy: 'season', season: 2027 }).toString()).toBe('season=2027');
    expect(toForecastParams({ groupBy: 'category' }).toString()).toBe('groupBy=category');
  });

  it('when the CSV is exported, then its address carries the same filters (and a drill-down key when given)', () => {
    expect(forecastExportHref({ groupBy: 'category', season: 2028, territoryId: 3 })).toBe('/api/forecast/export.csv?groupBy=category&season=2028&territoryId=3');
    expect(forecastExportHref({ groupBy: 'specialist', season: 2027 }, 'none')).toBe('/api/forecast/export.csv?groupBy=specialist&season=2027&key=none');
  });
});

describe('this season and the next', () => {
  it('when it is before July, then this season is this year; from July on it is next year (common practice)', () => {
    expect(currentSeason(new Date('2027-03-15T12:00:00Z'))).toBe(2027);
    expect(currentSeason(new Date('2027-06-30T23:59:59Z'))).toBe(2027);
    expect(currentSeason(new Date('2026-07-01T00:00:00Z'))).toBe(2027);
    expect(currentSeason(new Date('2026-12-01T23:12:00Z'))).toBe(2027);
  });

  it('when a category sells in only one of two seasons, then it still gets one line with zero in the other', () => {
    const rows = joinSeasons([2027, 2028], [[row('downforce', 100), row('seed-meter', 50)], [row('seed-meter', 300), row('row-cleaner', 20)]]);
    expect(rows.map((r) => r.key)).toEqual(['seed-meter', 'downforce', 'row-cleaner']);
    expect(rows[0].bySeason[2027].weightedUsd).toBe(50);
    expect(rows[0].bySeason[2028].weightedUsd).toBe(300);
    expect(rows[1].bySeason[2028]).toEqual({ pipelineUsd: 0, weightedUsd: 0, actualUsd: 0, itemCount: 0 });
    expect(rows[2].bySeason[2027].itemCount).toBe(0);
  });

  it('when a season has not loaded yet, then the other season still shows', () => {
    const rows = joinSeasons([2027, 2028], [undefined, [row('downforce', 10)]]);
    expect(rows).toHaveLength(1);
    expect(rows[0].bySeason[2027].weightedUsd).toBe(0);
  });

  it('when a panel groups by category, then the page’s category filter is not applied to it but the others are', () => {
    const page: ForecastFilters = { groupBy: 'month', season: 2030, from: '2027-01', territoryId: 2, specialistId: 5, category: 'downforce' };
    expect(panelFilters(page, 'category', 2027)).toEqual({ groupBy: 'category', season: 2027, territoryId: 2, specialistId: 5, category: undefined });
    expect(panelFilters(page, 'specialist', 2028)).toEqual({ groupBy: 'specialist', season: 2028, territoryId: 2, specialistId: undefined, category: 'downforce' });
  });
});

describe('quota amounts typed by a manager', () => {
  it('when a quota is typed with a dollar sign and separators, then it reads as the plain amount', () => {
    expect(parseUsdText('$420,000')).toBe(420_000);
    expect(parseUsdText(' 385000.50 ')).toBe(385_000.5);
    expect(parseUsdText('')).toBeUndefined();
    expect(parseUsdText('lots')).toBeNaN();
  });

  it('when a quota below zero is typed, then the shared schema refuses it with the server’s field message', () => {
    const result = quotaSchema.safeParse({ territoryId: 1, season: 2027, quotaUsd: parseUsdText('-5') });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0].message).toBe('A quota cannot be below zero');
  });

  it('when attainment is a share, then it shows as a whole percentage; without a quota it says so', () => {
    expect(formatShare(0.4213)).toBe('42 %');
    expect(formatShare(1.26)).toBe('126 %');
    expect(formatShare(null)).toBe('No quota');
  });
});
