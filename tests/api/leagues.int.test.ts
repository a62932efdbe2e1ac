import { count, eq } from 'drizzle-orm';
import { customer, leaguePlayer, leagueTeam } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildTestApp, type Client } from '../support/app';
import { write } from '../support/desk';
import { createRinkWithStaff, type RinkWorld } from '../support/world';

// A league manager's roster file and allocations: a file with bad rows changes nothing and names each bad line;
// a good file applies once; an allocation beyond the pool is refused.

const api = buildTestApp();
let world: RinkWorld;
let leagueManager: Client;
let leagueId: string;

const counts = async () => ({
  customers: (await currentDb().select({ n: count() }).from(customer).where(eq(customer.tenantId, world.id)))[0]?.n,
  teams: (await currentDb().select({ n: count() }).from(leagueTeam).where(eq(leagueTeam.tenantId, world.id)))[0]?.n,
  players: (await currentDb().select({ n: count() }).from(leaguePlayer).where(eq(leaguePlayer.tenantId, world.id)))[0]?.n,
});

beforeAll(async () => {
  world = await createRinkWithStaff('League Rink');
  leagueManager = await api.signIn(world.staff.league_manager.email, world.staff.league_manager.password);
  const made = await leagueManager.post(`/api/rinks/${world.slug}/leagues`).send({ name: 'Test Youth League', season: '2026–27' });
  expect(made.status).toBe(201);
  leagueId = made.body.league.id;
});

describe('roster import', () => {
  const good = 'team,name,email,phone\nGulls,Ada Brightwater,ada@example.test,\nGulls,Bo Lindqvist,,555-0101\nPilots,Cy Marrow,cy@example.test,\n';

  it('refuses a file with bad rows, names each line, and changes nothing', async () => {
    const before = await counts();
    const bad = 'team,name,email\nGulls,Ada Brightwater,ada@example.test\n,No Team,nt@example.test\nPilots,Bad Mail,not-an-email\nGulls,Ada Again,ada@example.test\n';
    const answer = await leagueManager.post(`/api/rinks/${world.slug}/leagues/${leagueId}/roster`).send({ csv: bad });
    expect(answer.status).toBe(400);
    expect(Object.keys(answer.body.error.fields).sort()).toEqual(['line 3', 'line 4', 'line 5']);
    expect(answer.body.error.fields['line 5'][0]).toContain('line 2');
    expect(await counts()).toEqual(before);
  });

  it('applies a good file once; the same file again changes nothing', async () => {
    const first = await leagueManager.post(`/api/rinks/${world.slug}/leagues/${leagueId}/roster`).send({ csv: good });
    expect(first.body).toMatchObject({ applied: true, rows: 3, teamsCreated: 2, playersAdded: 3, customersCreated: 3 });
    const listed = await leagueManager.get(`/api/rinks/${world.slug}/leagues`);
    expect(listed.body.leagues.find((l: { id: string }) => l.id === leagueId)).toMatchObject({ teams: 2, players: 3 });
    const after = await counts();
    const again = await leagueManager.post(`/api/rinks/${world.slug}/leagues/${leagueId}/roster`).send({ csv: good });
    expect(again.body).toMatchObject({ applied: false });
    expect(await counts()).toEqual(after);
  });

  it('refuses to allocate more than the pool holds, and changes nothing', async () => {
    const detail = await leagueManager.get(`/api/rinks/${world.slug}/leagues/${leagueId}`);
    const team = detail.body.teams.find((t: { name: string }) => t.name === 'Gulls');
    const tooMany = await write(leagueManager, `/api/rinks/${world.slug}/leagues/${leagueId}/allocations`, { teamId: team.id, credits: 5 });
    expect(tooMany.status).toBe(409);
    expect(tooMany.body.error.code).toBe('insufficient_credits');
    const after = await leagueManager.get(`/api/rinks/${world.slug}/leagues/${leagueId}`);
    expect(after.body.teams.find((t: { id: string }) => t.id === team.id)).toMatchObject({ allocated: 0, remaining: 0 });
  });
});
