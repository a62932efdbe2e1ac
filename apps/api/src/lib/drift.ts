import { driftWatch, type DeskSettings } from '@rinkwright/core';

// The drift watch as the rink has set it up, shared by the station screens and the quality report.

/** The drift watch, its chart and the band mix cover the station's latest readings, the same on every screen. */
export const DRIFT_WINDOW = 120;

export const driftOptions = (settings: DeskSettings) => ({ target: 0, lambda: settings.ewmaLambdaMilli / 1000, k: settings.ewmaKMilli / 1000 });

export function driftAlertOf(readingsNm: number[], settings: DeskSettings): boolean {
  return driftWatch(readingsNm, driftOptions(settings)).alert;
}
