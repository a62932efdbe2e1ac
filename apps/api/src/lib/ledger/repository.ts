import { and, asc, desc, eq, gt, inArray, isNotNull, isNull, lte, or, sql } from 'drizzle-orm';
import { creditAccount, creditEntry, creditLot, isDuplicateKey, membership, preparedInsert, preparedJoined, preparedUpdate, product, qualified, step, user, type Scope, type Step } from '@rinkwright/db';
import { compareText } from '../sorted';

// The ledger's queries. Every function takes the caller's scope, usually a transaction's, so that a whole
// operation (lock, read lots, write entries, move `remaining`) commits or rolls back as one.

export type AccountRow = typeof creditAccount.$inferSelect;
export type LotRecord = typeof creditLot.$inferSelect;
export type EntryRecord = typeof creditEntry.$inferSelect;
export type NewLot = Omit<typeof creditLot.$inferInsert, 'tenantId'>;

export const findAccountOfCustomer = (s: Scope, customerId: string) => s.findOne(creditAccount, eq(creditAccount.customerId, customerId));
export const accountsOfCustomers = (s: Scope, customerIds: string[]) =>
  customerIds.length === 0
    ? Promise.resolve([])
    : s.findJoined(creditAccount, { fields: { id: creditAccount.id, customerId: creditAccount.customerId }, joins: [], where: inArray(creditAccount.customerId, customerIds) });

/**
 * Credits moved on the team accounts of the leagues, per account: allocated to the team (its transfers in), used
 * (redemptions, less the ones reversed) in all and within a range. An account with no entry has no row.
 */
export function teamMovements(s: Scope, leagueIds: string[], range?: { start: Date; end: Date }) {
  if (leagueIds.length === 0) return Promise.resolve([]);
  const used = sql`${creditEntry.kind} in ('redeem', 'reversal')`;
  const inRange = range ? sql`${creditEntry.createdAt} >= ${range.start} and ${creditEntry.createdAt} < ${range.end}` : sql`true`;
  return s.findJoined(creditAccount, {
    fields: {
      accountId: creditAccount.id,
      teamId: creditAccount.teamId,
      allocated: sql<number>`coalesce(sum(case when ${creditEntry.kind} = 'transfer' then ${creditEntry.credits} else 0 end), 0)`.mapWith(Number),
      used: sql<number>`coalesce(-sum(case when ${used} then ${creditEntry.credits} else 0 end), 0)`.mapWith(Number),
      usedInRange: sql<number>`coalesce(-sum(case when ${used} and ${inRange} then ${creditEntry.credits} else 0 end), 0)`.mapWith(Number),
    },
    joins: [{ table: creditEntry, on: eq(creditEntry.accountId, creditAccount.id) }],
    where: and(inArray(creditAccount.leagueId, leagueIds), eq(creditAccount.kind, 'team')),
    groupBy: [creditAccount.id, creditAccount.teamId],
  });
}
export const findAccountOfTeam = (s: Scope, teamId: string) => s.findOne(creditAccount, eq(creditAccount.teamId, teamId));
export const findPoolOfLeague = (s: Scope, leagueId: string) =>
  s.findOne(creditAccount, and(eq(creditAccount.leagueId, leagueId), eq(creditAccount.kind, 'league_pool'))!);

/** Inserts the account unless a concurrent request just did (the unique keys decide), then reads it. */
export async function ensureAccount(s: Scope, row: Omit<typeof creditAccount.$inferInsert, 'tenantId'>, find: () => Promise<AccountRow | undefined>): Promise<AccountRow> {
  const existing = await find();
  if (existing) return existing;
  try {
    await s.insert(creditAccount, row);
  } catch (error) {
    if (!isDuplicateKey(error)) throw error;
  }
  const made = await find();
  if (!made) throw new Error('credit account vanished after insert');
  return made;
}

/** SELECT … FOR UPDATE on the account row: every change to its lots waits here, one at a time. */
export async function lockAccount(s: Scope, accountId: string): Promise<AccountRow | undefined> {
  const [row] = await s.lock(creditAccount, eq(creditAccount.id, accountId));
  return row;
}

export interface LotWithContext extends LotRecord {
  productName: string | null;
  membershipState: (typeof membership.$inferSelect)['state'] | null;
  membershipGraceUntil: Date | null;
}

/** A lot's columns and its membership's standing (a lot of a blocked membership cannot redeem). */
function standingFields() {
  return {
    ...columnsOf(creditLot),
    membershipState: sql<LotWithContext['membershipState']>`(select ${membership.state} from ${membership} where ${membership.tenantId} = ${qualified(creditLot, creditLot.tenantId)} and ${membership.id} = ${qualified(creditLot, creditLot.membershipId)})`,
    membershipGraceUntil: sql<Date | null>`(select ${membership.graceUntil} from ${membership} where ${membership.tenantId} = ${qualified(creditLot, creditLot.tenantId)} and ${membership.id} = ${qualified(creditLot, creditLot.membershipId)})`.mapWith(
      (v: string | Date | null) => (v === null ? null : v instanceof Date ? v : new Date(`${v.replace(' ', 'T')}Z`)),
    ),
  };
}

/** With the lot's product's name, which the balance shows. */
function lotFields() {
  return {
    ...standingFields(),
    productName: sql<string | null>`(select ${product.name} from ${product} where ${product.tenantId} = ${qualified(creditLot, creditLot.tenantId)} and ${product.id} = ${qualified(creditLot, creditLot.productId)})`,
  };
}

const LOT_ORDER = [asc(creditLot.createdAt), asc(creditLot.id)];

export function lotsOf(s: Scope, accountIds: string[], options: { liveOnly?: boolean } = {}): Promise<LotWithContext[]> {
  if (accountIds.length === 0) return Promise.resolve([]);
  const where = and(inArray(creditLot.accountId, accountIds), options.liveOnly ? gt(creditLot.remaining, 0) : undefined);
  return s.findJoined(creditLot, { fields: lotFields(), joins: [], where, orderBy: LOT_ORDER }) as Promise<LotWithContext[]>;
}

// Every redemption starts with this read, so it is built once (preparedJoined). A redemption answers with the
// balance's count only, so the lots' product names are not read.
const accountWithLots = preparedJoined(creditAccount, ['customerId'], (value) => ({
  fields: { ...standingFields(), lockedAccountId: creditAccount.id },
  joins: [{ table: creditLot, on: eq(creditLot.accountId, creditAccount.id), left: true, index: 'credit_lot_tenant_account_idx' }],
  where: eq(creditAccount.customerId, value('customerId')),
  index: 'credit_account_tenant_customer_unique',
  // Ordered here, not in SQL: ordering by the joined table would cost a temporary table on every redemption.
  lock: true,
}));

/**
 * The customer's account and all its lots in one locking read: the account row is locked (every change to its lots
 * waits on it), and so are the lots (their product names left out: null). Undefined when the customer has no account yet.
 */
export async function lockAccountOfCustomerWithLots(s: Scope, customerId: string): Promise<{ account: { id: string }; lots: LotWithContext[] } | undefined> {
  const rows = await s.run(accountWithLots, { customerId });
  const [first] = rows;
  if (!first) return undefined;
  // A left join gives an account without lots one row whose lot columns are all null.
  const lots = rows
    .filter((r) => r.id !== null)
    .map(({ lockedAccountId: _account, ...lot }) => ({ ...lot, productName: null }) as LotWithContext)
    .sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime() || compareText(a.id, b.id));
  return { account: { id: first.lockedAccountId }, lots };
}

function columnsOf(table: typeof creditLot) {
  const { id, tenantId, accountId, origin, credits, remaining, priceMinor, expiresAt, productId, paymentId, membershipId, fromLotId, createdAt } = table;
  return { id, tenantId, accountId, origin, credits, remaining, priceMinor, expiresAt, productId, paymentId, membershipId, fromLotId, createdAt };
}

export const insertLot = (s: Scope, row: NewLot) => s.insert(creditLot, row);
// A redemption writes one entry and moves one lot; both statements are built once.
const entryInsert = preparedInsert(creditEntry, [
  'id',
  'accountId',
  'lotId',
  'kind',
  'credits',
  'valueMinor',
  'source',
  'sourceId',
  'reason',
  'reversesId',
  'operationId',
  'idemKey',
  'actorUserId',
  'createdAt',
]);
const remainingMove = preparedUpdate(creditLot, ['lotId', 'delta'], (value) => ({
  set: { remaining: sql`${creditLot.remaining} + ${value('delta')}` },
  where: and(eq(creditLot.id, value('lotId')), sql`${creditLot.remaining} + ${value('delta')} >= 0`)!,
  index: 'PRIMARY',
}));

/** Entries in prepared multi-row inserts of up to ENTRIES_PER_INSERT rows (one statement is kept for each count). */
const ENTRIES_PER_INSERT = 8;
export function insertEntries(rows: EntryRecord[]): Step<number>[] {
  const inserts: Step<number>[] = [];
  for (let i = 0; i < rows.length; i += ENTRIES_PER_INSERT) inserts.push(step.insertRows(entryInsert, rows.slice(i, i + ENTRIES_PER_INSERT)));
  return inserts;
}

/** Moves a lot's running total by delta; refuses (changes no row, its result 0) to take it below zero. */
export const moveRemaining = (lotId: string, delta: number): Step<number> => step.update(remainingMove, { lotId, delta });

export const findEntryByKey = (s: Scope, key: string) => s.findOne(creditEntry, eq(creditEntry.idemKey, key));
export const entriesOfOperation = (s: Scope, operationId: string) => s.find(creditEntry, { where: eq(creditEntry.operationId, operationId), orderBy: asc(creditEntry.createdAt) });
export const entriesReversing = (s: Scope, entryIds: string[]) =>
  entryIds.length ? s.find(creditEntry, { where: inArray(creditEntry.reversesId, entryIds) }) : Promise.resolve([]);
export const entriesOfSource = (s: Scope, source: EntryRecord['source'], sourceIds: string[]) =>
  sourceIds.length ? s.find(creditEntry, { where: and(eq(creditEntry.source, source), inArray(creditEntry.sourceId, sourceIds)) }) : Promise.resolve([]);

export function entriesOf(s: Scope, accountIds: string[], limit = 200) {
  if (accountIds.length === 0) return Promise.resolve([]);
  return s.findJoined(creditEntry, {
    fields: {
      id: creditEntry.id,
      accountId: creditEntry.accountId,
      kind: creditEntry.kind,
      credits: creditEntry.credits,
      valueMinor: creditEntry.valueMinor,
      source: creditEntry.source,
      sourceId: creditEntry.sourceId,
      reason: creditEntry.reason,
      reversesId: creditEntry.reversesId,
      lotId: creditEntry.lotId,
      operationId: creditEntry.operationId,
      actor: sql<string | null>`(select ${user.name} from ${user} where ${user.id} = ${creditEntry.actorUserId})`,
      createdAt: creditEntry.createdAt,
    },
    joins: [],
    where: inArray(creditEntry.accountId, accountIds),
    orderBy: [desc(creditEntry.createdAt), desc(creditEntry.id)],
    limit,
  });
}

export const lotById = (s: Scope, lotId: string) => s.findOne(creditLot, eq(creditLot.id, lotId));
export const lotsOfPayment = (s: Scope, paymentId: string) => s.find(creditLot, { where: eq(creditLot.paymentId, paymentId) });
export const lotsOfMembership = (s: Scope, membershipId: string) => s.find(creditLot, { where: and(eq(creditLot.membershipId, membershipId), gt(creditLot.remaining, 0)) });

/** Lots past their expiry with credits left, except those of a running membership (its renewal rolls them over). */
export function expiredLotsDue(s: Scope, now: Date, limit = 500) {
  return s.findJoined(creditLot, {
    fields: columnsOf(creditLot),
    joins: [],
    where: and(
      gt(creditLot.remaining, 0),
      isNotNull(creditLot.expiresAt),
      lte(creditLot.expiresAt, now),
      or(
        isNull(creditLot.membershipId),
        sql`(select ${membership.state} from ${membership} where ${membership.tenantId} = ${creditLot.tenantId} and ${membership.id} = ${creditLot.membershipId}) = 'canceled'`,
      ),
    ),
    limit,
  });
}
