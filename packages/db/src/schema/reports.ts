import { bigint, customType, date, index, int, mysqlTable, primaryKey, smallint, varchar } from 'drizzle-orm/mysql-core';
import { at, rinkFk, tenantId } from './columns';

// Summary tables the reports read instead of the raw rows. Each is keyed by the rink's local day (its time
// zone), so a date-range filter is an index range. They are derived data: the refresh recomputes whole days
// from the raw rows, so a summary row can always be thrown away and rebuilt. "" stands for "none" in a key
// column (a primary key cannot hold NULL).

/** A summary table's key that names a row elsewhere (a station, a technician, a wheel), or "" for none. Compared as bytes: grouping by it is then several times cheaper than under the rink's text collation. */
const keyId = customType<{ data: string; notNull: true }>({ dataType: () => 'varchar(36) character set ascii collate ascii_bin' });

type Hour = `${0 | 1}${0 | 1 | 2 | 3 | 4 | 5 | 6 | 7 | 8 | 9}` | `2${0 | 1 | 2 | 3}`;
/** The property holding the pairs of one local hour (00–23) on a work day row. */
export const hourKey = (hour: number) => `pairsH${String(hour).padStart(2, '0')}` as `pairsH${Hour}`;
export const HOURS = Array.from({ length: 24 }, (_, h) => h);
const hourColumns = () => Object.fromEntries(HOURS.map((h) => [hourKey(h), int(`pairs_h${String(h).padStart(2, '0')}`).notNull().default(0)])) as Record<`pairsH${Hour}`, ReturnType<typeof int>>;

/**
 * The station or technician of a rollup row of `report_work_day`: the sum of that day's rows over every station
 * (technician). Each day has its rows (day, station, technician), and their rollups (day, station, ROLLUP_KEY),
 * (day, ROLLUP_KEY, technician) and (day, ROLLUP_KEY, ROLLUP_KEY), so a report reads the rows of the grain it shows
 * and nothing finer: 90 days of one rink's stations are 90 × stations rows, not 90 × stations × technicians.
 * Every column is a sum, so a rollup is exactly the sum of its rows.
 */
export const ROLLUP_KEY = '*';

/**
 * Pairs and their first readings, per local day, station and technician, with the pairs of each local hour for the
 * weekday-and-hour heat map, and the rollups of those rows (ROLLUP_KEY). A day row rather than an hour row: a 90-day
 * report groups a quarter as many rows.
 */
export const reportWorkDay = mysqlTable(
  'report_work_day',
  {
    tenantId: tenantId(),
    day: date('day', { mode: 'string' }).notNull(),
    stationId: keyId('station_id').notNull(),
    technicianId: keyId('technician_id').notNull(),
    pairs: int('pairs').notNull(),
    /** Blades with a first reading, and how those first readings fell in the station's bands. */
    firstReadings: int('first_readings').notNull(),
    firstTrue: int('first_true').notNull(),
    firstFair: int('first_fair').notNull(),
    firstOff: int('first_off').notNull(),
    /** Blades read a second time (a re-run). */
    reruns: int('reruns').notNull(),
    /** Σ |first reading| in nm, for the mean absolute reading. */
    firstAbsNm: bigint('first_abs_nm', { mode: 'number' }).notNull(),
    /**
     * Staffed hours as sums, so a report never counts distinct hours: each (day, hour, technician) with a pair
     * counts on one row of the day, and each (day, hour, station, technician) with a pair on its station's row.
     */
    staffedTotal: int('staffed_total').notNull(),
    staffedStation: int('staffed_station').notNull(),
    ...hourColumns(),
  },
  (t) => [
    primaryKey({ name: 'report_work_day_pk', columns: [t.tenantId, t.day, t.stationId, t.technicianId] }),
    rinkFk('report_work_day_rink_fk', t.tenantId),
    // A grain's rows by index range: a station (or every station's rollup, '*') over the days, then technicians;
    // and a technician (or '*') over the days, then stations.
    index('report_work_day_station_idx').on(t.tenantId, t.stationId, t.day, t.technicianId),
    index('report_work_day_technician_idx').on(t.tenantId, t.technicianId, t.day, t.stationId),
  ],
);

/** Pairs and passes over each wheel per local day, for the wheel's life, which spans more than any report period. */
export const reportWheelDay = mysqlTable(
  'report_wheel_day',
  {
    tenantId: tenantId(),
    wheelId: keyId('wheel_id').notNull(),
    day: date('day', { mode: 'string' }).notNull(),
    pairs: int('pairs').notNull(),
    passes: int('passes').notNull(),
  },
  (t) => [primaryKey({ name: 'report_wheel_day_pk', columns: [t.tenantId, t.wheelId, t.day] }), rinkFk('report_wheel_day_rink_fk', t.tenantId)],
);

/** Tickets that became ready, per local day of readiness, station and turnaround bucket. */
export const reportTurnaround = mysqlTable(
  'report_turnaround',
  {
    tenantId: tenantId(),
    day: date('day', { mode: 'string' }).notNull(),
    stationId: keyId('station_id').notNull(),
    /** Minutes from drop-off to ready, in buckets of TURNAROUND_BUCKET_MINUTES; the last bucket holds the rest. */
    bucket: smallint('bucket').notNull(),
    tickets: int('tickets').notNull(),
    /** Of those, ready by the time promised at drop-off. */
    onTime: int('on_time').notNull(),
  },
  (t) => [primaryKey({ name: 'report_turnaround_pk', columns: [t.tenantId, t.day, t.stationId, t.bucket] }), rinkFk('report_turnaround_rink_fk', t.tenantId)],
);

/** Payments (on their paid day) and refunds (on theirs), per product and channel, in the rink's currency. */
export const reportMoneyDay = mysqlTable(
  'report_money_day',
  {
    tenantId: tenantId(),
    day: date('day', { mode: 'string' }).notNull(),
    productId: keyId('product_id').notNull(),
    channel: varchar('channel', { length: 16 }).notNull(),
    sales: int('sales').notNull(),
    salesMinor: bigint('sales_minor', { mode: 'number' }).notNull(),
    feesMinor: bigint('fees_minor', { mode: 'number' }).notNull(),
    refunds: int('refunds').notNull(),
    refundsMinor: bigint('refunds_minor', { mode: 'number' }).notNull(),
  },
  (t) => [primaryKey({ name: 'report_money_day_pk', columns: [t.tenantId, t.day, t.productId, t.channel] }), rinkFk('report_money_day_rink_fk', t.tenantId)],
);

/**
 * Ledger entries per local day, kind and product. A reversal is counted under the kind it reverses (with its own
 * sign), so Σ redeem is the net redemptions. Σ credits over every day up to D is the balance outstanding at D.
 */
export const reportCreditDay = mysqlTable(
  'report_credit_day',
  {
    tenantId: tenantId(),
    day: date('day', { mode: 'string' }).notNull(),
    kind: varchar('kind', { length: 16 }).notNull(),
    productId: keyId('product_id').notNull(),
    credits: bigint('credits', { mode: 'number' }).notNull(),
    valueMinor: bigint('value_minor', { mode: 'number' }).notNull(),
  },
  (t) => [primaryKey({ name: 'report_credit_day_pk', columns: [t.tenantId, t.day, t.kind, t.productId] }), rinkFk('report_credit_day_rink_fk', t.tenantId)],
);

/**
 * Drift alerts per local day and station: how many began and how many ended, the drift watch evaluated after each
 * reading of the station's series (its check readings and first readings), as the refresh saw it.
 */
export const reportDriftDay = mysqlTable(
  'report_drift_day',
  {
    tenantId: tenantId(),
    day: date('day', { mode: 'string' }).notNull(),
    stationId: keyId('station_id').notNull(),
    raised: int('raised').notNull(),
    cleared: int('cleared').notNull(),
  },
  (t) => [primaryKey({ name: 'report_drift_day_pk', columns: [t.tenantId, t.day, t.stationId] }), rinkFk('report_drift_day_rink_fk', t.tenantId)],
);

/** How far each rink's summaries are current: rows written before `through` are in them. */
export const reportRefresh = mysqlTable(
  'report_refresh',
  {
    tenantId: tenantId(),
    through: at('through').notNull(),
    refreshedAt: at('refreshed_at').notNull(),
  },
  (t) => [primaryKey({ name: 'report_refresh_pk', columns: [t.tenantId] }), rinkFk('report_refresh_rink_fk', t.tenantId)],
);

/**
 * The effect of each leveling adjustment: the first readings of its station just before it and just after it
 * (up to EFFECT_READINGS each side, none beyond the adjustments next to it: effectWindows in @rinkwright/core), as
 * counts and sums for the means. `windowFrom` and `windowTo` are the times of the oldest reading before and the
 * newest after it that were counted; on a side with fewer, the time of the neighbouring adjustment that ends it, or
 * null while none does: a reading written between them (or on an open side) changes the effect, so the refresh
 * computes the adjustment again; one outside them cannot.
 */
export const reportLeveling = mysqlTable(
  'report_leveling',
  {
    tenantId: tenantId(),
    adjustmentId: keyId('adjustment_id').notNull(),
    stationId: keyId('station_id').notNull(),
    at: at('at').notNull(),
    amountMilli: int('amount_milli').notNull(),
    beforeReadings: int('before_readings').notNull(),
    beforeSumNm: bigint('before_sum_nm', { mode: 'number' }).notNull(),
    afterReadings: int('after_readings').notNull(),
    afterSumNm: bigint('after_sum_nm', { mode: 'number' }).notNull(),
    windowFrom: at('window_from'),
    windowTo: at('window_to'),
  },
  (t) => [
    primaryKey({ name: 'report_leveling_pk', columns: [t.tenantId, t.adjustmentId] }),
    rinkFk('report_leveling_rink_fk', t.tenantId),
    index('report_leveling_tenant_at_idx').on(t.tenantId, t.at),
  ],
);
