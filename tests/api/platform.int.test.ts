import { beforeAll, describe, expect, it } from 'vitest';
import { createUser } from '@rinkwright/db/testing';
import { currentDb } from '@rinkwright/db/unscoped';
import { buildTestApp } from '../support/app';
import { createCustomerAt, createRinkWithStaff, PASSWORD, uniqueEmail, type RinkWorld } from '../support/world';

const app = buildTestApp();
const platformRoutes = app.routes.filter((r) => r.access === 'platform');

describe('platform admin routes', () => {
  let rink: RinkWorld;
  let adminEmail: string;

  beforeAll(async () => {
    rink = await createRinkWithStaff('Platform Sweep');
    await createCustomerAt(rink.id, { name: 'Counted Skater' });
    await createCustomerAt(rink.id, { name: 'Second Skater' });
    adminEmail = uniqueEmail('platform-admin');
    await createUser(currentDb(), { email: adminEmail, name: 'Test Admin', password: PASSWORD, verified: true, platformRole: 'admin' });
  });

  it('has routes to check', () => {
    expect(platformRoutes.map((r) => `${r.method} ${r.path}`)).toContain('get /api/platform/rinks');
  });

  it('answers 401 signed out and 404 to every rink role, as if the route did not exist', async () => {
    const agents = await Promise.all(Object.values(rink.staff).map(async (staffer) => ({ staffer, agent: await app.signIn(staffer.email, staffer.password) })));
    for (const route of platformRoutes) {
      expect((await app.client()[route.method](route.path)).status).toBe(401);
      for (const { staffer, agent } of agents) {
        const response = await agent[route.method](route.path);
        expect(response.status, `${staffer.role} on ${route.path}`).toBe(404);
        expect(response.body.error.code).toBe('not_found');
      }
    }
  });

  it('lists every rink with its staff and customer counts for the platform admin', async () => {
    const agent = await app.signIn(adminEmail, PASSWORD);
    const response = await agent.get('/api/platform/rinks');
    expect(response.status).toBe(200);
    const row = response.body.rinks.find((r: { slug: string }) => r.slug === rink.slug);
    // createRinkWithStaff adds one member of each of the four roles.
    expect(row).toMatchObject({ name: rink.name, members: 4, customers: 2 });
  });
});
