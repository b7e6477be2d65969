import fs from 'node:fs/promises';
import path from 'node:path';
import { Router, type RequestHandler, type Response } from 'express';
import multer from 'multer';
import type { Sequelize } from 'sequelize';
import { idParamSchema } from '../../../shared/schemas/accounts.js';
import { requireAuth, requireRole } from '../../auth/guards.js';
import type { Config } from '../../config.js';
import { AppError, notFound, validationError } from '../../http/errors.js';
import { parsed, validate } from '../../http/validate.js';
import {
  attachmentFieldsSchema,
  attachmentFile,
  attachmentListQuerySchema,
  deleteAttachment,
  getAttachment,
  listAttachments,
  MAX_UPLOAD_BYTES,
  storeAttachment,
  type AttachmentFields,
  type AttachmentListQuery,
} from './attachments.service.js';

type Id = { id: number };
const tooLarge = () => new AppError('too_large', 413, 'Files may be at most 10 MB.');

// Kept in memory until its type is known, so a refused file never touches the disk.
const multipart = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 4, parts: 6, fieldSize: 200, fieldNameSize: 40 },
  defParamCharset: 'utf8',
}).single('file');

/** multipart/form-data with one file; size and shape errors become 413 and 400. */
const receiveFile: RequestHandler = (req, res, next) => {
  if (!req.is('multipart/form-data')) return next(new AppError('unsupported_type', 415, 'Send the file as multipart/form-data with the fields ownerType, ownerId and file.'));
  // A body announced far over the limit is refused before it is read.
  if (Number(req.get('content-length') ?? 0) > MAX_UPLOAD_BYTES + 1024 * 1024) {
    res.set('Connection', 'close');
    return next(tooLarge());
  }
  multipart(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return next(tooLarge());
      if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT') return next(validationError({ file: 'Send one file, in the field named file' }));
    }
    // Anything else here is a body busboy could not read (malformed part headers, a cut-off stream).
    next(new AppError('bad_upload', 400, 'The upload form could not be read: send ownerType, ownerId and one file.'));
  });
};

async function sendStored(res: Response, file: { dir: string; storedName: string; mime: string; name: string }, disposition: 'attachment' | 'inline') {
  try {
    await fs.access(path.join(file.dir, file.storedName));
  } catch {
    throw notFound('That file');
  }
  res.set('X-Content-Type-Options', 'nosniff');
  // The bytes are data, never a page: no scripts, no plugins, even if opened directly.
  res.set('Content-Security-Policy', "default-src 'none'; img-src 'self'; sandbox");
  res.attachment(file.name);
  if (disposition === 'inline') res.set('Content-Disposition', String(res.get('Content-Disposition')).replace(/^attachment/, 'inline'));
  res.type(file.mime);
  await new Promise<void>((resolve, reject) =>
    // A reader who goes away mid-download is not a server fault.
    res.sendFile(file.storedName, { root: path.resolve(file.dir), dotfiles: 'deny' }, (err) => (err && (err as NodeJS.ErrnoException).code !== 'ECONNABORTED' ? reject(err) : resolve())),
  );
}

/**
 * Attachments under /api. Upload and delete: staff who may change the record's account (growers
 * read only). List, metadata and download: anyone who may see the account; others get 404.
 */
export function attachmentsRouter(sequelize: Sequelize, config: Config) {
  const router = Router();

  router.post('/attachments', requireRole('admin', 'manager', 'specialist'), receiveFile, validate('body', attachmentFieldsSchema), async (req, res) => {
    const attachment = await storeAttachment(sequelize, config.dataDir, req.user!, parsed<AttachmentFields>(res, 'body'), req.file);
    res.status(201).json({ attachment });
  });

  router.get('/accounts/:id/attachments', requireAuth, validate('params', idParamSchema), validate('query', attachmentListQuerySchema), async (req, res) => {
    res.json({ items: await listAttachments(req.user!, parsed<Id>(res, 'params').id, parsed<AttachmentListQuery>(res, 'query')) });
  });

  router.get('/attachments/:id', requireAuth, validate('params', idParamSchema), async (req, res) => {
    res.json({ attachment: await getAttachment(req.user!, parsed<Id>(res, 'params').id) });
  });

  router.get('/attachments/:id/file', requireAuth, validate('params', idParamSchema), async (req, res) => {
    await sendStored(res, await attachmentFile(req.user!, config.dataDir, parsed<Id>(res, 'params').id), 'attachment');
  });

  // No image library is installed, so there are no scaled copies: images are served whole and
  // the client shows them at thumbnail size (img width). Documents have no thumbnail.
  router.get('/attachments/:id/thumb', requireAuth, validate('params', idParamSchema), async (req, res) => {
    const file = await attachmentFile(req.user!, config.dataDir, parsed<Id>(res, 'params').id);
    if (!file.isImage) throw new AppError('no_thumbnail', 404, 'Documents have no thumbnail.');
    await sendStored(res, file, 'inline');
  });

  router.delete('/attachments/:id', requireRole('admin', 'manager', 'specialist'), validate('params', idParamSchema), async (req, res) => {
    await deleteAttachment(sequelize, config.dataDir, req.user!, parsed<Id>(res, 'params').id);
    res.status(204).end();
  });
  return router;
}
