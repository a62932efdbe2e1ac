import { createServer } from 'node:net';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../apps/api/src/app';
import { testEnv } from '../support/env';

// Its own file: connectDb keeps one pool per process, and this app's pool must be the one pointing nowhere.

/** A port that was free a moment ago and has nothing listening on it now. */
async function closedPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const address = server.address();
  await new Promise<void>((resolve) => server.close(() => resolve()));
  if (address === null || typeof address === 'string') throw new Error('no port');
  return address.port;
}

const port = await closedPort();
const { app, close } = createApp(testEnv({ DATABASE_URL: `mysql://rw:pw@127.0.0.1:${port}/rinkwright_test`, DB_POOL_SIZE: '1' }));
afterAll(() => close());

describe('GET /api/health with the database unreachable', () => {
  it('answers 503 with db down', async () => {
    const response = await request(app).get('/api/health');

    // Status and body together, so a failure shows whether the body, the status or both are wrong.
    expect({ status: response.status, body: response.body }).toEqual({ status: 503, body: { status: 'degraded', db: 'down' } });
  });

  it('answers a route that needs the database with the error shape, not the driver error', async () => {
    const response = await request(app).get('/api/invitations/00000000-0000-4000-8000-000000000000');

    expect([500, 503]).toContain(response.status);
    expect(response.body).toEqual({ error: { code: expect.stringMatching(/^(internal|unavailable)$/), message: expect.any(String) } });
    expect(JSON.stringify(response.body)).not.toMatch(/ECONNREFUSED|mysql|127\.0\.0\.1/i);
  });
});
