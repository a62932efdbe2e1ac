import { eq } from 'drizzle-orm';
import { rink as rinkTable } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { describe, expect, it } from 'vitest';
import { buildTestApp, type Client } from '../support/app';
import { linkIn, waitForMail } from '../support/mail';
import { addStaffer, createPerson, createRinkWithStaff, uniqueEmail, uniqueSlug, type Staffer } from '../support/world';

// Rinks and their staff: creating a rink, inviting and accepting, roles, and the rules that keep one owner.

const api = buildTestApp();

const newRink = (slug: string) => ({ name: 'North Pond Arena', slug, timeZone: 'America/Winnipeg', currency: 'CAD', unitPreference: 'mm' });
const as = (staffer: Staffer) => api.signIn(staffer.email, staffer.password);

async function rolesAt(client: Client, slug: string): Promise<Record<string, string>> {
  const response = await client.get(`/api/rinks/${slug}/members`);
  expect(response.status).toBe(200);
  return Object.fromEntries((response.body.members as { id: string; role: string }[]).map((m) => [m.id, m.role]));
}

describe('rink creation', () => {
  it('makes the creator the owner of the new rink', async () => {
    const founder = await createPerson('founder');
    const agent = await api.signIn(founder.email, founder.password);
    const slug = uniqueSlug('north-pond');

    const created = await agent.post('/api/rinks').send(newRink(slug));
    const me = await agent.get('/api/me');
    const summary = await agent.get(`/api/rinks/${slug}`);

    expect(created.status).toBe(201);
    expect(created.body).toEqual({ slug });
    expect(me.body.rinks).toEqual([{ slug, name: 'North Pond Arena', role: 'owner', timeZone: 'America/Winnipeg', currency: 'CAD', unitPreference: 'mm' }]);
    expect(summary.body).toMatchObject({ slug, role: 'owner', counts: { members: 1, pendingInvitations: 0, customers: 0 } });
  });

  it('answers a taken slug with 400 and fields.slug', async () => {
    const existing = await createRinkWithStaff('Ice Harbor');
    const founder = await createPerson('copycat');
    const agent = await api.signIn(founder.email, founder.password);

    const response = await agent.post('/api/rinks').send(newRink(existing.slug));

    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({ slug: ['That address is taken; try another'] });
    expect((await agent.get('/api/me')).body.rinks).toEqual([]);
  });

  it('refuses a reserved slug', async () => {
    const founder = await createPerson('reserved');
    const agent = await api.signIn(founder.email, founder.password);

    const response = await agent.post('/api/rinks').send(newRink('admin'));

    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({ slug: ['That address is reserved'] });
  });
});

describe('invitations', () => {
  it('a manager invites by e-mail; the invitee previews and accepts, and joins with that role', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const manager = await as(rink.staff.manager);
    const inviteeEmail = uniqueEmail('new-tech');

    const invited = await manager.post(`/api/rinks/${rink.slug}/invitations`).send({ email: inviteeEmail, role: 'technician' });
    expect(invited.status).toBe(201);
    expect(invited.body.invitations).toEqual([
      expect.objectContaining({ email: inviteeEmail, role: 'technician', status: 'pending', invitedBy: rink.staff.manager.name }),
    ]);

    const mail = await waitForMail(inviteeEmail, { subject: /invited to/ });
    const link = linkIn(mail, /\/invitations\/[\w-]+$/);
    const invitationId = link.pathname.split('/').pop() ?? '';
    expect(link.origin).toBe(api.origin);
    expect(invitationId).toBe(invited.body.invitations[0].id);

    const preview = await api.client().get(`/api/invitations/${invitationId}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toEqual({ id: invitationId, rinkName: rink.name, role: 'technician', email: inviteeEmail, status: 'pending' });

    const invitee = await createPerson('new-tech', { email: inviteeEmail });
    const inviteeAgent = await api.signIn(invitee.email, invitee.password);
    const accepted = await inviteeAgent.post(`/api/invitations/${invitationId}/accept`);
    expect(accepted.status).toBe(200);
    expect(accepted.body).toEqual({ slug: rink.slug });

    expect((await inviteeAgent.get('/api/me')).body.rinks).toEqual([expect.objectContaining({ slug: rink.slug, role: 'technician' })]);
    const members = (await manager.get(`/api/rinks/${rink.slug}/members`)).body.members as { email: string; role: string }[];
    expect(members.find((m) => m.email === inviteeEmail)?.role).toBe('technician');
    expect((await api.client().get(`/api/invitations/${invitationId}`)).body.status).toBe('accepted');
    expect((await manager.get(`/api/rinks/${rink.slug}/invitations`)).body.invitations).toEqual([]);
  });

  it('lets only the invited address accept', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const owner = await as(rink.staff.owner);
    const invited = await owner.post(`/api/rinks/${rink.slug}/invitations`).send({ email: uniqueEmail('meant'), role: 'manager' });
    const invitationId = invited.body.invitations[0].id as string;
    const other = await createPerson('interloper');
    const otherAgent = await api.signIn(other.email, other.password);

    const response = await otherAgent.post(`/api/invitations/${invitationId}/accept`);

    expect(response.status).toBe(403);
    expect((await otherAgent.get('/api/me')).body.rinks).toEqual([]);
  });

  it('lists pending invitations, and a revoked one can no longer be accepted', async () => {
    const rink = await createRinkWithStaff('North Pond Arena');
    const manager = await as(rink.staff.manager);
    const inviteeEmail = uniqueEmail('revoked');
    await manager.post(`/api/rinks/${rink.slug}/invitations`).send({ email: inviteeEmail, role: 'league_manager' });

    const pending = await manager.get(`/api/rinks/${rink.slug}/invitations`);
    expect(pending.status).toBe(200);
    expect(pending.body.invitations).toEqual([expect.objectContaining({ email: inviteeEmail, role: 'league_manager', status: 'pending' })]);
    const invitationId = pending.body.invitations[0].id as string;

    const revoked = await manager.delete(`/api/rinks/${rink.slug}/invitations/${invitationId}`);
    expect(revoked.status).toBe(200);
    expect(revoked.body).toEqual({ ok: true });
    expect((await manager.get(`/api/rinks/${rink.slug}/invitations`)).body.invitations).toEqual([]);
    expect((await api.client().get(`/api/invitations/${invitationId}`)).body.status).toBe('canceled');
    expect((await manager.delete(`/api/rinks/${rink.slug}/invitations/${invitationId}`)).status).toBe(409);

    const invitee = await createPerson('revoked', { email: inviteeEmail });
    const inviteeAgent = await api.signIn(invitee.email, invitee.password);
    expect((await inviteeAgent.post(`/api/invitations/${invitationId}/accept`)).status).toBe(400);
    expect((await inviteeAgent.get('/api/me')).body.rinks).toEqual([]);
  });

  it('refuses an invitation from a technician with 403', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const technician = await as(rink.staff.technician);
    const email = uniqueEmail('not-invited');

    const response = await technician.post(`/api/rinks/${rink.slug}/invitations`).send({ email, role: 'technician' });

    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('forbidden');
    const owner = await as(rink.staff.owner);
    expect((await owner.get(`/api/rinks/${rink.slug}/invitations`)).body.invitations).toEqual([]);
  });

  it('refuses a manager inviting an owner (400 fields.role) and inviting a present member (400 fields.email)', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const manager = await as(rink.staff.manager);

    const asOwner = await manager.post(`/api/rinks/${rink.slug}/invitations`).send({ email: uniqueEmail('would-be-owner'), role: 'owner' });
    const present = await manager.post(`/api/rinks/${rink.slug}/invitations`).send({ email: rink.staff.technician.email, role: 'manager' });

    expect(asOwner.status).toBe(400);
    expect(Object.keys(asOwner.body.error.fields)).toEqual(['role']);
    expect(present.status).toBe(400);
    expect(Object.keys(present.body.error.fields)).toEqual(['email']);
    expect((await manager.get(`/api/rinks/${rink.slug}/invitations`)).body.invitations).toEqual([]);
  });
});

describe('roles', () => {
  it('a manager changes a technician to league manager', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const manager = await as(rink.staff.manager);

    const response = await manager.patch(`/api/rinks/${rink.slug}/members/${rink.staff.technician.memberId}`).send({ role: 'league_manager' });

    expect(response.status).toBe(200);
    expect((await rolesAt(manager, rink.slug))[rink.staff.technician.memberId]).toBe('league_manager');
  });

  it('a manager cannot give the owner role (400 fields.role)', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const manager = await as(rink.staff.manager);

    const response = await manager.patch(`/api/rinks/${rink.slug}/members/${rink.staff.technician.memberId}`).send({ role: 'owner' });

    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['role']);
    expect((await rolesAt(manager, rink.slug))[rink.staff.technician.memberId]).toBe('technician');
  });

  it('a manager can neither change nor remove an owner (403)', async () => {
    const rink = await createRinkWithStaff('North Pond Arena');
    await addStaffer(rink, 'owner', 'second-owner');
    const manager = await as(rink.staff.manager);
    const ownerPath = `/api/rinks/${rink.slug}/members/${rink.staff.owner.memberId}`;

    const changed = await manager.patch(ownerPath).send({ role: 'technician' });
    const removed = await manager.delete(ownerPath);

    expect(changed.status).toBe(403);
    expect(removed.status).toBe(403);
    expect((await rolesAt(manager, rink.slug))[rink.staff.owner.memberId]).toBe('owner');
  });

  it('a technician and a league manager cannot change roles (403)', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const target = `/api/rinks/${rink.slug}/members/${rink.staff.manager.memberId}`;

    const byTechnician = await (await as(rink.staff.technician)).patch(target).send({ role: 'technician' });
    const byLeague = await (await as(rink.staff.league_manager)).patch(target).send({ role: 'technician' });

    expect(byTechnician.status).toBe(403);
    expect(byLeague.status).toBe(403);
    expect((await rolesAt(await as(rink.staff.owner), rink.slug))[rink.staff.manager.memberId]).toBe('manager');
  });

  it('the last owner can be neither demoted nor removed (409)', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const owner = await as(rink.staff.owner);
    const selfPath = `/api/rinks/${rink.slug}/members/${rink.staff.owner.memberId}`;

    const demoted = await owner.patch(selfPath).send({ role: 'manager' });
    const removed = await owner.delete(selfPath);

    expect(demoted.status).toBe(409);
    expect(demoted.body.error.code).toBe('conflict');
    expect(removed.status).toBe(409);
    expect((await rolesAt(owner, rink.slug))[rink.staff.owner.memberId]).toBe('owner');
  });

  it('an owner hands over: promotes someone to owner, then steps down', async () => {
    const rink = await createRinkWithStaff('North Pond Arena');
    const owner = await as(rink.staff.owner);

    const promoted = await owner.patch(`/api/rinks/${rink.slug}/members/${rink.staff.manager.memberId}`).send({ role: 'owner' });
    const steppedDown = await owner.patch(`/api/rinks/${rink.slug}/members/${rink.staff.owner.memberId}`).send({ role: 'manager' });

    expect(promoted.status).toBe(200);
    expect(steppedDown.status).toBe(200);
    const roles = await rolesAt(owner, rink.slug);
    expect([roles[rink.staff.manager.memberId], roles[rink.staff.owner.memberId]]).toEqual(['owner', 'manager']);
  });

  it('a manager removes a technician, who then sees the rink as not found', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const manager = await as(rink.staff.manager);
    const technician = await as(rink.staff.technician);

    const removed = await manager.delete(`/api/rinks/${rink.slug}/members/${rink.staff.technician.memberId}`);

    expect(removed.status).toBe(200);
    expect(Object.keys(await rolesAt(manager, rink.slug))).not.toContain(rink.staff.technician.memberId);
    expect((await technician.get(`/api/rinks/${rink.slug}`)).status).toBe(404);
  });
});

// better-auth mounts its organization plugin's own endpoints under /api/auth/organization/*. The rink rules
// (slug never changes, reserved slugs, the time-zone list, who may delete a rink) live in our route table,
// so these endpoints must not offer a way around them.
describe("better-auth's organization endpoints", () => {
  const rinkRow = async (id: string) => (await currentDb().select().from(rinkTable).where(eq(rinkTable.id, id)))[0];

  it('do not let a manager change the slug or store a time zone our API would refuse', async () => {
    const rink = await createRinkWithStaff('Ice Harbor');
    const manager = await as(rink.staff.manager);
    const before = await rinkRow(rink.id);

    const response = await manager
      .post('/api/auth/organization/update')
      .send({ organizationId: rink.id, data: { slug: uniqueSlug('moved'), timeZone: 'Not/A_Zone' } });

    expect(response.status).toBeGreaterThanOrEqual(400);
    expect(await rinkRow(rink.id)).toEqual(before);
  });

  it('do not let an owner delete the rink outside the route table', async () => {
    const rink = await createRinkWithStaff('North Pond Arena');
    const owner = await as(rink.staff.owner);

    const response = await owner.post('/api/auth/organization/delete').send({ organizationId: rink.id });

    expect(response.status).toBeGreaterThanOrEqual(400);
    expect(await rinkRow(rink.id)).toBeDefined();
  });

  it('do not create a rink with a reserved slug', async () => {
    const founder = await createPerson('sideways');
    const agent = await api.signIn(founder.email, founder.password);

    const response = await agent
      .post('/api/auth/organization/create')
      .send({ name: 'Ice Harbor', slug: 'settings', timeZone: 'Nowhere/Land', currency: 'CAD', unitPreference: 'in' });

    expect(response.status).toBeGreaterThanOrEqual(400);
    expect((await agent.get('/api/me')).body.rinks).toEqual([]);
  });
});
