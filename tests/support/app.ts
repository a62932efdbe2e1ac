import { randomInt } from 'node:crypto';
import request from 'supertest';
import { afterAll } from 'vitest';
import { createApp, type AppBundle } from '../../apps/api/src/app';
import type { Env } from '../../apps/api/src/env';
import { testEnv } from './env';

export type Client = ReturnType<typeof request.agent>;

export interface TestApp extends AppBundle {
  env: Env;
  /** The APP_URL origin: the only origin the API accepts cookie-carrying writes from. */
  origin: string;
  /** A fresh browser-like client: its own cookie jar, its own address, the app's Origin on every request. */
  client(): Client;
  /** A client holding the session cookie of this user. */
  signIn(email: string, password: string): Promise<Client>;
}

/** An address from 10.0.0.0/8, so that each client gets its own rate-limit bucket. */
export function randomClientAddress(): string {
  return `10.${randomInt(256)}.${randomInt(256)}.${randomInt(1, 255)}`;
}

/**
 * Builds the app once for a test file and closes it after the file. connectDb keeps one pool per process,
 * so a file must build at most one app: a second one would silently reuse the first one's database.
 */
export function buildTestApp(overrides: Record<string, string> = {}): TestApp {
  const env = testEnv(overrides);
  const bundle = createApp(env);
  afterAll(() => bundle.close());
  const origin = new URL(env.APP_URL).origin;

  const client = () => request.agent(bundle.app).set('Origin', origin).set('X-Forwarded-For', randomClientAddress());

  async function signIn(email: string, password: string): Promise<Client> {
    const agent = client();
    const response = await agent.post('/api/auth/sign-in/email').send({ email, password });
    if (response.status !== 200) {
      throw new Error(`sign-in of ${email} answered ${response.status}: ${JSON.stringify(response.body)}`);
    }
    return agent;
  }

  return { ...bundle, env, origin, client, signIn };
}
