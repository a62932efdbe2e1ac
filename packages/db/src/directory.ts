import { and, asc, eq, isNull, sql } from 'drizzle-orm';
import { currentDb, isDuplicateKey, type Database } from './client';
import { runPrepared } from './scope';
import { customer, invitation, jobRun, member, rink, rinkBilling, user } from './schema/index';

// The few reads that are not inside one rink by nature: they start from the signed-in user (which rinks am
// I in?) or from a rink slug (which tenant is this URL?). Each is keyed by the caller's own user id or by the
// slug the tenant middleware resolves, so none of them lets a caller name another rink's rows.

/**
 * The rink of a slug with its standing with the platform (its plan's state and grace, and whether the platform
 * suspended it) and, given a user, that user's membership there, in one read: every rink request needs all three.
 */
export async function findRinkBySlug(slug: string, userId?: string) {
  // Without a user, an id no member has: the membership join matches nothing and the statement stays the same.
  const rows = await runPrepared(rinkBySlugQuery(currentDb()), { slug, userId: userId ?? '' });
  const row = rows[0];
  return (
    row && {
      ...row.rink,
      standing: { planState: row.planState, graceUntil: row.graceUntil, suspendedAt: row.suspendedAt, suspendedReason: row.suspendedReason },
      membership: row.memberId && row.memberRole ? { id: row.memberId, role: row.memberRole } : null,
    }
  );
}

/**
 * Every rink request starts with this read, so its statement is built once per pool (Drizzle's prepared query,
 * with placeholders) instead of once per request, which cost about a quarter of a millisecond each time.
 */
const rinkBySlugQueries = new WeakMap<Database, ReturnType<typeof buildRinkBySlug>>();

function rinkBySlugQuery(db: Database) {
  let query = rinkBySlugQueries.get(db);
  if (!query) rinkBySlugQueries.set(db, (query = buildRinkBySlug(db)));
  return query;
}

function buildRinkBySlug(db: Database) {
  return db
    .select({
      rink,
      planState: rinkBilling.planState,
      graceUntil: rinkBilling.planGraceUntil,
      suspendedAt: rinkBilling.suspendedAt,
      suspendedReason: rinkBilling.suspendedReason,
      memberId: member.id,
      memberRole: member.role,
    })
    .from(rink)
    .leftJoin(rinkBilling, eq(rinkBilling.tenantId, rink.id))
    .leftJoin(member, and(eq(member.organizationId, rink.id), eq(member.userId, sql.placeholder('userId'))))
    .where(eq(rink.slug, sql.placeholder('slug')))
    .limit(1)
    .prepare();
}

export async function listMembershipsOfUser(userId: string) {
  return currentDb()
    .select({
      rinkId: rink.id,
      slug: rink.slug,
      name: rink.name,
      role: member.role,
      timeZone: rink.timeZone,
      currency: rink.currency,
      unitPreference: rink.unitPreference,
    })
    .from(member)
    .innerJoin(rink, eq(rink.id, member.organizationId))
    .where(eq(member.userId, userId))
    .orderBy(asc(rink.name));
}

export async function listCustomerLinksOfUser(userId: string) {
  return currentDb()
    .select({ customerId: customer.id, memberCode: customer.memberCode, rinkId: rink.id, slug: rink.slug, name: rink.name })
    .from(customer)
    .innerJoin(rink, eq(rink.id, customer.tenantId))
    .where(eq(customer.userId, userId))
    .orderBy(asc(rink.name));
}

/**
 * Links every unlinked customer record whose e-mail is this user's verified e-mail, at every rink.
 * Called when the e-mail becomes verified; one person can be a customer of several rinks.
 */
export async function linkCustomersByVerifiedEmail(userId: string): Promise<number> {
  const db = currentDb();
  const [person] = await db.select({ email: user.email, verified: user.emailVerified }).from(user).where(eq(user.id, userId));
  if (!person?.verified) return 0;
  const [result] = await db
    .update(customer)
    .set({ userId })
    .where(and(eq(customer.email, person.email.toLowerCase()), isNull(customer.userId)));
  return result.affectedRows;
}

export async function findUserByEmail(email: string) {
  const rows = await currentDb().select().from(user).where(eq(user.email, email.toLowerCase())).limit(1);
  return rows[0];
}

/** An invitation by its id, which only the invitation e-mail carries (a 122-bit random UUID). */
export async function findInvitationPreview(invitationId: string) {
  const rows = await currentDb()
    .select({
      id: invitation.id,
      email: invitation.email,
      role: invitation.role,
      status: invitation.status,
      expiresAt: invitation.expiresAt,
      rinkName: rink.name,
      rinkSlug: rink.slug,
    })
    .from(invitation)
    .innerJoin(rink, eq(rink.id, invitation.organizationId))
    .where(eq(invitation.id, invitationId))
    .limit(1);
  return rows[0];
}

/** Which rink a payment-service event of this connected account belongs to (the event names the account). */
export async function findRinkByConnectedAccount(accountId: string) {
  const rows = await currentDb()
    .select({ rinkId: rinkBilling.tenantId })
    .from(rinkBilling)
    .where(eq(rinkBilling.connectedAccountId, accountId))
    .limit(1);
  return rows[0]?.rinkId;
}

/** Every rink's id, for the worker's nightly sweep (each rink is then worked on through its own scope). */
export async function listRinkIds(): Promise<string[]> {
  return (await currentDb().select({ id: rink.id }).from(rink)).map((r) => r.id);
}

/** Claims a job's run for a period once across every API process; false when another already has it. */
export async function claimJobRun(job: string, period: string): Promise<boolean> {
  try {
    await currentDb().insert(jobRun).values({ job, period });
    return true;
  } catch (error) {
    if (isDuplicateKey(error)) return false;
    throw error;
  }
}

export async function finishJobRun(job: string, period: string): Promise<void> {
  await currentDb().update(jobRun).set({ finishedAt: new Date() }).where(and(eq(jobRun.job, job), eq(jobRun.period, period)));
}
