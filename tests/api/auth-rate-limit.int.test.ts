import { describe, expect, it } from 'vitest';
import { buildTestApp } from '../support/app';
import { createPerson } from '../support/world';

// Its own file because the limit is read when the app is built, and a file may build only one app.
// AUTH_RATE_LIMIT_MAX=15 gives sign-in its floor of 5 attempts per minute per client address (auth.ts).
const api = buildTestApp({ AUTH_RATE_LIMIT_MAX: '15' });
const SIGN_IN_LIMIT = 5;

describe('sign-in rate limit', () => {
  it('answers 429 beyond the limit, even with the right password, and only for that client', async () => {
    const person = await createPerson('limited');
    const attacker = api.client();

    const answers: number[] = [];
    for (let i = 0; i < SIGN_IN_LIMIT; i++) {
      answers.push((await attacker.post('/api/auth/sign-in/email').send({ email: person.email, password: `wrong-guess-${i}` })).status);
    }
    const beyond = await attacker.post('/api/auth/sign-in/email').send({ email: person.email, password: person.password });

    expect(answers).toEqual(Array(SIGN_IN_LIMIT).fill(401));
    expect(beyond.status).toBe(429);
    expect(Number(beyond.headers['x-retry-after'])).toBeGreaterThan(0);

    const elsewhere = await api.client().post('/api/auth/sign-in/email').send({ email: person.email, password: person.password });
    expect(elsewhere.status).toBe(200);
  });
});
