import { describe, expect, it } from 'vitest';
import { linkIn, waitForMail } from '../support/mail';
import { DEMO_PASSWORD, expectNoProblems, openSession, signIn, useBrowser } from './browser';

// A demo technician forgets the password, resets it from the e-mailed link, renames the account, sets up a
// rink of their own and switches between their two rinks. No other browser test uses this sign-in.
const EMAIL = 'tech@north-pond.test';
const NEW_PASSWORD = 'new-edge-level-2026';

describe('account upkeep', () => {
  const browser = useBrowser();

  it('resets a forgotten password, renames the account and switches between two rinks', async () => {
    const session = await openSession(browser(), 'account');
    const { page } = session;
    await page.goto('/sign-in');
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    // Both pages have an E-mail field: wait for the new one before typing.
    await page.getByRole('heading', { name: 'Reset your password' }).waitFor();
    await page.getByLabel('E-mail').fill(EMAIL);
    await session.shot('forgot');
    await page.getByRole('button', { name: 'Send the reset link' }).click();
    await page.getByText('a reset link is on its way').waitFor();

    const mail = await waitForMail(EMAIL, { subject: /reset your rinkwright password/i });
    await page.goto(linkIn(mail, /reset-password/).toString());
    await page.getByRole('heading', { name: 'Choose a new password' }).waitFor();
    await page.getByLabel('New password', { exact: true }).fill(NEW_PASSWORD);
    await page.getByLabel('New password again').fill('not-the-same-password');
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.getByText('The two passwords differ').waitFor();
    await page.getByLabel('New password again').fill(NEW_PASSWORD);
    await session.shot('reset');
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.getByText('Your password is changed').waitFor();

    await signIn(session, EMAIL, DEMO_PASSWORD);
    await page.getByText('That e-mail and password do not match an account.').waitFor();
    await signIn(session, EMAIL, NEW_PASSWORD);
    await page.waitForURL('**/rinks/north-pond-arena');

    await page.getByRole('navigation', { name: 'Account' }).getByRole('link', { name: 'Desmond Aukett' }).click();
    await page.getByLabel('Name', { exact: true }).fill('Desmond A. Aukett');
    await page.getByRole('button', { name: 'Save name' }).click();
    await page.getByText('Name saved.').waitFor();
    await page.getByRole('link', { name: 'Desmond A. Aukett' }).waitFor();
    await session.shot('account');

    await page.goto('/rinks/new');
    await page.getByLabel('Rink name').fill('Cold Spring Rink');
    await page.getByRole('button', { name: 'Create the rink' }).click();
    await page.waitForURL('**/rinks/cold-spring-rink');
    const switcher = page.getByLabel('Switch rink');
    expect(await switcher.locator('option').allTextContents()).toEqual(['All my rinks', 'Cold Spring Rink', 'North Pond Arena']);
    await switcher.selectOption({ label: 'North Pond Arena' });
    await page.waitForURL('**/rinks/north-pond-arena');
    await page.getByRole('heading', { name: 'North Pond Arena' }).waitFor();
    await session.shot('switched');

    await page.goto('/account');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('link', { name: 'Set up your rink' }).waitFor();
    expectNoProblems(session);
    await session.context.close();
  });
});
