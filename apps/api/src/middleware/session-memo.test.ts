import { describe, expect, it } from 'vitest';
import { SessionMemo } from './session-memo';

const COPY = 'rinkwright.session_data';
const caller = { userId: 'u-1', email: 'pat.lindqvist@example.test', name: 'Pat Lindqvist', platformAdmin: false };

/** better-auth's compact session copy: base64url JSON whose `expiresAt` the signature covers. */
function copyCookie(expiresAt: unknown): string {
  const value = Buffer.from(JSON.stringify({ session: { session: {}, user: {} }, expiresAt, signature: 'sig' })).toString('base64url');
  return `rinkwright.session_token=tok.sig; ${COPY}=${value}`;
}

function memoAt(start: number) {
  const clock = { now: start };
  return { clock, memo: new SessionMemo(COPY, { now: () => clock.now }) };
}

describe('SessionMemo', () => {
  it('answers for the same cookies until their signed copy expires, and not after', () => {
    const { clock, memo } = memoAt(1_000_000);
    const cookies = copyCookie(1_000_000 + 60_000);
    memo.remember(cookies, caller);
    expect(memo.recall(cookies)).toEqual(caller);
    clock.now += 59_000;
    expect(memo.recall(cookies)).toEqual(caller);
    clock.now += 1_001;
    expect(memo.recall(cookies)).toBeUndefined();
  });

  it('answers only for the exact cookies it verified', () => {
    const { memo } = memoAt(0);
    const cookies = copyCookie(60_000);
    memo.remember(cookies, caller);
    expect(memo.recall(`${cookies}; theme=dark`)).toBeUndefined();
    expect(memo.recall(undefined)).toBeUndefined();
  });

  it('remembers nothing without a copy it can read the expiry of, or with an expired one', () => {
    const { memo } = memoAt(100_000);
    const cases = [
      'rinkwright.session_token=tok.sig',
      `rinkwright.session_token=tok.sig; ${COPY}=not-json`,
      copyCookie('tomorrow'),
      copyCookie(null),
      copyCookie(100_000),
      copyCookie(99_000),
    ];
    for (const cookies of cases) {
      memo.remember(cookies, caller);
      expect(memo.recall(cookies), cookies).toBeUndefined();
    }
    memo.remember(undefined, caller);
    expect(memo.recall(undefined)).toBeUndefined();
  });
});
