import { randomUUID } from 'node:crypto';
import { Faker, en, generateMersenne53Randomizer } from '@faker-js/faker';
import { hashPassword } from 'better-auth/crypto';
import { getTableColumns, getTableName } from 'drizzle-orm';
import type { MySqlTable } from 'drizzle-orm/mysql-core';
import type { Pool, PoolConnection } from 'mysql2/promise';
import { lotValueMinor } from '@rinkwright/core';
import {
  account,
  creditAccount,
  creditEntry,
  creditLot,
  customer,
  customerSearch,
  customerSearchRows,
  levelReading,
  levelingAdjustment,
  member,
  payment,
  product,
  productPrice,
  rink,
  serviceItem,
  sharpening,
  station,
  ticket,
  ticketPair,
  user,
  wheel,
  wheelEvent,
} from './schema/index';

// The large data set of `pnpm bench`: many rinks, a year of counter history and a ledger, written with multi-row
// INSERTs of a few thousand rows straight through the driver, millions of rows in minutes. Rows are typed by the
// Drizzle tables and their columns come from them, so a schema change breaks this file at compile time, not at
// run time. Everything follows from the seed, the namespace and `now`: the same inputs give the same rows.

/** Raised whenever the generator changes, so a data set seeded by an older one is not reused. */
export const BENCH_SEED_VERSION = 1;

export interface BenchSize {
  rinks: number;
  sharpenings: number;
  ledgerEntries: number;
}

export interface BenchSeedOptions extends BenchSize {
  /** Eight hex digits inside every id, slug and e-mail, so several seeded sets can share one database. */
  namespace: string;
  seed: number;
  now: Date;
  /** Local days of history per rink, ending the day before `now`. */
  historyDays?: number;
  /** Share of the sharpenings and ledger entries that belong to the one large rink. */
  largeShare?: number;
  /** The password of every staff user of the data set. */
  password: string;
  /** Rinks written at once, each on its own connection. */
  concurrency?: number;
  onProgress?: (done: { rinks: number; sharpenings: number }) => void;
}

export interface BenchRink {
  id: string;
  slug: string;
  name: string;
  timeZone: string;
  technicianEmail: string;
  managerEmail: string;
  stationIds: string[];
  customers: number;
}

export interface BenchSeedResult {
  /** Rows written per table. */
  counts: Record<string, number>;
  /** The last local day of history of the large rink (the day before `now` there). */
  lastDay: string;
  historyDays: number;
  large: BenchRink;
  rinkIds: string[];
}

const DAY = 86_400_000;
const MINUTE = 60_000;
const INCH = 25_400_000;
const THOU = 25_400;
const RESPONSE_NM_PER_TURN = 20_000;
const ROWS_PER_STATEMENT = 2_000;
const FLUSH_AT = 24_000;
const ZONES = ['America/Toronto', 'America/Halifax', 'America/Winnipeg', 'America/Edmonton', 'America/Vancouver', 'America/St_Johns', 'America/Chicago', 'America/New_York', 'America/Denver'];
/** The alphabet of core's memberCode (no 0/O or 1/I/L), which draws at random and so could repeat a code. */
const CODE_ALPHABET = '23456789ABCDEFGHJKMNPQRSTUVWXYZ';
const HOLLOWS = [INCH / 2, INCH / 2, INCH / 2, (INCH * 5) / 8, (INCH * 7) / 16, (INCH * 3) / 4, (INCH * 3) / 8];
const WIDTHS = [2_900_000, 2_900_000, 2_900_000, 3_000_000, 4_000_000];
/** Pairs per day by weekday, Monday first: in this data set weekends are the counter's busy days. */
const WEEKDAY_WEIGHT = [0.8, 0.8, 0.9, 1, 1.2, 1.6, 1.5];

// ---- ids ------------------------------------------------------------------------------------------------------

const TABLE_CODES = new Map<MySqlTable, number>(
  [user, account, member, rink, station, wheel, wheelEvent, levelingAdjustment, serviceItem, customer, ticket, ticketPair, sharpening, levelReading, product, productPrice, payment, creditAccount, creditLot, creditEntry].map((t, i) => [t, i + 1]),
);

/**
 * A UUID-shaped id that sorts in insertion order within a rink and table, so the clustered primary keys are
 * appended to rather than split, and that can be computed again from its parts (a child needs no lookup).
 */
export function benchId(namespace: string, table: MySqlTable, rinkIndex: number, n: number): string {
  const code = TABLE_CODES.get(table) ?? 0;
  const hex = n.toString(16).padStart(15, '0');
  return `${namespace}-${code.toString(16).padStart(4, '0')}-4${rinkIndex.toString(16).padStart(3, '0')}-8${hex.slice(0, 3)}-${hex.slice(3)}`;
}

/** Distinct member codes for k < 31^6: k is scrambled by a multiplier coprime to the alphabet's size. */
function benchMemberCode(k: number): string {
  const space = CODE_ALPHABET.length ** 6;
  let x = (k * 48_271 + 7_919) % space;
  let code = '';
  for (let i = 0; i < 6; i++) {
    code += CODE_ALPHABET[x % CODE_ALPHABET.length];
    x = Math.floor(x / CODE_ALPHABET.length);
  }
  return code;
}

// ---- writing --------------------------------------------------------------------------------------------------

interface TablePlan {
  name: string;
  keys: string[];
  sql: string;
  fill: ((() => unknown) | undefined)[];
}

function planOf(table: MySqlTable): TablePlan {
  const columns = Object.entries(getTableColumns(table));
  return {
    name: getTableName(table),
    keys: columns.map(([key]) => key),
    sql: `INSERT INTO \`${getTableName(table)}\` (${columns.map(([, c]) => `\`${c.name}\``).join(', ')}) VALUES ?`,
    // An omitted property gets the column's own default, as Drizzle's insert would give it.
    fill: columns.map(([, c]) => {
      const fn = (c as { defaultFn?: () => unknown }).defaultFn;
      if (fn) return fn;
      return c.hasDefault ? () => c.default : undefined;
    }),
  };
}

/** Tables in foreign-key order: a flush writes parents before the children buffered with them. */
const ORDER: MySqlTable[] = [rink, user, account, member, serviceItem, station, wheel, wheelEvent, levelingAdjustment, customer, customerSearch, ticket, ticketPair, sharpening, levelReading, product, productPrice, payment, creditAccount, creditLot, creditEntry];
const PLANS = new Map(ORDER.map((t) => [t, planOf(t)]));

/** Buffers rows per table and writes them as multi-row INSERTs, parents first. */
class BatchWriter {
  private readonly buffers = new Map<MySqlTable, unknown[][]>();
  private buffered = 0;
  readonly counts: Record<string, number> = {};

  constructor(private readonly conn: PoolConnection) {}

  add<T extends MySqlTable>(table: T, row: T['$inferInsert']): void {
    const plan = PLANS.get(table);
    if (!plan) throw new Error(`bench seed: no plan for ${getTableName(table)}`);
    const record = row as Record<string, unknown>;
    const values = plan.keys.map((key, i) => {
      const value = record[key];
      return value === undefined ? (plan.fill[i]?.() ?? null) : value;
    });
    const buffer = this.buffers.get(table);
    if (buffer) buffer.push(values);
    else this.buffers.set(table, [values]);
    this.buffered += 1;
    this.counts[plan.name] = (this.counts[plan.name] ?? 0) + 1;
  }

  get full(): boolean {
    return this.buffered >= FLUSH_AT;
  }

  async flush(): Promise<void> {
    for (const table of ORDER) {
      const rows = this.buffers.get(table);
      if (!rows?.length) continue;
      const plan = PLANS.get(table)!;
      for (let i = 0; i < rows.length; i += ROWS_PER_STATEMENT) await this.conn.query(plan.sql, [rows.slice(i, i + ROWS_PER_STATEMENT)]);
      this.buffers.set(table, []);
    }
    this.buffered = 0;
  }
}

// ---- time -----------------------------------------------------------------------------------------------------

const zoneFormats = new Map<string, Intl.DateTimeFormat>();

/** The zone's offset from UTC at an instant, in ms (Intl is the only time-zone database Node carries). */
function zoneOffsetMs(zone: string, utcMs: number): number {
  let format = zoneFormats.get(zone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-US', { timeZone: zone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: 'numeric', minute: 'numeric', second: 'numeric' });
    zoneFormats.set(zone, format);
  }
  const part = Object.fromEntries(format.formatToParts(new Date(utcMs)).map((p) => [p.type, Number(p.value)]));
  const asUtc = Date.UTC(part.year ?? 0, (part.month ?? 1) - 1, part.day ?? 1, part.hour ?? 0, part.minute ?? 0, part.second ?? 0);
  return asUtc - Math.floor(utcMs / 1000) * 1000;
}

/** The local calendar date (YYYY-MM-DD) of an instant in a zone. */
export function localDate(zone: string, utcMs: number): string {
  return new Date(utcMs + zoneOffsetMs(zone, utcMs)).toISOString().slice(0, 10);
}

/** The UTC instant of a local wall-clock time: the offset is looked up at a first guess, then at the answer. */
export function localTimeUtc(zone: string, day: string, hours: number): number {
  const [y, m, d] = day.split('-').map(Number) as [number, number, number];
  const wall = Date.UTC(y, m - 1, d) + hours * 3_600_000;
  const guess = wall - zoneOffsetMs(zone, wall);
  return wall - zoneOffsetMs(zone, guess);
}

export const addDays = (day: string, n: number) => new Date(Date.parse(`${day}T00:00:00Z`) + n * DAY).toISOString().slice(0, 10);

/**
 * History ends the day before `now`, counted from eight hours earlier: the last evening's work can run past
 * midnight, and it must still be over by `now`.
 */
export const lastHistoryDay = (zone: string, now: Date) => addDays(localDate(zone, now.getTime() - 8 * 3_600_000), -1);

// ---- numbers --------------------------------------------------------------------------------------------------

interface Rand {
  (): number;
  int(min: number, max: number): number;
  normal(): number;
  pick<T>(items: readonly T[]): T;
}

function randomOf(seed: number): Rand {
  const source = generateMersenne53Randomizer(seed);
  const next = (() => source.next()) as Rand;
  next.int = (min, max) => min + Math.floor(source.next() * (max - min + 1));
  // Box–Muller; the first uniform is kept off zero so the logarithm stays finite.
  next.normal = () => Math.sqrt(-2 * Math.log(1 - source.next())) * Math.cos(2 * Math.PI * source.next());
  next.pick = (items) => items[Math.floor(source.next() * items.length)]!;
  return next;
}

/** Splits `total` in proportion to `weights` so that the parts are integers adding up to it exactly. */
export function apportion(total: number, weights: number[]): number[] {
  const sum = weights.reduce((a, b) => a + b, 0);
  if (sum <= 0) return weights.map((_, i) => (i === 0 ? total : 0));
  const exact = weights.map((w) => (total * w) / sum);
  const parts = exact.map(Math.floor);
  let left = total - parts.reduce((a, b) => a + b, 0);
  const byRemainder = exact.map((x, i) => [x - Math.floor(x), i] as const).sort((a, b) => b[0] - a[0] || a[1] - b[1]);
  for (const [, i] of byRemainder) {
    if (left <= 0) break;
    parts[i]! += 1;
    left -= 1;
  }
  return parts;
}

// ---- one rink -------------------------------------------------------------------------------------------------

interface RinkPlan {
  index: number;
  sharpenings: number;
  entries: number;
  large: boolean;
}

interface Shared {
  o: Required<Omit<BenchSeedOptions, 'onProgress'>>;
  passwordHash: string;
}

const PRODUCTS = [
  { name: 'Ten sharpenings', credits: 10, priceMinor: 11_000, monthsValid: 12 },
  { name: 'Five sharpenings', credits: 5, priceMinor: 5_800, monthsValid: 6 },
  { name: 'Single sharpening', credits: 1, priceMinor: 1_200, monthsValid: 3 },
] as const;

function addMonths(at: Date, months: number): Date {
  const d = new Date(at.getTime());
  d.setUTCMonth(d.getUTCMonth() + months);
  return d;
}

async function seedRink(w: BatchWriter, shared: Shared, plan: RinkPlan): Promise<BenchRink> {
  const { o } = shared;
  // Each rink has its own generators, so its rows do not depend on which connection wrote which rink first.
  const rand = randomOf(o.seed * 7_919 + plan.index);
  const faker = new Faker({ locale: [en], randomizer: generateMersenne53Randomizer(o.seed * 31 + plan.index) });
  const r = plan.index;
  const ns = o.namespace;
  const idOf = (table: MySqlTable, n: number) => benchId(ns, table, r, n);
  const counters = new Map<MySqlTable, number>();
  const nextId = (table: MySqlTable) => {
    const n = counters.get(table) ?? 0;
    counters.set(table, n + 1);
    return idOf(table, n);
  };

  const timeZone = plan.large ? 'America/Toronto' : ZONES[r % ZONES.length]!;
  const lastDay = lastHistoryDay(timeZone, o.now);
  const firstDay = addDays(lastDay, -(o.historyDays - 1));
  const start = new Date(localTimeUtc(timeZone, firstDay, 0));
  const tenantId = idOf(rink, 0);
  const number = String(r).padStart(3, '0');
  const slug = plan.large ? `bench-${ns}-ice-harbor` : `bench-${ns}-${number}`;
  const name = plan.large ? 'Ice Harbor (bench)' : `Bench rink ${number}`;
  w.add(rink, { id: tenantId, name, slug, logo: null, metadata: null, timeZone, currency: r % 5 === 4 ? 'USD' : 'CAD', unitPreference: r % 3 === 2 ? 'mm' : 'in', createdAt: new Date(start.getTime() - 30 * DAY) });

  // Staff: an owner, a manager and the technicians, all with the same known password.
  const technicians = plan.large ? 6 : 2;
  const staff: { role: 'owner' | 'manager' | 'technician'; email: string }[] = [
    { role: 'owner', email: `owner.${ns}.${number}@example.test` },
    { role: 'manager', email: `manager.${ns}.${number}@example.test` },
    ...Array.from({ length: technicians }, (_, k) => ({ role: 'technician' as const, email: `tech${k + 1}.${ns}.${number}@example.test` })),
  ];
  const technicianIds: string[] = [];
  for (const person of staff) {
    const userId = nextId(user);
    const at = new Date(start.getTime() - 20 * DAY);
    w.add(user, { id: userId, name: faker.person.fullName(), email: person.email, emailVerified: true, image: null, role: 'user', banned: false, createdAt: at, updatedAt: at });
    w.add(account, { id: nextId(account), accountId: userId, providerId: 'credential', userId, password: shared.passwordHash, createdAt: at, updatedAt: at });
    w.add(member, { id: nextId(member), organizationId: tenantId, userId, role: person.role, createdAt: at });
    // The manager works the counter too.
    if (person.role !== 'owner') technicianIds.push(userId);
  }

  const services = [
    { name: 'Standard sharpening', kind: 'standard' as const, priceMinor: 1_200 },
    { name: 'Profiling', kind: 'profiling' as const, priceMinor: 3_600 },
    { name: 'New steel fitted', kind: 'new_steel' as const, priceMinor: 2_400 },
    { name: 'Blade guards', kind: 'add_on' as const, priceMinor: 900 },
  ].map((s) => ({ id: nextId(serviceItem), ...s }));
  for (const s of services) w.add(serviceItem, { ...s, tenantId, active: 1, createdAt: start });
  const [standard, profiling] = services as [(typeof services)[number], (typeof services)[number]];

  const stationCount = plan.large ? 12 : 1 + (r % 3);
  const stations = Array.from({ length: stationCount }, (_, k) => ({
    id: nextId(station),
    wheelId: '',
    offset: rand.int(-6, 6) * 1_000,
    diameter: 7 * INCH,
    busyUntil: 0,
    name: `Bench ${k + 1}`,
  }));
  for (const s of stations) {
    w.add(station, { id: s.id, tenantId, name: s.name, status: 'active', rpm: 3450, adjustUnit: 'turns', adjustStepMilli: 125, ownTrueNm: null, ownFairNm: null, precision: false, createdAt: start });
    s.wheelId = nextId(wheel);
    w.add(wheel, { id: s.wheelId, tenantId, stationId: s.id, label: `${s.name} wheel`, grit: 80, diameterNewNm: 7 * INCH, minDiameterNm: 6 * INCH, ratedMaxRpm: 4140, mountedAt: start, mountedBy: technicianIds[0]!, removedAt: null });
    w.add(wheelEvent, { id: nextId(wheelEvent), tenantId, wheelId: s.wheelId, stationId: s.id, kind: 'mount', hollowNm: null, diameterNm: 7 * INCH, note: null, at: start, byUserId: technicianIds[0]! });
  }

  const customerCount = Math.max(20, Math.round(plan.sharpenings / 10));
  for (let k = 0; k < customerCount; k++) {
    const first = faker.person.firstName();
    const last = faker.person.lastName();
    const withEmail = rand() < 0.65;
    const row = {
      id: idOf(customer, k),
      tenantId,
      name: `${first} ${last}`,
      email: withEmail ? `${first}.${last}.${k}@example.test`.toLowerCase().replace(/[^a-z0-9.@-]/g, '') : null,
      phone: withEmail && rand() < 0.5 ? null : `555-${String(1000 + ((k * 7_907) % 9000)).padStart(4, '0')}`,
      memberCode: benchMemberCode(k),
      userId: null,
      paymentCustomerId: null,
      createdAt: new Date(start.getTime() - rand.int(0, 400) * DAY),
    };
    w.add(customer, row);
    for (const term of customerSearchRows(row)) w.add(customerSearch, term);
    if (w.full) await w.flush();
  }
  const customerId = () => idOf(customer, rand.int(0, customerCount - 1));

  // ---- a year of tickets, pairs, sharpenings and readings --------------------------------------------------------
  const dayWeights = Array.from({ length: o.historyDays }, (_, d) => {
    const weekday = (new Date(`${addDays(firstDay, d)}T12:00:00Z`).getUTCDay() + 6) % 7;
    return WEEKDAY_WEIGHT[weekday]! * (0.8 + 0.4 * rand());
  });
  const perDay = apportion(plan.sharpenings, dayWeights);
  let ticketNumber = 0;
  let logged = 0;
  for (let d = 0; d < o.historyDays; d++) {
    const day = addDays(firstDay, d);
    const opening = localTimeUtc(timeZone, day, 8);
    let pairsLeft = perDay[d]!;
    const drops: number[] = [];
    const sizes: number[] = [];
    while (pairsLeft > 0) {
      const size = Math.min(pairsLeft, rand() < 0.7 ? 1 : rand() < 0.67 ? 2 : 3);
      sizes.push(size);
      pairsLeft -= size;
    }
    for (let i = 0; i < sizes.length; i++) drops.push(opening + rand() * 12.5 * 3_600_000);
    drops.sort((a, b) => a - b);
    for (let t = 0; t < sizes.length; t++) {
      const ticketId = nextId(ticket);
      ticketNumber += 1;
      const dropped = drops[t]!;
      const size = sizes[t]!;
      // The counter puts the skates on whichever bench frees up first.
      const s = stations.reduce((a, b) => (b.busyUntil < a.busyUntil ? b : a));
      const technicianId = rand.pick(technicianIds);
      const startedAt = Math.max(dropped + 5 * MINUTE, s.busyUntil);
      const doneTimes: number[] = [];
      for (let p = 0, clock = startedAt; p < size; p++) doneTimes.push((clock += (6 + 4 * rand()) * MINUTE));
      const finished = doneTimes[doneTimes.length - 1]!;
      s.busyUntil = finished;
      const readyAt = finished + MINUTE;
      const collectedAt = readyAt + rand.int(20, 600) * MINUTE;
      // Some skates of the last evening are still waiting to be picked up.
      const collected = collectedAt < o.now.getTime() && !(d === o.historyDays - 1 && rand() < 0.05);
      const hollow = rand.pick(HOLLOWS);
      const width = rand.pick(WIDTHS);
      w.add(ticket, {
        id: ticketId,
        tenantId,
        number: ticketNumber,
        customerId: customerId(),
        state: collected ? 'collected' : 'ready',
        stationId: s.id,
        payment: 'counter',
        creditAccountId: null,
        notes: null,
        droppedAt: new Date(dropped),
        promisedAt: new Date(dropped + (20 + 8 * size) * MINUTE),
        startedAt: new Date(startedAt),
        readyAt: new Date(readyAt),
        collectedAt: collected ? new Date(collectedAt) : null,
        voidReason: null,
        createdBy: technicianId,
      });
      for (let p = 0; p < size; p++) {
        const pairId = nextId(ticketPair);
        const service = rand() < 0.92 ? standard : profiling;
        w.add(ticketPair, { id: pairId, tenantId, ticketId, position: p + 1, skateProfileId: null, label: `Pair ${p + 1}`, bladeWidthNm: width, hollowNm: hollow, serviceId: service.id, priceMinor: service.priceMinor, notes: null });
        const sharpeningId = nextId(sharpening);
        const doneAt = new Date(doneTimes[p]!);
        w.add(sharpening, { id: sharpeningId, tenantId, ticketId, ticketPairId: pairId, stationId: s.id, wheelId: s.wheelId, technicianId, hollowNm: hollow, passes: rand.int(3, 6), bladeWidthNm: width, doneAt, correctsId: null, correctionReason: null, createdAt: doneAt });
        logged += 1;
        for (const blade of ['left', 'right'] as const) {
          const value = Math.round(s.offset + rand.normal() * 0.35 * THOU);
          w.add(levelReading, { id: nextId(levelReading), tenantId, stationId: s.id, sharpeningId, kind: 'sharpening', blade, attempt: 1, readingNm: value, tiltMillideg: null, takenAt: doneAt, takenBy: technicianId });
          // A blade read well off level is usually re-run at once: a second attempt, the first kept as it was.
          if (Math.abs(value) > 1.5 * THOU && rand() < 0.7) {
            w.add(levelReading, { id: nextId(levelReading), tenantId, stationId: s.id, sharpeningId, kind: 'sharpening', blade, attempt: 2, readingNm: Math.round(value / 3), tiltMillideg: null, takenAt: new Date(doneAt.getTime() + 2 * MINUTE), takenBy: technicianId });
          }
        }
      }
      if (w.full) await w.flush();
    }
    // Upkeep before the next morning: dressing every two weeks; a holder knocked out of level, then re-levelled.
    const upkeepAt = new Date(localTimeUtc(timeZone, addDays(day, 1), 7));
    stations.forEach((s, k) => {
      if (d % 14 === k % 14) {
        s.diameter -= rand.int(180_000, 260_000);
        w.add(wheelEvent, { id: nextId(wheelEvent), tenantId, wheelId: s.wheelId, stationId: s.id, kind: 'dressing', hollowNm: INCH / 2, diameterNm: s.diameter, note: null, at: upkeepAt, byUserId: technicianIds[0]! });
      }
      const phase = (d + k * 9) % 30;
      if (phase === 0 && d > 0) s.offset += (rand() < 0.5 ? -1 : 1) * rand.int(15_000, 32_000);
      else if (phase === 3 && d > 3) {
        const turns = Math.round(-s.offset / RESPONSE_NM_PER_TURN / 0.125) * 0.125;
        if (turns !== 0) {
          w.add(levelingAdjustment, { id: nextId(levelingAdjustment), tenantId, stationId: s.id, amountMilli: Math.round(turns * 1000), note: 'Re-levelled after check readings', at: upkeepAt, byUserId: technicianIds[0]! });
          s.offset += turns * RESPONSE_NM_PER_TURN;
        }
      } else s.offset += rand.normal() * 300;
    });
  }
  if (logged !== plan.sharpenings) throw new Error(`bench seed: rink ${r} got ${logged} sharpenings, not ${plan.sharpenings}`);

  // The queue now: skates dropped off in the last hour, some already on a bench, none of their pairs logged yet.
  const waiting = plan.large ? 16 : r % 4 === 0 ? 1 : 0;
  for (let k = 0; k < waiting; k++) {
    const ticketId = nextId(ticket);
    ticketNumber += 1;
    const dropped = o.now.getTime() - rand.int(1, 60) * MINUTE;
    const technicianId = rand.pick(technicianIds);
    const onStation = k % 3 === 2 ? rand.pick(stations) : undefined;
    w.add(ticket, {
      id: ticketId,
      tenantId,
      number: ticketNumber,
      customerId: customerId(),
      state: onStation ? 'on_station' : 'waiting',
      stationId: onStation?.id ?? null,
      payment: 'counter',
      creditAccountId: null,
      notes: null,
      droppedAt: new Date(dropped),
      promisedAt: new Date(dropped + 36 * MINUTE),
      startedAt: onStation ? new Date(Math.min(dropped + 5 * MINUTE, o.now.getTime())) : null,
      readyAt: null,
      collectedAt: null,
      voidReason: null,
      createdBy: technicianId,
    });
    w.add(ticketPair, { id: nextId(ticketPair), tenantId, ticketId, position: 1, skateProfileId: null, label: 'Pair 1', bladeWidthNm: 2_900_000, hollowNm: INCH / 2, serviceId: standard.id, priceMinor: standard.priceMinor, notes: null });
  }

  await seedLedger(w, { rand, idOf, nextId, tenantId, start, end: new Date(localTimeUtc(timeZone, lastDay, 22)), customerCount, technicianIds, entries: plan.entries, currency: r % 5 === 4 ? 'USD' : 'CAD' });
  await w.flush();
  return { id: tenantId, slug, name, timeZone, technicianEmail: staff[2]!.email, managerEmail: staff[1]!.email, stationIds: stations.map((s) => s.id), customers: customerCount };
}

interface LedgerContext {
  rand: Rand;
  idOf: (table: MySqlTable, n: number) => string;
  nextId: (table: MySqlTable) => string;
  tenantId: string;
  start: Date;
  end: Date;
  customerCount: number;
  technicianIds: string[];
  entries: number;
  currency: string;
}

/**
 * Punch cards sold at the counter, each a paid payment and a lot, then redeemed one credit at a time and, once
 * past their expiry, expired. Exactly `entries` ledger entries, and every lot's remaining is the sum of its own.
 */
async function seedLedger(w: BatchWriter, c: LedgerContext): Promise<void> {
  const { rand, tenantId } = c;
  if (c.entries <= 0) return;
  const products = PRODUCTS.map((p) => ({ ...p, id: c.nextId(product), priceId: c.nextId(productPrice) }));
  for (const p of products) {
    w.add(product, { id: p.id, tenantId, kind: p.credits === 1 ? 'single' : 'punch_card', name: p.name, description: null, credits: p.credits, monthsValid: p.monthsValid, rolloverCap: null, graceDays: null, interval: null, active: 1, listed: 1, paymentProductId: null, createdAt: c.start, updatedAt: c.start });
    w.add(productPrice, { id: p.priceId, tenantId, productId: p.id, amountMinor: p.priceMinor, currency: c.currency, paymentPriceId: null, retiredAt: null, createdAt: c.start });
  }
  let budget = c.entries;
  let accounts = 0;
  const step = c.customerCount % 7_919 === 0 ? 7_907 : 7_919;
  const span = c.end.getTime() - c.start.getTime();
  while (budget > 0) {
    // Distinct customers, in an order scrambled by a multiplier coprime to their count.
    if (accounts >= c.customerCount) throw new Error('bench seed: more ledger entries than the customers can hold');
    const customerIndex = (accounts * step) % c.customerCount;
    const accountId = c.nextId(creditAccount);
    const lots = rand.int(1, 3);
    let opened = c.start.getTime() + rand() * span * 0.9;
    w.add(creditAccount, { id: accountId, tenantId, kind: 'skater', customerId: c.idOf(customer, customerIndex), leagueId: null, teamId: null, createdAt: new Date(opened) });
    accounts += 1;
    for (let l = 0; l < lots && budget > 0; l++) {
      const p = budget <= 2 ? products[2]! : rand.pick(products);
      const last = budget <= p.credits + 2;
      // The lot that closes the budget is recent, so it cannot need an expiry entry it has no room for.
      const createdAt = new Date(last ? c.end.getTime() - DAY : opened);
      const expiresAt = addMonths(createdAt, p.monthsValid);
      const paymentId = c.nextId(payment);
      const lotId = c.nextId(creditLot);
      const sellerId = rand.pick(c.technicianIds);
      w.add(payment, { id: paymentId, tenantId, customerId: c.idOf(customer, customerIndex), leagueId: null, productId: p.id, priceId: p.priceId, membershipId: null, channel: 'counter', state: 'paid', amountMinor: p.priceMinor, currency: c.currency, feeMinor: Math.round((p.priceMinor * 300) / 10_000), refundedMinor: 0, checkoutSessionId: null, paymentIntentId: null, invoiceId: null, serviceUpdatedAt: 0, createdBy: sellerId, paidAt: createdAt, createdAt });
      const usable = Math.min(expiresAt.getTime(), c.end.getTime()) - createdAt.getTime();
      const expires = expiresAt.getTime() <= c.end.getTime();
      let redeems = Math.min(p.credits, Math.round(p.credits * (0.4 + 0.6 * rand())));
      redeems = Math.min(redeems, budget - 1 - (expires && redeems < p.credits ? 1 : 0));
      const expireEntry = expires && redeems < p.credits && budget - 1 - redeems >= 1;
      const lot: { credits: number; remaining: number; priceMinor: number } = { credits: p.credits, remaining: 0, priceMinor: p.priceMinor };
      const entry = (kind: 'purchase' | 'redeem' | 'expire', credits: number, at: Date, source: 'payment' | 'staff' | 'system', sourceId: string | null, key: string) => {
        const valueMinor = credits > 0 ? lot.priceMinor : -lotValueMinor(lot, -credits);
        lot.remaining += credits;
        const entryId = c.nextId(creditEntry);
        w.add(creditEntry, { id: entryId, tenantId, accountId, lotId, kind, credits, valueMinor, source, sourceId, reason: null, reversesId: null, operationId: entryId, idemKey: key, actorUserId: source === 'system' ? null : sellerId, createdAt: at });
        budget -= 1;
      };
      // The row holds where its entries end; `lot` walks them from 0, valuing each step as the ledger does.
      w.add(creditLot, { id: lotId, tenantId, accountId, origin: 'purchase', credits: p.credits, remaining: p.credits - redeems - (expireEntry ? p.credits - redeems : 0), priceMinor: p.priceMinor, expiresAt, productId: p.id, paymentId, membershipId: null, fromLotId: null, createdAt });
      entry('purchase', p.credits, createdAt, 'payment', paymentId, `grant:${paymentId}`);
      const times = Array.from({ length: redeems }, () => createdAt.getTime() + MINUTE + rand() * Math.max(MINUTE, usable - 2 * MINUTE)).sort((a, b) => a - b);
      for (const at of times) entry('redeem', -1, new Date(at), 'staff', null, `redeem:${lotId}:${lot.credits - lot.remaining}`);
      if (expireEntry) entry('expire', -lot.remaining, expiresAt, 'system', lotId, `expire:${lotId}`);
      opened = Math.min(c.end.getTime() - 2 * DAY, createdAt.getTime() + rand.int(20, 120) * DAY);
      if (w.full) await w.flush();
    }
  }
}

// ---- the whole set --------------------------------------------------------------------------------------------

/** Writes the data set. Rinks are independent, so they are written `concurrency` at a time on their own connections. */
export async function seedBench(pool: Pool, options: BenchSeedOptions): Promise<BenchSeedResult> {
  if (!/^[0-9a-f]{8}$/.test(options.namespace)) throw new Error('bench seed: the namespace is eight lowercase hex digits');
  if (options.rinks < 1 || options.rinks > 4095) throw new Error('bench seed: between 1 and 4095 rinks');
  const { onProgress: _progress, ...given } = options;
  const o: Shared['o'] = { historyDays: 365, largeShare: 0.2, concurrency: 2, ...given };
  const shared: Shared = { o, passwordHash: await hashPassword(o.password) };

  // The large rink takes its share; the others split the rest with some rinks busier than others.
  const otherWeights = Array.from({ length: o.rinks - 1 }, (_, i) => 0.5 + ((i * 7_919) % 1_000) / 1_000);
  const largeSharpenings = o.rinks === 1 ? o.sharpenings : Math.round(o.sharpenings * o.largeShare);
  const largeEntries = o.rinks === 1 ? o.ledgerEntries : Math.round(o.ledgerEntries * o.largeShare);
  const sharpeningsOf = [largeSharpenings, ...apportion(o.sharpenings - largeSharpenings, otherWeights)];
  const entriesOf = [largeEntries, ...apportion(o.ledgerEntries - largeEntries, otherWeights)];
  const plans: RinkPlan[] = sharpeningsOf.map((n, index) => ({ index, sharpenings: n, entries: entriesOf[index] ?? 0, large: index === 0 }));

  const counts: Record<string, number> = {};
  const results: BenchRink[] = new Array<BenchRink>(plans.length);
  const queue = [...plans];
  let doneRinks = 0;
  let doneSharpenings = 0;
  const worker = async () => {
    const conn = await pool.getConnection();
    try {
      for (let next = queue.shift(); next; next = queue.shift()) {
        const writer = new BatchWriter(conn);
        results[next.index] = await seedRink(writer, shared, next);
        for (const [table, n] of Object.entries(writer.counts)) counts[table] = (counts[table] ?? 0) + n;
        doneRinks += 1;
        doneSharpenings += next.sharpenings;
        options.onProgress?.({ rinks: doneRinks, sharpenings: doneSharpenings });
      }
    } finally {
      conn.release();
    }
  };
  await Promise.all(Array.from({ length: Math.max(1, Math.min(o.concurrency, plans.length)) }, worker));
  const large = results[0]!;
  return { counts, lastDay: lastHistoryDay(large.timeZone, o.now), historyDays: o.historyDays, large, rinkIds: results.map((x) => x.id) };
}

// ---- checks ---------------------------------------------------------------------------------------------------

export interface LedgerCheck {
  lots: number;
  /** Lots whose remaining is not the sum of their entries. */
  mismatched: number;
  negative: number;
  /** Lots whose entries' values do not add up to what their remaining credits are worth. */
  valueMismatched: number;
}

/** The ledger's invariant over some rinks' lots (or only the given accounts'): remaining == Σ entries per lot. */
export async function checkLedger(pool: Pool, where: { tenantIds: string[]; accountIds?: string[] }): Promise<LedgerCheck> {
  if (where.tenantIds.length === 0) return { lots: 0, mismatched: 0, negative: 0, valueMismatched: 0 };
  const accounts = where.accountIds?.length ? where.accountIds : undefined;
  const [rows] = await pool.query(
    `SELECT COUNT(*) AS lots,
            COALESCE(SUM(l.remaining <> COALESCE(e.credits, 0)), 0) AS mismatched,
            COALESCE(SUM(l.remaining < 0), 0) AS negative,
            COALESCE(SUM(COALESCE(e.value, 0) <> ROUND(l.price_minor) - ROUND(l.price_minor * (l.credits - l.remaining) / l.credits)), 0) AS value_mismatched
       FROM credit_lot l
       LEFT JOIN (SELECT tenant_id, lot_id, SUM(credits) AS credits, SUM(value_minor) AS value
                    FROM credit_entry
                   WHERE tenant_id IN (?)${accounts ? ' AND account_id IN (?)' : ''}
                   GROUP BY tenant_id, lot_id) e
              ON e.tenant_id = l.tenant_id AND e.lot_id = l.id
      WHERE l.tenant_id IN (?)${accounts ? ' AND l.account_id IN (?)' : ''}`,
    [where.tenantIds, ...(accounts ? [accounts] : []), where.tenantIds, ...(accounts ? [accounts] : [])],
  );
  const row = (rows as Record<string, unknown>[])[0] ?? {};
  return { lots: Number(row.lots ?? 0), mismatched: Number(row.mismatched ?? 0), negative: Number(row.negative ?? 0), valueMismatched: Number(row.value_mismatched ?? 0) };
}

// ---- fixtures of one bench run ------------------------------------------------------------------------------------

/**
 * Fresh customers of a rink, each with a credit account holding one granted lot, for one load run to redeem from.
 * Fresh every run, so "granted − redeemed == balance" needs nothing from earlier runs.
 */
export async function grantLoadAccounts(pool: Pool, input: { tenantId: string; count: number; credits: number; label: string; actorUserId: string | null }): Promise<{ customerIds: string[]; accountIds: string[]; granted: number }> {
  const now = new Date();
  const customerIds: string[] = [];
  const accountIds: string[] = [];
  const customers: unknown[][] = [];
  const accounts: unknown[][] = [];
  const lots: unknown[][] = [];
  const entries: unknown[][] = [];
  for (let i = 0; i < input.count; i++) {
    const [customerId, accountId, lotId, entryId] = [randomUUID(), randomUUID(), randomUUID(), randomUUID()];
    customerIds.push(customerId);
    accountIds.push(accountId);
    customers.push([customerId, input.tenantId, `${input.label} ${i + 1}`, `L${customerId.slice(0, 8).toUpperCase()}`, now]);
    accounts.push([accountId, input.tenantId, 'skater', customerId, now]);
    lots.push([lotId, input.tenantId, accountId, 'grant', input.credits, input.credits, 0, null, now]);
    entries.push([entryId, input.tenantId, accountId, lotId, 'grant', input.credits, 0, 'staff', null, `Load run: ${input.label}`, entryId, `grant:${entryId}`, input.actorUserId, now]);
  }
  const conn = await pool.getConnection();
  try {
    await conn.beginTransaction();
    await conn.query('INSERT INTO customer (id, tenant_id, name, member_code, created_at) VALUES ?', [customers]);
    await conn.query('INSERT INTO credit_account (id, tenant_id, kind, customer_id, created_at) VALUES ?', [accounts]);
    await conn.query('INSERT INTO credit_lot (id, tenant_id, account_id, origin, credits, remaining, price_minor, expires_at, created_at) VALUES ?', [lots]);
    await conn.query(
      'INSERT INTO credit_entry (id, tenant_id, account_id, lot_id, kind, credits, value_minor, source, source_id, reason, operation_id, idem_key, actor_user_id, created_at) VALUES ?',
      [entries],
    );
    await conn.commit();
  } catch (error) {
    await conn.rollback();
    throw error;
  } finally {
    conn.release();
  }
  return { customerIds, accountIds, granted: input.count * input.credits };
}
