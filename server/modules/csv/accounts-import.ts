// Import of accounts and their contacts from one CSV file (columns in shared/schemas/csv.ts).
// Every line is checked before anything is written; a commit writes all of it in one transaction
// or none of it, and the report names every bad line with its reason.
import { Op, type Sequelize } from 'sequelize';
import { accountSchema, crops, type AccountStatus } from '../../../shared/schemas/accounts.js';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import {
  accountColumns,
  accountFileColumns,
  acresColumn,
  contactColumns,
  parseCsv,
  requiredAccountFileColumns,
  unguardFormula,
  type AccountFileColumn,
  type CsvRecord,
  type ImportedAccount,
  type ImportedContact,
  type ImportIssue,
  type ImportReport,
  type ImportRow,
} from '../../../shared/schemas/csv.js';
import { contactSchema } from '../../../shared/schemas/fleet.js';
import { Account, AuditEvent, Contact, Territory, User, UserTerritory } from '../../db/models/index.js';
import { AppError } from '../../http/errors.js';

// The account fields are checked without the two ids: those come from names looked up here.
const accountFieldsSchema = accountSchema.omit({ territoryId: true, specialistId: true });

const accountFieldColumn: Record<string, AccountFileColumn> = {
  name: 'account_name',
  status: 'status',
  address: 'address',
  town: 'town',
  state: 'state',
  lat: 'lat',
  lng: 'lng',
  notes: 'notes',
};
const contactFieldColumn: Record<string, AccountFileColumn> = {
  name: 'contact_name',
  roleOnFarm: 'contact_role',
  email: 'contact_email',
  phone: 'contact_phone',
  reminderOptIn: 'contact_reminders',
};

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const ISO_DATE_TIME = /^\d{4}-\d{2}-\d{2}([T ]\d{2}:\d{2}(:\d{2}(\.\d{1,6})?)?(Z|[+-]\d{2}:?\d{2})?)?$/;

type Cells = Record<AccountFileColumn, string>;

interface Line {
  line: number;
  cells: Cells;
  group: string;
  issues: ImportIssue[];
  contact: ImportedContact | null;
}

interface Group {
  key: string;
  lines: Line[];
  account: ImportedAccount | null;
}

export interface ImportPlan {
  report: ImportReport;
  groups: Group[];
}

// Names looked up in Rowpath (territory, specialist) and the status word are matched without case.
const comparable = (column: AccountFileColumn, value: string) => (column === 'territory' || column === 'specialist_email' || column === 'status' ? value.toLowerCase() : value);

const normaliseHeader = (h: string) => h.trim().toLowerCase().replace(/[\s-]+/g, '_');

function readHeader(record: CsvRecord | undefined): { columns: (AccountFileColumn | null)[]; issues: ImportIssue[] } {
  const issues: ImportIssue[] = [];
  if (!record) return { columns: [], issues: [{ line: 1, column: null, message: 'The file is empty: the first line must name the columns' }] };
  if (record.error) issues.push({ line: record.line, column: null, message: record.error });
  const known = new Set<string>(accountFileColumns);
  const seen = new Set<string>();
  const columns = record.fields.map((raw) => {
    const name = normaliseHeader(raw);
    if (!known.has(name)) {
      issues.push({ line: record.line, column: raw, message: `Unknown column "${raw}": the columns are ${accountFileColumns.join(', ')}` });
      return null;
    }
    if (seen.has(name)) issues.push({ line: record.line, column: name, message: `The column ${name} appears twice` });
    seen.add(name);
    return name as AccountFileColumn;
  });
  for (const required of requiredAccountFileColumns) {
    if (!seen.has(required)) issues.push({ line: record.line, column: required, message: `The column ${required} is required` });
  }
  return { columns, issues };
}

function cellsOf(record: CsvRecord, columns: (AccountFileColumn | null)[]): Cells {
  const cells = Object.fromEntries(accountFileColumns.map((c) => [c, ''])) as Cells;
  columns.forEach((column, i) => {
    if (column) cells[column] = unguardFormula(record.fields[i] ?? '').trim();
  });
  return cells;
}

/** A number column: empty is null, anything not a plain decimal is NaN (the schema then names it). */
const numberCell = (v: string) => (v === '' ? null : NUMBER.test(v) ? Number(v) : Number.NaN);

function readContact(cells: Cells, issues: ImportIssue[], line: number): ImportedContact | null {
  if (contactColumns.every((c) => cells[c] === '')) return null;
  const reminders = cells.contact_reminders.toLowerCase();
  let reminderOptIn: boolean | undefined;
  if (['yes', 'y', 'true', '1'].includes(reminders)) reminderOptIn = true;
  else if (['no', 'n', 'false', '0'].includes(reminders)) reminderOptIn = false;
  else if (reminders !== '') issues.push({ line, column: 'contact_reminders', message: 'Use yes or no' });

  let unsubscribedAt: string | null = null;
  const when = cells.contact_unsubscribed_at;
  if (when !== '') {
    // A time without a zone is read as UTC, the zone Rowpath keeps every timestamp in.
    const withZone = /[T ]\d{2}:\d{2}/.test(when) && !/(Z|[+-]\d{2}:?\d{2})$/.test(when) ? `${when.replace(' ', 'T')}Z` : when.replace(' ', 'T');
    const ms = ISO_DATE_TIME.test(when) ? Date.parse(withZone) : Number.NaN;
    if (Number.isNaN(ms)) issues.push({ line, column: 'contact_unsubscribed_at', message: 'Use an ISO date-time such as 2026-01-15T09:30:00Z, or leave it empty' });
    else unsubscribedAt = new Date(ms).toISOString();
  }

  const parsed = contactSchema.safeParse({
    name: cells.contact_name,
    roleOnFarm: cells.contact_role,
    email: cells.contact_email,
    phone: cells.contact_phone,
    reminderOptIn,
  });
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      issues.push({ line, column: contactFieldColumn[String(issue.path[0])] ?? null, message: issue.message });
    }
    return null;
  }
  return { ...parsed.data, unsubscribedAt };
}

function accountRaw(cells: Cells) {
  const acresByCrop: Record<string, number | null> = {};
  for (const crop of crops) {
    const v = numberCell(cells[acresColumn(crop)]);
    if (v !== null) acresByCrop[crop] = v;
  }
  return {
    name: cells.account_name,
    status: cells.status === '' ? undefined : cells.status.toLowerCase(),
    address: cells.address,
    town: cells.town,
    state: cells.state,
    lat: numberCell(cells.lat),
    lng: numberCell(cells.lng),
    acresByCrop,
    notes: cells.notes,
  };
}

interface Lookups {
  territories: Map<string, { id: number; name: string }>;
  specialists: Map<string, { id: number; email: string; territoryIds: Set<number> }>;
}

async function lookUp(lines: Line[]): Promise<Lookups> {
  const territoryNames = [...new Set(lines.map((l) => l.cells.territory).filter(Boolean))];
  const emails = [...new Set(lines.map((l) => l.cells.specialist_email.toLowerCase()).filter(Boolean))];
  const [territoryRows, userRows] = await Promise.all([
    territoryNames.length ? Territory.findAll({ where: { name: { [Op.in]: territoryNames } }, attributes: ['id', 'name'] }) : [],
    emails.length ? User.findAll({ where: { email: { [Op.in]: emails }, role: 'specialist', disabled: false }, attributes: ['id', 'email'] }) : [],
  ]);
  const links = userRows.length ? await UserTerritory.findAll({ where: { userId: { [Op.in]: userRows.map((u) => u.id) } } }) : [];
  const territories = new Map(territoryRows.map((t) => [t.name.toLowerCase(), { id: t.id, name: t.name }]));
  const specialists = new Map(
    userRows.map((u) => [u.email.toLowerCase(), { id: u.id, email: u.email, territoryIds: new Set(links.filter((l) => l.userId === u.id).map((l) => l.territoryId)) }]),
  );
  return { territories, specialists };
}

function readAccount(user: SessionUser, group: Group, lookups: Lookups, issues: ImportIssue[]): ImportedAccount | null {
  const first = group.lines[0];
  const { cells, line } = first;
  const also = group.lines.length > 1 ? ` (the account's other lines: ${group.lines.slice(1).map((l) => l.line).join(', ')})` : '';
  const push = (column: string | null, message: string) => issues.push({ line, column, message: `${message}${also}` });
  const before = issues.length;

  const territory = lookups.territories.get(cells.territory.toLowerCase());
  if (!cells.territory) push('territory', 'Give the territory name');
  else if (!territory) push('territory', `No territory is named "${cells.territory}"`);
  else if (user.role !== 'admin' && !user.territoryIds.includes(territory.id)) push('territory', `You do not cover the territory ${territory.name}`);

  let specialist: { id: number; email: string } | null = null;
  if (cells.specialist_email) {
    const found = lookups.specialists.get(cells.specialist_email.toLowerCase());
    if (!found) push('specialist_email', `No active specialist has the e-mail ${cells.specialist_email}`);
    else if (territory && !found.territoryIds.has(territory.id)) push('specialist_email', `${found.email} does not cover the territory ${territory.name}`);
    else specialist = found;
  }

  const parsed = accountFieldsSchema.safeParse(accountRaw(cells));
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const [field, crop] = issue.path.map(String);
      const column = field === 'acresByCrop' && crop ? `acres_${crop}` : accountFieldColumn[field] ?? null;
      push(column, issue.message);
    }
  }
  if (issues.length > before || !parsed.success || !territory) return null;
  return {
    ...parsed.data,
    territoryId: territory.id,
    territoryName: territory.name,
    specialistId: specialist?.id ?? null,
    specialistEmail: specialist?.email ?? null,
  };
}

/**
 * Reads and checks a whole file without writing anything. Staff only (the router checks the role);
 * territories must be ones the user covers, unless an admin.
 */
export async function planAccountImport(user: SessionUser, text: string, mode: ImportReport['mode']): Promise<ImportPlan> {
  const records = parseCsv(text);
  const { columns, issues: headerIssues } = readHeader(records[0]);
  const issues: ImportIssue[] = [...headerIssues];
  const warnings: ImportIssue[] = [];
  const data = records.slice(1);
  if (records.length && !data.length) issues.push({ line: 2, column: null, message: 'The file has no rows under its header' });

  const lines: Line[] = [];
  const groups = new Map<string, Group>();
  if (!headerIssues.length) {
    for (const record of data) {
      const lineIssues: ImportIssue[] = [];
      if (record.error) lineIssues.push({ line: record.line, column: null, message: record.error });
      if (record.fields.length !== columns.length)
        lineIssues.push({ line: record.line, column: null, message: `This line has ${record.fields.length} fields; the header has ${columns.length}` });
      const cells = cellsOf(record, columns);
      const key = cells.account_ref ? `ref:${cells.account_ref}` : `name:${cells.account_name.toLowerCase()}|${cells.territory.toLowerCase()}`;
      const line: Line = { line: record.line, cells, group: cells.account_ref || cells.account_name, issues: lineIssues, contact: null };
      line.contact = readContact(cells, lineIssues, record.line);
      const group = groups.get(key);
      if (group) {
        // Rows of one account repeat its columns; a difference means two accounts were mixed up.
        const differ = accountColumns.filter((c) => c !== 'account_ref' && comparable(c, group.lines[0].cells[c]) !== comparable(c, cells[c]));
        if (differ.length)
          lineIssues.push({
            line: record.line,
            column: differ[0],
            message: `Same account as line ${group.lines[0].line} but ${differ.join(', ')} ${differ.length === 1 ? 'differs' : 'differ'}: repeat the account's columns exactly`,
          });
        group.lines.push(line);
      } else {
        groups.set(key, { key, lines: [line], account: null });
      }
      lines.push(line);
    }

    const lookups = await lookUp(lines);
    for (const group of groups.values()) {
      const accountIssues: ImportIssue[] = [];
      group.account = readAccount(user, group, lookups, accountIssues);
      group.lines[0].issues.push(...accountIssues);
    }
    await warnAboutExisting([...groups.values()], warnings);
  }

  for (const line of lines) issues.push(...line.issues);
  issues.sort((a, b) => a.line - b.line);
  const groupOf = new Map<Line, Group>();
  for (const g of groups.values()) for (const l of g.lines) groupOf.set(l, g);
  const rows: ImportRow[] = lines.map((l) => {
    const account = groupOf.get(l)!.account;
    return { line: l.line, group: l.group, ok: !l.issues.length && account !== null, account, contact: l.contact };
  });
  const ok = issues.length === 0;
  return {
    groups: [...groups.values()],
    report: {
      mode,
      ok,
      committed: false,
      summary: {
        lines: data.length,
        accounts: groups.size,
        contacts: lines.filter((l) => l.contact).length,
        badLines: new Set(issues.map((i) => i.line)).size,
      },
      rows,
      errors: issues,
      warnings,
      accountIds: [],
    },
  };
}

async function warnAboutExisting(groups: Group[], warnings: ImportIssue[]) {
  const valid = groups.filter((g) => g.account);
  if (!valid.length) return;
  const existing = await Account.findAll({
    where: { territoryId: { [Op.in]: [...new Set(valid.map((g) => g.account!.territoryId))] }, name: { [Op.in]: [...new Set(valid.map((g) => g.account!.name))] } },
    attributes: ['id', 'name', 'territoryId'],
  });
  for (const g of valid) {
    const twin = existing.find((a) => a.territoryId === g.account!.territoryId && a.name.toLowerCase() === g.account!.name.toLowerCase());
    if (twin)
      warnings.push({ line: g.lines[0].line, column: 'account_name', message: `An account named ${twin.name} already exists in ${g.account!.territoryName} (id ${twin.id}): importing adds a second one` });
  }
}

const CHUNK = 500;

/**
 * Writes a checked plan: every account, its contacts and an audit line per account, in one
 * transaction. A plan with any error is refused whole (400) and nothing is written.
 */
export async function commitAccountImport(sequelize: Sequelize, user: SessionUser, plan: ImportPlan): Promise<ImportReport> {
  const { report } = plan;
  if (!report.ok) {
    throw new AppError('import_rejected', 400, `${report.summary.badLines} ${report.summary.badLines === 1 ? 'line has' : 'lines have'} problems: nothing was imported.`, {
      errors: report.errors,
      warnings: report.warnings,
      summary: report.summary,
    });
  }
  const accountIds = await sequelize.transaction(async (transaction) => {
    const ids: number[] = [];
    const at = new Date();
    for (let start = 0; start < plan.groups.length; start += CHUNK) {
      const chunk = plan.groups.slice(start, start + CHUNK);
      const created = await Account.bulkCreate(
        chunk.map(({ account }) => {
          const a = account!;
          return {
            name: a.name,
            status: a.status as AccountStatus,
            territoryId: a.territoryId,
            specialistId: a.specialistId,
            address: a.address,
            town: a.town,
            state: a.state,
            lat: a.lat,
            lng: a.lng,
            acresByCrop: a.acresByCrop,
            notes: a.notes,
          };
        }),
        { transaction },
      );
      // MariaDB hands out consecutive ids to one multi-row INSERT; make sure before relying on them.
      const check = await Account.findAll({ where: { id: { [Op.in]: created.map((a) => a.id) } }, attributes: ['id', 'name'], transaction });
      const names = new Map(check.map((a) => [a.id, a.name]));
      if (created.some((a, i) => names.get(a.id) !== chunk[i].account!.name)) throw new Error('Imported account ids could not be matched to their rows');
      const contacts = chunk.flatMap((g, i) =>
        g.lines
          .filter((l) => l.contact)
          .map((l) => ({ ...l.contact!, unsubscribedAt: l.contact!.unsubscribedAt ? new Date(l.contact!.unsubscribedAt) : null, accountId: created[i].id })),
      );
      for (let c = 0; c < contacts.length; c += CHUNK) await Contact.bulkCreate(contacts.slice(c, c + CHUNK), { transaction });
      await AuditEvent.bulkCreate(
        chunk.map((g, i) => {
          const count = g.lines.filter((l) => l.contact).length;
          return {
            at,
            accountId: created[i].id,
            userId: user.id,
            entity: 'account',
            entityId: created[i].id,
            action: 'import',
            summary: `Imported the account ${g.account!.name} with ${count} contact${count === 1 ? '' : 's'} from a CSV file`.slice(0, 255),
            changes: null,
          };
        }),
        { transaction },
      );
      ids.push(...created.map((a) => a.id));
    }
    return ids;
  });
  return { ...report, committed: true, accountIds };
}
