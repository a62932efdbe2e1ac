import {
  bandsFor,
  classifyLevel,
  driftWatch,
  effectWindows,
  levelingAdvice,
  speedCheck,
  wheelWear,
  type DeskSettings,
  type StationDetail,
  type StationRow,
} from '@rinkwright/core';
import { DRIFT_WINDOW, driftOptions } from '../../lib/drift';

// Turns a station's raw history into what its page shows: the readings in their bands, the drift watch, the
// leveling advice from its own adjustments, and the wheel's life. Pure: the service loads, this computes.

/** The advice looks at the station's readings since its last adjustment, the most recent ones. */
const RECENT = 30;

const average = (values: number[]) => values.reduce((sum, v) => sum + v, 0) / values.length;

export interface StationHistory {
  station: StationRow & { ownTrueNm: number | null; ownFairNm: number | null };
  settings: DeskSettings;
  readings: { takenAt: Date; readingNm: number; kind: 'sharpening' | 'check'; attempt: number }[];
  adjustments: { at: Date; amountMilli: number; note: string | null; by: string }[];
  wheelEvents: { kind: 'mount' | 'dressing' | 'removal'; hollowNm: number | null; diameterNm: number | null; at: Date; note: string | null; passesBefore: number }[];
  now: Date;
}


export function assessStation(h: StationHistory): StationDetail {
  const bands = bandsFor({ rink: h.settings, station: h.station, precision: h.station.precision });
  const series = h.readings.filter((r) => r.kind === 'check' || r.attempt === 1);
  const charted = series.slice(-DRIFT_WINDOW);
  const values = charted.map((r) => r.readingNm);
  const readings = charted.map((r) => ({ takenAt: r.takenAt.toISOString(), readingNm: r.readingNm, kind: r.kind, band: classifyLevel(r.readingNm, bands) }));
  const bandMix = { true: 0, fair: 0, off: 0 };
  for (const r of readings) bandMix[r.band] += 1;

  const watch = driftWatch(values, driftOptions(h.settings));
  const drift =
    watch.status === 'watching'
      ? {
          status: watch.status,
          alert: watch.alert,
          reasons: watch.reasons.map((r) => ({ chart: r.chart, ...(r.rule ? { rule: r.rule } : {}), index: r.index, valueNm: r.valueNm })),
          mean: watch.imr.mean,
          ucl: watch.imr.ucl,
          lcl: watch.imr.lcl,
          ewma: watch.ewma.ewma,
          ewmaUcl: watch.ewma.ucl,
          ewmaLcl: watch.ewma.lcl,
        }
      : { status: watch.status, alert: false, reasons: [], mean: null, ucl: null, lcl: null, ewma: [], ewmaUcl: null, ewmaLcl: null };

  const byTime = [...h.adjustments].sort((a, b) => a.at.getTime() - b.at.getTime());
  const windows = effectWindows(
    series.map((r) => r.takenAt.getTime()),
    byTime.map((a) => a.at.getTime()),
  );
  const meanOf = ([from, to]: [number, number]) => (to > from ? average(series.slice(from, to).map((r) => r.readingNm)) : null);
  const adjustments = byTime.map((adj, i) => ({ ...adj, beforeNm: meanOf(windows[i]!.before), afterNm: meanOf(windows[i]!.after) }));
  const lastAdjustment = byTime[byTime.length - 1]?.at;
  const recent = series.filter((r) => !lastAdjustment || r.takenAt > lastAdjustment).slice(-RECENT).map((r) => r.readingNm);
  const advice = levelingAdvice({
    adjustments: adjustments.flatMap((a) => (a.beforeNm !== null && a.afterNm !== null ? [{ turns: a.amountMilli / 1000, beforeNm: a.beforeNm, afterNm: a.afterNm }] : [])),
    recentReadingsNm: recent,
    defaultResponseNmPerTurn: h.settings.defaultResponseNmPerTurn,
    stepTurns: h.station.adjustStepMilli / 1000,
  });

  const wheel = h.station.wheel;
  let wheelLife: StationDetail['wheelLife'] = null;
  if (wheel) {
    const points = [
      { passes: 0, diameterNm: wheel.diameterNewNm, at: new Date(wheel.mountedAt) },
      ...h.wheelEvents.filter((e) => e.kind === 'dressing' && e.diameterNm !== null && e.at > new Date(wheel.mountedAt)).map((e) => ({ passes: e.passesBefore, diameterNm: e.diameterNm as number, at: e.at })),
    ];
    const wear = wheelWear({ points, minDiameterNm: wheel.minDiameterNm, now: h.now });
    const speed = speedCheck({ diameterNm: wheel.diameterNm, rpm: h.station.rpm, ratedMaxRpm: wheel.ratedMaxRpm });
    wheelLife = {
      wearPerPassNm: wear.wearPerPassNm,
      passesLeft: wear.passesLeft,
      daysLeft: wear.daysLeft,
      predictedAt: wear.predictedAt?.toISOString() ?? null,
      atOrBelowMinimum: wear.atOrBelowMinimum,
      sfpm: speed.sfpm,
      speedStatus: speed.status,
      maxRpm: speed.maxRpm,
    };
  }

  return {
    station: h.station,
    bands: { trueNm: bands.trueNm, fairNm: bands.fairNm, source: bands.source, precision: bands.precision },
    readings,
    bandMix,
    drift,
    advice: JSON.parse(JSON.stringify(advice)) as StationDetail['advice'],
    adjustments: adjustments.map((a) => ({ ...a, at: a.at.toISOString() })).reverse(),
    wheelLife,
    wheelEvents: h.wheelEvents.map((e) => ({ kind: e.kind, hollowNm: e.hollowNm, diameterNm: e.diameterNm, at: e.at.toISOString(), note: e.note })).reverse(),
  };
}
