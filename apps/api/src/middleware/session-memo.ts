import { LRUCache } from 'lru-cache';
import { parseCookies } from 'better-auth/cookies';
import type { UserContext } from '../http/route';

/**
 * Remembers, in this process, the caller a set of session cookies was verified as, until the signed session copy
 * in those cookies expires. better-auth accepts that copy until then without reading the database (auth.ts,
 * SESSION_CACHE_SECONDS), so answering from here changes nothing but the cost: checking the copy's signature again
 * on every request was a sixth of each request's time in the counter routes (README, benchmarks).
 *
 * Only a verification that renewed no cookie is remembered: it was answered from a copy that is still valid.
 * The copy's expiry is read from the cookie better-auth just verified (its compact form: base64url JSON with an
 * `expiresAt` covered by the signature); a cookie of any other shape is never remembered.
 */
export class SessionMemo {
  private readonly known: LRUCache<string, UserContext>;
  private readonly now: () => number;

  /** `copyCookie`: the name of the cookie holding the signed copy (better-auth's `session_data`, prefixed). */
  constructor(
    private readonly copyCookie: string,
    options: { max?: number; now?: () => number } = {},
  ) {
    this.now = options.now ?? Date.now;
    // ttlResolution 0: every look-up asks the clock (lru-cache otherwise reuses a reading for up to 1 ms).
    this.known = new LRUCache({ max: options.max ?? 10_000, ttlResolution: 0, perf: { now: this.now } });
  }

  /** The caller these exact cookies were verified as, while their signed copy is valid. */
  recall(cookieHeader: string | undefined): UserContext | undefined {
    return cookieHeader ? this.known.get(cookieHeader) : undefined;
  }

  /** After better-auth verified these cookies as this caller without renewing any of them. */
  remember(cookieHeader: string | undefined, caller: UserContext): void {
    if (!cookieHeader) return;
    const expiresAt = copyExpiry(parseCookies(cookieHeader).get(this.copyCookie));
    const ttl = expiresAt === undefined ? 0 : Math.floor(expiresAt - this.now());
    if (ttl > 0) this.known.set(cookieHeader, caller, { ttl });
  }
}

function copyExpiry(value: string | undefined): number | undefined {
  if (!value) return undefined;
  try {
    const parsed: unknown = JSON.parse(Buffer.from(value, 'base64url').toString('utf8'));
    const expiresAt = (parsed as { expiresAt?: unknown } | null)?.expiresAt;
    return typeof expiresAt === 'number' && Number.isFinite(expiresAt) ? expiresAt : undefined;
  } catch {
    return undefined;
  }
}
