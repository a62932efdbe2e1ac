import { z } from 'zod';
import { id } from './common';

// The reports: request filters, the answers, and the columns of every table (the screen and the CSV export
// read the same list, so a column shown is a column exported).

const isoDay = z.iso.date('Use a date like 2026-11-30');

/** Longest range one report covers: a year and a day, so a leap year fits. */
export const MAX_REPORT_DAYS = 367;
export const TURNAROUND_BUCKET_MINUTES = 15;
/** Turnarounds of two days or more share the last bucket. */
export const TURNAROUND_LAST_BUCKET = (48 * 60) / TURNAROUND_BUCKET_MINUTES;

const dayNumber = (day: string) => Date.parse(`${day}T00:00:00Z`) / 86_400_000;

/** Days are the rink's local days, both ends included. */
export const reportQuery = z
  .object({
    from: isoDay,
    to: isoDay,
    stationId: id.optional(),
    technicianId: id.optional(),
    compareFrom: isoDay.optional(),
    compareTo: isoDay.optional(),
  })
  .superRefine((q, ctx) => {
    const checkRange = (from: string, to: string, toKey: string) => {
      if (dayNumber(from) > dayNumber(to)) ctx.addIssue({ code: 'custom', path: [toKey], message: 'The end date must not be before the start date' });
      else if (dayNumber(to) - dayNumber(from) + 1 > MAX_REPORT_DAYS) ctx.addIssue({ code: 'custom', path: [toKey], message: `A report covers at most ${MAX_REPORT_DAYS} days` });
    };
    checkRange(q.from, q.to, 'to');
    if ((q.compareFrom === undefined) !== (q.compareTo === undefined)) {
      ctx.addIssue({ code: 'custom', path: [q.compareFrom === undefined ? 'compareFrom' : 'compareTo'], message: 'Give both dates of the period to compare with' });
    } else if (q.compareFrom && q.compareTo) {
      checkRange(q.compareFrom, q.compareTo, 'compareTo');
    }
  });
export type ReportQuery = z.infer<typeof reportQuery>;

/** What the report filters offer, and the rink's today in its own time zone (the default period ends there). */
export const reportFilterChoices = z.object({
  timeZone: z.string(),
  currency: z.string(),
  today: z.string(),
  stations: z.array(z.object({ id: z.string(), name: z.string() })),
  technicians: z.array(z.object({ id: z.string(), name: z.string() })),
});
export type ReportFilterChoices = z.infer<typeof reportFilterChoices>;

const period = z.object({ from: z.string(), to: z.string() });
const share = z.number().min(0).max(1).nullable();

// ---- Throughput --------------------------------------------------------------------------------------------

const staffedWork = z.object({ pairs: z.number().int(), staffedHours: z.number().int(), pairsPerStaffedHour: z.number().nullable() });

export const throughputTotals = z.object({
  pairs: z.number().int(),
  staffedHours: z.number().int(),
  pairsPerStaffedHour: z.number().nullable(),
  ticketsReady: z.number().int(),
  medianTurnaroundMinutes: z.number().nullable(),
  p90TurnaroundMinutes: z.number().nullable(),
  promisedHitRate: share,
});
export const throughputReport = z.object({
  period,
  totals: throughputTotals,
  compare: z.object({ period, totals: throughputTotals }).nullable(),
  tables: z.object({
    byDay: z.array(z.object({ day: z.string(), pairs: z.number().int(), ticketsReady: z.number().int(), onTime: z.number().int() })),
    byStation: z.array(staffedWork.extend({ stationId: z.string(), station: z.string() })),
    byTechnician: z.array(staffedWork.extend({ technicianId: z.string(), technician: z.string() })),
    /** weekday 1 = Monday … 7 = Sunday (ISO 8601), hour 0–23 local. */
    byHour: z.array(z.object({ weekday: z.number().int().min(1).max(7), hour: z.number().int().min(0).max(23), pairs: z.number().int() })),
  }),
});
export type ThroughputReport = z.infer<typeof throughputReport>;

// ---- Quality -----------------------------------------------------------------------------------------------

export const qualityTotals = z.object({
  firstReadings: z.number().int(),
  trueShare: share,
  fairShare: share,
  offShare: share,
  reRunRate: share,
  meanAbsReadingNm: z.number().nullable(),
});
export const qualityReport = z.object({
  period,
  totals: qualityTotals,
  compare: z.object({ period, totals: qualityTotals }).nullable(),
  tables: z.object({
    byStation: z.array(
      qualityTotals.extend({ stationId: z.string(), station: z.string(), driftAlertsRaised: z.number().int(), driftAlertsCleared: z.number().int() }),
    ),
    leveling: z.array(
      z.object({
        stationId: z.string(),
        station: z.string(),
        at: z.string(),
        amountMilli: z.number().int(),
        unit: z.string(),
        /** Mean signed first reading of the station's last pairs before and first pairs after (nm). */
        meanBeforeNm: z.number().nullable(),
        meanAfterNm: z.number().nullable(),
      }),
    ),
    wheels: z.array(
      z.object({
        wheelId: z.string(),
        wheel: z.string(),
        station: z.string(),
        mountedAt: z.string(),
        removedAt: z.string().nullable(),
        pairs: z.number().int(),
        passes: z.number().int(),
        /** Passes the wheel's wear so far predicts it gives in all before its minimum diameter (null until a loss is measured). */
        predictedPasses: z.number().int().nullable(),
      }),
    ),
  }),
});
export type QualityReport = z.infer<typeof qualityReport>;

// ---- Money -------------------------------------------------------------------------------------------------

export const moneyTotals = z.object({
  currency: z.string(),
  sales: z.number().int(),
  salesMinor: z.number().int(),
  refundsMinor: z.number().int(),
  feesMinor: z.number().int(),
  redemptions: z.number().int(),
  redemptionValueMinor: z.number().int(),
  breakageCredits: z.number().int(),
  breakageMinor: z.number().int(),
});
export const moneyReport = z.object({
  period,
  totals: moneyTotals,
  compare: z.object({ period, totals: moneyTotals }).nullable(),
  /** At the end of the period: credits not yet used or expired, and what they are worth (deferred revenue). */
  outstanding: z.object({ credits: z.number().int(), valueMinor: z.number().int() }),
  memberships: z.object({
    /** Active at the end of the period, and their recurring revenue per month. */
    active: z.number().int(),
    monthlyRecurringMinor: z.number().int(),
    canceledInPeriod: z.number().int(),
    /** Cancelled in the period over those active at its start. */
    churnRate: share,
  }),
  tables: z.object({
    byProduct: z.array(
      z.object({
        productId: z.string(),
        product: z.string(),
        channel: z.string(),
        sales: z.number().int(),
        salesMinor: z.number().int(),
        refunds: z.number().int(),
        refundsMinor: z.number().int(),
        feesMinor: z.number().int(),
      }),
    ),
    byDay: z.array(z.object({ day: z.string(), salesMinor: z.number().int(), refundsMinor: z.number().int(), redemptions: z.number().int(), breakageCredits: z.number().int() })),
  }),
});
export type MoneyReport = z.infer<typeof moneyReport>;

// ---- League usage --------------------------------------------------------------------------------------------

export const leagueReport = z.object({
  period,
  tables: z.object({
    teams: z.array(
      z.object({
        leagueId: z.string(),
        league: z.string(),
        teamId: z.string(),
        team: z.string(),
        /** Credits given to the team from the pool (all time, net of any taken back). */
        allocated: z.number().int(),
        /** Credits the team's players used in the period, and all time. */
        usedInPeriod: z.number().int(),
        used: z.number().int(),
        remaining: z.number().int(),
      }),
    ),
  }),
});
export type LeagueReport = z.infer<typeof leagueReport>;

// ---- Tables and their columns (screen headers and CSV headers) ------------------------------------------------

export const REPORT_NAMES = ['throughput', 'quality', 'money', 'leagues'] as const;
export type ReportName = (typeof REPORT_NAMES)[number];

export type ColumnFormat = 'text' | 'int' | 'decimal' | 'share' | 'minor' | 'nm' | 'datetime';
export interface ReportColumn {
  key: string;
  label: string;
  format: ColumnFormat;
}

const col = (key: string, label: string, format: ColumnFormat = 'int'): ReportColumn => ({ key, label, format });

/** Every table of every report, with its title and columns in order. */
export const REPORT_TABLES = {
  throughput: {
    byDay: { title: 'Pairs by day', columns: [col('day', 'Day', 'text'), col('pairs', 'Pairs'), col('ticketsReady', 'Tickets ready'), col('onTime', 'Ready by the promised time')] },
    byStation: { title: 'By station', columns: [col('station', 'Station', 'text'), col('pairs', 'Pairs'), col('staffedHours', 'Staffed hours'), col('pairsPerStaffedHour', 'Pairs per staffed hour', 'decimal')] },
    byTechnician: { title: 'By technician', columns: [col('technician', 'Technician', 'text'), col('pairs', 'Pairs'), col('staffedHours', 'Staffed hours'), col('pairsPerStaffedHour', 'Pairs per staffed hour', 'decimal')] },
    byHour: { title: 'Pairs by weekday and hour', columns: [col('weekday', 'Weekday (1 = Monday)'), col('hour', 'Hour'), col('pairs', 'Pairs')] },
  },
  quality: {
    byStation: {
      title: 'First readings by station',
      columns: [
        col('station', 'Station', 'text'),
        col('firstReadings', 'First readings'),
        col('trueShare', 'True', 'share'),
        col('fairShare', 'Fair', 'share'),
        col('offShare', 'Off', 'share'),
        col('reRunRate', 'Re-run rate', 'share'),
        col('meanAbsReadingNm', 'Mean absolute reading', 'nm'),
        col('driftAlertsRaised', 'Drift alerts raised'),
        col('driftAlertsCleared', 'Drift alerts cleared'),
      ],
    },
    leveling: {
      title: 'Leveling adjustments and their effect',
      columns: [col('station', 'Station', 'text'), col('at', 'When', 'datetime'), col('amountMilli', 'Adjustment (thousandths)'), col('unit', 'Unit', 'text'), col('meanBeforeNm', 'Mean reading before', 'nm'), col('meanAfterNm', 'Mean reading after', 'nm')],
    },
    wheels: {
      title: 'Wheel life',
      columns: [col('wheel', 'Wheel', 'text'), col('station', 'Station', 'text'), col('mountedAt', 'Mounted', 'datetime'), col('removedAt', 'Removed', 'datetime'), col('pairs', 'Pairs sharpened'), col('passes', 'Passes run'), col('predictedPasses', 'Passes predicted in all')],
    },
  },
  money: {
    byProduct: {
      title: 'Sales by product and channel',
      columns: [col('product', 'Product', 'text'), col('channel', 'Channel', 'text'), col('sales', 'Sales'), col('salesMinor', 'Sales amount', 'minor'), col('refunds', 'Refunds'), col('refundsMinor', 'Refunded', 'minor'), col('feesMinor', 'Platform fees', 'minor')],
    },
    byDay: {
      title: 'Money by day',
      columns: [col('day', 'Day', 'text'), col('salesMinor', 'Sales', 'minor'), col('refundsMinor', 'Refunds', 'minor'), col('redemptions', 'Credits redeemed'), col('breakageCredits', 'Credits expired')],
    },
  },
  leagues: {
    teams: {
      title: 'League usage by team',
      columns: [col('league', 'League', 'text'), col('team', 'Team', 'text'), col('allocated', 'Allocated'), col('usedInPeriod', 'Used in period'), col('used', 'Used in all'), col('remaining', 'Remaining')],
    },
  },
} as const satisfies Record<ReportName, Record<string, { title: string; columns: ReportColumn[] }>>;

/** The columns of one report table, or undefined when the report has no such table. */
export function reportColumns(report: ReportName, table: string): readonly ReportColumn[] | undefined {
  const tables: Record<string, { columns: readonly ReportColumn[] }> = REPORT_TABLES[report];
  return Object.hasOwn(tables, table) ? tables[table]?.columns : undefined;
}
