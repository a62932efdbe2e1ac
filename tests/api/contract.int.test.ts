import { STAFF_ROLES } from '@rinkwright/core';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildTestApp } from '../support/app';
import { disposableDatabaseName } from '../support/fresh-database';
import { createCustomerAt, createPendingInvitation, createPerson, createRinkWithStaff, type RinkWorld } from '../support/world';

// The shape every later check relies on: health, who-am-I, the rink gate, the OpenAPI document, the error body.

const api = buildTestApp();

const errorShape = (code: string) => ({ error: { code, message: expect.any(String) } });

let rink: RinkWorld;
beforeAll(async () => {
  rink = await createRinkWithStaff('Ice Harbor');
  await createCustomerAt(rink.id, { name: 'Contract Skater' });
  await createPendingInvitation(rink);
});

describe('GET /api/health', () => {
  it('answers ok with the database up', async () => {
    const response = await api.client().get('/api/health');

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ status: 'ok', db: 'up' });
  });
});

describe('GET /api/me', () => {
  it('answers 401 with the error shape when signed out', async () => {
    const response = await api.client().get('/api/me');

    expect(response.status).toBe(401);
    expect(response.body).toEqual(errorShape('unauthenticated'));
  });

  it('describes the signed-in user, their rinks and role', async () => {
    const owner = rink.staff.owner;
    const agent = await api.signIn(owner.email, owner.password);

    const response = await agent.get('/api/me');

    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      user: { id: owner.id, name: owner.name, email: owner.email, emailVerified: true, platformAdmin: false },
      rinks: [{ slug: rink.slug, name: rink.name, role: 'owner', timeZone: 'America/Toronto', currency: 'CAD', unitPreference: 'in' }],
      customerOf: [],
    });
  });
});

describe('GET /api/rinks/:slug', () => {
  it('gives a member the summary with their role and its permissions', async () => {
    const technician = rink.staff.technician;
    const agent = await api.signIn(technician.email, technician.password);

    const response = await agent.get(`/api/rinks/${rink.slug}`);

    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      id: rink.id,
      slug: rink.slug,
      name: rink.name,
      timeZone: 'America/Toronto',
      currency: 'CAD',
      unitPreference: 'in',
      role: 'technician',
      permissions: {
        rink: ['read'],
        customer: ['read', 'create', 'update'],
        station: ['read', 'upkeep'],
        service: ['read'],
        ticket: ['read', 'create', 'work'],
        product: ['read'],
        sale: ['create'],
        credit: ['read', 'redeem'],
        league: ['read'],
      },
      counts: { members: STAFF_ROLES.length, pendingInvitations: 1, customers: 1 },
      createdAt: expect.stringMatching(/^\d{4}-\d\d-\d\dT/),
    });
  });

  it('answers a non-member exactly as for a rink that does not exist (404, never 403)', async () => {
    const stranger = await createPerson('stranger');
    const agent = await api.signIn(stranger.email, stranger.password);

    const foreign = await agent.get(`/api/rinks/${rink.slug}`);
    const unknown = await agent.get('/api/rinks/no-such-rink-anywhere');

    expect(foreign.status).toBe(404);
    expect(foreign.body).toEqual(errorShape('not_found'));
    expect(unknown.status).toBe(404);
    expect(unknown.body).toEqual(foreign.body);
  });

  it('answers 401 when signed out', async () => {
    const response = await api.client().get(`/api/rinks/${rink.slug}`);

    expect(response.status).toBe(401);
    expect(response.body).toEqual(errorShape('unauthenticated'));
  });
});

describe('GET /api/openapi.json', () => {
  it('is OpenAPI 3.1 and lists every route of the route table, and nothing else', async () => {
    const response = await api.client().get('/api/openapi.json');
    const paths = response.body.paths as Record<string, Record<string, unknown>>;

    const documented = Object.entries(paths).flatMap(([path, operations]) => Object.keys(operations).map((method) => `${method} ${path}`));
    const routed = api.routes.map((r) => `${r.method} ${r.path.replace(/:(\w+)/g, '{$1}')}`);

    expect(response.status).toBe(200);
    expect(response.body.openapi).toBe('3.1.0');
    expect(routed.length).toBeGreaterThanOrEqual(10);
    expect(new Set(routed).size, 'two routes share a method and path').toBe(routed.length);
    expect(documented.sort()).toEqual(routed.sort());
  });

  it('documents the 403 and 404 answers of every rink route', async () => {
    const response = await api.client().get('/api/openapi.json');
    const paths = response.body.paths as Record<string, Record<string, { responses: Record<string, unknown> }>>;

    for (const route of api.routes.filter((r) => r.access === 'rink')) {
      const operation = paths[route.path.replace(/:(\w+)/g, '{$1}')]?.[route.method];
      expect(Object.keys(operation?.responses ?? {}), `${route.method} ${route.path}`).toEqual(expect.arrayContaining(['401', '403', '404']));
    }
  });
});

describe('errors', () => {
  it('answers invalid input with 400 and a message per field', async () => {
    const person = await createPerson('validator');
    const agent = await api.signIn(person.email, person.password);

    const response = await agent
      .post('/api/rinks')
      .send({ name: 'x', slug: 'Not A Slug', timeZone: 'Mars/Olympus_Mons', currency: 'QQQ', unitPreference: 'cm' });

    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('validation_failed');
    expect(response.body.error.fields).toEqual({
      name: ['At least 2 characters'],
      slug: ['Lower-case letters, digits and single dashes'],
      timeZone: ['Choose a time zone from the list'],
      currency: ['Use a three-letter currency code such as CAD or USD'],
      unitPreference: [expect.any(String)],
    });
  });

  it('keys a bad path parameter by "params."', async () => {
    const owner = rink.staff.owner;
    const agent = await api.signIn(owner.email, owner.password);

    const response = await agent.patch(`/api/rinks/${rink.slug}/members/${'x'.repeat(40)}`).send({ role: 'technician' });

    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['params.memberId']);
  });

  it('answers a body that is not JSON with 400 bad_request', async () => {
    const owner = rink.staff.owner;
    const agent = await api.signIn(owner.email, owner.password);

    const response = await agent.patch(`/api/rinks/${rink.slug}`).set('Content-Type', 'application/json').send('{"name":');

    expect(response.status).toBe(400);
    expect(response.body).toEqual(errorShape('bad_request'));
  });

  it('answers an unknown /api route with 404 and the error shape', async () => {
    const response = await api.client().get('/api/no-such-thing');

    expect(response.status).toBe(404);
    expect(response.body).toEqual(errorShape('not_found'));
  });

  it('refuses a cookie-carrying write from a foreign origin with 403 forbidden_origin', async () => {
    const person = await createPerson('origin');
    const agent = await api.signIn(person.email, person.password);
    const slug = `foreign-origin-${person.id.slice(0, 8)}`;

    const response = await agent
      .post('/api/rinks')
      .set('Origin', 'https://attacker.example')
      .send({ name: 'North Pond Arena', slug, timeZone: 'America/Toronto', currency: 'CAD', unitPreference: 'in' });

    expect(response.status).toBe(403);
    expect(response.body).toEqual(errorShape('forbidden_origin'));
    expect((await agent.get(`/api/rinks/${slug}`)).status).toBe(404);
  });

  it('accepts the same write from the app origin', async () => {
    const person = await createPerson('origin-ok');
    const agent = await api.signIn(person.email, person.password);
    const slug = `own-origin-${person.id.slice(0, 8)}`;

    const response = await agent
      .post('/api/rinks')
      .send({ name: 'North Pond Arena', slug, timeZone: 'America/Toronto', currency: 'CAD', unitPreference: 'in' });

    expect(response.status).toBe(201);
    expect(response.body).toEqual({ slug });
  });
});

describe('integration set-up', () => {
  it('refuses to drop a database whose name does not end in _test', () => {
    expect(() => disposableDatabaseName('mysql://rw:pw@127.0.0.1:3507/rinkwright_dev', '_test')).toThrow(/must end in _test/);
    expect(() => disposableDatabaseName('mysql://rw:pw@127.0.0.1:3507/', '_test')).toThrow(/must end in _test/);
    expect(disposableDatabaseName('mysql://rw:pw@127.0.0.1:3507/rinkwright_test', '_test')).toBe('rinkwright_test');
  });
});
