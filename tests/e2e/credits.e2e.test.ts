import { describe, expect, inject, it } from 'vitest';
import { expectNoProblems, openSession, signIn, useBrowser } from './browser';

// Selling a punch card end to end: the owner's payout account is connected, a skater buys on the rink's public
// page and pays on the payment service's hosted page, the credits arrive by webhook, and a technician redeems
// one at the counter.

const STRIPE = inject('browserEnv').STRIPE_API_BASE ?? 'http://127.0.0.1:12112';

describe('buying credits online and redeeming one at the counter', () => {
  const browser = useBrowser();

  it('goes from the public page through hosted checkout to a redemption', async () => {
    const owner = await openSession(browser(), 'credits-owner');
    await signIn(owner, 'owner@ice-harbor.test');
    await owner.page.waitForURL(/\/rinks/);
    const account = await owner.page.evaluate(async () => {
      await fetch('/api/rinks/ice-harbor/billing/payout-account', { method: 'POST' });
      return (await (await fetch('/api/rinks/ice-harbor/billing')).json()).payout.accountId as string;
    });
    expect((await fetch(`${STRIPE}/_fake/accounts/${account}/complete_onboarding`, { method: 'POST' })).ok).toBe(true);
    await owner.page.evaluate(() => fetch('/api/rinks/ice-harbor/billing/payout-account/refresh', { method: 'POST' }));
    await owner.page.goto('/rinks/ice-harbor/billing');
    await owner.page.getByText(/payout/i).first().waitFor();
    await owner.shot('billing');

    const skater = await openSession(browser(), 'credits-skater');
    const email = `buyer-${Date.now()}@example.test`;
    await skater.page.goto('/r/ice-harbor');
    await skater.page.getByRole('button', { name: /Buy Ten sharpenings/ }).click();
    await skater.page.getByLabel('Name').fill('Mika Tollander');
    await skater.page.getByLabel('E-mail').fill(email);
    await skater.shot('public-page');
    await skater.page.getByRole('button', { name: 'Continue to payment' }).click();
    await skater.page.getByRole('heading', { name: 'Payment service test checkout' }).waitFor();
    await skater.page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await skater.page.getByLabel('Expiry (MM / YY)').fill('12 / 34');
    await skater.page.getByLabel('CVC').fill('123');
    await skater.shot('hosted-checkout');
    await skater.page.getByRole('button', { name: /^Pay / }).click();
    await skater.page.waitForURL(/\/r\/ice-harbor\/thanks/);
    await skater.page.getByText('10 credits added').waitFor({ timeout: 30_000 });
    await skater.shot('thanks');

    const tech = await openSession(browser(), 'credits-technician');
    await signIn(tech, 'tech@ice-harbor.test');
    await tech.page.waitForURL(/\/rinks/);
    const customerId = await tech.page.evaluate(async (q) => (await (await fetch(`/api/rinks/ice-harbor/customers?q=${encodeURIComponent(q)}`)).json()).customers[0].id as string, email);
    await tech.page.goto(`/rinks/ice-harbor/customers/${customerId}`);
    await tech.page.getByRole('button', { name: 'Redeem one credit' }).click();
    await expect.poll(() => tech.page.evaluate(async (id) => (await (await fetch(`/api/rinks/ice-harbor/customers/${id}/balance`)).json()).credits as number, customerId)).toBe(9);
    await tech.shot('redeemed');
    expectNoProblems(owner);
    expectNoProblems(skater);
    expectNoProblems(tech);
    for (const session of [owner, skater, tech]) await session.context.close();
  }, 90_000);
});
