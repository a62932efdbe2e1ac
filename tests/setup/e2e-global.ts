import { spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { z } from 'zod';
import { createDbHandle } from '@rinkwright/db/unscoped';
import { seedDemo } from '../../packages/db/src/seed';
import { recreateDatabase } from '../support/fresh-database';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    chromiumPath: string;
    artifacts: string;
    browserEnv: Record<string, string>;
  }
}

const settings = z
  .object({
    E2E_DATABASE_URL: z.string().startsWith('mysql://'),
    E2E_PORT: z.coerce.number().int().default(3100),
    BETTER_AUTH_SECRET: z.string().min(32),
    SMTP_PORT: z.coerce.number().int(),
    MAIL_API_URL: z.url(),
    WEB_DIST: z.string().default('dist/web'),
    CHROMIUM_PATH: z.string().default('/usr/bin/chromium'),
  })
  .parse(process.env);

/**
 * The browser tests run against the built app (the same bundle `npm start` serves) on its own port and its
 * own database, seeded with the demo, so a running demo is never touched.
 */
export default async function setup(project: TestProject) {
  await recreateDatabase(settings.E2E_DATABASE_URL, '_e2e');
  const handle = createDbHandle(settings.E2E_DATABASE_URL, { connectionLimit: 2 });
  try {
    await seedDemo(handle.db);
  } finally {
    await handle.close();
  }

  const baseUrl = `http://127.0.0.1:${settings.E2E_PORT}`;
  const artifacts = path.resolve('test-artifacts');
  mkdirSync(path.join(artifacts, 'screenshots'), { recursive: true });
  const server: ChildProcess = spawn(process.execPath, ['apps/api/dist/server.js'], {
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(settings.E2E_PORT),
      APP_URL: baseUrl,
      DATABASE_URL: settings.E2E_DATABASE_URL,
      WEB_DIST: path.resolve(settings.WEB_DIST),
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(settings.SMTP_PORT),
      LOG_LEVEL: 'warn',
      // Every browser test comes from one address; the limiters have their own integration tests.
      AUTH_RATE_LIMIT_MAX: '100000',
      API_RATE_LIMIT_MAX: '100000',
    },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  await waitForHealth(`${baseUrl}/api/health`, server);

  project.provide('baseUrl', baseUrl);
  project.provide('chromiumPath', settings.CHROMIUM_PATH);
  project.provide('artifacts', artifacts);
  // Chromium writes under HOME: give it a fresh one.
  const home = mkdtempSync(path.join(tmpdir(), 'rinkwright-chromium-'));
  project.provide('browserEnv', { ...(process.env as Record<string, string>), HOME: home });

  return async () => {
    server.kill('SIGTERM');
    await new Promise((resolve) => server.once('exit', resolve).once('error', resolve));
  };
}

async function waitForHealth(url: string, server: ChildProcess): Promise<void> {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error(`the API exited with code ${server.exitCode} before it was healthy`);
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error(`the API did not answer ${url} within 30 s`);
}
