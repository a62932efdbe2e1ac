import { randomUUID } from 'node:crypto';
import { Faker, en } from '@faker-js/faker';
import { hashPassword } from 'better-auth/crypto';
import type { Executor } from './client';
import { account, customer, invitation, member, rink, user } from './schema/index';

// Fake-data factories shared by the tests and the demo seed. Each writes real rows through Drizzle;
// a seeded Faker makes the demo the same on every machine.

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

const CODE_ALPHABET = '23456789ABCDEFGHJKMNPQRSTUVWXYZ';
/** A short code a skater can read out at the counter: no 0/O or 1/I/L to confuse. */
export function memberCode(random: () => number = Math.random): string {
  let code = '';
  for (let i = 0; i < 6; i++) code += CODE_ALPHABET[Math.floor(random() * CODE_ALPHABET.length)];
  return code;
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
  return row;
}
