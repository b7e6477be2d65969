// iCalendar (RFC 5545) writer for Rowpath's visit feeds, and a checker for the rules the writer
// must keep. Pure: events in, text out. Every time is written in UTC ("Z" form), so no
// VTIMEZONE component is needed and any calendar program places the visit correctly.

export interface IcalEvent {
  /** Globally unique and stable across feeds, so a calendar updates the event instead of duplicating it. */
  uid: string;
  /** When this copy of the event was produced. */
  stamp: Date;
  start: Date;
  end: Date;
  summary: string;
  description?: string;
  location?: string;
  geo?: { lat: number; lng: number };
  status?: 'TENTATIVE' | 'CONFIRMED' | 'CANCELLED';
  /** Raised each time the event changes (the record's version serves). */
  sequence?: number;
  lastModified?: Date;
  categories?: string[];
}

export interface IcalCalendar {
  /** PRODID value; Rowpath's own. */
  prodId: string;
  /** Display name (X-WR-CALNAME, understood by most calendar programs). */
  name?: string;
  /** Suggested polling interval for subscribed feeds (REFRESH-INTERVAL, RFC 7986), minutes. */
  refreshIntervalMin?: number;
  events: readonly IcalEvent[];
}

export const ROWPATH_PRODID = '-//Rowpath//Visit calendar 1.0//EN';
/** RFC 5545 §3.1: content lines SHOULD NOT be longer than 75 octets, excluding the line break. */
export const MAX_LINE_OCTETS = 75;
const CRLF = '\r\n';
const encoder = new TextEncoder();
const octets = (s: string) => encoder.encode(s).length;

/** RFC 5545 §3.3.11 TEXT: backslash, semicolon and comma are escaped; a line break becomes \n. */
export function escapeText(value: string): string {
  return value
    .replace(/\\/g, '\\\\')
    .replace(/;/g, '\\;')
    .replace(/,/g, '\\,')
    .replace(/\r\n|\r|\n/g, '\\n');
}

/**
 * RFC 5545 §3.1 folding: a line longer than 75 octets is split by CRLF followed by one space.
 * Splits fall between characters, never inside a UTF-8 sequence (nor between surrogate halves).
 */
export function foldLine(line: string): string {
  if (octets(line) <= MAX_LINE_OCTETS) return line;
  const parts: string[] = [];
  let current = '';
  let currentOctets = 0;
  // Continuation lines begin with the folding space, which counts against their 75 octets.
  let limit = MAX_LINE_OCTETS;
  for (const char of line) {
    const size = octets(char);
    if (currentOctets + size > limit) {
      parts.push(current);
      current = '';
      currentOctets = 0;
      limit = MAX_LINE_OCTETS - 1;
    }
    current += char;
    currentOctets += size;
  }
  parts.push(current);
  return parts.join(`${CRLF} `);
}

const pad2 = (n: number) => String(n).padStart(2, '0');

/** RFC 5545 §3.3.5 DATE-TIME, UTC form: 19980119T070000Z. Seconds are truncated. */
export function formatUtc(date: Date): string {
  if (Number.isNaN(date.getTime())) throw new RangeError('formatUtc: invalid date');
  return (
    `${String(date.getUTCFullYear()).padStart(4, '0')}${pad2(date.getUTCMonth() + 1)}${pad2(date.getUTCDate())}` +
    `T${pad2(date.getUTCHours())}${pad2(date.getUTCMinutes())}${pad2(date.getUTCSeconds())}Z`
  );
}

/** A UID may not hold line breaks; anything else passes (it is not TEXT, so no escaping). */
function cleanUid(uid: string): string {
  const clean = uid.replace(/[\r\n]/g, '');
  if (!clean) throw new RangeError('An event needs a UID');
  return clean;
}

function eventLines(event: IcalEvent): string[] {
  if (!(event.end.getTime() > event.start.getTime())) throw new RangeError(`Event ${event.uid} ends before it starts`);
  const lines = [
    'BEGIN:VEVENT',
    `UID:${cleanUid(event.uid)}`,
    `DTSTAMP:${formatUtc(event.stamp)}`,
    `DTSTART:${formatUtc(event.start)}`,
    `DTEND:${formatUtc(event.end)}`,
    `SUMMARY:${escapeText(event.summary)}`,
  ];
  if (event.description) lines.push(`DESCRIPTION:${escapeText(event.description)}`);
  if (event.location) lines.push(`LOCATION:${escapeText(event.location)}`);
  // GEO is two FLOATs separated by a semicolon (§3.8.1.6), up to 6 decimals.
  if (event.geo) lines.push(`GEO:${Number(event.geo.lat.toFixed(6))};${Number(event.geo.lng.toFixed(6))}`);
  if (event.status) lines.push(`STATUS:${event.status}`);
  if (event.sequence !== undefined) lines.push(`SEQUENCE:${Math.max(0, Math.floor(event.sequence))}`);
  if (event.lastModified) lines.push(`LAST-MODIFIED:${formatUtc(event.lastModified)}`);
  if (event.categories?.length) lines.push(`CATEGORIES:${event.categories.map(escapeText).join(',')}`);
  lines.push('TRANSP:OPAQUE', 'END:VEVENT');
  return lines;
}

/** The whole calendar object, CRLF after every line (the last included), long lines folded. */
export function writeCalendar(calendar: IcalCalendar): string {
  const lines = ['BEGIN:VCALENDAR', 'VERSION:2.0', `PRODID:${calendar.prodId}`, 'CALSCALE:GREGORIAN', 'METHOD:PUBLISH'];
  if (calendar.name) lines.push(`X-WR-CALNAME:${escapeText(calendar.name)}`, `NAME:${escapeText(calendar.name)}`);
  if (calendar.refreshIntervalMin) {
    const minutes = Math.max(1, Math.round(calendar.refreshIntervalMin));
    lines.push(`REFRESH-INTERVAL;VALUE=DURATION:PT${minutes}M`, `X-PUBLISHED-TTL:PT${minutes}M`);
  }
  for (const event of calendar.events) lines.push(...eventLines(event));
  lines.push('END:VCALENDAR');
  return lines.map(foldLine).join(CRLF) + CRLF;
}

// ---------- checker ----------

export interface IcalProperty {
  name: string;
  params: string;
  value: string;
}
export interface IcalComponent {
  name: string;
  properties: IcalProperty[];
  children: IcalComponent[];
}

const NAME = /^[A-Za-z0-9-]+$/;
const UTC_DATE_TIME = /^\d{8}T\d{6}Z$/;

function propertyOf(line: string): IcalProperty | null {
  // The value starts after the first colon that is not inside a quoted parameter value (§3.1).
  let inQuotes = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (c === '"') inQuotes = !inQuotes;
    else if (c === ':' && !inQuotes) {
      const head = line.slice(0, i);
      const semi = head.indexOf(';');
      return { name: (semi < 0 ? head : head.slice(0, semi)).toUpperCase(), params: semi < 0 ? '' : head.slice(semi + 1), value: line.slice(i + 1) };
    }
  }
  return null;
}

/** True when a TEXT value keeps §3.3.11: no bare ; or , no control characters, only known escapes. */
export function isEscapedText(value: string): boolean {
  for (let i = 0; i < value.length; i++) {
    const c = value[i];
    if (c === '\\') {
      if (!'\\;,nN'.includes(value[i + 1] ?? '')) return false;
      i++;
    } else if (c === ';' || c === ',' || (c.charCodeAt(0) < 0x20 && c !== '\t') || c === '\x7f') return false;
  }
  return true;
}

const TEXT_PROPERTIES = new Set(['SUMMARY', 'DESCRIPTION', 'LOCATION', 'COMMENT', 'X-WR-CALNAME', 'NAME']);

/**
 * Reads a calendar and lists every way it breaks the rules Rowpath's feeds must keep:
 * CRLF line ends, lines of at most 75 octets, paired BEGIN/END, VERSION and PRODID on the
 * calendar, UID, DTSTAMP and DTSTART on every event, UTC DATE-TIME values, DTEND after DTSTART,
 * escaped TEXT. An empty list means the text passes. Also returns the parsed components.
 */
export function checkCalendar(text: string): { problems: string[]; calendar: IcalComponent | null } {
  const problems: string[] = [];
  if (!text.endsWith(CRLF)) problems.push('the text does not end with CRLF');
  // Every CR must be followed by LF and every LF preceded by CR.
  for (let i = 0; i < text.length; i++) {
    if (text[i] === '\r' && text[i + 1] !== '\n') problems.push(`bare CR at offset ${i}`);
    if (text[i] === '\n' && text[i - 1] !== '\r') problems.push(`bare LF at offset ${i}`);
  }
  const physical = text.split(CRLF);
  if (physical[physical.length - 1] === '') physical.pop();
  physical.forEach((line, n) => {
    if (octets(line) > MAX_LINE_OCTETS) problems.push(`line ${n + 1} is ${octets(line)} octets long (more than ${MAX_LINE_OCTETS})`);
  });
  // Unfold: a line that begins with a space or tab continues the one before (§3.1).
  const logical: string[] = [];
  for (const line of physical) {
    if ((line.startsWith(' ') || line.startsWith('\t')) && logical.length) logical[logical.length - 1] += line.slice(1);
    else logical.push(line);
  }

  const stack: IcalComponent[] = [];
  let root: IcalComponent | null = null;
  logical.forEach((line, n) => {
    if (line === '') {
      problems.push(`line ${n + 1} is empty`);
      return;
    }
    const prop = propertyOf(line);
    if (!prop || !NAME.test(prop.name)) {
      problems.push(`line ${n + 1} is not a content line: ${line.slice(0, 40)}`);
      return;
    }
    if (prop.name === 'BEGIN') {
      const component: IcalComponent = { name: prop.value.toUpperCase(), properties: [], children: [] };
      if (stack.length) stack[stack.length - 1].children.push(component);
      else if (root) problems.push('more than one top-level component');
      else root = component;
      stack.push(component);
      return;
    }
    if (prop.name === 'END') {
      const open = stack.pop();
      if (!open) problems.push(`END:${prop.value} without BEGIN`);
      else if (open.name !== prop.value.toUpperCase()) problems.push(`END:${prop.value} closes BEGIN:${open.name}`);
      return;
    }
    if (!stack.length) {
      problems.push(`property ${prop.name} outside any component`);
      return;
    }
    stack[stack.length - 1].properties.push(prop);
  });
  for (const open of stack) problems.push(`BEGIN:${open.name} is never closed`);

  const calendar = root as IcalComponent | null;
  if (!calendar || calendar.name !== 'VCALENDAR') {
    problems.push('the text is not a VCALENDAR');
    return { problems, calendar };
  }
  const one = (c: IcalComponent, name: string) => c.properties.filter((p) => p.name === name);
  const requireOnce = (c: IcalComponent, name: string, where: string) => {
    const count = one(c, name).length;
    if (count !== 1) problems.push(`${where} has ${count} ${name} properties (exactly 1 required)`);
  };
  requireOnce(calendar, 'VERSION', 'VCALENDAR');
  requireOnce(calendar, 'PRODID', 'VCALENDAR');
  if (one(calendar, 'VERSION')[0]?.value !== '2.0') problems.push('VERSION is not 2.0');
  if (!calendar.children.length) problems.push('the calendar holds no component (RFC 5545 requires at least one)');
  for (const p of calendar.properties) if (TEXT_PROPERTIES.has(p.name) && !isEscapedText(p.value)) problems.push(`VCALENDAR: ${p.name} is not escaped TEXT`);

  const uids = new Set<string>();
  for (const event of calendar.children.filter((c) => c.name === 'VEVENT')) {
    const uid = one(event, 'UID')[0]?.value ?? '(no UID)';
    const where = `VEVENT ${uid}`;
    for (const name of ['UID', 'DTSTAMP', 'DTSTART']) requireOnce(event, name, where);
    if (uids.has(uid)) problems.push(`UID ${uid} is used twice`);
    uids.add(uid);
    for (const name of ['DTSTAMP', 'DTSTART', 'DTEND', 'LAST-MODIFIED']) {
      for (const p of one(event, name)) if (!UTC_DATE_TIME.test(p.value)) problems.push(`${where}: ${name} ${p.value} is not a UTC DATE-TIME`);
    }
    const start = one(event, 'DTSTART')[0]?.value;
    const end = one(event, 'DTEND')[0]?.value;
    if (end && one(event, 'DURATION').length) problems.push(`${where}: DTEND and DURATION together`);
    if (start && end && UTC_DATE_TIME.test(start) && UTC_DATE_TIME.test(end) && end <= start) problems.push(`${where}: DTEND is not after DTSTART`);
    for (const p of event.properties) {
      if (TEXT_PROPERTIES.has(p.name) && !isEscapedText(p.value)) problems.push(`${where}: ${p.name} is not escaped TEXT`);
    }
    const status = one(event, 'STATUS')[0]?.value;
    if (status && !['TENTATIVE', 'CONFIRMED', 'CANCELLED'].includes(status)) problems.push(`${where}: STATUS ${status} is not one for an event`);
  }
  return { problems, calendar };
}

/** Reverses escapeText, for reading a TEXT value back. */
export function unescapeText(value: string): string {
  return value.replace(/\\([\\;,nN])/g, (_m, c: string) => (c === 'n' || c === 'N' ? '\n' : c));
}
