// Photos and documents attached to an account, a planter or an install. The bytes live outside the
// web root under random names (config.dataDir/uploads); the table row says what they belong to.
import { randomBytes } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import { Op, type Sequelize } from 'sequelize';
import { z } from 'zod';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import { Attachment, Install, Planter, User } from '../../db/models/index.js';
import { AppError, notFound, validationError } from '../../http/errors.js';
import { accountFor, audit } from '../fleet/fleet-access.js';
import { detectKind, safeFileName } from './file-type.js';

export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;
export const attachmentOwnerTypes = ['account', 'planter', 'install'] as const;
export type AttachmentOwnerType = (typeof attachmentOwnerTypes)[number];

export const attachmentFieldsSchema = z.object({
  ownerType: z.enum(attachmentOwnerTypes, { error: 'Attach it to an account, a planter or an install' }),
  ownerId: z.coerce.number({ error: 'Not a valid id' }).int('Not a valid id').positive('Not a valid id'),
});
export type AttachmentFields = z.infer<typeof attachmentFieldsSchema>;

export const attachmentListQuerySchema = z.object({
  ownerType: z.enum(attachmentOwnerTypes, { error: 'ownerType is account, planter or install' }).optional(),
  ownerId: z.coerce.number().int().positive().optional(),
});
export type AttachmentListQuery = z.infer<typeof attachmentListQuerySchema>;

export const uploadsDir = (dataDir: string) => path.join(dataDir, 'uploads');

function view(a: Attachment, uploaderName: string | null = null) {
  const image = a.mime.startsWith('image/');
  return {
    id: a.id,
    accountId: a.accountId,
    ownerType: a.ownerType,
    ownerId: a.ownerId,
    originalName: a.originalName,
    mime: a.mime,
    sizeBytes: a.sizeBytes,
    isImage: image,
    uploadedBy: a.uploadedBy,
    uploadedByName: uploaderName,
    createdAt: a.createdAt,
    fileUrl: `/api/attachments/${a.id}/file`,
    // No image library is installed: the "thumbnail" is the original, scaled by the browser.
    thumbUrl: image ? `/api/attachments/${a.id}/thumb` : null,
  };
}
export type AttachmentView = ReturnType<typeof view>;

/** The account a record belongs to; a missing record reads as 404, like one out of scope. */
async function accountOfOwner(ownerType: AttachmentOwnerType, ownerId: number): Promise<number> {
  if (ownerType === 'account') return ownerId;
  if (ownerType === 'planter') {
    const planter = await Planter.findByPk(ownerId, { attributes: ['id', 'accountId'] });
    if (!planter) throw notFound('That planter');
    return planter.accountId;
  }
  const install = await Install.findByPk(ownerId, { attributes: ['id', 'planterId'], include: [{ model: Planter, as: 'planter', attributes: ['accountId'] }] });
  const planter = (install as (Install & { planter?: Planter | null }) | null)?.planter;
  if (!install || !planter) throw notFound('That install');
  return planter.accountId;
}

/** Owner's record exists and the user may see it: the account id. */
export async function checkOwner(user: SessionUser, fields: AttachmentFields, mode: 'read' | 'edit') {
  const accountId = await accountOfOwner(fields.ownerType, fields.ownerId);
  await accountFor(user, accountId, mode);
  return accountId;
}

/**
 * Staff who may change the account. Checks the owner, then the file's real type from its bytes
 * (415 otherwise); writes the file and the row (with an audit line) together: a failure of either
 * leaves neither behind.
 */
export async function storeAttachment(
  sequelize: Sequelize,
  dataDir: string,
  user: SessionUser,
  fields: AttachmentFields,
  file: { buffer: Buffer; originalname?: string } | undefined,
) {
  if (!file) throw validationError({ file: 'Choose a file to upload' });
  const accountId = await checkOwner(user, fields, 'edit');
  if (file.buffer.length === 0) throw validationError({ file: 'The file is empty' });
  if (file.buffer.length > MAX_UPLOAD_BYTES) throw new AppError('too_large', 413, 'Files may be at most 10 MB.');
  const kind = detectKind(file.buffer);
  if (!kind) throw new AppError('unsupported_type', 415, 'Only JPEG, PNG and WebP photos and PDF documents can be attached.');

  const originalName = safeFileName(file.originalname, kind);
  const storedName = `${randomBytes(16).toString('hex')}${kind.ext}`;
  const dir = uploadsDir(dataDir);
  const target = path.join(dir, storedName);
  let written = false;
  try {
    const id = await sequelize.transaction(async (transaction) => {
      const row = await Attachment.create(
        { accountId, ownerType: fields.ownerType, ownerId: fields.ownerId, originalName, storedName, thumbName: null, mime: kind.mime, sizeBytes: file.buffer.length, uploadedBy: user.id },
        { transaction },
      );
      await audit(transaction, {
        accountId,
        userId: user.id,
        entity: 'attachment',
        entityId: row.id,
        action: 'upload',
        summary: `Attached ${originalName} (${kind.mime}, ${Math.ceil(file.buffer.length / 1024)} kB) to the ${fields.ownerType} ${fields.ownerId}`.slice(0, 255),
      });
      await fs.mkdir(dir, { recursive: true, mode: 0o700 });
      // 'wx': never overwrite; the file is written before the commit so a failed write rolls back the row.
      await fs.writeFile(target, file.buffer, { flag: 'wx', mode: 0o600 });
      written = true;
      return row.id;
    });
    return getAttachment(user, id);
  } catch (err) {
    if (written) await fs.rm(target, { force: true });
    throw err;
  }
}

async function loadVisible(user: SessionUser, id: number, mode: 'read' | 'edit') {
  const row = await Attachment.findByPk(id);
  if (!row) throw notFound('That attachment');
  await accountFor(user, row.accountId, mode);
  return row;
}

export async function getAttachment(user: SessionUser, id: number) {
  const row = await loadVisible(user, id, 'read');
  const uploader = row.uploadedBy ? await User.findByPk(row.uploadedBy, { attributes: ['id', 'name'] }) : null;
  return view(row, uploader?.name ?? null);
}

/** Anyone who may see the account: its attachments, newest first, optionally of one record. */
export async function listAttachments(user: SessionUser, accountId: number, query: AttachmentListQuery) {
  await accountFor(user, accountId, 'read');
  const where: Record<string, unknown> = { accountId };
  if (query.ownerType) where.ownerType = query.ownerType;
  if (query.ownerId) where.ownerId = query.ownerId;
  const rows = await Attachment.findAll({ where, order: [['createdAt', 'DESC'], ['id', 'DESC']] });
  const userIds = [...new Set(rows.map((r) => r.uploadedBy).filter((u): u is number => u !== null))];
  const users = userIds.length ? await User.findAll({ where: { id: { [Op.in]: userIds } }, attributes: ['id', 'name'] }) : [];
  const names = new Map(users.map((u) => [u.id, u.name]));
  return rows.map((r) => view(r, r.uploadedBy ? names.get(r.uploadedBy) ?? null : null));
}

/** Anyone who may see the account: where the bytes are, for streaming. */
export async function attachmentFile(user: SessionUser, dataDir: string, id: number) {
  const row = await loadVisible(user, id, 'read');
  // Stored names are ours (hex + extension); the check keeps a tampered row from reaching elsewhere.
  if (!/^[0-9a-f]{32}\.(jpg|png|webp|pdf)$/.test(row.storedName)) throw notFound('That file');
  return { dir: uploadsDir(dataDir), storedName: row.storedName, mime: row.mime, name: row.originalName, isImage: row.mime.startsWith('image/') };
}

/** Staff who may change the account. The row goes with an audit line; the file after the commit. */
export async function deleteAttachment(sequelize: Sequelize, dataDir: string, user: SessionUser, id: number) {
  const row = await sequelize.transaction(async (transaction) => {
    const found = await Attachment.findByPk(id, { transaction });
    if (!found) throw notFound('That attachment');
    await accountFor(user, found.accountId, 'edit', transaction);
    await found.destroy({ transaction });
    await audit(transaction, { accountId: found.accountId, userId: user.id, entity: 'attachment', entityId: id, action: 'delete', summary: `Removed the attachment ${found.originalName}`.slice(0, 255) });
    return found;
  });
  for (const name of [row.storedName, row.thumbName]) if (name) await fs.rm(path.join(uploadsDir(dataDir), name), { force: true });
}
