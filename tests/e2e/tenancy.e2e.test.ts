import { describe, expect, it } from 'vitest';
import { expectNoProblems, openSession, signIn, useBrowser } from './browser';

// Demo sign-ins, seeded by the e2e set-up from the same seed as `npm start`.
describe('one rink never sees another', () => {
  const browser = useBrowser();

  it("shows a manager of one rink the other rink's pages as not found", async () => {
    const session = await openSession(browser(), 'north-pond-manager');
    const { page } = session;
    await signIn(session, 'manager@north-pond.test');
    await page.waitForURL('**/rinks/north-pond-arena');
    await page.getByRole('heading', { name: 'North Pond Arena' }).waitFor();
    await session.shot('own-rink');

    for (const path of ['/rinks/ice-harbor', '/rinks/ice-harbor/staff', '/rinks/ice-harbor/settings']) {
      await page.goto(path);
      await page.getByRole('heading', { name: 'We could not find that page' }).waitFor();
      expect(await page.getByText('Ice Harbor').count()).toBe(0);
    }
    await session.shot('other-rink-not-found');
    expectNoProblems(session);
    await session.context.close();
  });

  it('gives a manager the staff and settings pages', async () => {
    const session = await openSession(browser(), 'ice-harbor-manager');
    const { page } = session;
    await signIn(session, 'manager@ice-harbor.test');
    await page.waitForURL('**/rinks/ice-harbor');
    const sections = page.getByRole('navigation', { name: 'Ice Harbor sections' });
    await sections.waitFor();
    expect(await sections.getByRole('link').allTextContents()).toEqual(['Overview', 'Counter', 'Stations', 'Services', 'Products', 'Leagues', 'Billing', 'Reports', 'Staff', 'Settings']);
    await sections.getByRole('link', { name: 'Staff' }).click();
    await page.getByRole('cell', { name: 'tech@ice-harbor.test', exact: true }).waitFor();
    await session.shot('staff');
    await sections.getByRole('link', { name: 'Settings' }).click();
    await page.getByLabel('Rink name').waitFor();
    await session.shot('settings');
    expectNoProblems(session);
    await session.context.close();
  });

  it('shows the platform admin every rink, and a skater the rinks where they skate', async () => {
    const admin = await openSession(browser(), 'platform-admin');
    await signIn(admin, 'admin@rinkwright.test');
    await admin.page.getByRole('link', { name: 'Platform', exact: true }).click();
    for (const name of ['Ice Harbor', 'North Pond Arena']) await admin.page.getByRole('cell').getByText(name, { exact: true }).waitFor();
    await admin.shot('platform-rinks');
    expectNoProblems(admin);
    await admin.context.close();

    const skater = await openSession(browser(), 'skater');
    await signIn(skater, 'skater@ice-harbor.test');
    const where = skater.page.getByRole('region', { name: 'Where you skate' });
    await where.getByText('North Pond Arena').waitFor();
    expect(await where.getByText(/Member code/).count()).toBe(2);
    expect(await skater.page.getByRole('link', { name: 'Platform', exact: true }).count()).toBe(0);
    await skater.shot('where-you-skate');
    expectNoProblems(skater);
    await skater.context.close();
  });
});
