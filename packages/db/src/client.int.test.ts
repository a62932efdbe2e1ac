import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connectDb, currentDb, disconnectDb, transaction, type Database } from './client';
import { dbEnv } from './env';
import { createRink } from './factories';
import { rink } from './schema/index';

// transaction() runs on connections with autocommit off and sends no BEGIN: these check that what it runs is
// still one transaction, and that no connection goes back to the pool inside one.

const LIMIT = 2;
beforeAll(() => {
  connectDb(dbEnv.DATABASE_URL, { connectionLimit: LIMIT });
});
afterAll(() => disconnectDb());

const nameOf = async (id: string) => (await currentDb().select({ name: rink.name }).from(rink).where(eq(rink.id, id)))[0]?.name;
const connectionId = async (tx: Database) => Number(((await tx.execute(sql`select connection_id() as id`)) as unknown as [{ id: number }[]])[0][0]!.id);

describe('transaction()', () => {
  it('keeps its writes from other connections until it commits', async () => {
    const r = await createRink(currentDb(), { name: 'Ice Harbor' });
    let seenInside: string | undefined;
    await transaction(async (tx) => {
      await tx.update(rink).set({ name: 'Renamed inside' }).where(eq(rink.id, r.id));
      seenInside = await nameOf(r.id);
    });
    expect(seenInside).toBe('Ice Harbor');
    expect(await nameOf(r.id)).toBe('Renamed inside');
  });

  it('rolls every write back when its function throws, and passes the error on', async () => {
    const r = await createRink(currentDb(), { name: 'North Pond Arena' });
    await expect(
      transaction(async (tx) => {
        await tx.update(rink).set({ name: 'First write' }).where(eq(rink.id, r.id));
        await tx.update(rink).set({ timeZone: 'Europe/Oslo' }).where(eq(rink.id, r.id));
        throw new Error('refused after two writes');
      }),
    ).rejects.toThrow('refused after two writes');
    const [row] = await currentDb().select().from(rink).where(eq(rink.id, r.id));
    expect(row?.name).toBe('North Pond Arena');
    expect(row?.timeZone).not.toBe('Europe/Oslo');
  });

  it('holds a row lock until it ends, as a BEGIN would', async () => {
    const r = await createRink(currentDb(), { name: 'Lock holder' });
    const order: string[] = [];
    let locked!: () => void;
    const hasLock = new Promise<void>((resolve) => (locked = resolve));
    const first = transaction(async (tx) => {
      await tx.select().from(rink).where(eq(rink.id, r.id)).for('update');
      locked();
      await new Promise((resolve) => setTimeout(resolve, 300));
      order.push('first ends');
    });
    await hasLock;
    const second = transaction(async (tx) => {
      await tx.select().from(rink).where(eq(rink.id, r.id)).for('update');
      order.push('second has the lock');
    });
    await Promise.all([first, second]);
    expect(order).toEqual(['first ends', 'second has the lock']);
  });

  it('leaves no transaction open on a connection it gives back, after a commit or a rollback', async () => {
    const r = await createRink(currentDb(), { name: 'Round 0' });
    const ids = new Set<number>();
    // More transactions than the pool has connections, each reading a row another connection has just changed.
    // A connection given back inside its transaction would keep that transaction's snapshot and read an old name.
    for (let i = 1; i <= LIMIT * 3; i++) {
      await currentDb().update(rink).set({ name: `Round ${i}` }).where(eq(rink.id, r.id));
      const seen = await transaction(async (tx) => {
        ids.add(await connectionId(tx));
        const [row] = await tx.select({ name: rink.name }).from(rink).where(eq(rink.id, r.id));
        if (i % 2) throw new Error(`rolled back after reading ${row?.name}`);
        return row?.name;
      }).catch((error: Error) => error.message.replace('rolled back after reading ', ''));
      expect(seen).toBe(`Round ${i}`);
    }
    expect(ids.size).toBeLessThanOrEqual(LIMIT);
  });

  it('passes on the error of a connection that died inside a transaction, and runs the next ones on live connections with autocommit off', async () => {
    let dead = 0;
    await expect(
      transaction(async (tx) => {
        dead = await connectionId(tx);
        await currentDb().execute(sql.raw(`kill connection ${dead}`));
        await tx.execute(sql`select 1`);
      }),
    ).rejects.toThrow();
    // Every connection of the pool in turn, and one more: none of them may be the dead one.
    const next = await Promise.all(Array.from({ length: LIMIT + 1 }, () => transaction((tx) => connectionId(tx))));
    expect(next).not.toContain(dead);
    expect(await transaction(async (tx) => ((await tx.execute(sql`select @@autocommit as a`)) as unknown as [{ a: number }[]])[0][0]!.a)).toBe(0);
  });
});

describe('the pools', () => {
  const switches = async (db: Database) => ((await db.execute(sql`select @@session.optimizer_switch as s`)) as unknown as [{ s: string }[]])[0][0]!.s;

  it('turn off the subquery cache on every connection, for reads and in transactions', async () => {
    // More reads at once than the pool has connections, so every connection it opens answers one.
    const seen = await Promise.all(Array.from({ length: LIMIT * 2 }, () => switches(currentDb())));
    seen.push(...(await Promise.all(Array.from({ length: LIMIT * 2 }, () => transaction(switches)))));
    for (const s of seen) expect(s).toContain('subquery_cache=off');
    // The server's own default stays on: only these sessions change it.
    const [[global]] = (await currentDb().execute(sql`select @@global.optimizer_switch as s`)) as unknown as [{ s: string }[]];
    expect(global!.s).toContain('subquery_cache=on');
  });
});
