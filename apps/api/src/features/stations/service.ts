import { randomUUID } from 'node:crypto';
import type {
  AdjustmentInput,
  CheckReadingInput,
  DeskSettings,
  DressingInput,
  MountWheelInput,
  StationDetail,
  StationInput,
  StationRow,
} from '@rinkwright/core';
import type { Logger } from 'pino';
import { AppError } from '../../http/errors';
import type { RinkContext } from '../../http/route';
import { readDeskSettings, saveDeskSettings } from '../../lib/desk-settings';
import { driftAlertOf, DRIFT_WINDOW } from '../../lib/drift';
import { assessStation } from './quality';
import * as repo from './repository';

const NOT_FOUND = 'No such station at this rink';

/**
 * What follows the number of active stations outside this feature (the rink's plan is billed per active station);
 * app.ts wires it, so stations need not know about billing.
 */
export interface StationHooks {
  /** Called after a station was activated, deactivated or added active; `changeId` names this one change. */
  activeStationsChanged(tenantId: string, changeId: string): Promise<unknown>;
  logger: Pick<Logger, 'warn'>;
}

/** The station change is already saved: a payment service that fails or is slow must not undo or fail it. */
async function tellActiveStationsChanged(hooks: StationHooks, tenantId: string): Promise<void> {
  try {
    await hooks.activeStationsChanged(tenantId, randomUUID());
  } catch (error) {
    hooks.logger.warn({ err: error, tenantId }, 'the plan did not follow a station change; the daily sweep sets it again');
  }
}

type WheelRow = Awaited<ReturnType<typeof repo.currentWheels>>[number];

/** Each mounted wheel with its latest dressed hollow and diameter, and the passes ground on it. */
async function describeWheels(tenantId: string, wheels: WheelRow[]) {
  const ids = wheels.map((w) => w.id);
  const [events, passes] = await Promise.all([repo.wheelEvents(tenantId, ids), repo.passesByWheel(tenantId, ids)]);
  return new Map(
    wheels.map((w) => {
      const own = events.filter((e) => e.wheelId === w.id);
      const dressings = own.filter((e) => e.kind === 'dressing');
      const lastDiameter = [...own].reverse().find((e) => e.diameterNm !== null)?.diameterNm ?? w.diameterNewNm;
      return [
        w.stationId,
        {
          id: w.id,
          label: w.label,
          grit: w.grit,
          diameterNewNm: w.diameterNewNm,
          minDiameterNm: w.minDiameterNm,
          ratedMaxRpm: w.ratedMaxRpm,
          mountedAt: w.mountedAt.toISOString(),
          hollowNm: dressings[dressings.length - 1]?.hollowNm ?? null,
          diameterNm: lastDiameter,
          passesSinceMount: passes.get(w.id) ?? 0,
        },
      ] as const;
    }),
  );
}

export async function listStations(ctx: RinkContext): Promise<{ stations: StationRow[] }> {
  return { stations: await stationRows(ctx) };
}

/** The rink's stations as the list shows them, or just one: a station's page need not work out every wheel's passes. */
async function stationRows(ctx: RinkContext, onlyId?: string): Promise<StationRow[]> {
  const [stations, wheels, counts, settings] = await Promise.all([
    repo.listStations(ctx.tenantId, onlyId),
    repo.currentWheels(ctx.tenantId, onlyId),
    repo.queueCounts(ctx.tenantId),
    readDeskSettings(ctx.tenantId),
  ]);
  const [wheelOf, alerts] = await Promise.all([
    describeWheels(ctx.tenantId, wheels),
    Promise.all(stations.map(async (s) => driftAlertOf(await repo.latestSeries(ctx.tenantId, s.id, DRIFT_WINDOW), settings))),
  ]);
  const countOf = (stationId: string, state: string) => counts.find((c) => c.stationId === stationId && c.state === state)?.n ?? 0;
  return stations.map((s, i) => ({
    id: s.id,
    name: s.name,
    status: s.status,
    rpm: s.rpm,
    adjustUnit: s.adjustUnit,
    adjustStepMilli: s.adjustStepMilli,
    ownTrueNm: s.ownTrueNm,
    ownFairNm: s.ownFairNm,
    precision: s.precision,
    wheel: wheelOf.get(s.id) ?? null,
    queue: { waiting: countOf(s.id, 'waiting'), onStation: countOf(s.id, 'on_station') },
    driftAlert: alerts[i] ?? false,
  }));
}

export async function stationRowOf(ctx: RinkContext, stationId: string): Promise<StationRow> {
  const [row] = await stationRows(ctx, stationId);
  if (!row) throw AppError.notFound(NOT_FOUND);
  return row;
}

export async function requireStation(ctx: RinkContext, stationId: string) {
  const found = await repo.findStation(ctx.tenantId, stationId);
  if (!found) throw AppError.notFound(NOT_FOUND);
  return found;
}

export async function addStation(ctx: RinkContext, hooks: StationHooks, input: StationInput): Promise<StationRow> {
  if (await repo.stationNameTaken(ctx.tenantId, input.name)) throw AppError.field('name', 'Another station has this name');
  const id = randomUUID();
  await repo.createStation(ctx.tenantId, { ...input, id });
  if (input.status === 'active') await tellActiveStationsChanged(hooks, ctx.tenantId);
  return stationRowOf(ctx, id);
}

export async function changeStation(ctx: RinkContext, hooks: StationHooks, stationId: string, input: StationInput): Promise<StationRow> {
  const before = await requireStation(ctx, stationId);
  if (await repo.stationNameTaken(ctx.tenantId, input.name, stationId)) throw AppError.field('name', 'Another station has this name');
  await repo.updateStation(ctx.tenantId, stationId, input);
  if ((before.status === 'active') !== (input.status === 'active')) await tellActiveStationsChanged(hooks, ctx.tenantId);
  return stationRowOf(ctx, stationId);
}

export async function mountWheel(ctx: RinkContext, stationId: string, input: MountWheelInput): Promise<StationRow> {
  await requireStation(ctx, stationId);
  const { ringTested: _checked, ...wheel } = input;
  await repo.mountWheel(ctx.tenantId, { ...wheel, id: randomUUID(), stationId, byUserId: ctx.userId, eventIds: [randomUUID(), randomUUID()] });
  return stationRowOf(ctx, stationId);
}

async function mountedWheel(ctx: RinkContext, stationId: string) {
  const row = await stationRowOf(ctx, stationId);
  if (!row.wheel) throw new AppError('conflict', 'No wheel is mounted on this station');
  return { row, wheel: row.wheel };
}

export async function dressWheel(ctx: RinkContext, stationId: string, input: DressingInput): Promise<StationRow> {
  const { wheel } = await mountedWheel(ctx, stationId);
  if (input.diameterNm > wheel.diameterNm) throw AppError.field('diameterNm', 'Dressing removes material: the diameter cannot grow');
  await repo.addWheelEvent(ctx.tenantId, {
    id: randomUUID(),
    wheelId: wheel.id,
    stationId,
    kind: 'dressing',
    hollowNm: input.hollowNm,
    diameterNm: input.diameterNm,
    note: input.note ?? null,
    at: new Date(),
    byUserId: ctx.userId,
  });
  return stationRowOf(ctx, stationId);
}

export async function removeWheel(ctx: RinkContext, stationId: string): Promise<StationRow> {
  const { wheel } = await mountedWheel(ctx, stationId);
  await repo.removeWheel(ctx.tenantId, wheel.id, stationId, ctx.userId);
  return stationRowOf(ctx, stationId);
}

export async function logAdjustment(ctx: RinkContext, stationId: string, input: AdjustmentInput): Promise<{ ok: true }> {
  await requireStation(ctx, stationId);
  await repo.addAdjustment(ctx.tenantId, { id: randomUUID(), stationId, amountMilli: input.amountMilli, note: input.note ?? null, at: new Date(), byUserId: ctx.userId });
  return { ok: true };
}

export async function logCheckReading(ctx: RinkContext, stationId: string, input: CheckReadingInput): Promise<{ ok: true }> {
  await requireStation(ctx, stationId);
  await repo.addCheckReading(ctx.tenantId, {
    id: randomUUID(),
    stationId,
    sharpeningId: null,
    kind: 'check',
    blade: input.blade,
    attempt: 1,
    readingNm: input.readingNm,
    takenAt: new Date(),
    takenBy: ctx.userId,
  });
  return { ok: true };
}

export const getDeskSettings = (ctx: RinkContext) => readDeskSettings(ctx.tenantId);

export async function putDeskSettings(ctx: RinkContext, input: DeskSettings): Promise<DeskSettings> {
  await saveDeskSettings(ctx.tenantId, input);
  return readDeskSettings(ctx.tenantId);
}

/** How far back the station page looks. */
const HISTORY_DAYS = 190;

export async function describeStation(ctx: RinkContext, stationId: string): Promise<StationDetail> {
  const row = await stationRowOf(ctx, stationId);
  const now = new Date();
  const [settings, readings, adjustments, events] = await Promise.all([
    readDeskSettings(ctx.tenantId),
    repo.readingsSince(ctx.tenantId, stationId, new Date(now.getTime() - HISTORY_DAYS * 86_400_000)),
    repo.adjustmentsOf(ctx.tenantId, stationId),
    row.wheel ? repo.wheelEvents(ctx.tenantId, [row.wheel.id]) : Promise.resolve([]),
  ]);
  const passes = row.wheel ? await repo.passesOnWheelBefore(ctx.tenantId, row.wheel.id, events.map((e) => e.at)) : [];
  return assessStation({
    station: row,
    settings,
    readings,
    adjustments,
    wheelEvents: events.map((e, i) => ({ kind: e.kind, hollowNm: e.hollowNm, diameterNm: e.diameterNm, at: e.at, note: e.note, passesBefore: passes[i] ?? 0 })),
    now,
  });
}
