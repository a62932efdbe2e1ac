import { randomUUID } from 'node:crypto';
import { and, asc, eq, isNull, lte } from 'drizzle-orm';
import nodemailer from 'nodemailer';
import { isDuplicateKey, outboxMail } from '@rinkwright/db';
import { currentDb, transaction, type Executor } from '@rinkwright/db/unscoped';
import type { Logger } from 'pino';
import type { Env } from '../env';

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export interface Mailer {
  /**
   * Sends through the outbox: the mail is stored first, sent now if the server answers, and retried by the
   * worker with backoff if not. A dedupe key makes a repeat (a replayed webhook, a second sweep) send nothing.
   * A mail with a live link (sign-in, password reset, invitation) asks for its body to be blanked once sent,
   * so the outbox never keeps a usable token.
   */
  deliver(mail: Mail, options?: { tenantId?: string | null; dedupeKey?: string | null; redactAfterSend?: boolean }): Promise<void>;
  /** Sends the mails that are due (the worker's step); returns how many went out. */
  drain(limit?: number): Promise<number>;
  close(): void;
}

/** Minutes to wait before the next try: 1, 2, 4, … up to a day. */
export const retryDelayMinutes = (attempts: number) => Math.min(24 * 60, 2 ** Math.max(0, attempts - 1));

export function createMailer(env: Env, logger: Logger): Mailer {
  const transport = nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    // The local capture server speaks plain SMTP; a real relay is configured with SMTP_SECURE and a user.
    ignoreTLS: !env.SMTP_SECURE && !env.SMTP_USER,
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? '' } : undefined,
  });
  const send = async (mail: Mail) => {
    await transport.sendMail({ from: env.MAIL_FROM, ...mail });
    logger.info({ to: mail.to, subject: mail.subject }, 'mail sent');
  };

  /** `db` is the drain's transaction when it holds the row's lock: writing through another connection would wait on it. */
  async function attempt(row: typeof outboxMail.$inferSelect, db: Executor = currentDb()): Promise<boolean> {
    try {
      await send({ to: row.to, subject: row.subject, text: row.text, html: row.html });
      const redacted = row.redactAfterSend ? { text: '', html: '' } : {};
      await db.update(outboxMail).set({ sentAt: new Date(), attempts: row.attempts + 1, lastError: null, ...redacted }).where(eq(outboxMail.id, row.id));
      return true;
    } catch (error) {
      const attempts = row.attempts + 1;
      const next = new Date(Date.now() + retryDelayMinutes(attempts) * 60_000);
      await db.update(outboxMail).set({ attempts, nextAttemptAt: next, lastError: String((error as Error).message ?? error).slice(0, 500) }).where(eq(outboxMail.id, row.id));
      logger.warn({ to: row.to, subject: row.subject, attempts, err: error }, 'mail failed; the worker will retry');
      return false;
    }
  }

  return {
    async deliver(mail, options = {}) {
      const row = { id: randomUUID(), tenantId: options.tenantId ?? null, dedupeKey: options.dedupeKey ?? null, ...mail, redactAfterSend: options.redactAfterSend ? 1 : 0, attempts: 0, nextAttemptAt: new Date(), sentAt: null, lastError: null, createdAt: new Date() };
      try {
        await currentDb().insert(outboxMail).values(row);
      } catch (error) {
        if (isDuplicateKey(error)) return;
        throw error;
      }
      await attempt(row);
    },
    async drain(limit = 20) {
      // SKIP LOCKED lets several API processes drain one outbox without sending a mail twice.
      return transaction(async (tx) => {
        const due = await tx.select().from(outboxMail).where(and(isNull(outboxMail.sentAt), lte(outboxMail.nextAttemptAt, new Date()))).orderBy(asc(outboxMail.nextAttemptAt)).limit(limit).for('update', { skipLocked: true });
        let sent = 0;
        for (const row of due) if (await attempt(row, tx)) sent++;
        return sent;
      });
    },
    close: () => transport.close(),
  };
}

/** A receipt: what was paid or refunded, at which rink, with a reference to quote at the counter. */
export function receiptMail(input: { to: string; rinkName: string; greeting: string; lines: string[]; reference: string }): Mail {
  const text = `${input.greeting}\n\nYour receipt from ${input.rinkName}:\n${input.lines.map((l) => `- ${l}`).join('\n')}\n\nReference: ${input.reference}\n\n— Rinkwright`;
  const html = `<!doctype html><html><body style="font-family:Manrope,Arial,sans-serif;color:#0E2233;background:#F7FAFC;padding:24px">
<p>${escape(input.greeting)}</p><p>Your receipt from ${escape(input.rinkName)}:</p><ul>${input.lines.map((l) => `<li>${escape(l)}</li>`).join('')}</ul>
<p style="font-size:13px;color:#44586b">Reference: ${escape(input.reference)}</p><p>— Rinkwright</p></body></html>`;
  return { to: input.to, subject: `Receipt from ${input.rinkName}`, text, html };
}

const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

/** One plain layout for every message: a greeting, a paragraph, one button-like link, and the link spelled out. */
export function actionMail(input: { to: string; subject: string; greeting: string; body: string; action: string; url: string; footer: string }): Mail {
  const text = `${input.greeting}\n\n${input.body}\n\n${input.action}: ${input.url}\n\n${input.footer}\n\n— Rinkwright`;
  const html = `<!doctype html><html><body style="font-family:Manrope,Arial,sans-serif;color:#0E2233;background:#F7FAFC;padding:24px">
<p>${escape(input.greeting)}</p><p>${escape(input.body)}</p>
<p><a href="${escape(input.url)}" style="display:inline-block;background:#2F6FAB;color:#fff;padding:12px 20px;border-radius:8px;text-decoration:none">${escape(input.action)}</a></p>
<p style="font-size:13px">Or open this address: <a href="${escape(input.url)}">${escape(input.url)}</a></p>
<p style="font-size:13px;color:#44586b">${escape(input.footer)}</p><p>— Rinkwright</p></body></html>`;
  return { to: input.to, subject: input.subject, text, html };
}

/** A message with no link to follow, such as "your skates are ready". */
export function noticeMail(input: { to: string; subject: string; greeting: string; body: string; footer: string }): Mail {
  const text = `${input.greeting}\n\n${input.body}\n\n${input.footer}\n\n— Rinkwright`;
  const html = `<!doctype html><html><body style="font-family:Manrope,Arial,sans-serif;color:#0E2233;background:#F7FAFC;padding:24px">
<p>${escape(input.greeting)}</p><p>${escape(input.body)}</p><p style="font-size:13px;color:#44586b">${escape(input.footer)}</p><p>— Rinkwright</p></body></html>`;
  return { to: input.to, subject: input.subject, text, html };
}
