// Reminder templates: plain text with merge fields such as {{grower.name}}. A template is checked
// when it is saved, so an unknown or misspelt field is refused then and never reaches a grower.
// Rendering gives the three parts a message needs: subject, plain text and HTML. The HTML has no
// images and no remote resources at all, so a message cannot carry a tracking pixel.

export type MergeFieldKind = 'text' | 'list' | 'link';
export interface MergeFieldInfo {
  kind: MergeFieldKind;
  description: string;
  /** Shown when a list is empty. */
  emptyText?: string;
  /** The words of a link in the HTML part. */
  linkLabel?: string;
}

/** Every field a template may use. Anything else is refused at save time. */
export const MERGE_FIELDS = {
  'grower.name': { kind: 'text', description: "The contact's full name" },
  'grower.firstName': { kind: 'text', description: "The contact's first name" },
  'account.name': { kind: 'text', description: 'The farm operation' },
  'specialist.name': { kind: 'text', description: "The account's specialist" },
  'specialist.email': { kind: 'text', description: "The specialist's e-mail address" },
  season: { kind: 'text', description: 'The planting season, e.g. 2027' },
  crop: { kind: 'text', description: 'The crop the campaign is for' },
  windowStart: { kind: 'text', description: 'The day the planting window opens, e.g. April 15, 2027' },
  daysBefore: { kind: 'text', description: 'Days from this reminder to the window start' },
  planters: { kind: 'list', description: "The grower's planters", emptyText: 'No planters are on record yet.' },
  roadmapItems: { kind: 'list', description: "This season's roadmap items", emptyText: 'No upgrades are planned for this season.' },
  checklist: { kind: 'list', description: 'The pre-season check-up checklist' },
  bookingLink: { kind: 'link', description: 'Link to request a check-up visit', linkLabel: 'Request a pre-season check-up' },
  unsubscribeLink: { kind: 'link', description: 'One-click unsubscribe link', linkLabel: 'Unsubscribe from these reminders' },
} as const satisfies Record<string, MergeFieldInfo>;

export type MergeField = keyof typeof MERGE_FIELDS;
export const MERGE_FIELD_NAMES = Object.keys(MERGE_FIELDS) as MergeField[];

/**
 * What a pre-season check-up covers. Opener discs: a 15-in disc is replaced when worn to about
 * 14.5 in (common practice; Penn State Extension no-till planter guidance).
 */
export const PRE_SEASON_CHECKLIST: readonly string[] = Object.freeze([
  'Opener disc wear: measure the discs and replace 15-in discs worn to 14.5 in',
  'Seed meter calibration on the test stand, at this season’s population',
  'Hoses and fittings: hydraulic, liquid and air lines for cracks and leaks',
  'Display and controller software updated to the current release',
]);

export type MergeValues = { [K in MergeField]: (typeof MERGE_FIELDS)[K]['kind'] extends 'list' ? readonly string[] : string };

export interface TemplateInput {
  subject: string;
  body: string;
}

export interface RenderedMessage {
  subject: string;
  text: string;
  html: string;
}

type Token = { kind: 'text'; value: string } | { kind: 'field'; name: string };

const FIELD = /\{\{\s*([^{}]*?)\s*\}\}/g;

/** Splits a template into literal text and {{field}} tokens; throws on a brace left open. */
function tokenize(template: string): Token[] {
  const tokens: Token[] = [];
  let last = 0;
  for (const match of template.matchAll(FIELD)) {
    if (match.index > last) tokens.push({ kind: 'text', value: template.slice(last, match.index) });
    tokens.push({ kind: 'field', name: match[1] });
    last = match.index + match[0].length;
  }
  if (last < template.length) tokens.push({ kind: 'text', value: template.slice(last) });
  return tokens;
}

export interface TemplateCheck {
  /** Field names used that Rowpath does not know, in order of first use. */
  unknownFields: string[];
  /** A description of broken braces, or null. */
  malformed: string | null;
}

/** The fields a template uses that are not merge fields, and any broken braces. */
export function checkTemplate(template: string): TemplateCheck {
  const unknownFields: string[] = [];
  for (const token of tokenize(template)) {
    if (token.kind === 'field' && !(token.name in MERGE_FIELDS) && !unknownFields.includes(token.name)) unknownFields.push(token.name);
  }
  // Braces left after removing every well-formed field are a typo such as "{{grower.name}".
  const rest = template.replace(FIELD, '');
  const malformed = /\{\{|\}\}/.test(rest) ? 'A merge field is not closed: write fields as {{grower.name}}.' : null;
  return { unknownFields, malformed };
}

/** One message per template part that cannot be saved ({ body: "Unknown merge field …" }); empty when both are fine. */
export function templateProblems(input: Partial<TemplateInput>): Partial<Record<keyof TemplateInput, string>> {
  const problems: Partial<Record<keyof TemplateInput, string>> = {};
  for (const part of ['subject', 'body'] as const) {
    const text = input[part];
    if (text === undefined) continue;
    const { unknownFields, malformed } = checkTemplate(text);
    if (unknownFields.length) {
      const names = unknownFields.map((f) => `{{${f}}}`).join(', ');
      problems[part] = `Unknown merge field${unknownFields.length > 1 ? 's' : ''} ${names}. Use one of: ${MERGE_FIELD_NAMES.map((f) => `{{${f}}}`).join(', ')}.`;
    } else if (malformed) {
      problems[part] = malformed;
    } else if (part === 'subject') {
      const links = tokenize(text).filter((t) => t.kind === 'field' && MERGE_FIELDS[t.name as MergeField].kind !== 'text');
      if (links.length) problems.subject = 'A subject line takes text fields only, not lists or links.';
    }
  }
  return problems;
}

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** Only web links may be placed in a message. */
function safeUrl(url: string): string {
  return /^https?:\/\//i.test(url) ? url : '#';
}

function joinList(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function fieldText(name: MergeField, values: MergeValues): string {
  const info: MergeFieldInfo = MERGE_FIELDS[name];
  const value = values[name];
  if (info.kind === 'list') {
    const items = value as readonly string[];
    return items.length ? joinList(items) : (info.emptyText ?? '');
  }
  return String(value);
}

function fieldHtml(name: MergeField, values: MergeValues): string {
  const info: MergeFieldInfo = MERGE_FIELDS[name];
  if (info.kind === 'link') return `<a href="${escapeHtml(safeUrl(String(values[name])))}" style="color:#2f3a6b">${escapeHtml(info.linkLabel ?? String(values[name]))}</a>`;
  return escapeHtml(fieldText(name, values));
}

const P = 'margin:0 0 14px 0;line-height:1.5';

/** One paragraph: a lone list field becomes a bulleted list, a lone link a button-like link. */
function renderParagraph(paragraph: string, values: MergeValues): { text: string; html: string } {
  const tokens = tokenize(paragraph.trim());
  if (tokens.length === 1 && tokens[0].kind === 'field') {
    const name = tokens[0].name as MergeField;
    const info: MergeFieldInfo = MERGE_FIELDS[name];
    if (info.kind === 'list') {
      const items = values[name] as readonly string[];
      if (!items.length) return { text: info.emptyText ?? '', html: `<p style="${P}">${escapeHtml(info.emptyText ?? '')}</p>` };
      return {
        text: items.map((i) => `  - ${i}`).join('\n'),
        html: `<ul style="margin:0 0 14px 0;padding-left:22px;line-height:1.5">${items.map((i) => `<li>${escapeHtml(i)}</li>`).join('')}</ul>`,
      };
    }
    if (info.kind === 'link') {
      const url = String(values[name]);
      // The booking link is the message's one action; unsubscribing stays a plain, quiet link.
      const style = name === 'bookingLink' ? 'display:inline-block;padding:10px 16px;background:#2f3a6b;color:#ffffff;text-decoration:none;border-radius:4px' : 'color:#5a4f44';
      return {
        text: `${info.linkLabel}: ${url}`,
        html: `<p style="${P}"><a href="${escapeHtml(safeUrl(url))}" style="${style}">${escapeHtml(info.linkLabel ?? url)}</a></p>`,
      };
    }
  }
  let text = '';
  let html = '';
  for (const token of tokens) {
    if (token.kind === 'text') {
      text += token.value;
      html += escapeHtml(token.value).replace(/\n/g, '<br>');
    } else {
      text += fieldText(token.name as MergeField, values);
      html += fieldHtml(token.name as MergeField, values);
    }
  }
  return { text, html: `<p style="${P}">${html}</p>` };
}

/**
 * Fills a checked template for one grower. Paragraphs are separated by a blank line. When the
 * body has no {{unsubscribeLink}}, a footer with it is added: every reminder can be refused in one click.
 */
export function renderTemplate(template: TemplateInput, values: MergeValues): RenderedMessage {
  const problems = templateProblems(template);
  const first = problems.subject ?? problems.body;
  if (first) throw new Error(first);
  const subject = tokenize(template.subject)
    .map((t) => (t.kind === 'text' ? t.value : fieldText(t.name as MergeField, values)))
    .join('')
    .replace(/\s+/g, ' ')
    .trim();
  const paragraphs = template.body.replace(/\r\n/g, '\n').split(/\n[ \t]*\n/).filter((p) => p.trim().length);
  const parts = paragraphs.map((p) => renderParagraph(p, values));
  if (!tokenize(template.body).some((t) => t.kind === 'field' && t.name === 'unsubscribeLink')) {
    parts.push(renderParagraph('You receive these pre-season reminders from your dealership.', values), renderParagraph('{{unsubscribeLink}}', values));
  }
  const text = `${parts.map((p) => p.text).join('\n\n')}\n`;
  const html =
    // A language and a title, so that a screen reader opening the message on its own reads it right.
    '<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>A reminder from your dealership</title></head>' +
    '<body style="margin:0;padding:0;background:#f4f1ec">' +
    '<div style="max-width:600px;margin:0 auto;padding:24px;background:#ffffff;color:#22263a;font-family:Arial,Helvetica,sans-serif;font-size:16px">' +
    parts.map((p) => p.html).join('') +
    '</div></body></html>';
  return { subject, text, html };
}

/** Example values, for a preview before any grower is chosen and for tests. */
export function sampleMergeValues(links: { bookingLink: string; unsubscribeLink: string }): MergeValues {
  return {
    'grower.name': 'Avery Sample',
    'grower.firstName': 'Avery',
    'account.name': 'Sample Family Farms',
    'specialist.name': 'Your specialist',
    'specialist.email': 'specialist@example.test',
    season: '2027',
    crop: 'corn',
    windowStart: 'April 15, 2027',
    daysBefore: '60',
    planters: ['16-row planter, 30-in rows'],
    roadmapItems: [],
    checklist: PRE_SEASON_CHECKLIST,
    ...links,
  };
}
