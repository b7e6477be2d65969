import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { fieldsFromZod, validationError } from './errors.js';

type Part = 'body' | 'query' | 'params';

/** Parses one part of the request with a shared zod schema; the parsed value lands in res.locals[part]. */
export function validate<S extends z.ZodType>(part: Part, schema: S): RequestHandler {
  return (req, res, next) => {
    const input = part === 'body' && (req.body === undefined || req.body === null) ? {} : req[part];
    if (part === 'body' && (typeof input !== 'object' || Array.isArray(input))) {
      return next(validationError({ _: 'The body must be a JSON object.' }));
    }
    const result = schema.safeParse(input);
    if (!result.success) return next(validationError(fieldsFromZod(result.error)));
    res.locals[part] = result.data;
    next();
  };
}

/** The parsed value left by `validate`. */
export function parsed<T>(res: { locals: Record<string, unknown> }, part: Part): T {
  return res.locals[part] as T;
}
