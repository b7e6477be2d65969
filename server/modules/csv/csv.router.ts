import express, { Router, type RequestHandler, type Response } from 'express';
import type { Sequelize } from 'sequelize';
import {
  accountExportQuerySchema,
  contactExportQuerySchema,
  importQuerySchema,
  MAX_IMPORT_BYTES,
  type AccountExportQuery,
  type ContactExportQuery,
  type ImportQuery,
} from '../../../shared/schemas/csv.js';
import { requireAuth, requireRole } from '../../auth/guards.js';
import { AppError } from '../../http/errors.js';
import { parsed, validate } from '../../http/validate.js';
import { exportAccountsCsv, exportContactsCsv } from './accounts-export.js';
import { commitAccountImport, planAccountImport } from './accounts-import.js';

// Browsers label a .csv file in several ways (text/csv, text/plain, and some desktop systems a
// spreadsheet type); all of them are read as UTF-8 text.
const CSV_TYPES = ['text/csv', 'text/plain', 'application/csv', 'application/vnd.ms-excel'];

const requireCsvBody: RequestHandler = (req, _res, next) => {
  if (!req.is(CSV_TYPES)) return next(new AppError('unsupported_type', 415, 'Send the file as text/csv (UTF-8).'));
  next();
};

function sendCsv(res: Response, csv: string, what: string) {
  const day = new Date().toISOString().slice(0, 10);
  res.attachment(`rowpath-${what}-${day}.csv`);
  res.type('text/csv; charset=utf-8');
  res.set('X-Content-Type-Options', 'nosniff');
  // The byte-order mark lets spreadsheet programs read the file as UTF-8; the import skips it.
  res.send(`\uFEFF${csv}`);
}

/**
 * CSV exchange under /api. Exports: every signed-in role, limited to the accounts its scope allows.
 * Import of accounts and contacts: admin, manager and specialist, into territories they cover.
 * Mounted before the accounts router so that /accounts/export.csv is not read as an account id.
 */
export function csvRouter(sequelize: Sequelize) {
  const router = Router();

  router.get('/accounts/export.csv', requireAuth, validate('query', accountExportQuerySchema), async (req, res) => {
    sendCsv(res, await exportAccountsCsv(req.user!, parsed<AccountExportQuery>(res, 'query')), 'accounts');
  });

  router.get('/contacts/export.csv', requireAuth, validate('query', contactExportQuerySchema), async (req, res) => {
    sendCsv(res, await exportContactsCsv(req.user!, parsed<ContactExportQuery>(res, 'query')), 'contacts');
  });

  router.post(
    '/imports/accounts',
    requireRole('admin', 'manager', 'specialist'),
    validate('query', importQuerySchema),
    requireCsvBody,
    express.text({ type: CSV_TYPES, limit: MAX_IMPORT_BYTES, defaultCharset: 'utf-8' }),
    async (req, res) => {
      const { mode } = parsed<ImportQuery>(res, 'query');
      const text = typeof req.body === 'string' ? req.body : '';
      const plan = await planAccountImport(req.user!, text, mode);
      if (mode === 'preview') return void res.json(plan.report);
      res.status(201).json(await commitAccountImport(sequelize, req.user!, plan));
    },
  );
  return router;
}
