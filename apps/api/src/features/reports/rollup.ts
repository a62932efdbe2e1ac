import { ROLLUP_KEY } from '@rinkwright/db';
import type { WorkDayRow } from './repository';

type Sums = Omit<WorkDayRow, 'day' | 'stationId' | 'technicianId'>;

/**
 * A day's work rows with their rollups (schema/reports.ts, ROLLUP_KEY): per station over its technicians, per
 * technician over the stations, and the whole day. Every column but the keys is a sum, so each rollup adds up
 * its rows; the hour columns included.
 */
export function withRollups(rows: WorkDayRow[]): WorkDayRow[] {
  const rollups = new Map<string, WorkDayRow>();
  const add = (day: string, stationId: string, technicianId: string, row: WorkDayRow) => {
    const k = `${day}|${stationId}|${technicianId}`;
    let total = rollups.get(k);
    if (!total) rollups.set(k, (total = { day, stationId, technicianId, pairs: 0, firstReadings: 0, firstTrue: 0, firstFair: 0, firstOff: 0, reruns: 0, firstAbsNm: 0, staffedTotal: 0, staffedStation: 0 }));
    for (const [column, value] of Object.entries(row) as [keyof Sums, unknown][]) {
      if (typeof value === 'number') total[column] = (total[column] ?? 0) + value;
    }
  };
  for (const row of rows) {
    if (row.stationId === ROLLUP_KEY || row.technicianId === ROLLUP_KEY) throw new Error('a work row cannot have the rollup key as its station or technician');
    add(row.day, row.stationId, ROLLUP_KEY, row);
    add(row.day, ROLLUP_KEY, row.technicianId, row);
    add(row.day, ROLLUP_KEY, ROLLUP_KEY, row);
  }
  return [...rows, ...rollups.values()];
}
