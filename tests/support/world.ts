import { addMember, createCustomer, createInvitation, createRink, createUser, uniqueSuffix, type StaffRole } from '@rinkwright/db/testing';
import { currentDb } from '@rinkwright/db/unscoped';

// Test data written straight to the database with the shared factories. Every slug and e-mail carries a
// random suffix, so test files can run in parallel on one database without seeing each other's rows.
// These need the app's pool: call them after buildTestApp().

export const PASSWORD = 'harbor-ice-test-1';

export const uniqueEmail = (label: string) => `${label}-${uniqueSuffix()}@example.test`;
export const uniqueSlug = (label: string) => `${label}-${uniqueSuffix()}`;

export interface Person {
  id: string;
  email: string;
  name: string;
  password: string;
}

/** A verified account that can sign in with PASSWORD. */
export async function createPerson(label: string, options: { email?: string } = {}): Promise<Person> {
  const email = options.email ?? uniqueEmail(label);
  const made = await createUser(currentDb(), { email, name: `Test ${label}`, password: PASSWORD, verified: true });
  return { ...made, password: PASSWORD };
}

export interface Staffer extends Person {
  memberId: string;
  role: StaffRole;
}

export interface RinkWorld {
  id: string;
  slug: string;
  name: string;
  staff: Record<StaffRole, Staffer>;
}

/** A new verified person who is a member of the rink with this role. */
export async function addStaffer(rink: { id: string; slug: string }, role: StaffRole, label: string = role): Promise<Staffer> {
  const person = await createPerson(`${rink.slug}-${label}`);
  const membership = await addMember(currentDb(), rink.id, person.id, role);
  return { ...person, memberId: membership.id, role };
}

/** A rink with exactly one member of each role, so the rink has a single owner. */
export async function createRinkWithStaff(name: string): Promise<RinkWorld> {
  const made = await createRink(currentDb(), { name, slug: uniqueSlug(name.toLowerCase().replace(/\W+/g, '-')) });
  const staff = {
    owner: await addStaffer(made, 'owner'),
    manager: await addStaffer(made, 'manager'),
    technician: await addStaffer(made, 'technician'),
    league_manager: await addStaffer(made, 'league_manager'),
  };
  return { id: made.id, slug: made.slug, name: made.name, staff };
}

export function createCustomerAt(rinkId: string, input: { name?: string; email?: string | null } = {}) {
  return createCustomer(currentDb(), rinkId, input);
}

export function createPendingInvitation(rink: RinkWorld, role: StaffRole = 'technician') {
  return createInvitation(currentDb(), { rinkId: rink.id, inviterId: rink.staff.owner.id, role, email: uniqueEmail('invitee') });
}
