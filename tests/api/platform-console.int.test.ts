import { beforeAll, describe, expect, it } from 'vitest';
import { createSharpening, createTicket, createUser } from '@rinkwright/db/testing';
import { currentDb } from '@rinkwright/db/unscoped';
import { buildTestApp, type Client } from '../support/app';
import { createDesk, type Desk } from '../support/desk';
import { PASSWORD, uniqueEmail } from '../support/world';

// The platform console: suspending and reactivating a rink, and the same reports for any rink.

const api = buildTestApp();
let desk: Desk;
let admin: Client;
let today: string;

beforeAll(async () => {
  desk = await createDesk('Console Rink');
  const email = uniqueEmail('console-admin');
  await createUser(currentDb(), { email, name: 'Console Admin', password: PASSWORD, verified: true, platformRole: 'admin' });
  admin = await api.signIn(email, PASSWORD);
  const made = await createTicket(currentDb(), desk.world.id, { customerId: desk.skater.id, serviceId: desk.service.id, createdBy: desk.world.staff.technician.id, number: 1 });
  await createSharpening(currentDb(), desk.world.id, { ticketId: made.id, pairId: made.pairIds[0]!, stationId: desk.station.id, technicianId: desk.world.staff.technician.id });
  today = (await admin.get(`/api/platform/rinks/${desk.world.id}/reports`)).body.today;
});

describe('suspending a rink', () => {
  it('asks for a reason, and knows no rink that does not exist', async () => {
    const bare = await admin.post(`/api/platform/rinks/${desk.world.id}/suspension`).send({ reason: '' });
    expect(bare.status).toBe(400);
    expect(bare.body.error.fields).toHaveProperty('reason');
    expect((await admin.post('/api/platform/rinks/no-such-rink/suspension').send({ reason: 'Testing the brake' })).status).toBe(404);
  });

  it('stops the staff with the reason and hides the public page, and reactivation undoes both', async () => {
    const manager = await api.signIn(desk.world.staff.manager.email, PASSWORD);
    expect((await manager.get(`/api/rinks/${desk.world.slug}/stations`)).status).toBe(200);
    expect((await api.client().get(`/api/public/rinks/${desk.world.slug}`)).status).toBe(200);

    expect((await admin.post(`/api/platform/rinks/${desk.world.id}/suspension`).send({ reason: 'Unpaid since spring' })).status).toBe(200);
    const refused = await manager.get(`/api/rinks/${desk.world.slug}/stations`);
    expect(refused.status).toBe(403);
    expect(refused.body.error).toMatchObject({ code: 'suspended', message: expect.stringContaining('Unpaid since spring') });
    expect((await api.client().get(`/api/public/rinks/${desk.world.slug}`)).status).toBe(404);
    const listed = (await admin.get('/api/platform/rinks')).body.rinks.find((r: { id: string }) => r.id === desk.world.id);
    expect(listed.suspension).toMatchObject({ reason: 'Unpaid since spring' });

    expect((await admin.post(`/api/platform/rinks/${desk.world.id}/reactivation`)).status).toBe(200);
    expect((await manager.get(`/api/rinks/${desk.world.slug}/stations`)).status).toBe(200);
    expect((await api.client().get(`/api/public/rinks/${desk.world.slug}`)).status).toBe(200);
    expect((await admin.get('/api/platform/rinks')).body.rinks.find((r: { id: string }) => r.id === desk.world.id).suspension).toBeNull();
  });
});

describe('the reports of any rink', () => {
  it('answers the platform admin with the rink’s own figures, and its tables as CSV', async () => {
    const report = await admin.get(`/api/platform/rinks/${desk.world.id}/reports/throughput?from=${today}&to=${today}`);
    expect(report.status, JSON.stringify(report.body)).toBe(200);
    expect(report.body.totals).toMatchObject({ pairs: 1, staffedHours: 1 });
    const csv = await admin.get(`/api/platform/rinks/${desk.world.id}/reports/throughput/byStation.csv?from=${today}&to=${today}`);
    expect(csv.text.trim().split('\n')).toEqual(['Station,Pairs,Staffed hours,Pairs per staffed hour', 'Station One,1,1,1']);
    const listed = (await admin.get('/api/platform/rinks')).body.rinks.find((r: { id: string }) => r.id === desk.world.id);
    expect(listed.volume).toMatchObject({ pairs30d: 1, feesMinor30d: 0 });
  });

  it('is not there for a rink’s own staff', async () => {
    const owner = await api.signIn(desk.world.staff.owner.email, PASSWORD);
    expect((await owner.get(`/api/platform/rinks/${desk.world.id}/reports/throughput?from=${today}&to=${today}`)).status).toBe(404);
  });
});
