import { and, eq, gt, gte, isNotNull, lt, lte, sql } from 'drizzle-orm';
import type { Logger } from 'pino';
import { creditAccount, creditEntry, creditLot, customer, directory, idempotencyKey, membership, rinkBilling, scoped, type Scope } from '@rinkwright/db';
import type { Env } from '../env';
import { syncPlanQuantity } from '../features/billing/plan';
import { refreshReports } from '../features/reports/refresh';
import * as ledger from '../lib/ledger/ledger';
import { expiredLotsDue } from '../lib/ledger/repository';
import { noticeMail, type Mailer } from '../lib/mailer';
import { createPayments, type Payments } from '../lib/payments';

// The background worker: mail retries and report summaries every tick; once a day per rink, expired lots become breakage entries,
// reminders go out (expiry within two weeks, a low balance after a redemption), lapsed grace periods take
// effect, the plan's quantity is set again to the active stations, and idempotency keys past their window are
// swept. Every step is safe to run twice.

const DAY = 86_400_000;

export interface WorkerDeps {
  env: Env;
  mailer: Mailer;
  logger: Logger;
  /** The payment service's client; made from env when not given. */
  payments?: Payments;
}

/** One rink's daily work; exported so tests can run it at a chosen time. */
export async function sweepRink(rinkId: string, deps: WorkerDeps, now = new Date()) {
  const s = scoped(rinkId);
  const expired = await expireLots(s, now);
  const reminders = (await remindExpiring(s, deps, now)) + (await remindLowBalance(s, deps, now));
  await lapseGrace(s, now);
  const plan = await resyncPlanQuantity(s, deps, now);
  await s.remove(idempotencyKey, lt(idempotencyKey.createdAt, new Date(now.getTime() - 2 * DAY)));
  // Rows whose transaction committed long after they were stamped are picked up here at the latest.
  await refreshReports(rinkId, { since: new Date(now.getTime() - 2 * DAY) });
  return { expired, reminders, plan };
}

/**
 * Station changes set the plan's quantity as they happen, but one may have failed to reach the payment service;
 * once a day it is set to the active count. A service that is down leaves it to tomorrow and the sweep goes on.
 */
async function resyncPlanQuantity(s: Scope, deps: WorkerDeps, now: Date) {
  try {
    return await syncPlanQuantity(s, { payments: deps.payments ?? createPayments(deps.env) }, `sweep:${now.toISOString().slice(0, 10)}`);
  } catch (error) {
    deps.logger.warn({ err: error, rinkId: s.tenantId }, 'plan quantity not set by the daily sweep');
    return null;
  }
}

async function expireLots(s: Scope, now: Date): Promise<number> {
  let n = 0;
  for (const lot of await expiredLotsDue(s, now)) {
    const op = await ledger.removeLots(s, { accountId: lot.accountId, key: `expire:${lot.id}`, actor: { userId: null, source: 'system', sourceId: lot.id, reason: 'Expired unused' }, lotIds: [lot.id], kind: 'expire' });
    if (!op.replayed) n += op.entries.length;
  }
  return n;
}

async function rinkName(s: Scope) {
  return (await s.rink())?.name ?? 'your rink';
}

async function remindExpiring(s: Scope, deps: WorkerDeps, now: Date): Promise<number> {
  const soon = await s.findJoined(creditLot, {
    fields: { lotId: creditLot.id, remaining: creditLot.remaining, expiresAt: creditLot.expiresAt, email: customer.email, name: customer.name },
    joins: [
      { table: creditAccount, on: eq(creditAccount.id, creditLot.accountId) },
      { table: customer, on: eq(customer.id, creditAccount.customerId) },
    ],
    where: and(gt(creditLot.remaining, 0), isNotNull(creditLot.expiresAt), gt(creditLot.expiresAt, now), lte(creditLot.expiresAt, new Date(now.getTime() + 14 * DAY)), eq(customer.notifyReminders, 1), isNotNull(customer.email)),
  });
  const name = await rinkName(s);
  for (const lot of soon) {
    await deps.mailer.deliver(
      noticeMail({
        to: lot.email!,
        subject: `${lot.remaining} sharpening credit${lot.remaining === 1 ? '' : 's'} at ${name} expire soon`,
        greeting: `Hello ${lot.name},`,
        body: `${lot.remaining} of your credits at ${name} expire on ${lot.expiresAt!.toISOString().slice(0, 10)}. Bring your skates to the counter before then.`,
        footer: 'You can turn reminders off in your portal.',
      }),
      { tenantId: s.tenantId, dedupeKey: `expiry:${lot.lotId}` },
    );
  }
  return soon.length;
}

async function remindLowBalance(s: Scope, deps: WorkerDeps, now: Date): Promise<number> {
  const recent = await s.findJoined(creditEntry, {
    fields: { accountId: creditEntry.accountId, last: sql<string>`max(${creditEntry.id})` },
    joins: [],
    where: and(eq(creditEntry.kind, 'redeem'), gte(creditEntry.createdAt, new Date(now.getTime() - DAY))),
    groupBy: [creditEntry.accountId],
  });
  const people = await s.findJoined(creditAccount, {
    fields: { accountId: creditAccount.id, email: customer.email, name: customer.name, reminders: customer.notifyReminders },
    joins: [{ table: customer, on: eq(customer.id, creditAccount.customerId) }],
  });
  const name = await rinkName(s);
  let sent = 0;
  for (const r of recent) {
    const person = people.find((p) => p.accountId === r.accountId);
    if (!person?.email || person.reminders !== 1) continue;
    const { credits } = await ledger.balanceOf(s, [r.accountId], now);
    if (credits > deps.env.LOW_BALANCE_CREDITS) continue;
    await deps.mailer.deliver(
      noticeMail({
        to: person.email,
        subject: credits === 0 ? `No sharpening credits left at ${name}` : `${credits} sharpening credit${credits === 1 ? '' : 's'} left at ${name}`,
        greeting: `Hello ${person.name},`,
        body: `You have ${credits} credit${credits === 1 ? '' : 's'} left at ${name}. A new punch card or a membership can be bought from your portal or at the counter.`,
        footer: 'You can turn reminders off in your portal.',
      }),
      { tenantId: s.tenantId, dedupeKey: `low:${r.accountId}:${r.last}` },
    );
    sent++;
  }
  return sent;
}

/** Grace that has run out is written down: memberships stop redeeming, and an unpaid plan makes the rink read-only. */
async function lapseGrace(s: Scope, now: Date) {
  await s.update(membership, { state: 'blocked', updatedAt: now }, and(eq(membership.state, 'past_due'), lte(membership.graceUntil, now))!);
  await s.update(rinkBilling, { planState: 'read_only', updatedAt: now }, and(eq(rinkBilling.planState, 'past_due'), lte(rinkBilling.planGraceUntil, now))!);
}

/** Starts the ticking worker (not in tests: they call the steps). Returns a stop function. */
export function startWorker(given: WorkerDeps): () => void {
  const deps = { ...given, payments: given.payments ?? createPayments(given.env) };
  let running = false;
  const tick = async () => {
    if (running) return;
    running = true;
    try {
      await deps.mailer.drain();
      const day = new Date().toISOString().slice(0, 10);
      const rinkIds = await directory.listRinkIds();
      // Report summaries follow the writes every tick (a rink with nothing new costs a few indexed reads).
      for (const rinkId of rinkIds) {
        await refreshReports(rinkId).catch((error: unknown) => deps.logger.warn({ err: error, rinkId }, 'report summaries not refreshed'));
      }
      for (const rinkId of rinkIds) {
        if (!(await directory.claimJobRun(`sweep:${rinkId}`, day))) continue;
        const done = await sweepRink(rinkId, deps);
        await directory.finishJobRun(`sweep:${rinkId}`, day);
        if (done.expired || done.reminders || done.plan?.updated) deps.logger.info({ rinkId, ...done }, 'daily credit sweep');
      }
    } catch (error) {
      deps.logger.error({ err: error }, 'worker tick failed');
    } finally {
      running = false;
    }
  };
  const timer = setInterval(() => void tick(), deps.env.WORKER_INTERVAL_MS);
  void tick();
  return () => clearInterval(timer);
}
