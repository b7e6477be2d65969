import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { Account, AuditEvent, Contact } from '../../server/db/models/index.js';
import { accountFileColumns, csvField, guardFormula, parseCsv, toCsv, unguardFormula } from '../../shared/schemas/csv.js';
import { client, makeAccount, makeTerritory, makeUser, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';

type Api = Awaited<ReturnType<typeof signedIn>>;

let t: TestApp;
let territory: { id: number; name: string };
let specialistUser: Awaited<ReturnType<typeof makeUser>>;
let specialist: Api;
let admin: Api;
beforeAll(async () => {
  t = await testApp();
  territory = await makeTerritory();
  specialistUser = await makeUser('specialist', { territoryIds: [territory.id] });
  specialist = await signedIn(t.app, specialistUser);
  admin = await signedIn(t.app, await makeUser('admin'));
});
afterAll(async () => t.close());

const importCsv = (api: Api, text: string, mode = 'preview', type = 'text/csv') =>
  api.agent.post(`/api/imports/accounts?mode=${mode}`).set('X-Forwarded-For', api.ip).set('X-CSRF-Token', api.csrf).type(type).send(text);

/** The records of a CSV body as objects keyed by the header (BOM and CRLF handled by the parser). */
function table(text: string) {
  const [header, ...rest] = parseCsv(text);
  return rest.map((r) => Object.fromEntries(header.fields.map((h, i) => [h, r.fields[i]])));
}

const header = accountFileColumns.join(',');
/** One file line from named cells, the rest empty. */
const line = (cells: Record<string, string>) => accountFileColumns.map((c) => csvField(cells[c] ?? '')).join(',');

describe('RFC 4180 reader and writer', () => {
  // Examples from RFC 4180 (Shafranovich, 2005), section 2, rules 1-7 (memory).
  it('when fields are plain, quoted, hold a doubled quote or a line break, then they read as RFC 4180 section 2 says', () => {
    expect(parseCsv('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n').map((r) => r.fields)).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
    expect(parseCsv('aaa,bbb,ccc\r\nzzz,yyy,xxx').map((r) => r.fields)).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
    expect(parseCsv('"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx\r\n').map((r) => [r.line, r.fields])).toEqual([
      [1, ['aaa', 'b\r\nbb', 'ccc']],
      [3, ['zzz', 'yyy', 'xxx']],
    ]);
    expect(parseCsv('"aaa","b""bb","ccc"')[0].fields).toEqual(['aaa', 'b"bb', 'ccc']);
    expect(parseCsv(' a , b ')[0].fields).toEqual([' a ', ' b ']); // rule 4: spaces belong to the field
    expect(parseCsv('\uFEFFa,b\n\nc,\n')).toEqual([
      { line: 1, fields: ['a', 'b'] },
      { line: 3, fields: ['c', ''] },
    ]);
  });

  it('when a quote is stray or never closed, then the record carries an error on its own line', () => {
    const records = parseCsv('ok,1\r\nbad"quote,2\r\n"x"y,3\r\n"open,4\r\nmore\r\n');
    expect(records.map((r) => [r.line, r.error ?? null])).toEqual([
      [1, null],
      [2, expect.stringMatching(/quote appears inside/)],
      [3, expect.stringMatching(/follows a closing quote/)],
      [4, expect.stringMatching(/opens on line 4 is never closed/)],
    ]);
  });

  it('when any table of strings is written and read back, then it is unchanged', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.string({ unit: fc.constantFrom('a', 'Z', ' ', ',', '"', '\r', '\n', '=', "'", 'é', '-') }), { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 6 }), (rows) => {
        expect(parseCsv(toCsv(rows)).map((r) => r.fields)).toEqual(rows);
      }),
    );
  });

  it('when text starts like a spreadsheet formula, then it is written with an apostrophe and read back exactly', () => {
    expect(guardFormula('=SUM(A1:A9)')).toBe("'=SUM(A1:A9)");
    expect(guardFormula('+1 785 555 0101')).toBe("'+1 785 555 0101");
    expect(guardFormula("'plain")).toBe("'plain");
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom("'", '=', '+', '-', '@', 'a', '\t') }), (text) => {
        expect(unguardFormula(guardFormula(text))).toBe(text);
        expect(/^[=+\-@\t\r]/.test(guardFormula(text))).toBe(false);
      }),
    );
  });
});

describe('CSV export', () => {
  it('when a specialist exports, then every field of the accounts in their territories is there, quoted where needed', async () => {
    const account = await makeAccount(territory.id, { name: `Quoted, "Field" Farms ${uid()}`, specialistId: specialistUser.id });
    await account.update({ notes: 'Line one\nLine two, with a comma', acresByCrop: { corn: 1200, soybean: 650.5 }, status: 'prospect', address: '12 County Rd' });
    await Contact.create({ accountId: account.id, name: '=Risky Name', roleOnFarm: 'Owner', email: 'risky@example.test', phone: '+1 785 555 0101', reminderOptIn: false });
    const elsewhere = await makeAccount((await makeTerritory()).id);

    const res = await specialist.get('/api/accounts/export.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv; charset=utf-8/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?rowpath-accounts-\d{4}-\d{2}-\d{2}\.csv"?$/);
    expect(res.text.startsWith('\uFEFF' + header + '\r\n')).toBe(true);
    expect(res.text).toContain(`"Quoted, ""Field"" Farms`);
    const rows = table(res.text);
    expect(rows.some((r) => r.account_ref === String(elsewhere.id))).toBe(false);
    const mine = rows.filter((r) => r.account_ref === String(account.id));
    expect(mine).toHaveLength(1);
    expect(mine[0]).toMatchObject({
      account_name: account.name,
      status: 'prospect',
      territory: territory.name,
      specialist_email: specialistUser.email,
      address: '12 County Rd',
      town: 'Testville',
      state: 'KS',
      lat: '39.5',
      lng: '-98.1',
      acres_corn: '1200',
      acres_soybean: '650.5',
      acres_wheat: '',
      notes: 'Line one\nLine two, with a comma',
      contact_name: "'=Risky Name",
      contact_role: 'Owner',
      contact_email: 'risky@example.test',
      contact_phone: "'+1 785 555 0101",
      contact_reminders: 'no',
      contact_unsubscribed_at: '',
    });
  });

  it('when a grower exports, then only their own account is in the file; signed out it is 401', async () => {
    const own = await makeAccount(territory.id);
    await makeAccount(territory.id);
    await Contact.create({ accountId: own.id, name: 'Own Contact', roleOnFarm: null, email: null, phone: null, reminderOptIn: true });
    const grower = await signedIn(t.app, await makeUser('grower', { accountId: own.id }));
    const accounts = table((await grower.get('/api/accounts/export.csv')).text);
    expect(accounts.map((r) => r.account_ref)).toEqual([String(own.id)]);
    const contacts = await grower.get('/api/contacts/export.csv');
    expect(contacts.status).toBe(200);
    expect(table(contacts.text)).toEqual([
      expect.objectContaining({ account_ref: String(own.id), account_name: own.name, territory: territory.name, contact_name: 'Own Contact', contact_reminders: 'yes' }),
    ]);
    expect((await client(t.app).get('/api/accounts/export.csv')).status).toBe(401);
    expect((await client(t.app).get('/api/contacts/export.csv')).status).toBe(401);
    expect((await specialist.get('/api/accounts/export.csv?sort=shoe-size')).status).toBe(400);
  });
});

describe('CSV import', () => {
  it('when accounts are exported, imported into a fresh territory and exported again, then every field is kept', async () => {
    const from = await makeTerritory();
    const to = await makeTerritory();
    const bothTerritories = await makeUser('specialist', { territoryIds: [from.id, to.id] });
    const api = await signedIn(t.app, bothTerritories);
    const a = await makeAccount(from.id, { name: 'Alder Creek Grain', specialistId: bothTerritories.id, lat: 38.123456, lng: -97.654321 });
    await a.update({ status: 'inactive', address: '4 Mill "Lane", Unit 2', acresByCrop: { corn: 0, sorghum: 310, sunflower: 75.5 }, notes: '=not a formula\r\n"quoted" note, second line' });
    await Contact.create({ accountId: a.id, name: 'Bea Alder', roleOnFarm: 'Operator', email: 'bea@example.test', phone: '-555-0102', reminderOptIn: true, unsubscribedAt: new Date('2026-01-15T09:30:00Z') });
    await Contact.create({ accountId: a.id, name: "O'Neil, Cy", roleOnFarm: null, email: null, phone: '@cy', reminderOptIn: false });
    const b = await makeAccount(from.id, { name: 'Birch Row Farms' });
    await b.update({ town: null, state: null, lat: null, lng: null, acresByCrop: {} });

    const first = await api.get(`/api/accounts/export.csv?territoryId=${from.id}`);
    expect(first.status).toBe(200);
    // Move the file to the fresh territory by name: the only column the test changes.
    const records = parseCsv(first.text).map((r) => r.fields);
    const territoryIndex = records[0].indexOf('territory');
    const moved = toCsv(records.map((fields, i) => (i === 0 ? fields : fields.map((v, k) => (k === territoryIndex ? to.name : v)))));

    const committed = await importCsv(api, moved, 'commit');
    expect(committed.status, JSON.stringify(committed.body)).toBe(201);
    expect(committed.body).toMatchObject({ committed: true, ok: true, summary: { accounts: 2, contacts: 2, lines: 3, badLines: 0 } });
    expect(committed.body.accountIds).toHaveLength(2);
    expect(await AuditEvent.count({ where: { accountId: committed.body.accountIds, action: 'import' } })).toBe(2);

    const second = await api.get(`/api/accounts/export.csv?territoryId=${to.id}`);
    const strip = (rows: Record<string, string>[]) => rows.map(({ account_ref: _ref, territory: _territory, ...rest }) => rest);
    const before = table(first.text);
    const after = table(second.text);
    expect(after.every((r) => r.territory === to.name)).toBe(true);
    expect(strip(after)).toEqual(strip(before));
    expect(after.map((r) => r.account_ref)).toEqual(committed.body.accountIds.flatMap((id: number, i: number) => (i === 0 ? [String(id), String(id)] : [String(id)])));
    expect(before.find((r) => r.contact_name === 'Bea Alder')!.contact_unsubscribed_at).toBe('2026-01-15T09:30:00.000Z');
  });

  it('when one line in a file is bad, then a commit imports nothing and the report names every bad line with its reason', async () => {
    const other = await makeTerritory();
    const fresh = await makeTerritory();
    const outsider = await makeUser('specialist', { territoryIds: [other.id] });
    const name = (n: string) => `Import ${n} ${uid()}`;
    const good1 = name('good one');
    const text =
      [
        header,
        line({ account_ref: 'A', account_name: good1, territory: fresh.name, contact_name: 'Ok Person', contact_email: 'ok@example.test' }),
        line({ account_ref: 'A', account_name: good1, territory: fresh.name, contact_name: 'Second Person', contact_reminders: 'maybe' }),
        line({ account_ref: 'B', account_name: name('bad lat'), territory: fresh.name, lat: '95', acres_corn: 'lots' }),
        line({ account_ref: 'C', account_name: name('nowhere'), territory: 'No Such Territory' }),
        line({ account_ref: 'D', account_name: name('bad contact'), territory: fresh.name, contact_name: 'Mail Person', contact_email: 'not-an-email' }),
        line({ account_ref: 'A', account_name: good1, territory: fresh.name, status: 'prospect', contact_name: 'Third Person' }),
        line({ account_ref: 'E', account_name: name('wrong specialist'), territory: fresh.name, specialist_email: outsider.email }),
        line({ account_ref: 'F', account_name: '', territory: fresh.name }),
        line({ account_ref: 'G', account_name: name('good two'), territory: fresh.name }),
      ].join('\r\n') + '\r\n';
    const before = await Account.count();

    const preview = await importCsv(admin, text, 'preview');
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ mode: 'preview', ok: false, committed: false, summary: { lines: 9, accounts: 7, badLines: 7 } });
    const byLine = (n: number) => preview.body.errors.filter((e: { line: number }) => e.line === n);
    expect(byLine(3)).toEqual([{ line: 3, column: 'contact_reminders', message: 'Use yes or no' }]);
    expect(byLine(4).map((e: { column: string }) => e.column).sort()).toEqual(['acres_corn', 'lat']);
    expect(byLine(4).find((e: { column: string }) => e.column === 'lat').message).toMatch(/Latitude must be from -90 to 90/);
    expect(byLine(5)).toEqual([{ line: 5, column: 'territory', message: 'No territory is named "No Such Territory"' }]);
    expect(byLine(6)).toEqual([{ line: 6, column: 'contact_email', message: 'Enter a valid e-mail address' }]);
    expect(byLine(7)).toEqual([expect.objectContaining({ column: 'status', message: expect.stringMatching(/Same account as line 2 but status differs/) })]);
    expect(byLine(8)).toEqual([expect.objectContaining({ column: 'specialist_email', message: expect.stringMatching(/does not cover the territory/) })]);
    expect(byLine(9)).toEqual([expect.objectContaining({ column: 'account_name', message: 'Enter the operation name' })]);
    expect(byLine(2)).toEqual([]);
    expect(byLine(10)).toEqual([]);
    expect(preview.body.rows.find((r: { line: number }) => r.line === 10)).toMatchObject({ ok: true, account: { territoryId: fresh.id, status: 'active' } });

    const commit = await importCsv(admin, text, 'commit');
    expect(commit.status).toBe(400);
    expect(commit.body.error.code).toBe('import_rejected');
    expect(commit.body.error.message).toMatch(/7 lines have problems: nothing was imported/);
    expect(new Set(commit.body.error.details.errors.map((e: { line: number }) => e.line))).toEqual(new Set([3, 4, 5, 6, 7, 8, 9]));
    expect(await Account.count()).toBe(before);
    expect(await Account.count({ where: { territoryId: fresh.id } })).toBe(0);
  });

  it('when the same file is clean, then a commit adds accounts with their contacts and a preview of a twin warns', async () => {
    const fresh = await makeTerritory();
    const covering = await makeUser('specialist', { territoryIds: [fresh.id] });
    const api = await signedIn(t.app, covering);
    const name = `Clean Import ${uid()}`;
    const text = [
      'Account Name,Territory,Specialist Email,Contact Name,Contact Email,Contact Reminders',
      `${name},${fresh.name.toUpperCase()},${covering.email.toUpperCase()},First Contact,first@example.test,no`,
      `${name},${fresh.name},${covering.email},Second Contact,,`,
    ].join('\n');
    const res = await importCsv(api, text, 'commit');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const [id] = res.body.accountIds;
    const stored = await Account.findByPk(id);
    expect(stored).toMatchObject({ name, territoryId: fresh.id, specialistId: covering.id, status: 'active' });
    const contacts = await Contact.findAll({ where: { accountId: id }, order: [['id', 'ASC']] });
    expect(contacts.map((c) => [c.name, c.email, c.reminderOptIn])).toEqual([
      ['First Contact', 'first@example.test', false],
      ['Second Contact', null, true],
    ]);
    const again = await importCsv(api, text, 'preview');
    expect(again.body.ok).toBe(true);
    expect(again.body.warnings).toEqual([expect.objectContaining({ line: 2, message: expect.stringMatching(/already exists/) })]);
  });

  it('when writing fails part-way through a commit, then the accounts already written are rolled back', async () => {
    const fresh = await makeTerritory();
    const text = [header, line({ account_ref: '1', account_name: `Rollback ${uid()}`, territory: fresh.name, contact_name: 'Someone' })].join('\r\n');
    // The fault comes after the accounts' INSERT, inside the same transaction.
    const spy = vi.spyOn(Contact, 'bulkCreate').mockRejectedValueOnce(new Error('disk full'));
    try {
      expect((await importCsv(admin, text, 'commit')).status).toBe(500);
    } finally {
      spy.mockRestore();
    }
    expect(await Account.count({ where: { territoryId: fresh.id } })).toBe(0);
    expect((await importCsv(admin, text, 'commit')).status).toBe(201);
    expect(await Account.count({ where: { territoryId: fresh.id } })).toBe(1);
  });

  it('when the file is not usable as a whole, then the reasons are on line 1 or the request is refused', async () => {
    const unknown = await importCsv(specialist, 'account_name,territory,shoe_size\nX,Y,9\n');
    expect(unknown.body.ok).toBe(false);
    expect(unknown.body.errors).toEqual([expect.objectContaining({ line: 1, column: 'shoe_size', message: expect.stringMatching(/Unknown column/) })]);
    const missing = await importCsv(specialist, 'account_name\nX\n');
    expect(missing.body.errors).toEqual([expect.objectContaining({ line: 1, column: 'territory', message: 'The column territory is required' })]);
    const empty = await importCsv(specialist, '');
    expect(empty.body.errors[0].message).toMatch(/empty/);
    const headerOnly = await importCsv(specialist, `${header}\r\n`);
    expect(headerOnly.body.errors[0]).toMatchObject({ line: 2, message: expect.stringMatching(/no rows/) });
    // A quoted note spanning lines 2-3 pushes the next record to line 4, and its stray quote is named there.
    const multi = await importCsv(specialist, `account_name,territory,notes\nA,${territory.name},"two\nlines"\nB",${territory.name},x\nC,${territory.name}\n`);
    expect(multi.body.errors).toEqual([
      { line: 4, column: null, message: expect.stringMatching(/quote appears inside/) },
      { line: 5, column: null, message: 'This line has 2 fields; the header has 3' },
    ]);
    expect(multi.body.rows[0]).toMatchObject({ line: 2, ok: true, account: { notes: 'two\nlines' } });
  });

  it('when the caller or the request is wrong, then 401, 403, 400, 415 or 413 and nothing is written', async () => {
    const before = await Account.count();
    const text = `account_name,territory\nRefused ${uid()},${territory.name}\n`;
    const anonymous = client(t.app);
    await anonymous.refreshCsrf();
    expect((await importCsv(anonymous, text, 'commit')).status).toBe(401);
    const grower = await signedIn(t.app, await makeUser('grower', { accountId: (await makeAccount(territory.id)).id }));
    expect((await importCsv(grower, text, 'commit')).status).toBe(403);
    const noMode = await specialist.agent.post('/api/imports/accounts').set('X-Forwarded-For', specialist.ip).set('X-CSRF-Token', specialist.csrf).type('text/csv').send(text);
    expect(noMode.status).toBe(400);
    expect(noMode.body.error.details.fields.mode).toMatch(/preview or \?mode=commit/);
    expect((await importCsv(specialist, text, 'commit', 'application/octet-stream')).status).toBe(415);
    const big = `account_name,territory\n${'x'.repeat(2 * 1024 * 1024)},${territory.name}\n`;
    const tooBig = await importCsv(specialist, big, 'commit');
    expect(tooBig.status).toBe(413);
    const noCsrf = await specialist.agent.post('/api/imports/accounts?mode=commit').set('X-Forwarded-For', specialist.ip).type('text/csv').send(text);
    expect(noCsrf.status).toBe(403);
    const otherTerritory = await makeTerritory();
    const notMine = await importCsv(specialist, `account_name,territory\nNot mine ${uid()},${otherTerritory.name}\n`, 'commit');
    expect(notMine.status).toBe(400);
    expect(notMine.body.error.details.errors).toEqual([expect.objectContaining({ line: 2, column: 'territory', message: `You do not cover the territory ${otherTerritory.name}` })]);
    expect(await Account.count()).toBe(before + 1); // only the grower's own account, made above
  });
});
