import { randomUUID } from 'node:crypto';
import {
  levelFromTilt,
  medianMinutesPerPair,
  promiseTime,
  type CorrectionInput,
  type CreateTicketInput,
  type LogSharpeningInput,
  type ReadingInput,
  type TicketDetail,
  type TicketState,
  type TicketSummary,
  type TransitionInput,
} from '@rinkwright/core';
import type { Logger } from 'pino';
import { AppError } from '../../http/errors';
import type { RinkContext } from '../../http/route';
import { readDeskSettings } from '../../lib/desk-settings';
import { noticeMail, type Mailer } from '../../lib/mailer';
import { groupBy } from '../../lib/sorted';
import { scoped, type Scope } from '@rinkwright/db';
import * as ledger from '../../lib/ledger/ledger';
import * as repo from './repository';

const TICKET_NOT_FOUND = 'No such ticket at this rink';
const ALREADY_LOGGED = 'This pair is already logged: add a re-run reading or a correction instead';
const PACE_DAYS = 28;
/** A gap longer than this between two pairs at a station is a break, not the time one pair took. */
const LONGEST_PAIR_MINUTES = 45;
/** Shorter gaps are rows of a batch typed in after the work, not the time a pair took. */
const SHORTEST_PAIR_MINUTES = 2;

/** Where a ticket may go from each state; everything else is refused. */
const NEXT: Record<TicketState, TicketState[]> = {
  waiting: ['on_station', 'void'],
  on_station: ['waiting', 'ready', 'void'],
  ready: ['collected', 'on_station', 'void'],
  collected: [],
  void: [],
};

export interface TicketDeps {
  mailer: Mailer;
  logger: Logger;
}

// ---- the promise ------------------------------------------------------------------------------------------

/** Each active station's median minutes per pair over the last weeks, from the gaps between its sharpenings. */
async function stationPaces(tenantId: string, now: Date) {
  const rows = await repo.recentSharpenings(tenantId, new Date(now.getTime() - PACE_DAYS * 86_400_000));
  const gaps = new Map<string, number[]>();
  for (let i = 1; i < rows.length; i++) {
    const [a, b] = [rows[i - 1], rows[i]];
    if (!a || !b || a.stationId !== b.stationId) continue;
    const minutes = (b.doneAt.getTime() - a.doneAt.getTime()) / 60_000;
    if (minutes >= SHORTEST_PAIR_MINUTES && minutes <= LONGEST_PAIR_MINUTES) gaps.set(b.stationId, [...(gaps.get(b.stationId) ?? []), minutes]);
  }
  return gaps;
}

export async function promiseFor(ctx: RinkContext, pairs: number, now = new Date()) {
  const [settings, stations, queue, paces] = await Promise.all([
    readDeskSettings(ctx.tenantId),
    repo.activeStations(ctx.tenantId),
    repo.openQueue(ctx.tenantId),
    stationPaces(ctx.tenantId, now),
  ]);
  const promised = promiseTime({
    now,
    queue: queue.map((t) => ({ pairs: Math.max(0, t.pairCount - t.pairsDone), stationId: t.stationId })),
    stations: stations.map((s) => ({ id: s.id, medianMinutesPerPair: medianMinutesPerPair(paces.get(s.id) ?? []) })),
    defaultMinutesPerPair: settings.defaultMinutesPerPair,
    newPairs: pairs,
  });
  if (!promised) throw new AppError('conflict', 'No station is active: set one to active before taking skates in');
  return { promisedAt: promised.promisedAt.toISOString(), minutesPerPair: promised.minutesPerPair, stationsActive: stations.length };
}

// ---- intake -------------------------------------------------------------------------------------------------

export async function takeIn(ctx: RinkContext, input: CreateTicketInput): Promise<TicketDetail> {
  const customer = await repo.findCustomer(ctx.tenantId, input.customerId);
  if (!customer) throw AppError.field('customerId', 'No such customer at this rink');
  const services = await repo.findServices(scoped(ctx.tenantId), [...new Set(input.pairs.map((p) => p.serviceId))]);
  const profileIds = input.pairs.flatMap((p) => (p.skateProfileId ? [p.skateProfileId] : []));
  const profiles = await repo.findProfiles(ctx.tenantId, customer.id, [...new Set(profileIds)]);
  const fields: Record<string, string[]> = {};
  input.pairs.forEach((p, i) => {
    const service = services.find((s) => s.id === p.serviceId);
    if (!service || service.active !== 1) fields[`pairs.${i}.serviceId`] = ['Choose one of the rink’s active services'];
    if (p.skateProfileId && !profiles.some((pr) => pr.id === p.skateProfileId)) fields[`pairs.${i}.skateProfileId`] = ['That profile is not this customer’s'];
  });
  if (Object.keys(fields).length) throw new AppError('validation_failed', 'Some pairs need attention', fields);

  const creditAccountId = await payingAccount(ctx, customer.id, input);
  const now = new Date();
  const { promisedAt } = await promiseFor(ctx, input.pairs.length, now);
  const id = randomUUID();
  const pairIds = input.pairs.map(() => randomUUID());
  const standard = new Set(services.filter((s) => s.kind === 'standard').map((s) => s.id));
  await repo.insertTicket(
    ctx.tenantId,
    {
      id,
      customerId: customer.id,
      state: 'waiting',
      stationId: null,
      payment: input.payment,
      creditAccountId,
      notes: input.notes,
      droppedAt: now,
      promisedAt: new Date(promisedAt),
      startedAt: null,
      readyAt: null,
      collectedAt: null,
      voidReason: null,
      createdBy: ctx.userId,
    },
    input.pairs.map((p, i) => {
      const profile = profiles.find((pr) => pr.id === p.skateProfileId);
      return {
        id: pairIds[i]!,
        ticketId: id,
        position: i + 1,
        skateProfileId: p.skateProfileId,
        label: p.label,
        bladeWidthNm: p.bladeWidthNm ?? profile?.bladeWidthNm ?? null,
        hollowNm: p.hollowNm ?? profile?.preferredHollowNm ?? null,
        serviceId: p.serviceId,
        priceMinor: services.find((s) => s.id === p.serviceId)?.priceMinor ?? 0,
        notes: p.notes,
      };
    }),
    creditAccountId
      ? async (tx) => {
          for (const [i, p] of input.pairs.entries()) {
                if (standard.has(p.serviceId)) await redeemForPair(tx, ctx, creditAccountId, pairIds[i]!);
          }
        }
      : undefined,
  );
  return describeTicket(scoped(ctx.tenantId), id);
}

/** The credit account a ticket's pairs draw from: the skater's own, or a league team's allocation. */
async function payingAccount(ctx: RinkContext, customerId: string, input: CreateTicketInput): Promise<string | null> {
  const s = scoped(ctx.tenantId);
  if (input.payment === 'credit') return (await ledger.skaterAccount(s, customerId)).id;
  if (input.payment !== 'allocation') return null;
  if (!input.teamId) throw AppError.field('teamId', 'Choose the team whose allocation pays');
  const account = await ledger.findTeamAccount(s, input.teamId);
  if (!account) throw AppError.field('teamId', 'No such team at this rink');
  return account.id;
}

/** One credit per standard pair, keyed by the pair, so a pair can never draw twice. */
function redeemForPair(tx: Scope, ctx: RinkContext, accountId: string, pairId: string) {
  return ledger.redeem(tx, { accountId, key: `pair:${pairId}`, actor: { userId: ctx.userId, source: 'ticket', sourceId: pairId } });
}

// ---- reading and listing ------------------------------------------------------------------------------------

export async function listTickets(ctx: RinkContext, filter: { state: TicketState | 'open'; stationId?: string | undefined; customerId?: string | undefined }) {
  const states: TicketState[] = filter.state === 'open' ? ['waiting', 'on_station', 'ready'] : [filter.state];
  const rows = await repo.listTickets(ctx.tenantId, { states, stationId: filter.stationId, customerId: filter.customerId });
  return { tickets: rows.map(toSummary) };
}

function toSummary(r: Awaited<ReturnType<typeof repo.listTickets>>[number]): TicketSummary {
  return {
    id: r.id,
    number: r.number,
    state: r.state,
    customer: { id: r.customerId, name: r.customerName, memberCode: r.memberCode },
    stationId: r.stationId,
    payment: r.payment,
    droppedAt: r.droppedAt.toISOString(),
    promisedAt: r.promisedAt.toISOString(),
    readyAt: r.readyAt?.toISOString() ?? null,
    pairCount: r.pairCount,
    pairsDone: r.pairsDone,
  };
}

/** The ticket as it stands in `s` (inside a transaction: with that transaction's own writes). */
export async function describeTicket(s: Scope, ticketId: string): Promise<TicketDetail> {
  return ticketDetail(await repo.ticketRows(s, ticketId));
}

/** A ticket's page from its rows, in their order (`repo.orderTicketRows`). */
function ticketDetail(rows: repo.TicketRows): TicketDetail {
  const head = rows.pairs[0];
  if (!head) throw AppError.notFound(TICKET_NOT_FOUND);
  // A row per reading (one, with null reading fields, for a sharpening without any), in order.
  const done = [...groupBy(rows.sharpenings, (r) => r.id).values()].map((group) => {
    const r = group[0]!;
    return {
      id: r.id,
      ticketPairId: r.ticketPairId,
      stationId: r.stationId,
      stationName: r.stationName,
      wheelId: r.wheelId,
      technician: r.technician,
      hollowNm: r.hollowNm,
      passes: r.passes,
      bladeWidthNm: r.bladeWidthNm,
      doneAt: r.doneAt.toISOString(),
      correctsId: r.correctsId,
      correctionReason: r.correctionReason,
      readings: group
        .filter((g) => g.readingId !== null)
        .map((g) => ({ id: g.readingId, blade: g.blade, attempt: g.attempt, readingNm: g.readingNm, tiltMillideg: g.tiltMillideg, takenAt: g.takenAt.toISOString(), takenBy: g.takenBy })),
    };
  });
  const byPair = groupBy(done, (d) => d.ticketPairId);
  // A ticket without pairs is one row whose pair fields are all null (the left join).
  const pairs = rows.pairs.flatMap((p) =>
    p.pairId === null
      ? []
      : [
          {
            id: p.pairId,
            position: p.position,
            label: p.label,
            skateProfileId: p.skateProfileId,
            bladeWidthNm: p.bladeWidthNm,
            hollowNm: p.hollowNm,
            serviceId: p.serviceId,
            serviceName: p.serviceName,
            priceMinor: p.priceMinor,
            notes: p.pairNotes,
            sharpenings: byPair.get(p.pairId) ?? [],
          },
        ],
  );
  return {
    ...toSummary({ ...head, pairCount: pairs.length, pairsDone: byPair.size }),
    notes: head.notes,
    voidReason: head.voidReason,
    pairs,
    events: rows.events.map((e) => ({
      fromState: e.fromState,
      toState: e.toState,
      stationName: e.stationName,
      reason: e.reason,
      at: e.at.toISOString(),
      by: e.by,
    })),
  };
}

// ---- moving a ticket --------------------------------------------------------------------------------------------

async function requireTicket(ctx: RinkContext, ticketId: string) {
  const found = await repo.findTicket(ctx.tenantId, ticketId);
  if (!found) throw AppError.notFound(TICKET_NOT_FOUND);
  return found;
}

async function requireActiveStation(ctx: RinkContext, stationId: string) {
  return activeStation(await repo.findStation(ctx.tenantId, stationId));
}

function activeStation<S extends { id: string; name: string; status: string }>(found: S | undefined): S {
  if (!found) throw AppError.field('stationId', 'No such station at this rink');
  if (found.status !== 'active') throw AppError.field('stationId', `${found.name} is not active`);
  return found;
}

export async function moveTicket(ctx: RinkContext, ticketId: string, input: TransitionInput, deps: TicketDeps): Promise<TicketDetail> {
  const found = await requireTicket(ctx, ticketId);
  if (!NEXT[found.state].includes(input.to)) {
    throw new AppError('conflict', `A ticket that is ${found.state.replace('_', ' ')} cannot become ${input.to.replace('_', ' ')}`);
  }
  const now = new Date();
  const event = { stationId: found.stationId, reason: null as string | null, at: now, byUserId: ctx.userId };
  let set: Parameters<typeof repo.moveTicket>[3];
  switch (input.to) {
    case 'on_station': {
      const target = await requireActiveStation(ctx, input.stationId);
      set = { state: 'on_station', stationId: target.id, startedAt: found.startedAt ?? now };
      event.stationId = target.id;
      break;
    }
    case 'waiting':
      set = { state: 'waiting' };
      break;
    case 'ready': {
      const left = await repo.countUnsharpenedPairs(ctx.tenantId, ticketId);
      if (left > 0) throw new AppError('conflict', `${left} pair${left === 1 ? ' is' : 's are'} not logged yet`);
      set = { state: 'ready', readyAt: now };
      break;
    }
    case 'collected':
      set = { state: 'collected', collectedAt: now };
      break;
    case 'void':
      set = { state: 'void', voidReason: input.reason };
      event.reason = input.reason;
      break;
  }
  // A void ticket gives its credits back: each redemption of its pairs is reversed in the same transaction.
  const giveBack = input.to === 'void' && found.creditAccountId ? await refundCreditsOf(ctx, ticketId, found.creditAccountId) : undefined;
  // Two tablets pressing at once: only the first move from the state both saw takes effect.
  if (!(await repo.moveTicket(ctx.tenantId, ticketId, found.state, set, event, giveBack))) {
    throw new AppError('conflict', 'The ticket changed meanwhile; look at it again');
  }
  if (input.to === 'ready') await sendReadyNotice(ctx, found.customerId, found.number, deps);
  return describeTicket(scoped(ctx.tenantId), ticketId);
}

async function refundCreditsOf(ctx: RinkContext, ticketId: string, accountId: string) {
  const pairIds = await repo.pairIdsOf(ctx.tenantId, ticketId);
  return async (tx: Scope) => {
    const redeemed = await ledger.redemptionsOfPairs(tx, pairIds);
    for (const entry of redeemed) {
      await ledger.reverse(tx, { accountId, key: `void:${entry.id}`, actor: { userId: ctx.userId, source: 'ticket', sourceId: entry.sourceId, reason: 'Ticket void' }, operationId: entry.operationId });
    }
  };
}

/** The skater hears that the skates are ready; a mail that fails is logged and does not undo the ticket. */
async function sendReadyNotice(ctx: RinkContext, customerId: string, number: number, deps: TicketDeps) {
  const customer = await repo.findCustomer(ctx.tenantId, customerId);
  if (!customer?.email || customer.notifyReady === 0) return;
  const rinkName = ctx.rinkName;
  try {
    await deps.mailer.deliver(
      noticeMail({
        to: customer.email,
        subject: `Your skates are ready at ${rinkName}`,
        greeting: `Hello ${customer.name},`,
        body: `Your skates on ticket ${number} are sharpened and ready to collect at the ${rinkName} counter.`,
        footer: 'Blades are sharp: carry them with guards on.',
      }),
      { tenantId: ctx.tenantId },
    );
  } catch (error) {
    deps.logger.error({ err: error, ticket: number }, 'ready notice not sent');
  }
}

// ---- the sharpening log -----------------------------------------------------------------------------------------

function readingRows(ctx: RinkContext, stationId: string, sharpeningId: string, widthNm: number, readings: ReadingInput[], attemptOf: (blade: 'left' | 'right') => number, at: Date) {
  return readings.map((r) => {
    const fromTilt = 'tiltDeg' in r;
    return {
      id: randomUUID(),
      stationId,
      sharpeningId,
      kind: 'sharpening' as const,
      blade: r.blade,
      attempt: attemptOf(r.blade),
      readingNm: fromTilt ? Math.round(levelFromTilt(widthNm, r.tiltDeg)) : r.readingNm,
      tiltMillideg: fromTilt ? Math.round(r.tiltDeg * 1000) : null,
      takenAt: at,
      takenBy: ctx.userId,
    };
  });
}

function assertOneReadingPerBlade(readings: ReadingInput[]) {
  const blades = readings.map((r) => r.blade);
  if (new Set(blades).size !== blades.length) throw AppError.field('readings', 'One reading per blade; a re-run adds the next one');
}

/**
 * Logs a pair, inside the route's transaction (an atomic route: the stored answer commits with it). The ticket's row
 * lock comes first, so two tablets logging on one ticket take turns: the second sees the first's pair and sharpening
 * before it decides a new pair's position or whether the named pair is done. Logging at a station puts the ticket on
 * that station, as the technician would by hand; a refused log rolls back whole and moves nothing.
 *
 * Two round trips to MariaDB: the lock with the whole ticket and the station; the writes, the stored answer and the
 * COMMIT (a new pair sends itself ahead, and redeems its credit, between the two). The answer is the ticket read
 * under the lock with the log's rows added: what reading it back before the COMMIT would give, as the transaction
 * reads the snapshot of its first plain read, taken once the lock was held (integration tests compare the two).
 */
export async function logSharpening(s: Scope, ctx: RinkContext, ticketId: string, input: LogSharpeningInput): Promise<TicketDetail> {
  // The lock is taken first in the round trip, so everything after it is read under it.
  const [[open], [found], pairs, sharpenings, events] = await s.together([repo.lockTicket(ticketId), repo.logTarget(input.stationId, ctx.userId), ...repo.ticketReads(ticketId)]);
  if (!open) throw AppError.notFound(TICKET_NOT_FOUND);
  if (open.state !== 'waiting' && open.state !== 'on_station') {
    throw new AppError('conflict', `The ticket is ${open.state.replace('_', ' ')}: reopen it on a station to log more`);
  }
  const target = activeStation(found);
  assertOneReadingPerBlade(input.readings);
  const now = new Date();
  const technician = found!.technician ?? ctx.name;
  let pairId: string;
  if (input.newPair) {
    const [service] = await repo.findServices(s, [input.newPair.serviceId]);
    if (!service || service.active !== 1) throw AppError.field('newPair.serviceId', 'Choose one of the rink’s active services');
    pairId = randomUUID();
    const pair = {
      id: pairId,
      ticketId,
      position: Math.max(0, ...pairs.map((p) => p.position ?? 0)) + 1,
      label: input.newPair.label,
      skateProfileId: null,
      bladeWidthNm: input.newPair.bladeWidthNm,
      hollowNm: input.newPair.hollowNm,
      serviceId: service.id,
      priceMinor: service.priceMinor,
      notes: input.newPair.notes,
    };
    await s.together([repo.insertPair(pair)]);
    // A batch pair paid by credit draws its credit here, keyed by the pair.
    if (open.creditAccountId && service.kind === 'standard') await redeemForPair(s, ctx, open.creditAccountId, pairId);
    const { id: _id, ticketId: _ticket, notes, ...kept } = pair;
    // A ticket without pairs reads as one row whose pair fields are null (the left join); the head fields are on every row.
    pairs.splice(0, pairs.length, ...pairs.filter((p) => p.pairId !== null), { ...pairs[0]!, ...kept, pairId, serviceName: service.name, pairNotes: notes });
  } else {
    const named = pairs.find((p) => p.pairId !== null && p.pairId === input.pairId);
    if (!named?.pairId) throw AppError.field('pairId', 'No such pair on this ticket');
    if (sharpenings.some((r) => r.ticketPairId === named.pairId && r.correctsId === null)) throw new AppError('conflict', ALREADY_LOGGED);
    pairId = named.pairId;
  }
  if (open.state === 'waiting' || open.stationId !== target.id) {
    const eventId = randomUUID();
    for (const w of repo.putOnStation(open, { stationId: target.id, at: now, byUserId: ctx.userId, eventId })) s.atCommit(w);
    for (const p of pairs) Object.assign(p, { state: 'on_station', stationId: target.id });
    events.push({ id: eventId, fromState: open.state, toState: 'on_station', stationId: target.id, stationName: target.name, reason: null, at: now, by: technician });
  }
  const sharpeningId = randomUUID();
  const row = {
    id: sharpeningId,
    ticketId,
    ticketPairId: pairId,
    stationId: target.id,
    wheelId: target.wheelId ?? null,
    technicianId: ctx.userId,
    hollowNm: input.hollowNm,
    passes: input.passes,
    bladeWidthNm: input.bladeWidthNm,
    doneAt: now,
    correctsId: null,
    correctionReason: null,
    createdAt: now,
  };
  const readings = readingRows(ctx, target.id, sharpeningId, input.bladeWidthNm, input.readings, () => 1, now);
  for (const w of repo.insertSharpening(row, readings)) s.atCommit(w);
  const { ticketId: _t, technicianId: _u, ...shown } = row;
  const done = { ...shown, stationName: target.name, technician };
  // The reading fields of a sharpening without readings are the left join's nulls, which the row type does not carry.
  const none = { readingId: null, blade: null, attempt: null, readingNm: null, tiltMillideg: null, takenAt: null, takenBy: null } as unknown as Omit<(typeof sharpenings)[number], keyof typeof done>;
  sharpenings.push(
    ...(readings.length === 0
      ? [{ ...done, ...none }]
      : readings.map((r) => ({ ...done, readingId: r.id, blade: r.blade, attempt: r.attempt, readingNm: r.readingNm, tiltMillideg: r.tiltMillideg, takenAt: r.takenAt, takenBy: technician }))),
  );
  return ticketDetail(repo.orderTicketRows({ pairs, sharpenings, events }));
}

async function requireSharpening(ctx: RinkContext, sharpeningId: string) {
  const found = await repo.findSharpening(ctx.tenantId, sharpeningId);
  if (!found) throw AppError.notFound('No such sharpening at this rink');
  return found;
}

/** A re-run: each blade's reading is added as the next attempt; the earlier ones stay as they were. */
export async function addRerunReadings(ctx: RinkContext, sharpeningId: string, readings: ReadingInput[]): Promise<TicketDetail> {
  const found = await requireSharpening(ctx, sharpeningId);
  assertOneReadingPerBlade(readings);
  const existing = await repo.readingsOf(ctx.tenantId, sharpeningId);
  const nextAttempt = (blade: 'left' | 'right') => Math.max(0, ...existing.filter((r) => r.blade === blade).map((r) => r.attempt)) + 1;
  await repo.insertReadings(ctx.tenantId, readingRows(ctx, found.stationId, sharpeningId, found.bladeWidthNm, readings, nextAttempt, new Date()));
  return describeTicket(scoped(ctx.tenantId), found.ticketId);
}

/** A correction is a new record that points at the original; both stay in the history. */
export async function correctSharpening(ctx: RinkContext, sharpeningId: string, input: CorrectionInput): Promise<TicketDetail> {
  const original = await requireSharpening(ctx, sharpeningId);
  if (original.correctsId) throw new AppError('conflict', 'Correct the original record, not a correction of it');
  const { tenantId: _tenant, ...kept } = original;
  await repo.insertCorrection(ctx.tenantId, {
    ...kept,
    id: randomUUID(),
    technicianId: ctx.userId,
    hollowNm: input.hollowNm,
    passes: input.passes,
    bladeWidthNm: input.bladeWidthNm,
    correctsId: original.id,
    correctionReason: input.reason,
    createdAt: new Date(),
  });
  return describeTicket(scoped(ctx.tenantId), original.ticketId);
}
