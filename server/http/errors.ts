import type { ErrorRequestHandler, RequestHandler } from 'express';
import { BaseError, ConnectionError, UniqueConstraintError, ValidationError as SequelizeValidationError } from 'sequelize';
import { ZodError } from 'zod';

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
    codes.some((c) => c && /^(ECONNREFUSED|ECONNRESET|ER_GET_CONNECTION_TIMEOUT|ER_CONNECTION_TIMEOUT|ER_SOCKET_UNEXPECTED_CLOSE|PROTOCOL_CONNECTION_LOST|ER_CLOSING_POOL|ETIMEDOUT)$/.test(c))
  );
}

export const unknownRoute: RequestHandler = (req, _res, next) => {
  next(new AppError('not_found', 404, `No API route ${req.method} ${req.path}.`));
};

export function errorHandler(log: (msg: string, err?: unknown) => void): ErrorRequestHandler {
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
    if (res.headersSent) return;
    res.status(status).json({ error: body.details ? body : { code: body.code, message: body.message } });
  };
}
