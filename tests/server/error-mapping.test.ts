// How database failures reach an API client: never as a 500 when the database is the cause.
import express from 'express';
import request from 'supertest';
import { ConnectionError, DatabaseError } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { errorHandler } from '../../server/http/errors.js';

function appThrowing(make: () => Error) {
  const app = express();
  app.post('/x', () => {
    throw make();
  });
  app.use(errorHandler(() => undefined));
  return app;
}

describe('database errors in API answers', () => {
  it('when a request loses a deadlock, then it answers 503 busy with Retry-After, not 500', async () => {
    const parent = Object.assign(new Error('Deadlock found when trying to get lock; try restarting transaction'), { errno: 1213, sql: 'UPDATE …' });
    const res = await request(appThrowing(() => new DatabaseError(parent as never))).post('/x');
    expect(res.status).toBe(503);
    expect(res.headers['retry-after']).toBe('1');
    expect(res.body.error.code).toBe('busy');
  });

  // Over the Unix socket a server that stops shows as a missing socket file (ENOENT) or a write to
  // a closed socket (EPIPE); the load run with MariaDB stopped found the EPIPE ones answered 500.
  it.each(['ENOENT', 'EPIPE', 'ECONNRESET'])('when the database socket fails with %s, then the answer is 503 db_unavailable', async (code) => {
    const raw = Object.assign(new Error(`write ${code}`), { code });
    for (const make of [() => raw, () => new ConnectionError(raw), () => Object.assign(new DatabaseError(raw as never), { parent: raw })]) {
      const res = await request(appThrowing(make)).post('/x');
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('db_unavailable');
    }
  });
});
