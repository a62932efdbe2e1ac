import { randomUUID } from 'node:crypto';
import { Faker, en } from '@faker-js/faker';
import { hashPassword } from 'better-auth/crypto';
import { memberCode } from '@rinkwright/core';
import type { Executor } from './client';
import {
  customerSearch,
  customerSearchRows,
  account,
  customer,
  invitation,
  levelReading,
  member,
  rink,
  serviceItem,
  sharpening,
  skateProfile,
  station,
  ticket,
  ticketEvent,
  ticketPair,
  type TICKET_STATES,
  user,
} from './schema/index';

// Fake-data factories shared by the tests and the demo seed. Each writes real rows through Drizzle;
// a seeded Faker makes the demo the same on every machine.

export { memberCode };

export type StaffRole = 'owner' | 'manager' | 'technician' | 'league_manager';

export function seededFaker(seed: number): Faker {
  const faker = new Faker({ locale: [en] });
  faker.seed(seed);
  return faker;
}

const hashes = new Map<string, Promise<string>>();
/** scrypt is slow by design; one hash per distinct password is enough for fixtures. */
function hashOnce(password: string): Promise<string> {
  let hash = hashes.get(password);
  if (!hash) {
    hash = hashPassword(password);
    hashes.set(password, hash);
  }
  return hash;
}

export function uniqueSuffix(): string {
  return randomUUID().slice(0, 8);
}

export async function createUser(
  db: Executor,
  input: { email?: string; name?: string; password?: string; verified?: boolean; platformRole?: 'admin' },
) {
  const id = randomUUID();
  const email = (input.email ?? `user-${uniqueSuffix()}@example.test`).toLowerCase();
  const now = new Date();
  await db.insert(user).values({
    id,
    name: input.name ?? 'Test User',
    email,
    emailVerified: input.verified ?? true,
    role: input.platformRole ?? 'user',
    createdAt: now,
    updatedAt: now,
  });
  await db.insert(account).values({
    id: randomUUID(),
    accountId: id,
    providerId: 'credential',
    userId: id,
    password: await hashOnce(input.password ?? 'correct-horse-battery'),
    createdAt: now,
    updatedAt: now,
  });
  return { id, email, name: input.name ?? 'Test User' };
}

export async function createRink(
  db: Executor,
  input: { name?: string; slug?: string; timeZone?: string; currency?: string; unitPreference?: 'in' | 'mm' },
) {
  const id = randomUUID();
  const slug = input.slug ?? `rink-${uniqueSuffix()}`;
  const row = {
    id,
    name: input.name ?? `Rink ${slug}`,
    slug,
    timeZone: input.timeZone ?? 'America/Toronto',
    currency: input.currency ?? 'CAD',
    unitPreference: input.unitPreference ?? 'in',
    createdAt: new Date(),
  } as const;
  await db.insert(rink).values(row);
  return row;
}

export async function addMember(db: Executor, rinkId: string, userId: string, role: StaffRole) {
  const id = randomUUID();
  await db.insert(member).values({ id, organizationId: rinkId, userId, role, createdAt: new Date() });
  return { id, rinkId, userId, role };
}

export async function createInvitation(
  db: Executor,
  input: { rinkId: string; inviterId: string; email?: string; role?: StaffRole; status?: string },
) {
  const id = randomUUID();
  const email = (input.email ?? `invitee-${uniqueSuffix()}@example.test`).toLowerCase();
  await db.insert(invitation).values({
    id,
    organizationId: input.rinkId,
    email,
    role: input.role ?? 'technician',
    status: input.status ?? 'pending',
    inviterId: input.inviterId,
    expiresAt: new Date(Date.now() + 7 * 24 * 3600 * 1000),
    createdAt: new Date(),
  });
  return { id, email };
}

export async function createCustomer(
  db: Executor,
  rinkId: string,
  input: { name?: string; email?: string | null; phone?: string | null; userId?: string | null; code?: string },
) {
  const id = randomUUID();
  const row = {
    id,
    tenantId: rinkId,
    name: input.name ?? 'Test Skater',
    email: input.email?.toLowerCase() ?? null,
    phone: input.phone ?? null,
    memberCode: input.code ?? memberCode(),
    userId: input.userId ?? null,
    createdAt: new Date(),
  };
  await db.insert(customer).values(row);
  await db.insert(customerSearch).values(customerSearchRows(row));
  return row;
}

export async function createStation(
  db: Executor,
  rinkId: string,
  input: { name?: string; status?: 'active' | 'maintenance' | 'retired'; rpm?: number; adjustStepMilli?: number; precision?: boolean } = {},
) {
  const row = {
    id: randomUUID(),
    tenantId: rinkId,
    name: input.name ?? `Station ${uniqueSuffix()}`,
    status: input.status ?? 'active',
    rpm: input.rpm ?? 3450,
    adjustUnit: 'turns' as const,
    adjustStepMilli: input.adjustStepMilli ?? 125,
    ownTrueNm: null,
    ownFairNm: null,
    precision: input.precision ?? false,
    createdAt: new Date(),
  };
  await db.insert(station).values(row);
  return row;
}

export async function createService(db: Executor, rinkId: string, input: { name?: string; kind?: 'standard' | 'profiling' | 'new_steel' | 'add_on'; priceMinor?: number } = {}) {
  const row = { id: randomUUID(), tenantId: rinkId, name: input.name ?? 'Standard sharpening', kind: input.kind ?? 'standard', priceMinor: input.priceMinor ?? 1200, active: 1, createdAt: new Date() } as const;
  await db.insert(serviceItem).values(row);
  return row;
}

export async function createSkateProfile(db: Executor, rinkId: string, customerId: string, input: { label?: string; bladeWidthNm?: number; preferredHollowNm?: number } = {}) {
  const row = {
    id: randomUUID(),
    tenantId: rinkId,
    customerId,
    label: input.label ?? 'Game skates',
    bladeWidthNm: input.bladeWidthNm ?? 2_900_000,
    preferredHollowNm: input.preferredHollowNm ?? 12_700_000,
    profileRadiusNm: null,
    notes: null,
    createdAt: new Date(),
    updatedAt: new Date(),
  };
  await db.insert(skateProfile).values(row);
  return row;
}

/** A ticket with its pairs and first event, in the given state (numbers must be unique per rink). */
export async function createTicket(
  db: Executor,
  rinkId: string,
  input: { customerId: string; serviceId: string; createdBy: string; number: number; pairs?: number; state?: (typeof TICKET_STATES)[number]; stationId?: string | null; droppedAt?: Date },
) {
  const droppedAt = input.droppedAt ?? new Date();
  const id = randomUUID();
  await db.insert(ticket).values({
    id,
    tenantId: rinkId,
    number: input.number,
    customerId: input.customerId,
    state: input.state ?? 'waiting',
    stationId: input.stationId ?? null,
    payment: 'counter',
    droppedAt,
    promisedAt: new Date(droppedAt.getTime() + 30 * 60_000),
    createdBy: input.createdBy,
  });
  const pairs = Array.from({ length: input.pairs ?? 1 }, (_, i) => ({
    id: randomUUID(),
    tenantId: rinkId,
    ticketId: id,
    position: i + 1,
    label: `Pair ${i + 1}`,
    bladeWidthNm: 2_900_000,
    hollowNm: 12_700_000,
    serviceId: input.serviceId,
    priceMinor: 1200,
  }));
  await db.insert(ticketPair).values(pairs);
  await db.insert(ticketEvent).values({ id: randomUUID(), tenantId: rinkId, ticketId: id, toState: input.state ?? 'waiting', at: droppedAt, byUserId: input.createdBy });
  return { id, number: input.number, pairIds: pairs.map((p) => p.id) };
}

/** One logged pair with its first reading on each blade. */
export async function createSharpening(
  db: Executor,
  rinkId: string,
  input: { ticketId: string; pairId: string; stationId: string; technicianId: string; wheelId?: string | null; passes?: number; readingsNm?: [number, number]; doneAt?: Date },
) {
  const id = randomUUID();
  const doneAt = input.doneAt ?? new Date();
  await db.insert(sharpening).values({
    id,
    tenantId: rinkId,
    ticketId: input.ticketId,
    ticketPairId: input.pairId,
    stationId: input.stationId,
    wheelId: input.wheelId ?? null,
    technicianId: input.technicianId,
    hollowNm: 12_700_000,
    passes: input.passes ?? 4,
    bladeWidthNm: 2_900_000,
    doneAt,
    createdAt: doneAt,
  });
  const [left, right] = input.readingsNm ?? [5_080, -2_540];
  await db.insert(levelReading).values(
    (['left', 'right'] as const).map((blade, i) => ({
      id: randomUUID(),
      tenantId: rinkId,
      stationId: input.stationId,
      sharpeningId: id,
      kind: 'sharpening' as const,
      blade,
      attempt: 1,
      readingNm: i === 0 ? left : right,
      takenAt: doneAt,
      takenBy: input.technicianId,
    })),
  );
  return { id };
}
