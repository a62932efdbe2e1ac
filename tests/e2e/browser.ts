import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject, onTestFailed } from 'vitest';

// Debian's Chromium, driven by playwright-core; never a downloaded browser.
async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: inject('chromiumPath'),
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
    env: inject('browserEnv'),
  });
}

/** One browser for the calling test file, closed after it; each test opens its own sessions in it. */
export function useBrowser(): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });
  return () => {
    if (!browser) throw new Error('the browser is not started yet');
    return browser;
  };
}

export const DEMO_PASSWORD = 'rinkwright-demo';

export async function signIn(session: Session, email: string, password = DEMO_PASSWORD): Promise<void> {
  await session.page.goto('/sign-in');
  await session.page.getByLabel('E-mail').fill(email);
  await session.page.getByLabel('Password').fill(password);
  await session.page.getByRole('button', { name: 'Sign in' }).click();
}

export interface Session {
  context: BrowserContext;
  page: Page;
  /** Uncaught errors and console errors seen so far (failed loads of answered 4xx requests excepted). */
  problems: string[];
  shot(name: string): Promise<void>;
}

/** A new browser profile (its own cookies) at tablet size, with errors collected so a test can fail on them. */
export async function openSession(browser: Browser, label: string): Promise<Session> {
  const context = await browser.newContext({ baseURL: inject('baseUrl'), viewport: { width: 1180, height: 820 } });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  page.on('console', (message) => {
    // The browser logs every 4xx answer as a failed resource; the app expects some (401 before sign-in, 404 tests).
    if (message.type() === 'error' && !/Failed to load resource: the server responded with a status of 4\d\d/.test(message.text())) {
      problems.push(`console error: ${message.text()}`);
    }
  });
  let n = 0;
  // What the page showed when a test failed, to read beside the error.
  onTestFailed(async () => {
    await page.screenshot({ path: path.join(inject('artifacts'), 'screenshots', `${label}-FAILED.png`), fullPage: true }).catch(() => undefined);
  });
  return {
    context,
    page,
    problems,
    async shot(name) {
      n += 1;
      await page.waitForLoadState('networkidle');
      await page.screenshot({ path: path.join(inject('artifacts'), 'screenshots', `${label}-${String(n).padStart(2, '0')}-${name}.png`), fullPage: true });
    },
  };
}

/** Fails on any error the page logged; a test that cuts the network on purpose may allow the failed loads. */
export function expectNoProblems(session: Session, options: { networkCut?: boolean } = {}): void {
  const problems = options.networkCut ? session.problems.filter((p) => !/Failed to load resource: net::ERR_/.test(p)) : session.problems;
  expect(problems).toEqual([]);
}
