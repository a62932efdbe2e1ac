import { beforeAll, describe, expect, it } from 'vitest';
import { ROLE_LABELS } from '@rinkwright/core';
import { currentDb } from '@rinkwright/db/unscoped';
import demo from '../../packages/db/src/demo-sign-ins.json';
import { seedDemo } from '../../packages/db/src/seed';
import { buildTestApp } from '../support/app';

const app = buildTestApp();

// The README and `npm start` promise these sign-ins: each must work and land where its line says.
describe('the demo seed', () => {
  beforeAll(async () => {
    await seedDemo(currentDb());
  });

  it('is idempotent', async () => {
    expect(await seedDemo(currentDb())).toBe('already-seeded');
  });

  it.each(demo.signIns)('signs in $email as $who', async ({ email, who }) => {
    const agent = await app.signIn(email, demo.password);
    const me = (await agent.get('/api/me').expect(200)).body;
    const staff = /^(Ice Harbor|North Pond Arena), (.+)$/.exec(who);
    if (staff) {
      const [, rinkName, roleLabel] = staff;
      expect(me.rinks.map((r: { name: string; role: keyof typeof ROLE_LABELS }) => `${r.name}, ${ROLE_LABELS[r.role].toLowerCase()}`)).toEqual([
        `${rinkName}, ${roleLabel}`,
      ]);
    } else if (who === 'platform admin') {
      expect(me.user.platformAdmin).toBe(true);
      expect(me.rinks).toEqual([]);
    } else {
      expect(me.rinks).toEqual([]);
      expect(me.customerOf.map((c: { name: string }) => c.name).sort()).toEqual(['Ice Harbor', 'North Pond Arena']);
    }
  });
});
