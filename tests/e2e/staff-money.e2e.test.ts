import { describe, expect, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import { expectNoProblems, openSession, signIn, useBrowser, type Session } from './browser';

// The staff's money screens in a real browser against the demo: the owner connects the payout account and
// moves the test clock, a manager adds and reprices a punch card, sells one at the counter and refunds it, the
// league manager imports a roster and shares out the pool, and a rink whose plan payment failed says so.

const ICE = '/rinks/ice-harbor';

async function staffSession(browser: () => Browser, label: string, email: string, home: string): Promise<Session> {
  const session = await openSession(browser(), label);
  await signIn(session, email);
  await session.page.waitForURL(`**${home}`);
  return session;
}

/** A JSON answer of the API, read with the page's own session cookie. */
async function apiGet<T>(page: Page, path: string): Promise<T> {
  return page.evaluate(async (p) => {
    const res = await fetch(p);
    if (!res.ok) throw new Error(`${p} answered ${res.status}`);
    return (await res.json()) as unknown;
  }, path) as Promise<T>;
}

/** Picks the one option whose words match, as a person reads down the list. */
async function choose(select: Locator, words: RegExp): Promise<void> {
  const labels = await select.locator('option').allTextContents();
  const label = labels.find((l) => words.test(l));
  if (!label) throw new Error(`no option matches ${words}: ${labels.join(' | ')}`);
  await select.selectOption({ label });
}

/** A tablet shows the whole page width: nothing sticks out past the right edge. */
async function expectFitsWidth(page: Page): Promise<void> {
  expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
}

/** The number a money figure on screen stands for, in minor units ("CA$1,234.50" → 123450). */
const minorOf = (text: string) => Math.round(Number(text.replace(/[^\d.]/g, '')) * 100);

interface ProductJson {
  id: string;
  name: string;
  price: { amountMinor: number };
  priceHistory: { amountMinor: number; retiredAt: string | null }[];
}

interface LeagueJson {
  pool: { credits: number };
  teams: { name: string; allocated: number; remaining: number; players: { name: string }[] }[];
  imports: unknown[];
}

describe('the staff money screens', () => {
  const browser = useBrowser();

  it('lets the owner connect the payout account, read the plan and move the test clock', async () => {
    const owner = await staffSession(browser, 'money-owner', 'owner@ice-harbor.test', ICE);
    const { page } = owner;
    await page.getByRole('navigation', { name: 'Ice Harbor sections' }).getByRole('link', { name: 'Billing' }).click();
    const payout = page.getByRole('region', { name: 'Payout account' });
    // Another browser test may have connected the demo rink already; then there is nothing to connect.
    const state = payout.getByText(/^Not connected|^Connected and taking payments\.$/);
    await state.first().waitFor();
    if (/^Not connected/.test((await state.first().textContent()) ?? '')) {
      await owner.shot('billing-not-connected');
      await payout.getByRole('button', { name: 'Connect payout account' }).click();
      await page.getByRole('heading', { name: 'Payment service test onboarding' }).waitFor();
      await page.getByRole('button', { name: 'Complete onboarding' }).click();
      await page.getByRole('status').filter({ hasText: 'Back from the payment service. Connected and taking payments.' }).waitFor();
    }
    await payout.getByText('Connected and taking payments.', { exact: true }).waitFor();
    await expect(payout.getByRole('button', { name: /connect/i }).count()).resolves.toBe(0);

    const plan = page.getByRole('region', { name: 'Rinkwright plan' });
    await expect(plan.getByTestId('plan-state').textContent()).resolves.toMatch(/^Active, renews /);
    await expect(plan.getByRole('definition').first().textContent()).resolves.toBe('3');

    const clock = page.getByRole('form', { name: 'Test clock' });
    await clock.getByLabel('Advance by (days)').fill('0');
    await clock.getByRole('button', { name: 'Advance the test clock' }).click();
    await clock.getByText('At least 1 day').waitFor();
    await clock.getByLabel('Advance by (days)').fill('30');
    await clock.getByRole('button', { name: 'Advance the test clock' }).click();
    await clock.getByRole('status').filter({ hasText: 'Test clocks moved 30 days forward.' }).waitFor();
    await owner.shot('billing');
    expectNoProblems(owner);
    await owner.context.close();
  });

  it('lets a manager add a punch card, refusing a bad price, and reprice it as a new version', async () => {
    const manager = await staffSession(browser, 'money-products', 'manager@ice-harbor.test', ICE);
    const { page } = manager;
    await page.getByRole('navigation', { name: 'Ice Harbor sections' }).getByRole('link', { name: 'Products' }).click();
    const table = page.getByRole('table', { name: 'Products of the rink' });
    await table.getByRole('row').filter({ hasText: 'Ten sharpenings' }).waitFor();

    const add = page.getByRole('form', { name: 'Add a product' });
    await add.getByLabel('Kind').selectOption({ label: 'Punch card' });
    await add.getByLabel('Name', { exact: true }).fill('Eight sharpenings');
    await add.getByLabel('Credits', { exact: true }).fill('8');
    await add.getByLabel('Price (CAD)').fill('eighty');
    await add.getByLabel('Months to use (optional)').fill('9');
    await add.getByRole('button', { name: 'Add product' }).click();
    await expect(add.getByLabel('Price (CAD)').getAttribute('aria-invalid')).resolves.toBe('true');
    await add.getByText('Enter an amount such as 45.00').waitFor();
    await add.getByLabel('Price (CAD)').fill('0.10');
    await add.getByRole('button', { name: 'Add product' }).click();
    await add.getByText('At least 0.50').waitFor();
    const named = (list: ProductJson[]) => list.filter((p) => p.name === 'Eight sharpenings');
    expect(named((await apiGet<{ products: ProductJson[] }>(page, `/api${ICE}/products`)).products)).toEqual([]);
    await manager.shot('product-bad-price');

    await add.getByLabel('Price (CAD)').fill('84');
    await add.getByRole('button', { name: 'Add product' }).click();
    await add.getByRole('status').filter({ hasText: 'Eight sharpenings added.' }).waitFor();
    const row = table.getByRole('row').filter({ hasText: 'Eight sharpenings' });
    await expect(row.getByRole('cell').nth(3).textContent()).resolves.toMatch(/84\.00/);
    await expect(row.getByRole('cell').nth(4).textContent()).resolves.toBe('9 months');

    await row.getByRole('button', { name: 'Change Eight sharpenings' }).click();
    const change = page.getByRole('form', { name: 'Change Eight sharpenings' });
    await change.getByLabel('Price (CAD)').fill('88.50');
    await change.getByRole('button', { name: 'Save product' }).click();
    await page.getByRole('status').filter({ hasText: 'Eight sharpenings saved.' }).waitFor();
    await expect(row.getByRole('cell').nth(3).textContent()).resolves.toMatch(/88\.50/);

    // The old price is kept as a retired version, not edited in place.
    const [saved] = named((await apiGet<{ products: ProductJson[] }>(page, `/api${ICE}/products`)).products);
    expect(saved?.priceHistory.map((p) => [p.amountMinor, p.retiredAt === null])).toEqual([
      [8850, true],
      [8400, false],
    ]);
    await row.getByRole('button', { name: 'Change Eight sharpenings' }).click();
    const history = page.getByRole('region', { name: 'Price history' }).getByRole('listitem');
    await expect(history.count()).resolves.toBe(2);
    await expect(history.nth(0).textContent()).resolves.toMatch(/88\.50.*current/);
    await expect(history.nth(1).textContent()).resolves.toMatch(/84\.00.*from .* to /);
    await expectFitsWidth(page);
    await manager.shot('products');
    expectNoProblems(manager);
    await manager.context.close();
  });

  it('lets a manager sell a punch card for cash at the counter and refund its unused credits', async () => {
    const manager = await staffSession(browser, 'money-credits', 'manager@ice-harbor.test', ICE);
    const { page } = manager;
    const owedBefore = (await apiGet<{ deferredRevenueMinor: number }>(page, `/api${ICE}/credits/summary`)).deferredRevenueMinor;
    const customerId = await page.evaluate(async (path) => {
      const res = await fetch(path, { method: 'POST', headers: { 'Content-Type': 'application/json', 'Idempotency-Key': crypto.randomUUID() }, body: JSON.stringify({ name: 'Oriane Faldstrom', email: `oriane-${Date.now()}@example.test` }) });
      return ((await res.json()) as { id: string }).id;
    }, `/api${ICE}/customers`);
    await page.goto(`${ICE}/customers/${customerId}`);
    const credits = page.getByRole('region', { name: 'Credits', exact: true });
    await expect(credits.getByTestId('credit-balance').textContent()).resolves.toBe('0');

    const sale = page.getByRole('form', { name: 'Sell at the counter' });
    await sale.getByRole('button', { name: 'Sell', exact: true }).click();
    await sale.getByText('Choose a product', { exact: true }).and(page.getByRole('alert')).waitFor();
    // The price follows the name, so a narrow picker never cuts it off.
    await choose(sale.getByLabel('Product'), /^Ten sharpenings · .*110\.00 · 10 credits · 12 months · Punch card$/);
    await sale.getByLabel('Paid with').selectOption({ label: 'Cash' });
    await sale.getByRole('button', { name: 'Sell', exact: true }).click();
    await sale.getByRole('status').filter({ hasText: /^Ten sharpenings sold for .*110\.00\. Balance after the sale: 10\.$/ }).waitFor();
    // The picker is empty again: a second press of Sell asks for a product instead of selling another card.
    await expect(sale.getByLabel('Product').inputValue()).resolves.toBe('');
    await credits.getByTestId('credit-balance').filter({ hasText: /^10$/ }).waitFor();
    const lot = credits.getByRole('table').getByRole('row').filter({ hasText: 'Ten sharpenings' });
    await expect(lot.textContent()).resolves.toMatch(/10 \/ 10/);
    await expect(lot.textContent()).resolves.toMatch(/110\.00/);

    await credits.getByRole('button', { name: 'Redeem one credit' }).click();
    await credits.getByTestId('credit-balance').filter({ hasText: /^9$/ }).waitFor();
    await credits.getByRole('status').filter({ hasText: 'One credit redeemed. 9 left.' }).waitFor();
    await expectFitsWidth(page);
    await manager.shot('credit-panel');

    const owedAfterSale = (await apiGet<{ deferredRevenueMinor: number }>(page, `/api${ICE}/credits/summary`)).deferredRevenueMinor;
    expect(owedAfterSale - owedBefore).toBe(9900);

    await page.getByRole('region', { name: 'Payments', exact: true }).getByRole('button', { name: /^Refund Ten sharpenings of / }).click();
    const dialog = page.getByRole('dialog', { name: 'Refund Ten sharpenings' });
    // The rule is on screen before anything is confirmed: 9 of 10 unused, 9/10 of 110.00 back.
    await dialog.getByText(/^Refunds the unused share of the price: 9 of 10 credits are unused, so .*99\.00 of .*110\.00 comes back/).waitFor();
    await expect(dialog.getByRole('definition').nth(0).textContent()).resolves.toBe('9');
    await expect(dialog.getByRole('definition').nth(1).textContent()).resolves.toMatch(/99\.00/);
    await dialog.getByText(/for a cash sale, hand the money back from the till.*A refund cannot be undone\./).waitFor();
    const confirm = dialog.getByRole('button', { name: /^Refund .*99\.00$/ });
    await confirm.click();
    await dialog.getByText('Say why').waitFor();
    await manager.shot('refund-confirm');
    await dialog.getByLabel('Reason').fill('Bought the wrong card');
    await confirm.click();
    await dialog.waitFor({ state: 'detached' });
    await page.getByRole('status').filter({ hasText: /^Refunded .*99\.00, 9 credits removed\.$/ }).waitFor();
    await credits.getByTestId('credit-balance').filter({ hasText: /^0$/ }).waitFor();
    // The redemption's note said 9 left; with the balance moved on it no longer shows.
    await expect(credits.getByText('One credit redeemed. 9 left.').count()).resolves.toBe(0);
    await expect(credits.getByRole('row').filter({ hasText: 'Ten sharpenings' }).textContent()).resolves.toMatch(/0 \/ 10.*No: none left/);
    await page.getByRole('table', { name: 'Ledger entries, newest first' }).getByRole('row').filter({ hasText: 'Bought the wrong card' }).filter({ hasText: '\u22129' }).waitFor();
    const owedAfterRefund = (await apiGet<{ deferredRevenueMinor: number }>(page, `/api${ICE}/credits/summary`)).deferredRevenueMinor;
    expect(owedAfterRefund).toBe(owedBefore);
    await manager.shot('refunded');

    // The payment has nothing left to refund: the dialog says so and offers no refund button.
    await page.getByRole('region', { name: 'Payments', exact: true }).getByRole('button', { name: /^Refund Ten sharpenings of / }).click();
    const again = page.getByRole('dialog', { name: 'Refund Ten sharpenings' });
    await again.getByText(/^Nothing is left to refund on this payment/).waitFor();
    await expect(again.getByRole('button', { name: /^Refund/ }).count()).resolves.toBe(0);
    await again.getByRole('button', { name: 'Close' }).click();
    await again.waitFor({ state: 'detached' });

    // Deferred revenue is shown with the products: what the rink still owes skaters in unused credits.
    await page.goto(`${ICE}/products`);
    const owed = page.getByRole('region', { name: 'Credits owed to skaters' });
    const deferred = owed.getByRole('definition').nth(1);
    await deferred.waitFor();
    expect(minorOf((await deferred.textContent()) ?? '')).toBe(owedAfterRefund);
    await manager.shot('credits-owed');
    expectNoProblems(manager);
    await manager.context.close();
  });

  it('lets the league manager import a roster, refusing a bad file whole, and allocate to a team the counter then sees', async () => {
    const lead = await staffSession(browser, 'money-league', 'league@ice-harbor.test', ICE);
    const { page } = lead;
    await page.getByRole('navigation', { name: 'Ice Harbor sections' }).getByRole('link', { name: 'Leagues' }).click();
    await page.getByRole('link', { name: 'Harbor Youth League' }).click();
    await page.getByRole('heading', { name: 'Harbor Youth League' }).waitFor();
    const leagueId = /\/leagues\/([^/?#]+)/.exec(page.url())?.[1] ?? '';
    const before = await apiGet<LeagueJson>(page, `/api${ICE}/leagues/${leagueId}`);
    const pool = page.getByRole('region', { name: 'Pool', exact: true });
    const counts = pool.getByRole('definition').nth(2);
    await expect(counts.textContent()).resolves.toBe('3 · 12');
    await expectFitsWidth(page);
    await lead.shot('league');

    const roster = page.getByRole('form', { name: 'Upload a roster' });
    const bad = ['team,name,email,phone', 'Breakers,Lio Marchetti,lio.marchetti@example.test,', 'Breakers,Sanna Oyelaran,not-an-email,', 'Breakers,,,555-0142', 'Breakers,Tove Ambergast,,'].join('\n');
    await roster.getByLabel('Roster file').setInputFiles({ name: 'breakers-bad.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
    await roster.getByRole('button', { name: 'Import roster' }).click();
    const refusal = roster.getByRole('alert');
    await refusal.getByText('3 lines of the roster need fixing; nothing was imported').waitFor();
    const lines = await refusal.getByRole('listitem').allTextContents();
    expect(lines.map((l) => l.split(':')[0])).toEqual(['Line 3', 'Line 4', 'Line 5']);
    expect(lines[1]).toMatch(/name is empty/);
    await refusal.getByText('Fix these lines in the file and import it again. The header is line 1.').waitFor();
    await expect(refusal.getByText('Nothing was imported.').count()).resolves.toBe(0);
    expect(await apiGet<LeagueJson>(page, `/api${ICE}/leagues/${leagueId}`)).toEqual(before);
    await lead.shot('roster-errors');

    const good = ['team,name,email,phone', 'Breakers,Lio Marchetti,lio.marchetti@example.test,', 'Breakers,Sanna Oyelaran,sanna.oyelaran@example.test,', 'Breakers,Tove Ambergast,,555-0143'].join('\n');
    await roster.getByLabel('Roster file').setInputFiles({ name: 'breakers.csv', mimeType: 'text/csv', buffer: Buffer.from(good) });
    await roster.getByRole('button', { name: 'Import roster' }).click();
    await roster.getByRole('status').filter({ hasText: '3 rows imported: 1 team created, 3 players added, 3 new customer records.' }).waitFor();
    const teams = page.getByRole('region', { name: 'Teams', exact: true });
    const breakers = teams.getByRole('row').filter({ hasText: 'Breakers' });
    for (const name of ['Lio Marchetti', 'Sanna Oyelaran', 'Tove Ambergast']) await breakers.getByText(name).waitFor();
    await counts.filter({ hasText: /^4 · 15$/ }).waitFor();
    const poolCredits = pool.getByRole('definition').first();
    await expect(poolCredits.textContent()).resolves.toBe(String(before.pool.credits));
    const allocate = page.getByRole('form', { name: 'Allocate credits' });
    await allocate.getByLabel('To', { exact: true }).selectOption({ label: 'Team Breakers (shared)' });
    await allocate.getByLabel('Credits', { exact: true }).fill(String(before.pool.credits + 1));
    await allocate.getByRole('button', { name: 'Allocate credits' }).click();
    await allocate.getByRole('alert').first().waitFor();
    await expect(poolCredits.textContent()).resolves.toBe(String(before.pool.credits));
    await allocate.getByLabel('Credits', { exact: true }).fill('10');
    await allocate.getByRole('button', { name: 'Allocate credits' }).click();
    await allocate.getByRole('status').filter({ hasText: '10 credits given to Breakers.' }).waitFor();
    await poolCredits.filter({ hasText: new RegExp(`^${before.pool.credits - 10}$`) }).waitFor();
    const cells = await breakers.getByRole('cell').allTextContents();
    expect(cells.slice(0, 4)).toEqual(['Breakers', '10', '0', '10']);
    await lead.shot('league-allocated');
    expectNoProblems(lead);
    await lead.context.close();

    // At the counter, the technician can draw a ticket from the team's allocation.
    const tech = await staffSession(browser, 'money-counter-team', 'tech@ice-harbor.test', ICE);
    await tech.page.goto(`${ICE}/counter`);
    await tech.page.getByLabel('Find a skater').fill('Marchetti');
    await tech.page.getByRole('list', { name: 'Matching skaters' }).getByRole('button', { name: /Lio Marchetti/ }).click();
    await tech.page.getByLabel('Paid', { exact: true }).selectOption({ label: "From a team's allocation" });
    const team = tech.page.getByLabel('Team', { exact: true });
    await team.getByRole('option', { name: 'Breakers · Harbor Youth League · 10 credits left' }).waitFor({ state: 'attached' });
    await team.selectOption({ label: 'Breakers · Harbor Youth League · 10 credits left' });
    await tech.shot('counter-team');
    expectNoProblems(tech);
    await tech.context.close();
  });

  it('warns a manager at North Pond Arena that the plan payment failed', async () => {
    const manager = await staffSession(browser, 'money-grace', 'manager@north-pond.test', '/rinks/north-pond-arena');
    const banner = manager.page.getByRole('alert').filter({ hasText: 'The Rinkwright plan payment failed' });
    await banner.waitFor();
    // A manager cannot pay the plan: the banner says when the rink locks and whom to tell.
    await expect(banner.textContent()).resolves.toMatch(/Everything works until .*; after that the rink is read-only .* Only the rink's owner can pay it: let them know\. The plan is under Billing\./);
    await manager.page.getByRole('navigation', { name: 'North Pond Arena sections' }).getByRole('link', { name: 'Billing' }).click();
    await expect(manager.page.getByTestId('plan-state').textContent()).resolves.toMatch(/^Payment failed — grace until /);
    await manager.shot('plan-grace');
    expectNoProblems(manager);
    await manager.context.close();
  });
});
