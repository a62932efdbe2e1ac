import { formatLength, levelPosition, type PortalRinkDetail, type PublicRink } from '@rinkwright/core';
import type { Browser, Page } from 'playwright-core';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { DEMO_PASSWORD, expectNoProblems, openSession, signIn, useBrowser, type Session } from './browser';

// The skater's side in a real browser: the seeded skater's portal (balances, lots, sharpenings with their
// readings, profiles, member code), joining a membership through hosted checkout and cancelling it at the end of
// the period, mail choices that outlast a reload, and an anonymous visitor whose card is declined on the public
// page. Every page is also looked at phone-sized, where nothing may scroll sideways.

const STRIPE = inject('browserEnv').STRIPE_API_BASE ?? 'http://127.0.0.1:12112';
const SKATER = 'skater@ice-harbor.test';
const PHONE = { width: 390, height: 844 };
const BAND_WORDS = { true: 'True', fair: 'Fair', off: 'Off' } as const;

/** A signed-in page's own fetch: same cookies and Origin as the screens, so the API treats it as the app. */
async function callApi<T>(page: Page, path: string, init: { method?: string; body?: unknown; idempotent?: boolean } = {}): Promise<T> {
  const answer = await page.evaluate(
    async ({ path, init }) => {
      const headers: Record<string, string> = { 'content-type': 'application/json' };
      if (init.idempotent) headers['idempotency-key'] = crypto.randomUUID();
      const res = await fetch(path, { method: init.method ?? 'GET', headers, body: init.body === undefined ? undefined : JSON.stringify(init.body) });
      return { status: res.status, body: (await res.json()) as unknown };
    },
    { path, init },
  );
  if (answer.status >= 400) throw new Error(`${init.method ?? 'GET'} ${path} answered ${answer.status}: ${JSON.stringify(answer.body)}`);
  return answer.body as T;
}

/** A browser profile for setting the scene before the tests: openSession needs a running test for its failure screenshot. */
async function setupPage(browser: Browser, email: string): Promise<{ page: Page; close: () => Promise<void> }> {
  const context = await browser.newContext({ baseURL: inject('baseUrl') });
  const page = await context.newPage();
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/rinks/);
  return { page, close: () => context.close() };
}

async function signedIn(browser: Browser, label: string, email: string): Promise<Session> {
  const session = await openSession(browser, label);
  await signIn(session, email);
  await session.page.waitForURL(/\/rinks/);
  return session;
}

/** The page's width holds its content: a phone never has to scroll sideways (tables scroll inside themselves). */
async function expectFitsWidth(page: Page): Promise<void> {
  const { content, viewport } = await page.evaluate(() => ({ content: document.documentElement.scrollWidth, viewport: window.innerWidth }));
  expect(content).toBeLessThanOrEqual(viewport);
}

async function payOnHostedPage(page: Page, card: string, email: string): Promise<void> {
  await page.getByRole('heading', { name: 'Payment service test checkout' }).waitFor();
  // Typed only when the page leaves it empty: a checkout for a known customer may show their address fixed.
  const address = page.getByLabel('E-mail');
  if ((await address.inputValue()) === '') await address.fill(email);
  await page.getByLabel('Card number').fill(card);
  await page.getByLabel('Expiry (MM / YY)').fill('12 / 34');
  await page.getByLabel('CVC').fill('123');
  await page.getByRole('button', { name: /^Pay / }).click();
}

async function customerAtIceHarbor(tech: { page: Page }, email: string): Promise<string> {
  const found = await callApi<{ customers: { id: string; email: string | null }[] }>(tech.page, `/api/rinks/ice-harbor/customers?q=${encodeURIComponent(email)}`);
  const customer = found.customers.find((c) => c.email === email);
  if (!customer) throw new Error(`Ice Harbor has no customer ${email}`);
  return customer.id;
}

describe('the skater’s side: public page, hosted checkout and the portal', () => {
  const browser = useBrowser();

  beforeAll(async () => {
    // Ice Harbor can sell only once its payout account is onboarded (another browser test may have done it already).
    const owner = await setupPage(browser(), 'owner@ice-harbor.test');
    const billing = await callApi<{ payout: { chargesEnabled: boolean } }>(owner.page, '/api/rinks/ice-harbor/billing');
    if (!billing.payout.chargesEnabled) {
      await callApi(owner.page, '/api/rinks/ice-harbor/billing/payout-account', { method: 'POST' });
      const { payout } = await callApi<{ payout: { accountId: string } }>(owner.page, '/api/rinks/ice-harbor/billing');
      expect((await fetch(`${STRIPE}/_fake/accounts/${payout.accountId}/complete_onboarding`, { method: 'POST' })).ok).toBe(true);
      await callApi(owner.page, '/api/rinks/ice-harbor/billing/payout-account/refresh', { method: 'POST' });
    }
    expect((await callApi<PublicRink>(owner.page, '/api/public/rinks/ice-harbor')).selling).toBe(true);

    // The seed hands out lots and profiles at random, so the counter gives the skater one of each to look for.
    const tech = await setupPage(browser(), 'tech@ice-harbor.test');
    const customerId = await customerAtIceHarbor(tech, SKATER);
    const { products } = await callApi<PublicRink>(tech.page, '/api/public/rinks/ice-harbor');
    const five = products.find((p) => p.name === 'Five sharpenings');
    if (!five) throw new Error('the demo has no Five sharpenings card');
    await callApi(tech.page, `/api/rinks/ice-harbor/customers/${customerId}/sales`, { method: 'POST', idempotent: true, body: { productId: five.id, paymentMethodId: 'cash' } });
    await callApi(tech.page, `/api/rinks/ice-harbor/customers/${customerId}/profiles`, {
      method: 'POST',
      body: { label: 'Outdoor skates', bladeWidthNm: 2_900_000, preferredHollowNm: 15_875_000, notes: 'For the pond behind the rink' },
    });
    await owner.close();
    await tech.close();
  });

  it('shows the seeded skater each rink’s balance, lots, sharpenings with readings, profiles and member code', async () => {
    const skater = await signedIn(browser(), 'portal-tour', SKATER);
    await skater.page.getByRole('link', { name: /My skates/ }).click();
    await skater.page.waitForURL(/\/portal$/);
    await skater.page.getByRole('heading', { name: 'My skates' }).waitFor();
    const home = await callApi<{ rinks: { rink: { name: string; slug: string }; credits: number }[] }>(skater.page, '/api/portal');
    expect(home.rinks.map((r) => r.rink.name).sort()).toEqual(['Ice Harbor', 'North Pond Arena']);
    for (const r of home.rinks) {
      const card = skater.page.getByRole('region', { name: r.rink.name });
      await expect.poll(() => card.getByText(String(r.credits), { exact: true }).count()).toBe(1);
    }
    await skater.shot('home');

    await skater.page.getByRole('link', { name: 'History, sharpenings and member code at Ice Harbor' }).click();
    await skater.page.getByRole('heading', { name: 'Ice Harbor', level: 1 }).waitFor();
    const detail = await callApi<PortalRinkDetail>(skater.page, '/api/portal/rinks/ice-harbor');

    const credits = skater.page.getByRole('region', { name: 'Credits' });
    await expect.poll(() => credits.getByText(String(detail.balance.credits), { exact: true }).count()).toBe(1);
    const lot = credits.getByRole('listitem').filter({ hasText: 'Five sharpenings' }).filter({ hasText: '5 of 5 left' });
    await expect.poll(() => lot.count()).toBe(1);
    expect(await lot.innerText()).toMatch(/expires \S.*\d{4}/);
    for (const l of detail.balance.lots.filter((x) => x.remaining > 0 && x.expiresAt)) {
      expect(await credits.getByRole('listitem').filter({ hasText: `${l.remaining} of ${l.credits} left` }).count()).toBeGreaterThan(0);
    }

    await skater.shot('ice-harbor');
    const history = skater.page.getByRole('region', { name: 'Credit history' });
    const newest = history.getByRole('listitem').first();
    expect(await newest.innerText()).toMatch(/Purchase · Payment[\s\S]*\+5/);

    const sharpened = skater.page.getByRole('region', { name: 'Sharpenings' });
    const sharpeningItems = sharpened.getByRole('listitem').filter({ hasText: /Ticket \d+/ });
    await expect.poll(() => sharpeningItems.count()).toBe(Math.min(5, detail.sharpenings.length));
    const withReadings = detail.sharpenings.slice(0, 5).find((s) => s.readings.length > 0);
    if (!withReadings) throw new Error('the seeded skater has no sharpening with a level reading');
    const item = sharpened.getByRole('listitem').filter({ hasText: `Ticket ${withReadings.ticketNumber} ·` }).first();
    for (const r of withReadings.readings) {
      const shown = formatLength(r.readingNm, detail.rink.unitPreference, 'reading');
      const band = BAND_WORDS[levelPosition(r.readingNm, detail.bands).band];
      await expect.poll(() => item.getByRole('figure', { name: `Level reading ${shown.value} ${shown.unit}, ${band}` }).count()).toBeGreaterThan(0);
    }
    expect(await item.innerText()).toMatch(/\d+ passes|1 pass/);
    if (detail.sharpenings.length > 5) {
      await sharpened.getByRole('button', { name: `Show ${detail.sharpenings.length - 5} more sharpenings` }).click();
      await expect.poll(() => sharpeningItems.count()).toBe(detail.sharpenings.length);
    }
    const rerun = detail.sharpenings.find((s) => s.readings.some((r) => r.attempt === 2));
    if (rerun) {
      const rerunItem = sharpened.getByRole('listitem').filter({ hasText: `Ticket ${rerun.ticketNumber} · ${rerun.pairLabel}` }).first();
      await expect.poll(() => rerunItem.getByText('Attempt 2 (re-run)').count()).toBeGreaterThan(0);
    }
    await expect.poll(() => sharpened.getByText(/Freshly sharpened blades are sharp/).count()).toBe(1);

    const profiles = skater.page.getByRole('region', { name: 'Skate profiles' });
    expect(await profiles.getByRole('listitem').filter({ hasText: 'Outdoor skates' }).innerText()).toContain('5/8"');

    const code = skater.page.getByRole('region', { name: 'Member code' });
    const qr = code.getByRole('img', { name: `QR code of member code ${detail.customer.memberCode}` });
    await expect.poll(() => qr.locator('svg').count()).toBe(1);
    await expect.poll(() => code.getByText(detail.customer.memberCode, { exact: true }).count()).toBe(1);

    // The demo leaves North Pond without a payout account: until it has one, its prices show without a Buy button.
    await skater.page.goto('/portal/north-pond-arena');
    await skater.page.getByRole('heading', { name: 'North Pond Arena', level: 1 }).waitFor();
    const north = await callApi<PublicRink>(skater.page, '/api/public/rinks/north-pond-arena');
    const northBuy = skater.page.getByRole('region', { name: 'Buy credits' });
    await northBuy.getByText('Six sharpenings').waitFor();
    expect(await northBuy.getByText(/does not sell online yet/).count()).toBe(north.selling ? 0 : 1);
    expect(await northBuy.getByRole('button', { name: /^(Buy|Join) / }).count()).toBe(north.selling ? north.products.length : 0);
    await skater.shot('north-pond');

    await skater.page.setViewportSize(PHONE);
    for (const [path, heading] of [
      ['/portal', 'My skates'],
      ['/portal/ice-harbor', 'Ice Harbor'],
    ] as const) {
      await skater.page.goto(path);
      await skater.page.getByRole('heading', { name: heading, level: 1 }).waitFor();
      await skater.page.getByRole('region').first().waitFor();
      await expectFitsWidth(skater.page);
      await skater.shot(`phone${path.replaceAll('/', '-')}`);
    }
    expectNoProblems(skater);
    await skater.context.close();
  });

  it('joins a membership from the portal, pays on hosted checkout, sees its credits and cancels at period end', async () => {
    const skater = await signedIn(browser(), 'portal-membership', SKATER);
    await skater.page.goto('/portal/ice-harbor');
    const before = await callApi<PortalRinkDetail>(skater.page, '/api/portal/rinks/ice-harbor');
    expect(before.memberships).toEqual([]);
    const buy = skater.page.getByRole('region', { name: 'Buy credits' });
    await buy.getByRole('button', { name: 'Join Monthly edge club' }).click();
    await payOnHostedPage(skater.page, '4242 4242 4242 4242', SKATER);

    await skater.page.waitForURL(/\/portal\/ice-harbor\?session=cs_/);
    await skater.page.getByText('4 credits added — Monthly edge club').waitFor({ timeout: 30_000 });
    const memberships = skater.page.getByRole('region', { name: 'Memberships' });
    await memberships.getByText('Active', { exact: true }).waitFor();
    await memberships.getByText(/4 credits per month · Current period ends/).waitFor();
    const credits = skater.page.getByRole('region', { name: 'Credits' });
    await expect.poll(() => credits.getByText(String(before.balance.credits + 4), { exact: true }).count()).toBe(1);
    await expect.poll(() => credits.getByRole('listitem').filter({ hasText: 'Monthly edge club' }).filter({ hasText: '4 of 4 left' }).count()).toBe(1);
    await buy.getByText('You are a member').waitFor();
    expect(await buy.getByRole('button', { name: 'Join Monthly edge club' }).count()).toBe(0);
    await skater.shot('membership-paid');

    await memberships.getByRole('button', { name: 'Cancel at period end' }).click();
    const confirm = memberships.getByRole('group', { name: 'Confirm cancelling' });
    await confirm.getByText(/stays active until then/).waitFor();
    await skater.shot('membership-confirm-cancel');
    await confirm.getByRole('button', { name: 'Yes, cancel at period end' }).click();
    await memberships.getByText(/Cancels at the end of the period, on /).waitFor();
    expect(await memberships.getByRole('button', { name: 'Cancel at period end' }).count()).toBe(0);

    await skater.page.reload();
    await memberships.getByText(/Cancels at the end of the period, on /).waitFor();
    await expect.poll(() => memberships.getByText('Active', { exact: true }).count()).toBe(1);
    const after = await callApi<PortalRinkDetail>(skater.page, '/api/portal/rinks/ice-harbor');
    expect(after.memberships.map((m) => ({ state: m.state, cancelAtPeriodEnd: m.cancelAtPeriodEnd }))).toEqual([{ state: 'active', cancelAtPeriodEnd: true }]);
    await skater.page.goto('/portal');
    await skater.page.getByRole('region', { name: 'Ice Harbor' }).getByText(/Cancels at the end of the period/).waitFor();
    await skater.shot('membership-canceling');

    await skater.page.setViewportSize(PHONE);
    await skater.page.goto('/portal/ice-harbor');
    await memberships.getByText(/Cancels at the end of the period, on /).waitFor();
    await expectFitsWidth(skater.page);
    await skater.shot('phone-membership');
    expectNoProblems(skater);
    await skater.context.close();
  }, 120_000);

  it('keeps the skater’s mail choices after a reload', async () => {
    const skater = await signedIn(browser(), 'portal-preferences', SKATER);
    await skater.page.goto('/portal/ice-harbor');
    const form = skater.page.getByRole('form', { name: 'E-mail from this rink' });
    const ready = form.getByLabel('Tell me when my skates are ready');
    const reminders = form.getByLabel('Remind me before credits expire or run low');
    await ready.waitFor();
    const was = { ready: await ready.isChecked(), reminders: await reminders.isChecked() };
    await ready.setChecked(!was.ready);
    await reminders.setChecked(!was.reminders);
    await form.getByRole('button', { name: 'Save choices' }).click();
    await form.getByText('Saved.').waitFor();
    await skater.shot('preferences-saved');

    await skater.page.reload();
    await ready.waitFor();
    expect({ ready: await ready.isChecked(), reminders: await reminders.isChecked() }).toEqual({ ready: !was.ready, reminders: !was.reminders });
    expect((await callApi<PortalRinkDetail>(skater.page, '/api/portal/rinks/ice-harbor')).preferences).toEqual({ notifyReady: !was.ready, notifyReminders: !was.reminders });

    // Back to one choice changed: each box is saved for itself, not the pair as one switch.
    await reminders.setChecked(was.reminders);
    await form.getByRole('button', { name: 'Save choices' }).click();
    await form.getByText('Saved.').waitFor();
    await skater.page.reload();
    await ready.waitFor();
    expect({ ready: await ready.isChecked(), reminders: await reminders.isChecked() }).toEqual({ ready: !was.ready, reminders: was.reminders });
    // The skater's choices as they were: other browser tests expect this skater's "ready" mail.
    await ready.setChecked(was.ready);
    await form.getByRole('button', { name: 'Save choices' }).click();
    await form.getByText('Saved.').waitFor();
    expectNoProblems(skater);
    await skater.context.close();
  });

  it('explains an empty portal to someone no rink has linked yet', async () => {
    // North Pond's manager works at a rink but is nobody's customer: the portal has nothing of theirs to show.
    const stranger = await signedIn(browser(), 'portal-empty', 'manager@north-pond.test');
    await stranger.page.setViewportSize(PHONE);
    await stranger.page.goto('/portal');
    await stranger.page.getByText('No rink has linked your account yet.').waitFor();
    await stranger.page.getByText(/verified e-mail address matches the one the rink has for you/).waitFor();
    await expectFitsWidth(stranger.page);
    await stranger.shot('phone-empty');
    await stranger.page.goto('/portal/ice-harbor');
    await stranger.page.getByRole('heading', { name: 'You have no record at this rink yet', level: 1 }).waitFor();
    await stranger.page.getByRole('link', { name: 'The rink’s page' }).waitFor();
    await expectFitsWidth(stranger.page);
    await stranger.shot('phone-not-linked');
    expectNoProblems(stranger);
    await stranger.context.close();
  });

  it('shows an anonymous visitor the products with prices; a declined card grants nothing, a second card does', async () => {
    const visitor = await openSession(browser(), 'portal-visitor');
    await visitor.page.goto('/r/ice-harbor');
    await visitor.page.getByRole('heading', { name: 'Ice Harbor', level: 1 }).waitFor();
    for (const [group, name, price] of [
      ['Punch cards', 'Ten sharpenings', '110.00'],
      ['Punch cards', 'Five sharpenings', '58.00'],
      ['Memberships', 'Monthly edge club', '39.00'],
      ['Single sharpenings', 'Single sharpening', '12.00'],
    ] as const) {
      const row = visitor.page.getByRole('region', { name: group }).getByRole('listitem').filter({ hasText: name });
      await expect.poll(() => row.count()).toBe(1);
      expect(await row.innerText()).toContain(price);
    }
    expect(await visitor.page.getByText('League pack of 100').count()).toBe(0);
    await visitor.shot('public-page');

    const north = (await (await fetch(`${inject('baseUrl')}/api/public/rinks/north-pond-arena`)).json()) as PublicRink;
    await visitor.page.goto('/r/north-pond-arena');
    await visitor.page.getByRole('heading', { name: 'North Pond Arena', level: 1 }).waitFor();
    await visitor.page.getByText('Six sharpenings').waitFor();
    expect(await visitor.page.getByText('North Pond Arena is not selling online yet. Ask at the sharpening counter.').count()).toBe(north.selling ? 0 : 1);
    expect(await visitor.page.getByRole('button', { name: /^(Buy|Join) / }).count()).toBe(north.selling ? north.products.length : 0);
    await visitor.shot('public-north-pond');

    await visitor.page.goto('/r/ice-harbor');
    const email = `declined-${Date.now()}@example.test`;
    await visitor.page.getByRole('button', { name: 'Buy Five sharpenings' }).click();
    await visitor.page.getByLabel('Name').fill('Oskari Lindqvist-Moreau');
    await visitor.page.getByLabel('E-mail').fill(email);
    await visitor.shot('public-buy-form');
    await visitor.page.getByRole('button', { name: 'Continue to payment' }).click();
    await payOnHostedPage(visitor.page, '4000 0000 0000 0002', email);
    await visitor.page.getByRole('alert').filter({ hasText: 'Your card was declined.' }).waitFor();
    await visitor.shot('declined');
    const sessionId = /\/checkout\/(cs_[A-Za-z0-9_]+)/.exec(visitor.page.url())?.[1];
    if (!sessionId) throw new Error(`the declined card left the checkout page: ${visitor.page.url()}`);
    const status = (await (await fetch(`${inject('baseUrl')}/api/public/rinks/ice-harbor/checkout/${sessionId}`)).json()) as { state: string };
    expect(status.state).toBe('pending');

    await visitor.page.getByRole('link', { name: 'Cancel and go back' }).click();
    await visitor.page.waitForURL(/\/r\/ice-harbor$/);
    await visitor.page.getByRole('button', { name: 'Buy Five sharpenings' }).waitFor();

    const tech = await signedIn(browser(), 'portal-visitor-check', 'tech@ice-harbor.test');
    const customerId = await customerAtIceHarbor(tech, email);
    expect((await callApi<{ credits: number }>(tech.page, `/api/rinks/ice-harbor/customers/${customerId}/balance`)).credits).toBe(0);

    await visitor.page.setViewportSize(PHONE);
    await visitor.page.reload();
    await visitor.page.getByRole('button', { name: 'Buy Five sharpenings' }).waitFor();
    await expectFitsWidth(visitor.page);
    await visitor.shot('phone-public-page');
    // The form opens above the list: pressed at the foot of a phone's page, it must still come into view.
    await visitor.page.getByRole('button', { name: 'Buy Single sharpening' }).click();
    const name = visitor.page.getByLabel('Name');
    await expect.poll(() => name.evaluate((el) => el === document.activeElement && el.getBoundingClientRect().top >= 0 && el.getBoundingClientRect().bottom <= window.innerHeight)).toBe(true);
    await expectFitsWidth(visitor.page);
    await visitor.shot('phone-buy-form');

    // The same visitor tries again with a card that works: the thanks page confirms, and only this payment counts.
    await name.fill('Oskari Lindqvist-Moreau');
    await visitor.page.getByLabel('E-mail').fill(email);
    await visitor.page.getByRole('button', { name: 'Continue to payment' }).click();
    await payOnHostedPage(visitor.page, '4242 4242 4242 4242', email);
    await visitor.page.waitForURL(/\/r\/ice-harbor\/thanks\?session=cs_/);
    await visitor.page.getByText('1 credit added').waitFor({ timeout: 30_000 });
    await visitor.page.getByRole('link', { name: 'Create an account' }).waitFor();
    await expectFitsWidth(visitor.page);
    await visitor.shot('phone-thanks');
    expect((await callApi<{ credits: number }>(tech.page, `/api/rinks/ice-harbor/customers/${customerId}/balance`)).credits).toBe(1);
    expectNoProblems(visitor);
    expectNoProblems(tech);
    await visitor.context.close();
    await tech.context.close();
  });
});
