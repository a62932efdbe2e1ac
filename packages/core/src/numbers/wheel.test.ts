import { unit } from 'mathjs';
import { linearRegression } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { inchesToNm, mmToNm } from './units';
import { speedCheck, surfaceSpeedMps, surfaceSpeedSfpm, wheelWear } from './wheel';

const DAY = 86_400_000;
const mounted = new Date('2025-01-06T15:00:00Z');
const day = (n: number) => new Date(mounted.getTime() + n * DAY);

describe('surface speed', () => {
  it('is π·D·RPM/12 feet per minute', () => {
    // trade-facts.md, "Grinding-wheel safety" (29 CFR 1910.215 context): SFPM = π·D(in)·RPM/12; 6" at 3450 RPM = 1725π.
    expect(surfaceSpeedSfpm(inchesToNm(6), 3450)).toBeCloseTo(1725 * Math.PI, 9);
    expect(surfaceSpeedSfpm(inchesToNm(6), 0)).toBe(0);
  });

  it('gives the same speed in metres per second', () => {
    const sfpm = surfaceSpeedSfpm(mmToNm(200), 2850);
    // mathjs unit conversion, ft/min to m/s (1 ft = 0.3048 m exactly, NIST "Length").
    expect(surfaceSpeedMps(mmToNm(200), 2850)).toBeCloseTo(unit(sfpm, 'ft/min').toNumber('m/s'), 9);
  });

  it('refuses a wheel of no size or a negative speed', () => {
    expect(() => surfaceSpeedSfpm(0, 3000)).toThrow(RangeError);
    expect(() => surfaceSpeedMps(mmToNm(150), -1)).toThrow(RangeError);
  });
});

describe('speedCheck', () => {
  const sixInch = inchesToNm(6);

  it('is within the RPM rating up to and at the marked speed, and over above it', () => {
    expect(speedCheck({ diameterNm: sixInch, rpm: 3450, ratedMaxRpm: 3600 })).toMatchObject({ status: 'within', overRpm: false, maxRpm: 3600 });
    expect(speedCheck({ diameterNm: sixInch, rpm: 3600, ratedMaxRpm: 3600 }).status).toBe('within');
    expect(speedCheck({ diameterNm: sixInch, rpm: 3601, ratedMaxRpm: 3600 })).toMatchObject({ status: 'over', overRpm: true });
  });

  it('checks a surface-speed rating at the current diameter', () => {
    // 8" at 3450 RPM is 2300π ≈ 7226 SFPM (π·D·RPM/12, trade-facts.md), over a 6500 SFPM marking.
    const check = speedCheck({ diameterNm: inchesToNm(8), rpm: 3450, ratedMaxSfpm: 6500, ratedMaxRpm: 4000 });
    expect(check).toMatchObject({ status: 'over', overSfpm: true, overRpm: false });
    // The RPM that gives 6500 SFPM on 8": 6500·12/(8π).
    expect(check.maxRpm).toBeCloseTo((6500 * 12) / (8 * Math.PI), 9);
    expect(speedCheck({ diameterNm: inchesToNm(6), rpm: 3450, ratedMaxSfpm: 6500 }).status).toBe('within');
  });

  it('says when there is no rating to check against', () => {
    expect(speedCheck({ diameterNm: sixInch, rpm: 3450 })).toMatchObject({ status: 'unrated', overRpm: null, overSfpm: null, maxRpm: null });
    expect(() => speedCheck({ diameterNm: sixInch, rpm: 3450, ratedMaxRpm: 0 })).toThrow(RangeError);
  });
});

describe('wheelWear', () => {
  // Made-up wheel: 200 mm new, losing 0.5 mm per 1000 passes, 100 passes a day, minimum 150 mm.
  const steady = [0, 10, 20, 30].map((d) => ({ passes: 100 * d, diameterNm: mmToNm(200) - 500 * 100 * d, at: day(d) }));

  it('predicts passes and days left from a steady wheel', () => {
    const wear = wheelWear({ points: steady, minDiameterNm: mmToNm(150), now: day(40) });
    expect(wear.wearPerPassNm).toBeCloseTo(500, 9);
    expect(wear.passesPerDay).toBeCloseTo(100, 9);
    // From 198.5 mm at 3000 passes: 48.5 mm / 500 nm = 97,000 passes, 970 days after day 30, so 960 from day 40.
    expect(wear.passesLeft).toBe(97_000);
    expect(wear.daysLeft).toBeCloseTo(960, 9);
    expect(wear.predictedAt?.getTime()).toBe(day(1000).getTime());
    expect(wear.atOrBelowMinimum).toBe(false);
  });

  it('fits the wear by least squares, as a general statistics library does', () => {
    const noisy = [
      { passes: 0, diameterNm: 200_000_000, at: day(0) },
      { passes: 450, diameterNm: 199_810_000, at: day(4) },
      { passes: 1300, diameterNm: 199_320_000, at: day(11) },
      { passes: 2100, diameterNm: 198_990_000, at: day(20) },
      { passes: 2600, diameterNm: 198_610_000, at: day(26) },
    ];
    const wear = wheelWear({ points: noisy, minDiameterNm: mmToNm(150), now: day(26) });
    // simple-statistics linearRegression (independent least-squares implementation).
    const reference = linearRegression(noisy.map((p) => [p.passes, p.diameterNm]));
    expect(wear.wearPerPassNm).toBeCloseTo(-reference.m, 9);
    const rate = linearRegression(noisy.map((p) => [(p.at.getTime() - day(0).getTime()) / DAY, p.passes]));
    expect(wear.passesPerDay).toBeCloseTo(rate.m, 9);
    expect(wear.passesLeft).toBe(Math.floor((198_610_000 - mmToNm(150)) / -reference.m));
  });

  it('counts from the latest measured diameter, so a dressing shortens the prediction at once', () => {
    const dressed = [...steady, { passes: 3000, diameterNm: mmToNm(196), at: day(30.05) }];
    const wear = wheelWear({ points: dressed, minDiameterNm: mmToNm(150), now: day(31) });
    expect(wear.lastDiameterNm).toBe(mmToNm(196));
    expect(wear.passesLeft).toBe(Math.floor(mmToNm(46) / (wear.wearPerPassNm ?? Number.NaN)));
  });

  it('says 0 left at or below the minimum', () => {
    const worn = [...steady, { passes: 3100, diameterNm: mmToNm(150), at: day(31) }];
    const wear = wheelWear({ points: worn, minDiameterNm: mmToNm(150), now: day(35) });
    expect(wear).toMatchObject({ atOrBelowMinimum: true, passesLeft: 0, daysLeft: 0 });
  });

  it('gives null where nothing can be estimated', () => {
    expect(wheelWear({ points: [], minDiameterNm: mmToNm(150), now: day(0) })).toMatchObject({
      n: 0,
      wearPerPassNm: null,
      passesLeft: null,
      daysLeft: null,
      predictedAt: null,
      lastDiameterNm: null,
    });
    const one = wheelWear({ points: steady.slice(0, 1), minDiameterNm: mmToNm(150), now: day(0) });
    expect(one).toMatchObject({ n: 1, wearPerPassNm: null, passesLeft: null, lastDiameterNm: mmToNm(200) });
    const noWear = wheelWear({ points: steady.map((p) => ({ ...p, diameterNm: mmToNm(200) })), minDiameterNm: mmToNm(150), now: day(40) });
    expect(noWear).toMatchObject({ wearPerPassNm: null, passesLeft: null, daysLeft: null, passesPerDay: 100 });
    const sameDay = wheelWear({ points: steady.map((p) => ({ ...p, at: day(0) })), minDiameterNm: mmToNm(150), now: day(1) });
    expect(sameDay).toMatchObject({ passesLeft: 97_000, passesPerDay: null, daysLeft: null });
  });

  it('refuses impossible measurements', () => {
    expect(() => wheelWear({ points: [{ passes: -1, diameterNm: 1, at: day(0) }], minDiameterNm: 1, now: day(0) })).toThrow(RangeError);
    expect(() => wheelWear({ points: [], minDiameterNm: 0, now: day(0) })).toThrow(RangeError);
    expect(() => wheelWear({ points: [{ passes: 0, diameterNm: 1, at: new Date(Number.NaN) }], minDiameterNm: 1, now: day(0) })).toThrow(RangeError);
  });
});
