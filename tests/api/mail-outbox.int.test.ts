import { createServer } from 'node:net';
import { eq } from 'drizzle-orm';
import { outboxMail } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { describe, expect, it } from 'vitest';
import { createMailer } from '../../apps/api/src/lib/mailer';
import { buildTestApp } from '../support/app';
import { testEnv } from '../support/env';
import { linkIn, mailTo, waitForMail } from '../support/mail';
import { uniqueEmail } from '../support/world';

// Account mails (verification, reset, invitation) go through the same outbox as receipts: stored first, sent
// at once when the mail server answers, retried by the worker when it does not, and blanked once sent so the
// table never keeps a live link.

/** A loopback port nothing listens on: the mail server is "down" for the app built on it. */
async function closedPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

const api = buildTestApp({ SMTP_PORT: String(await closedPort()) });
const VERIFY_SUBJECT = /Confirm your e-mail/;

const rowsTo = (address: string) => currentDb().select().from(outboxMail).where(eq(outboxMail.to, address));

describe('account mails through the outbox', () => {
  it('keeps a sign-up whose mail could not go out, and the worker sends it when the mail server is back', async () => {
    const email = uniqueEmail('outbox');
    const signedUp = await api.client().post('/api/auth/sign-up/email').send({ name: 'Late Mail', email, password: 'blade-edge-12345' });
    expect(signedUp.status, JSON.stringify(signedUp.body)).toBe(200);

    const [waiting] = await rowsTo(email);
    expect(waiting).toMatchObject({ sentAt: null, attempts: 1, redactAfterSend: 1 });
    expect(waiting?.lastError).toMatch(/ECONNREFUSED/);
    expect(waiting?.text).toMatch(/verify-email\?token=/);
    expect(await mailTo(email)).toHaveLength(0);

    // The first retry is due a minute after the failure; moved to now so the test need not wait for it.
    await currentDb().update(outboxMail).set({ nextAttemptAt: new Date() }).where(eq(outboxMail.id, waiting!.id));
    const working = createMailer(testEnv(), api.logger);
    try {
      expect(await working.drain(100)).toBeGreaterThanOrEqual(1);
    } finally {
      working.close();
    }

    const mail = await waitForMail(email, { subject: VERIFY_SUBJECT });
    expect(linkIn(mail, /\/api\/auth\/verify-email\?/).searchParams.get('token')).toBeTruthy();
    const [sent] = await rowsTo(email);
    expect(sent).toMatchObject({ attempts: 2, lastError: null, text: '', html: '' });
    expect(sent?.sentAt).toBeInstanceOf(Date);
  });

  it('sends nothing twice: a second drain finds no mail due for that address', async () => {
    const email = uniqueEmail('outbox-once');
    await api.client().post('/api/auth/sign-up/email').send({ name: 'Once Only', email, password: 'blade-edge-12345' });
    const [row] = await rowsTo(email);
    await currentDb().update(outboxMail).set({ nextAttemptAt: new Date() }).where(eq(outboxMail.id, row!.id));
    const working = createMailer(testEnv(), api.logger);
    try {
      await Promise.all([working.drain(100), working.drain(100)]);
      await working.drain(100);
    } finally {
      working.close();
    }
    await waitForMail(email, { subject: VERIFY_SUBJECT });
    expect(await mailTo(email, VERIFY_SUBJECT)).toHaveLength(1);
  });
});
