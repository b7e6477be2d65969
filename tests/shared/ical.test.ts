import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  checkCalendar,
  escapeText,
  foldLine,
  formatUtc,
  isEscapedText,
  unescapeText,
  writeCalendar,
  MAX_LINE_OCTETS,
  ROWPATH_PRODID,
  type IcalEvent,
} from '@shared/calc/ical';

const octets = (s: string) => new TextEncoder().encode(s).length;
const unfold = (text: string) => text.replace(/\r\n[ \t]/g, '');

function event(over: Partial<IcalEvent> = {}): IcalEvent {
  return {
    uid: 'visit-1@rowpath.test',
    stamp: new Date(Date.UTC(2026, 11, 1, 12, 0, 0)),
    start: new Date(Date.UTC(2026, 11, 7, 15, 0, 0)),
    end: new Date(Date.UTC(2026, 11, 7, 16, 30, 0)),
    summary: 'Pre-season check-up',
    ...over,
  };
}

/** Value of one property of the first event, unfolded and unescaped. */
function eventValue(text: string, name: string): string | undefined {
  const { calendar } = checkCalendar(text);
  const value = calendar?.children[0]?.properties.find((p) => p.name === name)?.value;
  return value === undefined ? undefined : unescapeText(value);
}

describe('escapeText', () => {
  it('when a value spans three lines, then it matches the RFC 5545 §3.3.11 example', () => {
    // RFC 5545 §3.3.11 (TEXT), example: the three-line value is written with \n between the lines.
    expect(escapeText('Project XYZ Final Review\nConference Room - 3B\nCome Prepared.')).toBe('Project XYZ Final Review\\nConference Room - 3B\\nCome Prepared.');
  });

  it('when a value holds backslash, semicolon, comma and colon, then the first three are escaped and the colon is not', () => {
    // RFC 5545 §3.3.11: BACKSLASH, SEMICOLON and COMMA MUST be escaped; a COLON SHALL NOT be.
    expect(escapeText('Row units 1-8; 9,16 \\ at 10:30')).toBe('Row units 1-8\\; 9\\,16 \\\\ at 10:30');
    expect(escapeText('a\r\nb\rc')).toBe('a\\nb\\nc');
  });

  it('when any text is escaped, then it is valid TEXT and unescapes to the same text', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme' }), (raw) => {
        const text = raw.replace(/[\x00-\x08\x0b-\x1f\x7f]/g, '').replace(/\r\n?/g, '\n');
        const escaped = escapeText(text);
        expect(isEscapedText(escaped)).toBe(true);
        expect(unescapeText(escaped)).toBe(text);
      }),
      { numRuns: 300 },
    );
  });
});

describe('foldLine', () => {
  it('when a line is 75 octets or fewer, then it is left whole', () => {
    // RFC 5545 §3.1: lines SHOULD NOT be longer than 75 octets, excluding the line break.
    const line = `SUMMARY:${'x'.repeat(67)}`;
    expect(octets(line)).toBe(75);
    expect(foldLine(line)).toBe(line);
    expect(MAX_LINE_OCTETS).toBe(75);
  });

  it('when a line is longer, then every piece is at most 75 octets, pieces join with CRLF and one space, and unfolding restores it', () => {
    const line = `DESCRIPTION:${'Check seed meters, closing wheels and downforce. '.repeat(6)}`;
    const folded = foldLine(line);
    const pieces = folded.split('\r\n');
    expect(pieces.length).toBeGreaterThan(1);
    expect(octets(pieces[0])).toBe(75);
    for (const piece of pieces) expect(octets(piece)).toBeLessThanOrEqual(75);
    for (const piece of pieces.slice(1)) expect(piece.startsWith(' ')).toBe(true);
    expect(unfold(folded)).toBe(line);
  });

  it('when a long line holds multi-octet characters, then no UTF-8 sequence is split', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme', minLength: 1, maxLength: 400 }), (raw) => {
        const line = `LOCATION:${raw.replace(/[\r\n]/g, '')}`;
        const folded = foldLine(line);
        for (const piece of folded.split('\r\n')) {
          expect(octets(piece)).toBeLessThanOrEqual(75);
          // A fatal decoder throws on a piece that ends or starts inside a character.
          expect(() => new TextDecoder('utf-8', { fatal: true }).decode(new TextEncoder().encode(piece))).not.toThrow();
          expect(piece).not.toMatch(/[\ud800-\udbff]$/);
        }
        expect(unfold(folded)).toBe(line);
      }),
      { numRuns: 300 },
    );
  });
});

describe('formatUtc', () => {
  it('when given 1998-01-19 07:00 UTC, then it prints the RFC 5545 §3.3.5 UTC form 19980119T070000Z', () => {
    // RFC 5545 §3.3.5 (DATE-TIME), FORM #2 example: 19980119T070000Z.
    expect(formatUtc(new Date(Date.UTC(1998, 0, 19, 7, 0, 0)))).toBe('19980119T070000Z');
  });

  it('when the date is invalid, then it throws', () => {
    expect(() => formatUtc(new Date('nope'))).toThrow(RangeError);
  });
});

describe('writeCalendar', () => {
  it('when a feed is written, then it ends every line with CRLF and passes every check', () => {
    const text = writeCalendar({
      prodId: ROWPATH_PRODID,
      name: 'Rowpath visits, Hesketh Farms',
      refreshIntervalMin: 60,
      events: [
        event(),
        event({
          uid: 'visit-2@rowpath.test',
          summary: 'Roadmap review; 2027 season, electric drives',
          description: `Planter: 16-row 30-in\nChecklist: row cleaners, seed tubes, closing wheels\n${'Long note about downforce settings and singulation. '.repeat(5)}`,
          location: 'Hesketh Farms, 2210 Rd B, Mankato, KS',
          geo: { lat: 39.787123456, lng: -98.21 },
          status: 'TENTATIVE',
          sequence: 3,
          lastModified: new Date(Date.UTC(2026, 10, 30, 8, 0, 0)),
          categories: ['Roadmap review', 'Rowpath'],
        }),
      ],
    });
    expect(text.endsWith('\r\n')).toBe(true);
    expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
    const { problems, calendar } = checkCalendar(text);
    expect(problems).toEqual([]);
    expect(calendar!.children).toHaveLength(2);
    expect(text).toContain(`PRODID:${ROWPATH_PRODID}\r\n`);
    expect(text).toContain('DTSTART:20261207T150000Z\r\n');
    expect(text).toContain('DTEND:20261207T163000Z\r\n');
    expect(text).toContain('DTSTAMP:20261201T120000Z\r\n');
    expect(text).toContain('GEO:39.787123;-98.21\r\n');
    expect(eventValue(text, 'UID')).toBe('visit-1@rowpath.test');
    const second = checkCalendar(text).calendar!.children[1].properties;
    expect(unescapeText(second.find((p) => p.name === 'SUMMARY')!.value)).toBe('Roadmap review; 2027 season, electric drives');
    expect(second.find((p) => p.name === 'CATEGORIES')!.value).toBe('Roadmap review,Rowpath');
  });

  it('when summaries and descriptions are arbitrary text, then the feed still passes and reads back the same', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme', maxLength: 300 }), fc.string({ unit: 'grapheme', maxLength: 300 }), (summaryRaw, descriptionRaw) => {
        const clean = (s: string) => s.replace(/[\x00-\x08\x0b-\x1f\x7f]/g, '').replace(/\r\n?/g, '\n');
        const summary = clean(summaryRaw) || 'Visit';
        const description = clean(descriptionRaw);
        const text = writeCalendar({ prodId: ROWPATH_PRODID, events: [event({ summary, description })] });
        expect(checkCalendar(text).problems).toEqual([]);
        expect(eventValue(text, 'SUMMARY')).toBe(summary);
        if (description) expect(eventValue(text, 'DESCRIPTION')).toBe(description);
      }),
      { numRuns: 200 },
    );
  });

  it('when an event ends before it starts or has no UID, then writing refuses it', () => {
    expect(() => writeCalendar({ prodId: ROWPATH_PRODID, events: [event({ end: new Date(Date.UTC(2026, 11, 7, 14, 0, 0)) })] })).toThrow(/ends before/);
    expect(() => writeCalendar({ prodId: ROWPATH_PRODID, events: [event({ uid: '\r\n' })] })).toThrow(/UID/);
  });
});

describe('checkCalendar', () => {
  const good = writeCalendar({ prodId: ROWPATH_PRODID, events: [event()] });

  it('when the text is good, then it finds no problem', () => {
    expect(checkCalendar(good).problems).toEqual([]);
  });

  it('when lines end with LF only, then it says so', () => {
    expect(checkCalendar(good.replace(/\r\n/g, '\n')).problems.join('\n')).toMatch(/bare LF/);
  });

  it('when a line is longer than 75 octets, then it says so', () => {
    const long = good.replace('SUMMARY:Pre-season check-up', `SUMMARY:${'é'.repeat(40)}`);
    expect(checkCalendar(long).problems.join('\n')).toMatch(/line \d+ is 88 octets long/);
  });

  it('when BEGIN and END do not pair, then it says so', () => {
    expect(checkCalendar(good.replace('END:VEVENT\r\n', '')).problems.join('\n')).toMatch(/END:VCALENDAR closes BEGIN:VEVENT|never closed/);
    expect(checkCalendar(good.replace('END:VCALENDAR\r\n', '')).problems.join('\n')).toMatch(/BEGIN:VCALENDAR is never closed/);
  });

  it('when required properties are missing, then each is named', () => {
    const problems = checkCalendar(good.replace(/UID:[^\r]*\r\n/, '').replace(/DTSTAMP:[^\r]*\r\n/, '').replace(/PRODID:[^\r]*\r\n/, '')).problems.join('\n');
    expect(problems).toMatch(/0 UID/);
    expect(problems).toMatch(/0 DTSTAMP/);
    expect(problems).toMatch(/VCALENDAR has 0 PRODID/);
  });

  it('when a time is local rather than UTC, or the end precedes the start, then it says so', () => {
    expect(checkCalendar(good.replace('DTSTART:20261207T150000Z', 'DTSTART:20261207T090000')).problems.join('\n')).toMatch(/not a UTC DATE-TIME/);
    expect(checkCalendar(good.replace('DTEND:20261207T163000Z', 'DTEND:20261207T140000Z')).problems.join('\n')).toMatch(/DTEND is not after DTSTART/);
  });

  it('when TEXT holds a bare comma or semicolon, then it says so', () => {
    expect(checkCalendar(good.replace('SUMMARY:Pre-season check-up', 'SUMMARY:Check-up, planter')).problems.join('\n')).toMatch(/SUMMARY is not escaped TEXT/);
    expect(isEscapedText('a\\qb')).toBe(false);
    expect(isEscapedText('10:30\\, row 4\\; done\\n')).toBe(true);
  });
});
