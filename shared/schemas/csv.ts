import { z } from 'zod';
import { accountListQuerySchema, crops, type Crop } from './accounts.js';

// CSV exchange of accounts and contacts: an RFC 4180 reader and writer (no CSV package is installed),
// the column layout of the account import/export file, and the query and report shapes of the API.

// ---------- RFC 4180 ----------

export interface CsvRecord {
  /** Physical line (1-based) on which the record starts; quoted fields may span several lines. */
  line: number;
  fields: string[];
  /** Set when the record breaks the format (stray quote, unclosed quote). */
  error?: string;
}

/**
 * Reads RFC 4180 text: fields split by commas, records by CRLF (a lone LF or CR is accepted too),
 * fields in double quotes may hold commas, quotes (doubled) and line breaks. A leading byte-order
 * mark is skipped and empty lines are ignored. Broken records are kept with an `error` so that a
 * caller can report every bad line, not only the first.
 */
export function parseCsv(text: string): CsvRecord[] {
  const records: CsvRecord[] = [];
  const n = text.length;
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 1;
  while (i < n) {
    const startLine = line;
    const fields: string[] = [];
    let error: string | undefined;
    let quotedAny = false;
    for (;;) {
      let value = '';
      if (text[i] === '"') {
        quotedAny = true;
        i++;
        let closed = false;
        let start = i;
        while (i < n) {
          const c = text[i];
          if (c === '"') {
            value += text.slice(start, i);
            if (text[i + 1] === '"') {
              value += '"';
              i += 2;
              start = i;
              continue;
            }
            i++;
            closed = true;
            break;
          }
          // CRLF counts once (at the LF); a lone CR is a line break of its own.
          if (c === '\n' || (c === '\r' && text[i + 1] !== '\n')) line++;
          i++;
        }
        if (!closed) {
          value += text.slice(start, i);
          error ??= `The quoted field that opens on line ${startLine} is never closed`;
        }
        const after = i;
        while (i < n && text[i] !== ',' && text[i] !== '\n' && text[i] !== '\r') i++;
        if (i > after) {
          error ??= 'Text follows a closing quote: put the whole field in quotes';
          value += text.slice(after, i);
        }
      } else {
        const start = i;
        while (i < n && text[i] !== ',' && text[i] !== '\n' && text[i] !== '\r') i++;
        value = text.slice(start, i);
        if (value.includes('"')) error ??= 'A quote appears inside a field that is not quoted: quote the field and double the quote';
      }
      fields.push(value);
      if (i < n && text[i] === ',') {
        i++;
        continue;
      }
      if (text[i] === '\r') i += text[i + 1] === '\n' ? 2 : 1;
      else if (text[i] === '\n') i++;
      line++;
      break;
    }
    const blank = fields.length === 1 && fields[0] === '' && !quotedAny;
    if (!blank) records.push(error ? { line: startLine, fields, error } : { line: startLine, fields });
  }
  return records;
}

/** One field as RFC 4180 wants it: quoted when it holds a comma, quote or line break (or edge spaces). */
export function csvField(value: string): string {
  return /[",\r\n]/.test(value) || /^\s|\s$/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** Records as RFC 4180 text with CRLF line ends. A lone empty field is written `""` so the record survives. */
export function toCsv(rows: string[][]): string {
  return rows.map((r) => (r.length === 1 && r[0] === '' ? '""' : r.map(csvField).join(','))).join('\r\n') + '\r\n';
}

// Spreadsheets run a cell that starts with = + - @ (or a tab/CR) as a formula. Text cells that would
// are written with a leading apostrophe, and the reader takes exactly one apostrophe off again, so
// an export read back gives the original text (numbers are never guarded: -98.1 stays -98.1).
const FORMULA_START = /^'*[=+\-@\t\r]/;
const GUARDED = /^'+[=+\-@\t\r]/;
export const guardFormula = (text: string) => (FORMULA_START.test(text) ? `'${text}` : text);
export const unguardFormula = (text: string) => (GUARDED.test(text) ? text.slice(1) : text);

// ---------- the accounts file ----------

export const acresColumn = (crop: Crop) => `acres_${crop}` as const;

/**
 * Columns of the accounts file (export and import). One row per contact; an account's columns are
 * repeated on each of its contacts' rows, and an account without contacts has one row with the
 * contact columns empty. Column order is free on import; names are matched case-insensitively.
 */
export const accountColumns = [
  'account_ref',
  'account_name',
  'status',
  'territory',
  'specialist_email',
  'address',
  'town',
  'state',
  'lat',
  'lng',
  ...crops.map(acresColumn),
  'notes',
] as const;
export const contactColumns = ['contact_name', 'contact_role', 'contact_email', 'contact_phone', 'contact_reminders', 'contact_unsubscribed_at'] as const;
export const accountFileColumns = [...accountColumns, ...contactColumns] as const;
export type AccountFileColumn = (typeof accountFileColumns)[number];
export const requiredAccountFileColumns: AccountFileColumn[] = ['account_name', 'territory'];
export const numericAccountFileColumns: AccountFileColumn[] = ['lat', 'lng', ...crops.map(acresColumn)];

/** What each column holds: shown beside the import form and kept here as the file's documentation. */
export const accountFileColumnHelp: Record<AccountFileColumn, string> = {
  account_ref:
    'Groups rows into one account: rows with the same value are the same account. The export writes the account id; on import it is only a grouping key (a new account is always created). Empty: rows with the same account_name and territory are grouped.',
  account_name: 'Name of the operation (required).',
  status: 'active, prospect or inactive (empty: active).',
  territory: 'Territory name, exactly as Rowpath spells it (required). Staff may import only into territories they cover.',
  specialist_email: 'E-mail of the specialist assigned to the account; the specialist must cover the territory. Empty: none.',
  address: 'Street address.',
  town: 'Town.',
  state: 'Two-letter state code.',
  lat: 'Latitude of the farm office, decimal degrees (-90 to 90).',
  lng: 'Longitude of the farm office, decimal degrees (-180 to 180).',
  ...(Object.fromEntries(crops.map((c) => [acresColumn(c), `Acres of ${c} a year (empty: none recorded).`])) as Record<`acres_${Crop}`, string>),
  notes: 'Free notes; may hold line breaks (the field is then quoted).',
  contact_name: 'Contact name. Leave every contact column empty for an account row without a contact.',
  contact_role: 'Role on the farm (owner, operator, agronomist…).',
  contact_email: 'Contact e-mail.',
  contact_phone: 'Contact phone.',
  contact_reminders: 'yes or no: the contact receives season reminders (empty: yes).',
  contact_unsubscribed_at: 'When the contact unsubscribed from reminders (ISO date-time, UTC), or empty.',
};

/** Columns of the contacts export (one row per contact, for mailing and calling lists). */
export const contactExportColumns = ['account_ref', 'account_name', 'territory', 'contact_id', ...contactColumns] as const;

// ---------- API shapes ----------

export const accountExportQuerySchema = accountListQuerySchema.pick({ sort: true, q: true, territoryId: true, status: true });
export type AccountExportQuery = z.infer<typeof accountExportQuerySchema>;
export const contactExportQuerySchema = accountExportQuerySchema.extend({ accountId: z.coerce.number().int().positive().optional() });
export type ContactExportQuery = z.infer<typeof contactExportQuerySchema>;

export const importModes = ['preview', 'commit'] as const;
export const importQuerySchema = z.object({ mode: z.enum(importModes, { error: 'Add ?mode=preview or ?mode=commit' }) });
export type ImportQuery = z.infer<typeof importQuerySchema>;

export const MAX_IMPORT_BYTES = 2 * 1024 * 1024;

/** A problem found on one line: the column it is in (null when it concerns the whole line) and why. */
export interface ImportIssue {
  line: number;
  column: string | null;
  message: string;
}

export interface ImportedContact {
  name: string;
  roleOnFarm: string | null;
  email: string | null;
  phone: string | null;
  reminderOptIn: boolean;
  unsubscribedAt: string | null;
}

export interface ImportedAccount {
  name: string;
  status: string;
  territoryId: number;
  territoryName: string;
  specialistId: number | null;
  specialistEmail: string | null;
  address: string | null;
  town: string | null;
  state: string | null;
  lat: number | null;
  lng: number | null;
  acresByCrop: Partial<Record<Crop, number>>;
  notes: string | null;
}

/** One data line as read: its account group and, when valid, the parsed account and contact. */
export interface ImportRow {
  line: number;
  group: string;
  ok: boolean;
  account: ImportedAccount | null;
  contact: ImportedContact | null;
}

export interface ImportReport {
  mode: (typeof importModes)[number];
  /** True when the file has no errors (a commit would import it whole). */
  ok: boolean;
  committed: boolean;
  summary: { lines: number; accounts: number; contacts: number; badLines: number };
  rows: ImportRow[];
  errors: ImportIssue[];
  warnings: ImportIssue[];
  /** Ids of the accounts created (commit only). */
  accountIds: number[];
}
