import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { linkIn, waitForMail } from '../support/mail';
import { expectNoProblems, openSession, useBrowser, type Session } from './browser';

// The first hour of a new rink, in a real browser: an owner signs up and confirms the e-mail from the captured
// message, creates the rink, invites a technician; the technician accepts and sees only technician navigation.
describe('a new rink gets going', () => {
  const browser = useBrowser();
  const id = randomUUID().slice(0, 8);
  const owner = { name: 'Wren Caldmoor', email: `owner-${id}@example.test`, password: 'glacier-steel-42' };
  const tech = { name: 'Ossian Brightwater', email: `tech-${id}@example.test`, password: 'hollow-depth-77' };
  const rinkName = `Frostwick Gardens ${id}`;
  let invitationUrl = '';
  let slug = '';


  async function signUpAndConfirm(session: Session, person: typeof owner, startAt: string) {
    const { page } = session;
    await page.goto(startAt);
    await page.getByLabel('Your name').fill(person.name);
    if ((await page.getByLabel('E-mail').inputValue()) === '') await page.getByLabel('E-mail').fill(person.email);
    await page.getByLabel('Password').fill(person.password);
    await session.shot('sign-up');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
    await page.getByText(person.email).waitFor();
    await session.shot('check-email');

    const mail = await waitForMail(person.email, { subject: /confirm your e-mail/i });
    await page.goto(linkIn(mail, /verify-email/).toString());
    await page.getByRole('heading', { name: 'Your e-mail is confirmed' }).waitFor();
    await session.shot('confirmed');
  }

  it('lets an owner sign up, confirm the e-mail and create a rink', async () => {
    const session = await openSession(browser(), 'owner');
    const { page } = session;
    await page.goto('/');
    await session.shot('landing');
    await page.getByRole('link', { name: 'Set up your rink' }).click();
    await signUpAndConfirm(session, owner, '/sign-up');

    await page.getByRole('link', { name: 'Go to your rinks' }).click();
    await page.getByRole('heading', { name: `Hello, ${owner.name}` }).waitFor();
    await session.shot('rinks-empty');
    await page.getByRole('link', { name: 'Set up a new rink' }).click();
    await page.getByLabel('Rink name').fill(rinkName);
    slug = await page.getByLabel('Web address').inputValue();
    expect(slug).toBe(`frostwick-gardens-${id}`);
    await page.getByLabel('Time zone').selectOption('America/Regina');
    await page.getByLabel('Units').selectOption('mm');
    await session.shot('create-rink');
    await page.getByRole('button', { name: 'Create the rink' }).click();
    await page.waitForURL(`**/rinks/${slug}`);
    await page.getByRole('heading', { name: rinkName }).waitFor();
    await page.getByText('You are signed in as owner.').waitFor();
    await session.shot('overview');

    await page.getByRole('link', { name: 'Staff' }).click();
    await page.getByLabel('E-mail to invite').fill(tech.email);
    await page.getByLabel('Role', { exact: true }).selectOption('technician');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText(`Invitation sent to ${tech.email}.`).waitFor();
    await page.getByRole('cell', { name: tech.email, exact: true }).waitFor();
    await session.shot('invited');

    const invitation = await waitForMail(tech.email, { subject: /invited to/i });
    invitationUrl = linkIn(invitation, /\/invitations\//).toString();
    expectNoProblems(session);
    await session.context.close();
  });

  it('lets the invited technician accept and see only technician navigation', async () => {
    expect(invitationUrl).not.toBe('');
    const session = await openSession(browser(), 'technician');
    const { page } = session;
    await page.goto(invitationUrl);
    await page.getByRole('heading', { name: `Join ${rinkName}` }).waitFor();
    await session.shot('invitation');
    await page.getByRole('link', { name: 'Create an account to accept' }).click();
    expect(await page.getByLabel('E-mail').inputValue()).toBe(tech.email);
    await signUpAndConfirm(session, tech, page.url());

    await page.getByRole('link', { name: 'Continue' }).click();
    await page.getByRole('button', { name: `Accept and join ${rinkName}` }).click();
    await page.waitForURL(`**/rinks/${slug}`);
    await page.getByText('You are signed in as technician.').waitFor();
    const sections = page.getByRole('navigation', { name: `${rinkName} sections` });
    await sections.waitFor();
    expect(await sections.getByRole('link').allTextContents()).toEqual(['Overview', 'Counter', 'Stations', 'Products', 'Leagues']);
    await session.shot('technician-overview');

    // Typing the manager pages' addresses shows them as not found, not a half-working screen.
    await page.goto(`/rinks/${slug}/staff`);
    await page.getByRole('heading', { name: 'We could not find that page' }).waitFor();
    await session.shot('technician-staff-refused');
    expectNoProblems(session);
    await session.context.close();
  });
});
