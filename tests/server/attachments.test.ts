import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Attachment, AuditEvent } from '../../server/db/models/index.js';
import { detectKind, safeFileName } from '../../server/modules/attachments/file-type.js';
import { client, makeAccount, makeTerritory, makeUser, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';
import { makeComponent, planterBody } from '../helpers/fleet.js';

type Api = Awaited<ReturnType<typeof signedIn>>;

// Minimal files of each kind, built from the format signatures (memory: PNG spec §5.2, ITU-T T.81
// Annex B, the WebP RIFF container, ISO 32000-1 §7.5.2). A widely used 1×1 transparent PNG:
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');
const JPEG = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10]), Buffer.from('JFIF\0\x01\x01\0\0\x01\0\x01\0\0', 'latin1'), Buffer.from([0xff, 0xd9])]);
const WEBP = Buffer.concat([Buffer.from('RIFF', 'latin1'), Buffer.from([0x1a, 0, 0, 0]), Buffer.from('WEBPVP8L', 'latin1'), Buffer.from([0x0d, 0, 0, 0, 0x2f, 0, 0, 0, 0x10, 0x07, 0x10, 0x11, 0x11, 0x88, 0x88, 0xfe, 0x07, 0])]);
const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n', 'latin1');
// A Windows executable starts "MZ"; a Linux one 0x7F "ELF".
const EXE = Buffer.concat([Buffer.from('MZ', 'latin1'), Buffer.from([0x90, 0, 3, 0, 0, 0, 4, 0, 0, 0, 0xff, 0xff]), Buffer.alloc(64)]);
const ELF = Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), Buffer.alloc(56)]);
const SVG = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>');

let t: TestApp;
let dataDir: string;
let uploads: string;
let territoryId: number;
let specialist: Api;
beforeAll(async () => {
  dataDir = path.resolve(`.data/test-attachments-${uid()}`);
  uploads = path.join(dataDir, 'uploads');
  t = await testApp({ ROWPATH_DATA_DIR: dataDir });
  territoryId = (await makeTerritory()).id;
  specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territoryId] }));
});
afterAll(async () => {
  await t.close();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

const upload = (api: Api, owner: { ownerType: string; ownerId: number | string }, file: Buffer | null, filename = 'photo.jpg', contentType = 'image/jpeg') => {
  const req = api.agent.post('/api/attachments').set('X-Forwarded-For', api.ip).set('X-CSRF-Token', api.csrf).field('ownerType', owner.ownerType).field('ownerId', String(owner.ownerId));
  return file ? req.attach('file', file, { filename, contentType }) : req;
};
const download = (api: Api, url: string) => api.agent.get(url).set('X-Forwarded-For', api.ip).buffer(true).parse((res, cb) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
});
const storedFiles = () => (fs.existsSync(uploads) ? fs.readdirSync(uploads).sort() : []);

describe('file kinds and names', () => {
  it('when bytes carry a JPEG, PNG, WebP or PDF signature, then that kind is found whatever the name; anything else is null', () => {
    expect(detectKind(PNG)).toEqual({ mime: 'image/png', ext: '.png', image: true });
    expect(detectKind(JPEG)?.mime).toBe('image/jpeg');
    expect(detectKind(WEBP)?.mime).toBe('image/webp');
    expect(detectKind(PDF)).toEqual({ mime: 'application/pdf', ext: '.pdf', image: false });
    for (const bad of [EXE, ELF, SVG, Buffer.alloc(0), Buffer.from([0xff, 0xd8]), PNG.subarray(0, 8), Buffer.from('RIFF\0\0\0\0WAVEfmt ', 'latin1'), Buffer.from('%PDF-x')]) {
      expect(detectKind(bad)).toBeNull();
    }
  });

  it('when a client name holds paths, NUL, controls, bidi overrides or is very long, then the kept name is one short plain segment with the true extension', () => {
    const png = detectKind(PNG)!;
    expect(safeFileName('../../etc/passwd', png)).toBe('passwd.png');
    expect(safeFileName('C:\\Users\\x\\..\\boot.ini', png)).toBe('boot.png');
    expect(safeFileName('in\u0000voice\r\n.pdf', detectKind(PDF)!)).toBe('invoice.pdf');
    expect(safeFileName('photo\u202Egpj.exe', png)).toBe('photogpj.png');
    expect(safeFileName('...', png)).toBe('file.png');
    expect(safeFileName(undefined, png)).toBe('file.png');
    expect(safeFileName(`${'é'.repeat(500)}.jpg`, png)).toBe(`${'é'.repeat(120)}.png`);
  });
});

describe('uploads', () => {
  it('when a specialist attaches a photo to an account, then it is stored under a random name, listed, downloadable and audited', async () => {
    const account = await makeAccount(territoryId);
    const res = await upload(specialist, { ownerType: 'account', ownerId: account.id }, PNG, 'yard photo.png', 'image/png');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const a = res.body.attachment;
    expect(a).toMatchObject({ accountId: account.id, ownerType: 'account', ownerId: account.id, originalName: 'yard photo.png', mime: 'image/png', sizeBytes: PNG.length, isImage: true, fileUrl: `/api/attachments/${a.id}/file`, thumbUrl: `/api/attachments/${a.id}/thumb` });
    expect(a.uploadedByName).toBeTruthy();
    const row = (await Attachment.findByPk(a.id))!;
    expect(row.storedName).toMatch(/^[0-9a-f]{32}\.png$/);
    expect(row.thumbName).toBeNull();
    expect(fs.readFileSync(path.join(uploads, row.storedName)).equals(PNG)).toBe(true);
    expect(await AuditEvent.count({ where: { accountId: account.id, entity: 'attachment', entityId: a.id, action: 'upload' } })).toBe(1);

    const file = await download(specialist, a.fileUrl);
    expect(file.status).toBe(200);
    expect((file.body as Buffer).equals(PNG)).toBe(true);
    expect(file.headers['content-type']).toBe('image/png');
    expect(file.headers['x-content-type-options']).toBe('nosniff');
    expect(file.headers['content-disposition']).toBe('attachment; filename="yard photo.png"');
    expect(file.headers['content-security-policy']).toMatch(/sandbox/);
    const thumb = await download(specialist, a.thumbUrl);
    expect(thumb.status).toBe(200);
    expect(thumb.headers['content-disposition']).toMatch(/^inline; /);
    expect((thumb.body as Buffer).equals(PNG)).toBe(true);

    const list = await specialist.get(`/api/accounts/${account.id}/attachments`);
    expect(list.body.items.map((i: { id: number }) => i.id)).toEqual([a.id]);
    expect((await specialist.get(`/api/attachments/${a.id}`)).body.attachment.originalName).toBe('yard photo.png');
  });

  it('when the content and the name or declared type disagree, then the content decides', async () => {
    const account = await makeAccount(territoryId);
    const planter = (await specialist.post(`/api/accounts/${account.id}/planters`, planterBody())).body.planter;
    const pdf = await upload(specialist, { ownerType: 'planter', ownerId: planter.id }, PDF, 'photo.jpg', 'image/jpeg');
    expect(pdf.status).toBe(201);
    expect(pdf.body.attachment).toMatchObject({ mime: 'application/pdf', originalName: 'photo.pdf', isImage: false, thumbUrl: null, ownerType: 'planter', ownerId: planter.id, accountId: account.id });
    expect((await specialist.get(`/api/attachments/${pdf.body.attachment.id}/thumb`)).status).toBe(404);
    const part = await makeComponent();
    const install = (await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: part.id, scope: 'all-rows' })).body.install;
    const webp = await upload(specialist, { ownerType: 'install', ownerId: install.id }, WEBP, 'meter.bin', 'application/octet-stream');
    expect(webp.body.attachment).toMatchObject({ mime: 'image/webp', originalName: 'meter.webp', ownerType: 'install', accountId: account.id });
    const jpeg = await upload(specialist, { ownerType: 'planter', ownerId: planter.id }, JPEG, 'scan.pdf', 'application/pdf');
    expect(jpeg.body.attachment).toMatchObject({ mime: 'image/jpeg', originalName: 'scan.jpg' });
    const onPlanter = await specialist.get(`/api/accounts/${account.id}/attachments?ownerType=planter&ownerId=${planter.id}`);
    expect(onPlanter.body.items.map((i: { mime: string }) => i.mime).sort()).toEqual(['application/pdf', 'image/jpeg']);
  });

  it('when a file is an executable, a script, empty, oversize or the form is wrong, then it is refused and nothing is stored', async () => {
    const account = await makeAccount(territoryId);
    const owner = { ownerType: 'account', ownerId: account.id };
    const rows = await Attachment.count();
    const files = storedFiles();

    const exe = await upload(specialist, owner, EXE, 'holiday.jpg', 'image/jpeg');
    expect(exe.status).toBe(415);
    expect(exe.body.error.code).toBe('unsupported_type');
    expect((await upload(specialist, owner, ELF, 'tractor.png', 'image/png')).status).toBe(415);
    expect((await upload(specialist, owner, SVG, 'logo.png', 'image/png')).status).toBe(415);
    const oversize = Buffer.alloc(10 * 1024 * 1024 + 1);
    JPEG.copy(oversize);
    const big = await upload(specialist, owner, oversize, 'huge.jpg');
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('too_large');
    const empty = await upload(specialist, owner, Buffer.alloc(0), 'empty.jpg');
    expect(empty.status).toBe(400);
    const noFile = await upload(specialist, owner, null);
    expect(noFile.status).toBe(400);
    expect(noFile.body.error.details.fields.file).toBe('Choose a file to upload');
    const badOwner = await upload(specialist, { ownerType: 'tractor', ownerId: account.id }, PNG);
    expect(badOwner.body.error.details.fields.ownerType).toMatch(/account, a planter or an install/);
    const twoFiles = await upload(specialist, owner, PNG, 'a.png').attach('file', PNG, { filename: 'b.png', contentType: 'image/png' });
    expect(twoFiles.status).toBe(400);
    const json = await specialist.post('/api/attachments', { ownerType: 'account', ownerId: account.id });
    expect(json.status).toBe(415);

    expect(await Attachment.count()).toBe(rows);
    expect(storedFiles()).toEqual(files);
  });

  it('when a file is exactly 10 MB, then it is accepted', async () => {
    const account = await makeAccount(territoryId);
    const limit = Buffer.alloc(10 * 1024 * 1024);
    PDF.copy(limit);
    const res = await upload(specialist, { ownerType: 'account', ownerId: account.id }, limit, 'manual.pdf', 'application/pdf');
    expect(res.status).toBe(201);
    expect(res.body.attachment.sizeBytes).toBe(10 * 1024 * 1024);
    expect((await specialist.delete(`/api/attachments/${res.body.attachment.id}`)).status).toBe(204);
  });

  it('when a name tries path tricks, NUL or great length, then the file still lands in the uploads folder under a random name', async () => {
    const account = await makeAccount(territoryId);
    const before = new Set(storedFiles());
    for (const name of ['../../../../tmp/evil.png', '..\\..\\windows\\evil.png', 'tractor\u202Egpj.exe', `${'n'.repeat(3000)}.png`, '"; filename=other.exe']) {
      const res = await upload(specialist, { ownerType: 'account', ownerId: account.id }, PNG, name, 'image/png');
      expect(res.status, name).toBe(201);
      const original: string = res.body.attachment.originalName;
      expect(original).not.toMatch(/[\\/\u0000"]/);
      expect(original.length).toBeLessThanOrEqual(124);
      expect(original.endsWith('.png')).toBe(true);
      const file = await download(specialist, res.body.attachment.fileUrl);
      expect(file.headers['content-disposition']).not.toMatch(/\.\.|\/|\\|\u0000|other\.exe"?$/);
    }
    // A NUL byte can only arrive percent-encoded (RFC 5987 filename*); raw in a part header it is malformed.
    const boundary = `----rowpath${uid()}`;
    const multipart = (disposition: string) =>
      Buffer.concat([
        Buffer.from(
          `--${boundary}\r\nContent-Disposition: form-data; name="ownerType"\r\n\r\naccount\r\n` +
            `--${boundary}\r\nContent-Disposition: form-data; name="ownerId"\r\n\r\n${account.id}\r\n` +
            `--${boundary}\r\nContent-Disposition: form-data; name="file"; ${disposition}\r\nContent-Type: image/png\r\n\r\n`,
          'latin1',
        ),
        PNG,
        Buffer.from(`\r\n--${boundary}--\r\n`, 'latin1'),
      ]);
    const raw = (disposition: string) =>
      specialist.agent.post('/api/attachments').set('X-Forwarded-For', specialist.ip).set('X-CSRF-Token', specialist.csrf).set('Content-Type', `multipart/form-data; boundary=${boundary}`).send(multipart(disposition));
    const encoded = await raw("filename*=UTF-8''..%2F..%2Fnul%00byte%2Fx.png");
    expect(encoded.status, JSON.stringify(encoded.body)).toBe(201);
    expect(encoded.body.attachment.originalName).toBe('x.png');
    const rows = await Attachment.count();
    const rawNul = await raw('filename="nul\u0000byte.png"');
    expect(rawNul.status).toBe(400);
    expect(await Attachment.count()).toBe(rows);

    const added = storedFiles().filter((f) => !before.has(f));
    expect(added).toHaveLength(6);
    for (const f of added) expect(f).toMatch(/^[0-9a-f]{32}\.png$/);
    expect(fs.existsSync('/tmp/evil.png')).toBe(false);
  });
});

describe('who may see and change attachments', () => {
  it('when growers, other territories or strangers ask, then each gets only what the account allows', async () => {
    const account = await makeAccount(territoryId);
    const other = await makeAccount(territoryId);
    const a = (await upload(specialist, { ownerType: 'account', ownerId: account.id }, PNG, 'p.png', 'image/png')).body.attachment;

    const grower = await signedIn(t.app, await makeUser('grower', { accountId: account.id }));
    expect((await download(grower, a.fileUrl)).status).toBe(200);
    expect((await grower.get(`/api/accounts/${account.id}/attachments`)).body.items).toHaveLength(1);
    expect((await upload(grower, { ownerType: 'account', ownerId: account.id }, PNG)).status).toBe(403);
    expect((await grower.delete(`/api/attachments/${a.id}`)).status).toBe(403);

    const otherGrower = await signedIn(t.app, await makeUser('grower', { accountId: other.id }));
    expect((await download(otherGrower, a.fileUrl)).status).toBe(404);
    expect((await otherGrower.get(`/api/accounts/${account.id}/attachments`)).status).toBe(404);

    const elsewhere = await makeTerritory();
    const outsider = await signedIn(t.app, await makeUser('specialist', { territoryIds: [elsewhere.id] }));
    expect((await download(outsider, a.fileUrl)).status).toBe(404);
    expect((await download(outsider, a.thumbUrl)).status).toBe(404);
    expect((await outsider.get(`/api/attachments/${a.id}`)).status).toBe(404);
    expect((await outsider.get(`/api/accounts/${account.id}/attachments`)).status).toBe(404);
    expect((await outsider.delete(`/api/attachments/${a.id}`)).status).toBe(404);
    const rows = await Attachment.count();
    expect((await upload(outsider, { ownerType: 'account', ownerId: account.id }, PNG)).status).toBe(404);
    const planter = (await specialist.post(`/api/accounts/${account.id}/planters`, planterBody())).body.planter;
    expect((await upload(outsider, { ownerType: 'planter', ownerId: planter.id }, PNG)).status).toBe(404);
    expect((await upload(specialist, { ownerType: 'install', ownerId: 99999999 }, PNG)).status).toBe(404);
    expect(await Attachment.count()).toBe(rows);

    const stranger = client(t.app);
    await stranger.refreshCsrf();
    expect((await stranger.get(a.fileUrl)).status).toBe(401);
    expect((await upload(stranger, { ownerType: 'account', ownerId: account.id }, PNG)).status).toBe(401);
    expect((await specialist.get('/api/attachments/not-a-number/file')).status).toBe(400);
  });

  it('when staff delete an attachment, then the row and the file go, with an audit line', async () => {
    const account = await makeAccount(territoryId);
    const a = (await upload(specialist, { ownerType: 'account', ownerId: account.id }, JPEG, 'gone.jpg')).body.attachment;
    const stored = (await Attachment.findByPk(a.id))!.storedName;
    expect(fs.existsSync(path.join(uploads, stored))).toBe(true);
    expect((await specialist.delete(`/api/attachments/${a.id}`)).status).toBe(204);
    expect(fs.existsSync(path.join(uploads, stored))).toBe(false);
    expect(await Attachment.findByPk(a.id)).toBeNull();
    expect(await AuditEvent.count({ where: { accountId: account.id, entity: 'attachment', action: 'delete' } })).toBe(1);
    expect((await download(specialist, a.fileUrl)).status).toBe(404);
    expect((await specialist.delete(`/api/attachments/${a.id}`)).status).toBe(404);
  });
});
