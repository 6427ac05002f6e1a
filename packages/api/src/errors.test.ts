import type { AddressInfo } from 'node:net';
import express from 'express';
import { describe, expect, it } from 'vitest';
import { errorMiddleware } from './errors.js';

/** What the error middleware answers when a handler fails with `error`. */
async function answerTo(error: unknown): Promise<{ status: number; body: unknown }> {
  const app = express();
  app.get('/', () => {
    throw error;
  });
  app.use(errorMiddleware);
  const server = app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  try {
    const reply = await fetch(`http://127.0.0.1:${(server.address() as AddressInfo).port}/`);
    return { status: reply.status, body: await reply.json() };
  } finally {
    server.close();
  }
}

describe('errorMiddleware and database errors', () => {
  // The shapes are mysql2's errors as TypeORM wraps them (QueryFailedError keeps driverError).
  it('answers 503 to a transaction still refused after its retries (a deadlock, or a Galera certification failure): nothing was stored', async () => {
    const refused = { message: 'Deadlock found when trying to get lock; try restarting transaction', driverError: { code: 'ER_LOCK_DEADLOCK', errno: 1213 } };
    expect(await answerTo(refused)).toEqual({ status: 503, body: { error: 'unavailable', message: expect.stringMatching(/too busy.*nothing was changed/) } });
  });

  it("answers 503 to MariaDB's statement time limit, which mysql2 reports by number only", async () => {
    const stopped = { message: 'Query execution was interrupted (max_statement_time exceeded)', errno: 1969, driverError: { errno: 1969 } };
    expect(await answerTo(stopped)).toEqual({ status: 503, body: { error: 'unavailable', message: expect.stringMatching(/did not answer in time/) } });
  });

  it('still answers 500 to an error it does not know', async () => {
    expect((await answerTo(new Error('something else'))).status).toBe(500);
  });
});
