import { eq } from 'drizzle-orm';
import { customer } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { describe, expect, it } from 'vitest';
import { buildTestApp, type Client } from '../support/app';
import { linkIn, pathOf, waitForMail } from '../support/mail';
import { createCustomerAt, createRinkWithStaff, uniqueEmail } from '../support/world';

// The account screens end to end through better-auth: sign-up, the verification mail, sign-in, password reset.

// A short session cache, so the test can wait out the signed copy a device holds after its session ended.
const SESSION_CACHE_SECONDS = 1;
const api = buildTestApp({ SESSION_CACHE_SECONDS: String(SESSION_CACHE_SECONDS) });

const VERIFY_SUBJECT = /Confirm your e-mail/;
const RESET_SUBJECT = /Reset your Rinkwright password/;

async function signUp(client: Client, email: string, password: string) {
  const response = await client.post('/api/auth/sign-up/email').send({ name: 'New Sharpener', email, password });
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response;
}

/** Signs up, follows the link of the verification mail, and returns the client the link signed in. */
async function signUpVerified(email: string, password: string): Promise<Client> {
  const client = api.client();
  await signUp(client, email, password);
  const link = linkIn(await waitForMail(email, { subject: VERIFY_SUBJECT }), /\/api\/auth\/verify-email\?/);
  const followed = await client.get(pathOf(link));
  expect(followed.status, JSON.stringify(followed.body)).toBe(302);
  return client;
}

const signInAttempt = (email: string, password: string) => api.client().post('/api/auth/sign-in/email').send({ email, password });

describe('sign-up and e-mail verification', () => {
  it('sends a verification mail and refuses sign-in until the link is followed', async () => {
    const email = uniqueEmail('signup');
    const password = 'blade-edge-12345';
    const client = api.client();

    const created = await signUp(client, email, password);
    const mail = await waitForMail(email, { subject: VERIFY_SUBJECT });
    const link = linkIn(mail, /\/api\/auth\/verify-email\?/);

    expect(created.headers['set-cookie'] ?? []).not.toEqual(expect.arrayContaining([expect.stringMatching(/session_token=[^;]+/)]));
    expect(link.origin).toBe(api.origin);
    expect(link.searchParams.get('token')).toMatch(/^[\w-]+\.[\w-]+\.[\w-]+$/);

    const early = await signInAttempt(email, password);
    expect(early.status).toBe(403);
    expect(early.body.code).toBe('EMAIL_NOT_VERIFIED');
    // sendOnSignIn: the refused attempt mails a fresh link.
    await waitForMail(email, { subject: VERIFY_SUBJECT, count: 2 });

    const followed = await client.get(pathOf(link));
    expect(followed.status).toBe(302);
    const me = await client.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.user).toMatchObject({ email, emailVerified: true });

    const later = await signInAttempt(email, password);
    expect(later.status).toBe(200);
    expect(later.body.user.email).toBe(email);
  });

  it('refuses a tampered verification link', async () => {
    const email = uniqueEmail('tamper');
    const client = api.client();
    await signUp(client, email, 'blade-edge-12345');
    const link = linkIn(await waitForMail(email, { subject: VERIFY_SUBJECT }), /verify-email/);

    link.searchParams.set('token', `${link.searchParams.get('token')}x`);
    await client.get(pathOf(link));

    expect((await signInAttempt(email, 'blade-edge-12345')).status).toBe(403);
  });

  it('sets the session cookie HttpOnly and SameSite=Lax', async () => {
    const email = uniqueEmail('cookie');
    await signUpVerified(email, 'blade-edge-12345');

    const response = await signInAttempt(email, 'blade-edge-12345');
    const cookies = [response.headers['set-cookie'] ?? []].flat();
    const session = cookies.find((c) => c.startsWith('rinkwright.session_token='));

    expect(session, cookies.join('\n')).toBeDefined();
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
  });
});

describe('password reset', () => {
  it('mails a link that leads to a token, which sets a new password and ends the old sessions', async () => {
    const email = uniqueEmail('reset');
    const oldPassword = 'blade-edge-12345';
    const newPassword = 'fresh-hollow-67890';
    await signUpVerified(email, oldPassword);
    const before = await api.signIn(email, oldPassword);
    // Verified once here, so the process remembers it (session-memo.ts) — and must forget it with the copy.
    expect((await before.get('/api/me')).status).toBe(200);

    const asked = await api.client().post('/api/auth/request-password-reset').send({ email, redirectTo: '/reset-password' });
    expect(asked.status).toBe(200);
    const link = linkIn(await waitForMail(email, { subject: RESET_SUBJECT }), /\/api\/auth\/reset-password\//);
    const landed = await api.client().get(pathOf(link));
    expect(landed.status).toBe(302);
    const target = new URL(landed.headers.location ?? '', api.origin);
    expect(target.pathname).toBe('/reset-password');
    const token = target.searchParams.get('token');
    expect(token).toBeTruthy();

    const reset = await api.client().post('/api/auth/reset-password').send({ newPassword, token });
    expect(reset.status).toBe(200);

    expect((await signInAttempt(email, oldPassword)).status).toBe(401);
    expect((await signInAttempt(email, newPassword)).status).toBe(200);
    // The old session is gone from the database at once; the device that held it keeps a signed copy that is
    // honoured until it is SESSION_CACHE_SECONDS old, and not after.
    await new Promise((done) => setTimeout(done, SESSION_CACHE_SECONDS * 1000 + 300));
    expect((await before.get('/api/me')).status).toBe(401);
  });

  it('does not accept the same reset token twice', async () => {
    const email = uniqueEmail('reset-twice');
    await signUpVerified(email, 'blade-edge-12345');
    await api.client().post('/api/auth/request-password-reset').send({ email, redirectTo: '/reset-password' });
    const link = linkIn(await waitForMail(email, { subject: RESET_SUBJECT }), /reset-password\//);
    const token = link.pathname.split('/').pop();

    const first = await api.client().post('/api/auth/reset-password').send({ newPassword: 'fresh-hollow-67890', token });
    const second = await api.client().post('/api/auth/reset-password').send({ newPassword: 'other-hollow-13579', token });

    expect(first.status).toBe(200);
    expect(second.status).toBe(400);
    expect((await signInAttempt(email, 'fresh-hollow-67890')).status).toBe(200);
  });
});

describe('customer records follow a verified e-mail', () => {
  it('links every unlinked customer record with that e-mail, at every rink, once the e-mail is verified', async () => {
    const email = uniqueEmail('skater');
    const harbor = await createRinkWithStaff('Ice Harbor');
    const pond = await createRinkWithStaff('North Pond Arena');
    const atHarbor = await createCustomerAt(harbor.id, { name: 'Skating Parent', email });
    const atPond = await createCustomerAt(pond.id, { name: 'Skating Parent', email });
    await createCustomerAt(pond.id, { name: 'Someone Else', email: uniqueEmail('other') });

    const client = await signUpVerified(email, 'blade-edge-12345');
    const me = await client.get('/api/me');

    expect(me.status).toBe(200);
    expect(me.body.rinks).toEqual([]);
    expect([...me.body.customerOf].sort((x: { slug: string }, y: { slug: string }) => x.slug.localeCompare(y.slug))).toEqual(
      [
        { slug: harbor.slug, name: harbor.name, memberCode: atHarbor.memberCode },
        { slug: pond.slug, name: pond.name, memberCode: atPond.memberCode },
      ].sort((x, y) => x.slug.localeCompare(y.slug)),
    );
  });

  it('does not link before the e-mail is verified', async () => {
    const email = uniqueEmail('unverified-skater');
    const harbor = await createRinkWithStaff('Ice Harbor');
    const record = await createCustomerAt(harbor.id, { email });

    await signUp(api.client(), email, 'blade-edge-12345');
    await waitForMail(email, { subject: VERIFY_SUBJECT });

    const rows = await currentDb().select({ userId: customer.userId }).from(customer).where(eq(customer.id, record.id));
    expect(rows).toEqual([{ userId: null }]);
  });
});
