import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { waitForMail } from '../support/mail';
import { expectNoProblems, openSession, signIn, useBrowser, type Session } from './browser';

// The technician's day at the counter, in a real browser against the demo: take skates in, log pairs with
// their readings, finish the ticket (the skater gets a "ready" e-mail); and the counter's promise that nothing
// is lost or doubled when the network drops, a button is pressed twice, or an answer never arrives.

interface TicketJson {
  id: string;
  state: string;
  pairs: { label: string; sharpenings: { correctsId: string | null; readings: { attempt: number }[] }[] }[];
}

/** The ticket as the server has it, read with the page's own session cookie. */
async function ticketOnServer(page: Page): Promise<TicketJson> {
  const match = /\/rinks\/([^/]+)\/tickets\/([^/?#]+)/.exec(page.url());
  if (!match) throw new Error(`not on a ticket page: ${page.url()}`);
  return page.evaluate(async ([slug, id]) => (await fetch(`/api/rinks/${slug}/tickets/${id}`)).json(), [match[1], match[2]] as const);
}

const sharpeningsOf = (t: TicketJson) => t.pairs.flatMap((p) => p.sharpenings.filter((s) => !s.correctsId));

async function takeIn(session: Session, skater: string, extraPairs = 0) {
  const { page } = session;
  await page.goto('/rinks/ice-harbor/counter');
  await page.getByLabel('Find a skater').fill(skater);
  // The list shows the newest skaters until the search answers: wait for the one asked for.
  await page.getByRole('list', { name: 'Matching skaters' }).getByRole('button', { name: new RegExp(skater) }).first().click();
  await page.getByRole('region', { name: 'Skater' }).getByRole('link', { name: new RegExp(skater) }).waitFor();
  await page.getByRole('button', { name: '+ Another pair' }).click();
  for (let i = 0; i < extraPairs; i++) await page.getByRole('button', { name: '+ Another pair' }).click();
  await page.getByText(/^Promise:/).waitFor();
  await page.getByRole('button', { name: /^Take in/ }).click();
  await page.waitForURL(/\/tickets\//);
  await page.getByRole('heading', { name: /^Ticket \d+$/ }).waitFor();
}

describe('the counter', () => {
  const browser = useBrowser();

  it('takes skates in, logs a pair with its readings and tells the skater they are ready', async () => {
    const session = await openSession(browser(), 'counter');
    const { page } = session;
    await signIn(session, 'tech@ice-harbor.test');
    await page.waitForURL('**/rinks/ice-harbor');
    await page.getByRole('link', { name: 'Counter' }).click();
    await page.getByRole('heading', { name: 'Queue' }).waitFor();
    await session.shot('counter');

    await takeIn(session, 'Castellane');
    await session.shot('ticket-new');
    const form = page.getByRole('form', { name: 'Log Pair 1' });
    await form.getByLabel('Station').selectOption({ label: 'Bench 1' });
    await form.getByLabel('Hollow used').selectOption({ label: '1/2"' });
    await form.getByLabel('Blade width (in)').fill('0.1142');
    await form.getByLabel('Passes').fill('4');
    await form.getByLabel('Left reading (thou)').fill('0.4');
    await form.getByLabel('Right reading (thou)').fill('-1.6');
    await form.getByRole('button', { name: 'Log Pair 1' }).click();
    // Each reading shows its number, its band word and its place on the scale.
    await page.getByRole('figure', { name: /Level reading \+0\.4 thousandths of an inch, True/ }).waitFor();
    await page.getByRole('figure', { name: /Level reading −1\.6 thousandths of an inch, Fair/ }).waitFor();
    await session.shot('ticket-logged');

    await page.getByRole('button', { name: 'Re-run reading' }).click();
    await page.getByRole('form', { name: 'Re-run readings' }).getByLabel('Right reading (thou)').fill('-0.3');
    await page.getByRole('button', { name: 'Add re-run readings' }).click();
    await page.getByText('Re-run 1').waitFor();
    const afterRerun = await ticketOnServer(page);
    expect(sharpeningsOf(afterRerun)[0]?.readings.map((r) => r.attempt).sort()).toEqual([1, 1, 2]);

    await page.getByRole('button', { name: 'Finish: ready for pick-up' }).click();
    await page.getByText('Ready', { exact: true }).first().waitFor();
    const mail = await waitForMail('skater@ice-harbor.test', { subject: /your skates are ready at ice harbor/i });
    expect(mail.text).toMatch(/ticket \d+/i);
    await session.shot('ticket-ready');
    expectNoProblems(session);
    await session.context.close();
  });

  it('keeps pairs logged offline and sends each exactly once when the connection is back', async () => {
    const session = await openSession(browser(), 'offline');
    const { page, context } = session;
    await signIn(session, 'tech@ice-harbor.test');
    await page.waitForURL('**/rinks/ice-harbor');
    await takeIn(session, 'Castellane');
    // The bag's pairs go in batch mode; the one pair taken in stays unlogged.
    const batch = page.getByRole('region', { name: 'Batch mode' });
    await batch.getByLabel('Station').selectOption({ label: 'Bench 3' });
    await batch.getByLabel('Hollow').selectOption({ label: '1/2"' });
    await batch.getByLabel('Blade width (in)').fill('0.1142');
    await batch.getByLabel('Blade width (in)').blur();

    await context.setOffline(true);
    for (const [passes, left, right] of [
      ['4', '0.2', '-0.1'],
      ['5', '0.5', '0.3'],
    ]) {
      await batch.getByLabel('Passes').fill(passes as string);
      await batch.getByLabel('Passes').press('Enter');
      await page.keyboard.type(left as string);
      await page.keyboard.press('Enter');
      await page.keyboard.type(right as string);
      await page.keyboard.press('Enter');
      await batch.getByLabel('Passes').and(page.locator(':focus')).waitFor();
    }
    await page.getByTestId('pending-count').filter({ hasText: '2 changes waiting to be sent' }).waitFor();
    await expect(batch.getByTestId('batch-count').textContent()).resolves.toBe('2 pairs logged in this batch');
    await session.shot('offline-pending');

    await context.setOffline(false);
    await page.getByTestId('pending-count').waitFor({ state: 'detached', timeout: 30_000 });
    const ticket = await ticketOnServer(page);
    expect(sharpeningsOf(ticket)).toHaveLength(2);
    expect(ticket.pairs.map((p) => p.label)).toEqual(['Pair 1', 'Pair 2', 'Pair 3']);
    await page.reload();
    await page.getByRole('heading', { name: /^Pair 3 · / }).waitFor();
    await session.shot('offline-sent');
    expectNoProblems(session, { networkCut: true });
    await session.context.close();
  });

  it('makes one record of a double press, and of a write whose answer was lost', async () => {
    const session = await openSession(browser(), 'double');
    const { page } = session;
    await signIn(session, 'tech@ice-harbor.test');
    await page.waitForURL('**/rinks/ice-harbor');
    await takeIn(session, 'Castellane', 1);

    const fill = async (label: string) => {
      const form = page.getByRole('form', { name: `Log ${label}` });
      await form.getByLabel('Station').selectOption({ label: 'Bench 1' });
      await form.getByLabel('Hollow used').selectOption({ label: '1/2"' });
      await form.getByLabel('Blade width (in)').fill('0.1142');
      await form.getByLabel('Passes').fill('3');
      return form;
    };
    const first = await fill('Pair 1');
    await first.getByRole('button', { name: 'Log Pair 1' }).dblclick();
    await page.getByRole('form', { name: 'Log Pair 1' }).waitFor({ state: 'detached' });

    // The request reaches the server, but its answer never comes back to the tablet.
    let cut = false;
    await page.route('**/sharpenings', async (route) => {
      if (cut) return route.continue();
      cut = true;
      await route.fetch();
      await route.abort('connectionreset');
    });
    const second = await fill('Pair 2');
    await second.getByRole('button', { name: 'Log Pair 2' }).click();
    await page.getByTestId('pending-count').waitFor();
    await page.getByRole('button', { name: 'Try now' }).click();
    await page.getByTestId('pending-count').waitFor({ state: 'detached' });

    const ticket = await ticketOnServer(page);
    expect(ticket.pairs.map((p) => p.sharpenings.length)).toEqual([1, 1]);
    // A second press that got through would have been refused by the server and shown as "Not saved".
    expect(await page.getByText('Not saved:').count()).toBe(0);
    await session.shot('double-press');
    expectNoProblems(session, { networkCut: true });
    await session.context.close();
  });

  it('gives a pair added before the services arrived the standard service', async () => {
    const session = await openSession(browser(), 'slow-services');
    const { page } = session;
    await signIn(session, 'tech@ice-harbor.test');
    await page.waitForURL('**/rinks/ice-harbor');
    // The services answer is held back until the pair is added, as on a slow rink network.
    let release: () => void = () => undefined;
    const held = new Promise<void>((resolve) => (release = resolve));
    await page.route('**/api/rinks/ice-harbor/services', async (route) => {
      await held;
      await route.continue();
    });
    await page.goto('/rinks/ice-harbor/counter');
    await page.getByLabel('Find a skater').fill('Castellane');
    await page.getByRole('list', { name: 'Matching skaters' }).getByRole('button', { name: /Castellane/ }).first().click();
    await page.getByRole('button', { name: '+ Another pair' }).click();
    release();
    // The rink's standard service, whatever another test renamed it to: the first of the kind in the list.
    const standard = await page.evaluate(async () => {
      const list = (await (await fetch('/api/rinks/ice-harbor/services')).json()) as { services: { id: string; kind: string; active: boolean }[] };
      return list.services.find((s) => s.active && s.kind === 'standard')?.id;
    });
    expect(standard).toBeTruthy();
    const service = page.getByLabel('Service');
    await expect.poll(() => service.inputValue()).toBe(standard);
    await page.getByRole('button', { name: /^Take in/ }).click();
    await page.waitForURL(/\/tickets\//);
    await page.getByRole('heading', { name: /^Ticket \d+$/ }).waitFor();
    expectNoProblems(session);
    await session.context.close();
  });

  it("keeps a skater's profiles and shows their member code as a QR code", async () => {
    const session = await openSession(browser(), 'customer');
    const { page } = session;
    await signIn(session, 'tech@ice-harbor.test');
    await page.waitForURL('**/rinks/ice-harbor');
    await page.goto('/rinks/ice-harbor/counter');
    await page.getByLabel('Find a skater').fill('Castellane');
    await page.getByRole('list', { name: 'Matching skaters' }).getByRole('button', { name: /Castellane/ }).click();
    await page.getByRole('region', { name: 'Skater' }).getByRole('link', { name: /Castellane/ }).click();
    await page.getByRole('img', { name: /QR code of member code/ }).waitFor();

    const add = page.getByRole('form', { name: 'Add a skate profile' });
    await add.getByLabel('Label').fill('Beer-league skates');
    await add.getByLabel('Blade width (in)').fill('0.1181');
    await add.getByLabel('Preferred hollow').selectOption({ label: '5/8"' });
    await add.getByLabel('Profile radius (ft)').fill('10');
    await add.getByRole('button', { name: 'Add profile' }).click();
    await page.getByText(/Beer-league skates · blade 0\.1181" · hollow 5\/8" · profile 10 ft/).waitFor();

    await page.getByRole('listitem').filter({ hasText: 'Beer-league skates' }).getByRole('button', { name: 'Change' }).click();
    const change = page.getByRole('form', { name: 'Change Beer-league skates' });
    await change.getByLabel('Preferred hollow').selectOption({ label: '1/2"' });
    await change.getByRole('button', { name: 'Save profile' }).click();
    await page.getByText(/Beer-league skates · blade 0\.1181" · hollow 1\/2"/).waitFor();
    await session.shot('customer');
    expectNoProblems(session);
    await session.context.close();
  });
});
