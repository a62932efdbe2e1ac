import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { and, asc, eq, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import mysql from 'mysql2/promise';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connectDb, currentDb, disconnectDb, transaction, type Database } from './client';
import { dbEnv } from './env';
import { addMember, createCustomer, createRink, createUser } from './factories';
import { customer, member, rink, user } from './schema/index';
import { preparedInsert, preparedJoined, preparedUpdate, qualified, runPrepared, scoped, step } from './scope';

// Two rinks that share one person (staff at both), each with customers: every scope operation of rink A
// must act on A's rows alone, even when its condition names B's rows.

beforeAll(() => {
  connectDb(dbEnv.DATABASE_URL, { connectionLimit: 4 });
});
afterAll(() => disconnectDb());

async function twoRinks() {
  const db = currentDb();
  const a = await createRink(db, { name: 'Ice Harbor' });
  const b = await createRink(db, { name: 'North Pond Arena' });
  const shared = await createUser(db, { name: 'Shared Sharpener' });
  const memberA = await addMember(db, a.id, shared.id, 'technician');
  const memberB = await addMember(db, b.id, shared.id, 'manager');
  const customerA = await createCustomer(db, a.id, { name: 'Skater at A', userId: shared.id });
  const customerB = await createCustomer(db, b.id, { name: 'Skater at B', userId: shared.id });
  const secondB = await createCustomer(db, b.id, { name: 'Another at B' });
  return { a, b, shared, memberA, memberB, customerA, customerB, secondB };
}

/** How many PREPAREs and EXECUTEs the transaction's connection has run. */
async function sqlCounters(tx: Database) {
  const [rows] = (await tx.execute(sql`show session status where variable_name in ('Com_prepare_sql', 'Com_execute_sql')`)) as unknown as [{ Variable_name: string; Value: string }[]];
  return Object.fromEntries(rows.map((r) => [r.Variable_name, Number(r.Value)]));
}

const customersOf = (tenantId: string) =>
  currentDb().select().from(customer).where(eq(customer.tenantId, tenantId)).orderBy(asc(customer.id));

describe('scoped(tenantId)', () => {
  it('find returns only the tenant rows, whatever the condition', async () => {
    const w = await twoRinks();
    const scope = scoped(w.a.id);

    expect((await scope.find(customer)).map((c) => c.id)).toEqual([w.customerA.id]);
    expect(await scope.find(customer, { where: eq(customer.id, w.customerB.id) })).toEqual([]);
    expect((await scoped(w.b.id).find(customer, { orderBy: asc(customer.name) })).map((c) => c.name)).toEqual(['Another at B', 'Skater at B']);
  });

  it('findOne does not find another tenant row by its id', async () => {
    const w = await twoRinks();

    expect(await scoped(w.a.id).findOne(customer, eq(customer.id, w.customerB.id))).toBeUndefined();
    expect((await scoped(w.b.id).findOne(customer, eq(customer.id, w.customerB.id)))?.name).toBe('Skater at B');
  });

  it('count counts the tenant rows only', async () => {
    const w = await twoRinks();

    expect(await scoped(w.a.id).count(customer)).toBe(1);
    expect(await scoped(w.b.id).count(customer)).toBe(2);
    expect(await scoped(w.a.id).count(member, eq(member.userId, w.shared.id))).toBe(1);
  });

  it('update leaves another tenant row alone', async () => {
    const w = await twoRinks();
    const before = await customersOf(w.b.id);

    const changed = await scoped(w.a.id).update(customer, { name: 'Renamed' }, eq(customer.id, w.customerB.id));

    expect(changed).toBe(0);
    expect(await customersOf(w.b.id)).toEqual(before);
    expect(await scoped(w.a.id).update(customer, { name: 'Renamed' }, eq(customer.id, w.customerA.id))).toBe(1);
  });

  it('remove does not delete another tenant row', async () => {
    const w = await twoRinks();

    expect(await scoped(w.a.id).remove(customer, eq(customer.userId, w.shared.id))).toBe(1);

    expect((await customersOf(w.b.id)).map((c) => c.id).sort()).toEqual([w.customerB.id, w.secondB.id].sort());
    expect(await customersOf(w.a.id)).toEqual([]);
  });

  it('findJoined filters the main table and every joined tenant table', async () => {
    const w = await twoRinks();

    // The shared person is a member of both rinks: joining customer to member on user id alone would pair
    // A's customer with B's membership too.
    const rows = await scoped(w.a.id).findJoined(customer, {
      fields: { customerId: customer.id, memberId: member.id, role: member.role, email: user.email },
      joins: [
        { table: member, on: eq(member.userId, customer.userId) },
        { table: user, on: eq(user.id, customer.userId) },
      ],
    });

    expect(rows).toEqual([{ customerId: w.customerA.id, memberId: w.memberA.id, role: 'technician', email: w.shared.email }]);
  });

  it('a join by alias is filtered by the table behind it, not by the name it is given', async () => {
    const w = await twoRinks();
    // A global table a second time (as the ticket's readings join the user who took each): no tenant condition.
    const person = alias(user, 'person');
    const named = await scoped(w.a.id).findJoined(customer, {
      fields: { customerId: customer.id, person: person.name },
      joins: [{ table: person, on: eq(person.id, customer.userId) }],
    });
    expect(named).toEqual([{ customerId: w.customerA.id, person: 'Shared Sharpener' }]);

    // A tenant table under a global table's name keeps its tenant condition: B's customer of the same person stays out.
    const sameSkater = alias(customer, 'user');
    const rows = await scoped(w.a.id).findJoined(customer, {
      fields: { customerId: customer.id, otherId: sameSkater.id },
      joins: [{ table: sameSkater, on: eq(sameSkater.userId, customer.userId) }],
    });
    expect(rows).toEqual([{ customerId: w.customerA.id, otherId: w.customerA.id }]);
  });

  it('qualified names the outer row in a subquery of a one-table select, where a bare column is the inner one', async () => {
    const w = await twoRinks();
    const scope = scoped(w.b.id);
    const [row] = await scope.findJoined(customer, {
      fields: {
        // Rink B has two customers; every rink of the test database together has more.
        ownRink: sql<number>`(select count(*) from ${customer} as c2 where c2.tenant_id = ${qualified(customer, customer.tenantId)})`.mapWith(Number),
        bare: sql<number>`(select count(*) from ${customer} as c2 where c2.tenant_id = ${customer.tenantId})`.mapWith(Number),
      },
      joins: [],
      where: eq(customer.id, w.customerB.id),
    });
    expect(row?.ownRink).toBe(2);
    expect(row?.bare).toBeGreaterThan(2);
  });

  it('insert sets the tenant even when the values name another one', async () => {
    const w = await twoRinks();
    const id = randomUUID();
    const bulk = [randomUUID(), randomUUID()];

    // @ts-expect-error the type already refuses a tenant in the values; the scope must refuse it at run time too
    await scoped(w.a.id).insert(customer, { id, tenantId: w.b.id, name: 'Smuggled', memberCode: 'SMUG01' });
    await scoped(w.a.id).insert(
      customer,
      bulk.map((bulkId, i) => ({ id: bulkId, tenantId: w.b.id, name: `Bulk ${i}`, memberCode: `BULK0${i}` })),
    );
    const newcomer = await createUser(currentDb(), {});
    // @ts-expect-error as above, for a table whose tenant property is organizationId
    await scoped(w.a.id).insert(member, { id: randomUUID(), organizationId: w.b.id, userId: newcomer.id, role: 'technician', createdAt: new Date() });

    const landed = await currentDb().select({ tenantId: customer.tenantId }).from(customer).where(eq(customer.id, id));
    expect(landed).toEqual([{ tenantId: w.a.id }]);
    expect((await customersOf(w.a.id)).map((c) => c.id).sort()).toEqual([w.customerA.id, id, ...bulk].sort());
    expect(await customersOf(w.b.id)).toHaveLength(2);
    expect(await scoped(w.b.id).count(member)).toBe(1);
    expect(await scoped(w.a.id).count(member)).toBe(2);
  });

  it('update refuses to change tenant_id, whatever the column property is called', async () => {
    const w = await twoRinks();

    await expect(scoped(w.a.id).update(customer, { tenantId: w.b.id }, eq(customer.id, w.customerA.id))).rejects.toThrow(
      'tenant_id cannot be changed',
    );
    await expect(scoped(w.a.id).update(member, { organizationId: w.b.id }, eq(member.id, w.memberA.id))).rejects.toThrow(
      'tenant_id cannot be changed',
    );

    expect((await customersOf(w.a.id)).map((c) => c.id)).toEqual([w.customerA.id]);
    expect(await scoped(w.a.id).count(member)).toBe(1);
  });

  it('refuses a global table, so no read can drop the tenant filter by accident', async () => {
    const w = await twoRinks();

    await expect(scoped(w.a.id).find(user)).rejects.toThrow('user is not a tenant table');
  });

  it('rink() and updateRink() touch only the rink of the scope', async () => {
    const w = await twoRinks();

    await scoped(w.a.id).updateRink({ name: 'Ice Harbor Renamed' });

    expect((await scoped(w.a.id).rink())?.name).toBe('Ice Harbor Renamed');
    const [rinkB] = await currentDb().select().from(rink).where(eq(rink.id, w.b.id));
    expect(rinkB?.name).toBe('North Pond Arena');
  });

  it('left joins keep the row with null fields, and a lock reads inside the transaction', async () => {
    const w = await twoRinks();
    const unlinked = await createCustomer(currentDb(), w.a.id, { name: 'Walk-up at A' });
    const rows = await scoped(w.a.id).transaction((tx) =>
      tx.findJoined(customer, {
        fields: { id: customer.id, email: user.email },
        joins: [{ table: user, on: eq(user.id, customer.userId), left: true }],
        orderBy: asc(customer.name),
        lock: true,
      }),
    );
    expect(rows).toEqual([
      { id: w.customerA.id, email: w.shared.email },
      { id: unlinked.id, email: null },
    ]);
  });

  it('an index hint reads the table and a joined one by the named index, still in the scope’s rink; an unknown name is refused', async () => {
    const w = await twoRinks();
    const byName = (index: string) =>
      preparedJoined(customer, ['name'], (value) => ({
        fields: { customerId: customer.id, role: member.role },
        joins: [{ table: member, on: eq(member.userId, customer.userId), index: 'member_tenant_user_unique' }],
        where: eq(customer.name, value('name')),
        index,
      }));
    const hinted = byName('customer_tenant_name_idx');

    expect(await scoped(w.a.id).run(hinted, { name: 'Skater at A' })).toEqual([{ customerId: w.customerA.id, role: 'technician' }]);
    expect(await scoped(w.b.id).run(hinted, { name: 'Skater at A' })).toEqual([]);
    // MariaDB refuses a hint naming an index the table does not have (error 1176), so a renamed index fails loudly.
    await expect(scoped(w.a.id).run(byName('customer_no_such_idx'), { name: 'Skater at A' })).rejects.toThrow(/customer_no_such_idx/);
  });

  it('a prepared select runs with each scope’s tenant, and inside a transaction on its connection', async () => {
    const w = await twoRinks();
    // One statement for every rink: the tenant is a placeholder the scope fills, in the main table and the joined one.
    const membersNamed = preparedJoined(customer, ['name'], (value) => ({
      fields: { customerId: customer.id, role: member.role },
      joins: [{ table: member, on: eq(member.userId, customer.userId) }],
      where: eq(customer.name, value('name')),
    }));

    expect(await scoped(w.a.id).run(membersNamed, { name: 'Skater at A' })).toEqual([{ customerId: w.customerA.id, role: 'technician' }]);
    expect(await scoped(w.b.id).run(membersNamed, { name: 'Skater at A' })).toEqual([]);
    expect(await scoped(w.b.id).run(membersNamed, { name: 'Skater at B' })).toEqual([{ customerId: w.customerB.id, role: 'manager' }]);

    // Inside a transaction it sees the transaction's own write, which nobody outside sees until the commit.
    const renamed = await scoped(w.b.id).transaction(async (tx) => {
      await tx.update(customer, { name: 'Renamed at B' }, eq(customer.id, w.customerB.id));
      const inside = await tx.run(membersNamed, { name: 'Renamed at B' });
      const outside = await scoped(w.b.id).run(membersNamed, { name: 'Renamed at B' });
      return { inside, outside };
    });
    expect(renamed.inside).toEqual([{ customerId: w.customerB.id, role: 'manager' }]);
    expect(renamed.outside).toEqual([]);
  });

  it('MariaDB parses a statement once per connection: the first run prepares it, later runs execute it with their values', async () => {
    const w = await twoRinks();
    const named = preparedJoined(customer, ['name'], (value) => ({ fields: { id: customer.id, name: customer.name }, joins: [], where: eq(customer.name, value('name')) }));
    const insertNamed = preparedInsert(customer, ['id', 'name', 'memberCode']);
    // Quotes, a backslash and a question mark: values go as literals after EXECUTE … USING, never into the text.
    const odd = `O'Neil \\ "Sharp" ? ${randomUUID().slice(0, 8)}`;
    const id = randomUUID();
    const seen = await transaction(async (tx) => {
      const s = scoped(w.a.id, tx);
      const before = await sqlCounters(tx);
      await s.insertOne(insertNamed, { id, name: odd, memberCode: `Q${id.slice(0, 8)}` });
      const found = await s.run(named, { name: odd });
      const again = await s.run(named, { name: 'Skater at A' });
      const none = await s.run(named, { name: 'Skater at B' });
      return { before, after: await sqlCounters(tx), found, again, none };
    });
    expect(seen.found).toEqual([{ id, name: odd }]);
    expect(seen.again).toEqual([{ id: w.customerA.id, name: 'Skater at A' }]);
    expect(seen.none).toEqual([]);
    // Two statements new to this connection, prepared once each; four runs.
    expect(seen.after.Com_prepare_sql! - seen.before.Com_prepare_sql!).toBe(2);
    expect(seen.after.Com_execute_sql! - seen.before.Com_execute_sql!).toBe(4);
  });

  // The limit is the server's, so this needs root: over the checkout's own socket (scripts/lib/data.mjs), as in CI.
  const rootSocket = fileURLToPath(new URL('../../../.data/mariadb.sock', import.meta.url));
  it.skipIf(!existsSync(rootSocket))('when MariaDB refuses to prepare one more statement, the round trip goes as text and that connection prepares no more', async () => {
    const w = await twoRinks();
    const byName = (label: string) => preparedJoined(customer, ['name'], (value) => ({ fields: { id: customer.id, label: sql<string>`${label}` }, joins: [], where: eq(customer.name, value('name')) }));
    const refused = byName('refused');
    const later = byName('later');
    const root = await mysql.createConnection({ socketPath: rootSocket, user: 'root' });
    const [[{ limit }]] = (await root.query('SELECT @@global.max_prepared_stmt_count AS `limit`')) as unknown as [[{ limit: number }]];
    try {
      const seen = await transaction(async (tx) => {
        const s = scoped(w.a.id, tx);
        // None allowed: the server answers a PREPARE as it does when it holds as many as it allows.
        await root.query('SET GLOBAL max_prepared_stmt_count = 0');
        const first = await s.run(refused, { name: 'Skater at A' });
        await root.query('SET GLOBAL max_prepared_stmt_count = ?', [limit]);
        const before = await sqlCounters(tx);
        const second = await s.run(later, { name: 'Skater at A' });
        return { first, second, before, after: await sqlCounters(tx) };
      });
      expect(seen.first).toEqual([{ id: w.customerA.id, label: 'refused' }]);
      expect(seen.second).toEqual([{ id: w.customerA.id, label: 'later' }]);
      expect(seen.after).toEqual(seen.before);
    } finally {
      await root.query('SET GLOBAL max_prepared_stmt_count = ?', [limit]);
      await root.end();
    }
  });

  it('a prepared insert sets the scope’s tenant and makes a JS default at each insert', async () => {
    const w = await twoRinks();
    const insertNamed = preparedInsert(customer, ['id', 'name', 'memberCode']);
    const [first, second] = [randomUUID(), randomUUID()];

    await scoped(w.a.id).insertOne(insertNamed, { id: first, name: 'Prepared one', memberCode: `P1${first.slice(0, 6)}`, tenantId: w.b.id } as { id: string; name: string; memberCode: string });
    await new Promise((resolve) => setTimeout(resolve, 5));
    await scoped(w.a.id).transaction((tx) => tx.insertOne(insertNamed, { id: second, name: 'Prepared two', memberCode: `P2${second.slice(0, 6)}` }));

    const made = (await customersOf(w.a.id)).filter((c) => c.id === first || c.id === second);
    expect(made.map((c) => c.name).sort()).toEqual(['Prepared one', 'Prepared two']);
    // created_at comes from the column's $defaultFn, made at each insert rather than once when the statement was built.
    expect(new Set(made.map((c) => c.createdAt.getTime())).size).toBe(2);
    expect((await customersOf(w.b.id)).some((c) => c.id === first)).toBe(false);
  });

  it('a prepared update changes the scope’s rows only', async () => {
    const w = await twoRinks();
    const rename = preparedUpdate(customer, ['id', 'name'], (value) => ({ set: { name: sql`${value('name')}` }, where: eq(customer.id, value('id')) }));

    expect(await scoped(w.a.id).runUpdate(rename, { id: w.customerB.id, name: 'Renamed from A' })).toBe(0);
    expect(await scoped(w.b.id).runUpdate(rename, { id: w.customerB.id, name: 'Renamed at B' })).toBe(1);
    expect((await customersOf(w.b.id)).map((c) => c.name).sort()).toEqual(['Another at B', 'Renamed at B']);
    expect(() => preparedUpdate(user, [], () => ({ set: { name: 'x' }, where: sql`true` })).query()).toThrow(/updated in JS/);
  });

  it('a prepared update names its index to MariaDB', async () => {
    const w = await twoRinks();
    const rename = (index: string) =>
      preparedUpdate(customer, ['id', 'name'], (value) => ({ set: { name: sql`${value('name')}` }, where: eq(customer.id, value('id')), index }));

    expect(await scoped(w.b.id).runUpdate(rename('PRIMARY'), { id: w.customerB.id, name: 'By its key' })).toBe(1);
    expect(await scoped(w.a.id).runUpdate(rename('PRIMARY'), { id: w.customerB.id, name: 'Not from A' })).toBe(0);
    expect((await customersOf(w.b.id)).map((c) => c.name).sort()).toEqual(['Another at B', 'By its key']);
    // MariaDB refuses an index the table does not have (error 1176): the name reached it.
    await expect(scoped(w.b.id).runUpdate(rename('customer_no_such_idx'), { id: w.customerB.id, name: 'x' })).rejects.toThrow(/customer_no_such_idx/);
  });

  it('together sends its steps in one query, in order, the first ones ahead, each in its tenant', async () => {
    const w = await twoRinks();
    const insertNamed = preparedInsert(customer, ['id', 'name', 'memberCode']);
    const named = preparedJoined(customer, ['name'], (value) => ({ fields: { id: customer.id, createdAt: customer.createdAt }, joins: [], where: eq(customer.name, value('name')) }));
    const rename = preparedUpdate(customer, ['id', 'name'], (value) => ({ set: { name: sql`${value('name')}` }, where: eq(customer.id, value('id')) }));
    const id = randomUUID();

    const [before, renamedB, after] = await scoped(w.a.id).together(
      [step.select(named, { name: 'Together' }), step.update(rename, { id: w.customerB.id, name: 'Together' }), step.update(rename, { id, name: 'Together again' })],
      { first: [step.insert(insertNamed, { id, name: 'Together', memberCode: `T${id.slice(0, 8)}` })] },
    );
    // The select ran after the first step's insert; the rename of B's row found none of A's rows.
    expect(before.map((r) => r.id)).toEqual([id]);
    expect(before[0]?.createdAt).toBeInstanceOf(Date);
    expect(renamedB).toBe(0);
    expect(after).toBe(1);
    expect((await customersOf(w.b.id)).map((c) => c.name).sort()).toEqual(['Another at B', 'Skater at B']);
    expect((await customersOf(w.a.id)).find((c) => c.id === id)?.name).toBe('Together again');
  });

  it('together stops at a failing step, and in a transaction nothing of it commits', async () => {
    const w = await twoRinks();
    const insertNamed = preparedInsert(customer, ['id', 'name', 'memberCode']);
    const [id, later] = [randomUUID(), randomUUID()];
    const row = (key: string, name: string) => step.insert(insertNamed, { id: key, name, memberCode: `F${key.slice(0, 8)}` });

    await expect(
      scoped(w.a.id).transaction((tx) => tx.together([row(id, 'Written first'), row(id, 'Same key again'), row(later, 'Never reached')])),
    ).rejects.toMatchObject({ code: 'ER_DUP_ENTRY' });
    expect((await customersOf(w.a.id)).filter((c) => c.id === id || c.id === later)).toEqual([]);

    // Outside a transaction each statement commits on its own: the first stays, and none after the failure ran.
    await expect(scoped(w.a.id).together([row(id, 'Written first'), row(id, 'Same key again'), row(later, 'Never reached')])).rejects.toMatchObject({ code: 'ER_DUP_ENTRY' });
    expect((await customersOf(w.a.id)).filter((c) => c.id === id || c.id === later).map((c) => c.name)).toEqual(['Written first']);
  });

  it('a step sent at commit commits with the transaction, and its failure commits nothing', async () => {
    const w = await twoRinks();
    const insertNamed = preparedInsert(customer, ['id', 'name', 'memberCode']);
    const rename = preparedUpdate(customer, ['id', 'name'], (value) => ({ set: { name: sql`${value('name')}` }, where: eq(customer.id, value('id')) }));
    const [id, taken] = [randomUUID(), w.customerA.id];

    await scoped(w.a.id).transaction(async (tx) => {
      await tx.runUpdate(rename, { id: w.customerA.id, name: 'Renamed in the transaction' });
      tx.atCommit(step.insert(insertNamed, { id, name: 'Sent at commit', memberCode: `C${id.slice(0, 8)}` }));
    });
    const names = (await customersOf(w.a.id)).map((c) => c.name);
    expect(names).toContain('Sent at commit');
    expect(names).toContain('Renamed in the transaction');

    await expect(
      scoped(w.a.id).transaction(async (tx) => {
        await tx.runUpdate(rename, { id: w.customerA.id, name: 'Never committed' });
        tx.atCommit(step.insert(insertNamed, { id: taken, name: 'Taken key', memberCode: 'TAKEN' }));
      }),
    ).rejects.toMatchObject({ code: 'ER_DUP_ENTRY' });
    expect((await customersOf(w.a.id)).map((c) => c.name)).not.toContain('Never committed');
    expect(() => scoped(w.a.id).atCommit(step.insert(insertNamed, { id, name: 'x', memberCode: 'x' }))).toThrow(/inside a transaction/);
  });

  it('a prepared insert writes several rows in one statement, each given its JS default, in the scope’s tenant', async () => {
    const w = await twoRinks();
    const insertNamed = preparedInsert(customer, ['id', 'name', 'memberCode']);
    const ids: string[] = [randomUUID(), randomUUID(), randomUUID()];
    const rows = ids.map((id, i) => ({ id, name: `Row ${i + 1}`, memberCode: `R${i}${id.slice(0, 6)}`, tenantId: w.b.id }) as { id: string; name: string; memberCode: string });

    const [written] = await scoped(w.a.id).together([step.insertRows(insertNamed, rows)]);
    expect(written).toBe(3);
    const made = (await customersOf(w.a.id)).filter((c) => ids.includes(c.id));
    expect(made.map((c) => c.name).sort()).toEqual(['Row 1', 'Row 2', 'Row 3']);
    expect(made.every((c) => c.createdAt instanceof Date)).toBe(true);
    expect((await customersOf(w.b.id)).some((c) => ids.includes(c.id))).toBe(false);
    expect(() => step.insertRows(insertNamed, [])).toThrow(/needs a row/);
  });

  it('runPrepared reads a select Drizzle prepared as Drizzle would: nested fields, dates, a left join with no match', async () => {
    const w = await twoRinks();
    const bySlug = currentDb()
      .select({ rink, memberId: member.id })
      .from(rink)
      .leftJoin(member, and(eq(member.organizationId, rink.id), eq(member.userId, sql.placeholder('userId'))))
      .where(eq(rink.slug, sql.placeholder('slug')))
      .prepare();

    const [found] = await runPrepared(bySlug, { slug: w.a.slug, userId: w.shared.id });
    expect(found).toEqual(await bySlug.execute({ slug: w.a.slug, userId: w.shared.id }).then((rows) => rows[0]));
    expect(found?.rink.id).toBe(w.a.id);
    expect(found?.rink.createdAt).toBeInstanceOf(Date);
    expect(found?.memberId).toBe(w.memberA.id);
    expect((await runPrepared(bySlug, { slug: w.a.slug, userId: 'nobody' }))[0]?.memberId).toBeNull();
  });

  it('a scope bound to a transaction keeps its filter', async () => {
    const w = await twoRinks();

    const seen = await scoped(w.a.id).transaction(async (tx) => {
      await tx.update(customer, { name: 'In transaction' }, eq(customer.id, w.customerB.id));
      return tx.find(customer);
    });

    expect(seen.map((c) => c.id)).toEqual([w.customerA.id]);
    expect((await customersOf(w.b.id)).map((c) => c.name).sort()).toEqual(['Another at B', 'Skater at B']);
  });
});
