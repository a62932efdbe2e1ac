import nodemailer from 'nodemailer';
import type { Logger } from 'pino';
import type { Env } from '../env';

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export interface Mailer {
  send(mail: Mail): Promise<void>;
  close(): void;
}

export function createMailer(env: Env, logger: Logger): Mailer {
  const transport = nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    // The local capture server speaks plain SMTP; a real relay is configured with SMTP_SECURE and a user.
    ignoreTLS: !env.SMTP_SECURE && !env.SMTP_USER,
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? '' } : undefined,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: env.MAIL_FROM, ...mail });
      logger.info({ to: mail.to, subject: mail.subject }, 'mail sent');
    },
    close: () => transport.close(),
  };
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
