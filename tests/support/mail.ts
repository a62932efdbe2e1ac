import { integrationEnv } from './env';

// Reads what the app sent from the capture server's REST API (maildev 3 serves it under /api/email).

export interface CapturedMail {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: { address: string; name?: string }[];
}

async function allMail(): Promise<CapturedMail[]> {
  const response = await fetch(new URL('/api/email', integrationEnv().MAIL_API_URL));
  if (!response.ok) throw new Error(`the mail capture server answered ${response.status}`);
  return (await response.json()) as CapturedMail[];
}

export async function mailTo(address: string, subject?: RegExp): Promise<CapturedMail[]> {
  const wanted = address.toLowerCase();
  return (await allMail()).filter(
    (m) => m.to.some((t) => t.address.toLowerCase() === wanted) && (!subject || subject.test(m.subject)),
  );
}

/**
 * Waits until at least `count` messages to this address (and subject) have arrived and returns the latest.
 * Sending is asynchronous to the HTTP answer, so a test must poll instead of reading once.
 */
export async function waitForMail(
  address: string,
  options: { subject?: RegExp; count?: number; timeoutMs?: number } = {},
): Promise<CapturedMail> {
  const { subject, count = 1, timeoutMs = 20_000 } = options;
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = await mailTo(address, subject);
    const latest = found[found.length - 1];
    if (found.length >= count && latest) return latest;
    if (Date.now() > deadline) {
      const what = `${count} mail(s) to ${address}${subject ? ` matching ${subject}` : ''}`;
      throw new Error(`expected ${what} within ${timeoutMs} ms; found ${found.length}`);
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/** The first link in the plain-text part whose address matches the pattern. */
export function linkIn(mail: CapturedMail, pattern: RegExp): URL {
  const links = mail.text.match(/https?:\/\/[^\s<>"]+/g) ?? [];
  const link = links.find((l) => pattern.test(l));
  if (!link) throw new Error(`no link matching ${pattern} in "${mail.subject}": ${links.join(', ') || 'no links at all'}`);
  return new URL(link);
}

/** The path and query of a link, to follow it with supertest against the app under test. */
export const pathOf = (url: URL) => `${url.pathname}${url.search}`;
