import type { ErrorRequestHandler, RequestHandler } from 'express';
import { BaseError, ConnectionError, DatabaseError, ForeignKeyConstraintError, UniqueConstraintError, ValidationError as SequelizeValidationError } from 'sequelize';
import { ZodError } from 'zod';
import type { SecurityLog } from '../auth/security-log.js';
import { isRetryableLockError } from '../db/retry.js';

export type ErrorDetails = { fields?: Record<string, string>; [key: string]: unknown };

/** Thrown by services; the error middleware turns it into `{ error: { code, message, details } }`. */
export class AppError extends Error {
  constructor(
    public readonly code: string,
    public readonly status: number,
    message: string,
    public readonly details?: ErrorDetails,
  ) {
    super(message);
  }
}

export const notFound = (what = 'That record') => new AppError('not_found', 404, `${what} was not found.`);
export const forbidden = () => new AppError('forbidden', 403, 'Your role does not allow this.');

/** Zod issues → one message per field path ("rows", "toolbars.0.sizeFt"). */
export function fieldsFromZod(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    if (!(key in fields)) fields[key] = issue.message;
  }
  return fields;
}

export const validationError = (fields: Record<string, string>, message = 'Some fields need attention.') =>
  new AppError('validation', 400, message, { fields });

export function isDatabaseDown(err: unknown): boolean {
  if (err instanceof ConnectionError) return true;
  const e = err as { code?: string; name?: string; original?: { code?: string }; parent?: { code?: string } } | null;
  const codes = [e?.code, e?.original?.code, e?.parent?.code];
  return (
    e?.name === 'SequelizeConnectionAcquireTimeoutError' ||
    codes.some((c) => c && /^(ECONNREFUSED|ECONNRESET|ER_GET_CONNECTION_TIMEOUT|ER_CONNECTION_TIMEOUT|ER_SOCKET_UNEXPECTED_CLOSE|PROTOCOL_CONNECTION_LOST|ER_CLOSING_POOL|ETIMEDOUT|ENOENT|EPIPE)$/.test(c))
  );
}

// MariaDB refusing a value the client sent (found by fuzzing: a number past a DECIMAL column's
// range reached the INSERT). The shared schemas should bound such fields; until they all do, the
// client still gets a 400 naming the field instead of a 500.
const DB_INPUT_REFUSALS: Record<number, string> = {
  1264: 'That value is out of range.', // ER_WARN_DATA_OUT_OF_RANGE
  1406: 'That text is too long.', // ER_DATA_TOO_LONG
  1366: 'That value cannot be stored.', // ER_TRUNCATED_WRONG_VALUE_FOR_FIELD (e.g. a lone surrogate)
  1292: 'That value cannot be stored.', // ER_TRUNCATED_WRONG_VALUE
};

/** The 400 for a value MariaDB refused, with the column as a camelCase field name; null if not one. */
export function databaseInputRefusal(err: unknown): { fields: Record<string, string> } | null {
  if (!(err instanceof DatabaseError)) return null;
  const parent = (err as { parent?: { errno?: number; message?: string; sqlMessage?: string } }).parent;
  const message = parent?.errno ? DB_INPUT_REFUSALS[parent.errno] : undefined;
  if (!message) return null;
  const column = /column '([^']+)'/.exec(parent?.sqlMessage ?? parent?.message ?? '')?.[1];
  return { fields: { [column ? camel(column) : '_']: message } };
}

const camel = (column: string) => column.replace(/_([a-z0-9])/g, (_m, c: string) => c.toUpperCase());

export const unknownRoute: RequestHandler = (req, _res, next) => {
  next(new AppError('not_found', 404, `No API route ${req.method} ${req.path}.`));
};

/** Maps every error to the one error shape. A 403 refusal is also written to the security log
 * (CSRF refusals are logged where they happen, in the CSRF check). */
export function errorHandler(log: (msg: string, err?: unknown) => void, securityLog?: SecurityLog): ErrorRequestHandler {
  return (err, req, res, _next) => {
    let status = 500;
    let body: { code: string; message: string; details?: ErrorDetails };
    if (err instanceof AppError) {
      status = err.status;
      body = { code: err.code, message: err.message, details: err.details };
    } else if (err instanceof ZodError) {
      status = 400;
      body = { code: 'validation', message: 'Some fields need attention.', details: { fields: fieldsFromZod(err) } };
    } else if (err?.type === 'entity.parse.failed') {
      status = 400;
      body = { code: 'bad_json', message: 'The request body is not valid JSON.' };
    } else if (err?.type === 'entity.too.large') {
      status = 413;
      body = { code: 'too_large', message: 'The request body is too large.' };
    } else if (typeof err?.status === 'number' && err.status >= 400 && err.status < 500) {
      status = err.status;
      body = { code: 'bad_request', message: err.expose ? String(err.message) : 'The request could not be read.' };
    } else if (err instanceof UniqueConstraintError) {
      status = 409;
      const fields: Record<string, string> = {};
      for (const item of err.errors ?? []) if (item.path) fields[item.path] = `That ${item.path} is already in use.`;
      body = { code: 'conflict', message: 'That record already exists.', details: { fields } };
    } else if (err instanceof SequelizeValidationError) {
      status = 400;
      const fields: Record<string, string> = {};
      for (const item of err.errors ?? []) if (item.path) fields[item.path] = item.message;
      body = { code: 'validation', message: 'Some fields need attention.', details: { fields } };
    } else if (databaseInputRefusal(err)) {
      status = 400;
      body = { code: 'validation', message: 'Some fields need attention.', details: { ...databaseInputRefusal(err)!, refusedBy: 'database' } };
    } else if (err instanceof ForeignKeyConstraintError) {
      // A reference to a record that does not exist (insert) or a record others still use (delete).
      const inUse = (err as { parent?: { errno?: number } }).parent?.errno === 1451;
      status = inUse ? 409 : 400;
      body = inUse
        ? { code: 'in_use', message: 'Other records still use this one, so it cannot be removed.' }
        : { code: 'validation', message: 'Some fields need attention.', details: { fields: Object.fromEntries((Array.isArray(err.fields) ? err.fields : ['_']).map((f) => [camel(String(f)), 'That record does not exist.'])) } };
    } else if (isRetryableLockError(err)) {
      // A deadlock victim or a lock wait that timed out: the transaction was rolled back whole.
      status = 503;
      res.setHeader('Retry-After', '1');
      body = { code: 'busy', message: 'Someone else was saving the same records at that moment, so nothing was saved. Try again.' };
    } else if (isDatabaseDown(err)) {
      status = 503;
      res.setHeader('Retry-After', '5');
      body = { code: 'db_unavailable', message: 'The database is not reachable just now. Try again in a moment.' };
    } else {
      if (err instanceof BaseError && isDatabaseDown((err as { parent?: unknown }).parent)) status = 503;
      log(`${req.method} ${req.originalUrl} failed`, err);
      body =
        status === 503
          ? { code: 'db_unavailable', message: 'The database is not reachable just now. Try again in a moment.' }
          : { code: 'internal', message: 'Something went wrong on our side. It has been logged.' };
    }
    if (status === 403 && body.code !== 'csrf') {
      securityLog?.('access_refused', { userId: req.user?.id ?? null, ip: req.ip, detail: `${req.method} ${req.originalUrl.split('?')[0]} ${body.code}` });
    }
    if (res.headersSent) return;
    res.status(status).json({ error: body.details ? body : { code: body.code, message: body.message } });
  };
}
