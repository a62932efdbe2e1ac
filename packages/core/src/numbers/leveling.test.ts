import { linearRegression, sampleCorrelation } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { effectWindows, fitLevelingResponse, levelingAdvice, type LevelingAdviceInput } from './leveling';

// A made-up station: each turn lowers the reading by 20,000 nm, with a little scatter and a small offset.
const TURNS = [-1, -0.5, 0.25, 0.5, 1, 1.5];
const SCATTER = [300, -450, 120, -80, 500, -250];
const adjustments = TURNS.map((turns, i) => {
  const beforeNm = 40_000 - 7_000 * i;
  return { turns, beforeNm, afterNm: beforeNm + 150 - 20_000 * turns + (SCATTER[i] as number) };
});
const points = adjustments.map((a) => ({ turns: a.turns, deltaNm: a.afterNm - a.beforeNm }));

const around = (meanNm: number, spread = 200): number[] => [meanNm - spread, meanNm, meanNm + spread, meanNm];

function advise(overrides: Partial<LevelingAdviceInput>) {
  return levelingAdvice({
    adjustments: [],
    recentReadingsNm: around(0),
    defaultResponseNmPerTurn: -25_400,
    stepTurns: 0.25,
    ...overrides,
  });
}

describe('fitLevelingResponse', () => {
  it('matches a general statistics library on slope and intercept', () => {
    const fit = fitLevelingResponse(points);
    // simple-statistics linearRegression (independent least-squares implementation).
    const reference = linearRegression(points.map((p) => [p.turns, p.deltaNm]));
    expect(fit?.n).toBe(6);
    expect(fit?.slopeNmPerTurn).toBeCloseTo(reference.m, 8);
    expect(fit?.interceptNm).toBeCloseTo(reference.b, 8);
    expect(fit?.slopeNmPerTurn).toBeCloseTo(-20_000, -3);
  });

  it('gives the slope\u2019s standard error that the correlation implies', () => {
    const fit = fitLevelingResponse(points);
    const r = sampleCorrelation(
      points.map((p) => p.turns),
      points.map((p) => p.deltaNm),
    );
    const n = points.length;
    // Standard least-squares identity SE(b) = |b|·√((1 − r²)/(r²(n − 2))) (from memory), with r from simple-statistics.
    const expected = Math.abs(fit?.slopeNmPerTurn ?? Number.NaN) * Math.sqrt((1 - r * r) / (r * r * (n - 2)));
    expect(fit?.stdErrSlope).toBeCloseTo(expected, 6);
  });

  it('has no standard error for two points, and no line for one point or equal turns', () => {
    expect(fitLevelingResponse(points.slice(0, 2))?.stdErrSlope).toBeNull();
    expect(fitLevelingResponse(points.slice(0, 2))?.slopeNmPerTurn).toBeCloseTo((points[1]!.deltaNm - points[0]!.deltaNm) / 0.5, 9);
    expect(fitLevelingResponse(points.slice(0, 1))).toBeNull();
    expect(fitLevelingResponse([])).toBeNull();
    expect(fitLevelingResponse([1, 1, 1].map((turns) => ({ turns, deltaNm: -20_000 })))).toBeNull();
  });

  it('gives a zero standard error for points exactly on a line', () => {
    const exact = fitLevelingResponse([0, 1, 2].map((turns) => ({ turns, deltaNm: -10_000 * turns })));
    expect(exact).toEqual({ slopeNmPerTurn: -10_000, interceptNm: 0, stdErrSlope: 0, n: 3 });
  });
});

describe('levelingAdvice', () => {
  it('brings the predicted mean to zero, not part of the way', () => {
    const result = advise({ adjustments, recentReadingsNm: around(55_000) });
    expect(result.kind).toBe('advise');
    if (result.kind !== 'advise') return;
    expect(result.responseSource).toBe('fit');
    expect(result.rawTurns).toBeCloseTo(-result.meanNm / result.responseNmPerTurn, 9);
    // The whole correction: about 2.75 turns for +55,000 nm at about −20,000 nm per turn.
    expect(result.turns).toBe(2.75);
    expect(result.steps).toBe(11);
    const predicted = result.meanNm + result.responseNmPerTurn * result.turns;
    expect(result.predictedMeanNm).toBeCloseTo(predicted, 6);
    expect(Math.abs(predicted)).toBeLessThanOrEqual(result.stepEffectNm / 2);
    expect(Math.abs(predicted)).toBeLessThan(result.stepEffectNm);
  });

  it('rounds to the nearest step, away from zero on a half, in both directions', () => {
    // With the default −25,400 nm per turn, rawTurns = −mean / −25,400: a mean of 25,400·x asks for x turns.
    const at = (rawTurns: number, step = 0.5) => advise({ recentReadingsNm: around(25_400 * rawTurns), stepTurns: step });
    expect(at(0.8)).toMatchObject({ kind: 'advise', turns: 1, steps: 2 });
    expect(at(-0.8)).toMatchObject({ kind: 'advise', turns: -1, steps: -2 });
    expect(at(0.7)).toMatchObject({ kind: 'advise', turns: 0.5, steps: 1 });
    expect(at(0.25)).toMatchObject({ kind: 'advise', turns: 0.5 });
    expect(at(-0.25)).toMatchObject({ kind: 'advise', turns: -0.5 });
    expect(at(0.3, 0.1)).toMatchObject({ kind: 'advise', turns: 0.3, steps: 3 });
  });

  it('says level when no step can bring the mean closer to zero', () => {
    const result = advise({ recentReadingsNm: around(25_400 * 0.2), stepTurns: 0.5 });
    expect(result).toMatchObject({ kind: 'level', rawTurns: 0.2, responseSource: 'default' });
  });

  it('says level within the station\u2019s own dead band', () => {
    expect(advise({ recentReadingsNm: around(20_000), levelToleranceNm: 25_400 }).kind).toBe('level');
    expect(advise({ recentReadingsNm: around(20_000), levelToleranceNm: 19_999 }).kind).toBe('advise');
  });

  it('uses the rink\u2019s default response until the station has enough adjustments of its own', () => {
    const two = advise({ adjustments: adjustments.slice(0, 2), recentReadingsNm: around(50_800) });
    expect(two).toMatchObject({ kind: 'advise', responseSource: 'default', responseNmPerTurn: -25_400, turns: 2 });
    const sameTurns = [1, 1, 1].map((turns, i) => ({ turns, beforeNm: 10_000 * i, afterNm: 10_000 * i - 20_000 }));
    expect(advise({ adjustments: sameTurns, recentReadingsNm: around(50_800) })).toMatchObject({ kind: 'advise', responseSource: 'default', fit: null });
    expect(advise({ adjustments, minPoints: 7, recentReadingsNm: around(50_800) })).toMatchObject({ responseSource: 'default' });
  });

  it('gives the uncertainty of the turns from the readings\u2019 scatter when the response is the default', () => {
    const readings = around(50_800, 2_000);
    const result = advise({ recentReadingsNm: readings });
    if (result.kind !== 'advise') throw new Error(`expected advice, got ${result.kind}`);
    // Sample standard deviation of [−2000, 0, 2000, 0] about their mean is √(8e6/3); its standard error over 4 readings.
    const sem = Math.sqrt(8_000_000 / 3) / 2;
    expect(result.stdErrMeanNm).toBeCloseTo(sem, 6);
    expect(result.uncertaintyTurns).toBeCloseTo(sem / 25_400, 9);
  });

  it('adds the fit\u2019s uncertainty when the response comes from the fit', () => {
    const result = advise({ adjustments, recentReadingsNm: around(55_000) });
    if (result.kind !== 'advise') throw new Error(`expected advice, got ${result.kind}`);
    expect(result.uncertaintyTurns).toBeGreaterThan(result.stdErrMeanNm / Math.abs(result.responseNmPerTurn));
  });

  it('has nothing to say without recent readings, or with fewer than the minimum', () => {
    expect(advise({ recentReadingsNm: [] })).toEqual({ kind: 'not_enough_data', readingsCount: 0, minReadings: 3 });
    expect(advise({ recentReadingsNm: [30_000, 31_000] })).toMatchObject({ kind: 'not_enough_data', readingsCount: 2 });
    expect(advise({ recentReadingsNm: [30_000, 31_000], minReadings: 2 }).kind).toBe('advise');
  });

  it('calls a fit with zero slope too noisy rather than dividing by it', () => {
    const flat = [-1, 0, 1].map((turns) => ({ turns, beforeNm: 5_000, afterNm: 5_000 }));
    expect(advise({ adjustments: flat, recentReadingsNm: around(40_000) })).toMatchObject({
      kind: 'too_noisy',
      reason: 'response_fit',
      relativeStdErr: null,
    });
  });

  it('calls a scattered fit too noisy, at a relative standard error over 0.25', () => {
    const scattered = [-1, -0.5, 0.5, 1].map((turns, i) => ({ turns, beforeNm: 0, afterNm: -20_000 * turns + [15_000, -12_000, 14_000, -16_000][i]! }));
    const result = advise({ adjustments: scattered, recentReadingsNm: around(40_000) });
    expect(result).toMatchObject({ kind: 'too_noisy', reason: 'response_fit', maxRelativeStdErr: 0.25 });
    if (result.kind !== 'too_noisy' || result.reason !== 'response_fit') return;
    expect(result.relativeStdErr).toBeGreaterThan(0.25);
    // The same data pass once the threshold is raised above their relative error.
    expect(advise({ adjustments: scattered, recentReadingsNm: around(40_000), maxFitRelativeStdErr: (result.relativeStdErr ?? 0) + 0.01 }).kind).toBe('advise');
  });

  it('calls scattered readings too noisy rather than level or a guess', () => {
    const result = advise({ recentReadingsNm: [60_000, -55_000, 58_000, -50_000] });
    expect(result).toMatchObject({ kind: 'too_noisy', reason: 'readings' });
    if (result.kind !== 'too_noisy' || result.reason !== 'readings') return;
    expect(result.stdErrMeanNm).toBeGreaterThan(result.allowedStdErrMeanNm);
    // The same spread around a large offset leaves the mean meaningful.
    expect(advise({ recentReadingsNm: [260_000, 145_000, 258_000, 150_000] }).kind).toBe('advise');
  });

  it('refuses settings that cannot give advice', () => {
    expect(() => advise({ stepTurns: 0 })).toThrow(RangeError);
    expect(() => advise({ defaultResponseNmPerTurn: 0 })).toThrow(RangeError);
    expect(() => advise({ minPoints: 2 })).toThrow(RangeError);
    expect(() => advise({ minReadings: 1 })).toThrow(RangeError);
    expect(() => advise({ recentReadingsNm: [1, Number.NaN, 2] })).toThrow(RangeError);
  });
});

describe('the readings that show an adjustment’s effect (worked by hand)', () => {
  // Readings at minutes 1–30; adjustments at 12.5, 20 (exactly on a reading) and 29.5.
  const readings = Array.from({ length: 30 }, (_, i) => i + 1);
  const windows = effectWindows(readings, [12.5, 20, 29.5]);
  const times = (range: [number, number]) => readings.slice(range[0], range[1]);

  it('takes at most ten readings before, back to the previous adjustment', () => {
    // 12.5: ten before it, minutes 3–12 (1 and 2 are beyond the ten). 20: only 13–19, after 12.5.
    expect(times(windows[0]!.before)).toEqual([3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
    expect(times(windows[1]!.before)).toEqual([13, 14, 15, 16, 17, 18, 19]);
  });

  it('takes at most ten readings after, up to the next adjustment, and none at the adjustment’s own moment', () => {
    // 12.5: 13–19, then 20 is the next adjustment's own time. 20: 21–29 (nine, 30 is after 29.5). 29.5: only 30.
    expect(times(windows[0]!.after)).toEqual([13, 14, 15, 16, 17, 18, 19]);
    expect(times(windows[1]!.after)).toEqual([21, 22, 23, 24, 25, 26, 27, 28, 29]);
    expect(times(windows[2]!.before)).toEqual([21, 22, 23, 24, 25, 26, 27, 28, 29]);
    expect(times(windows[2]!.after)).toEqual([30]);
  });

  it('caps each side at the size it is given', () => {
    expect(times(effectWindows(readings, [12.5], 3)[0]!.before)).toEqual([10, 11, 12]);
    expect(times(effectWindows(readings, [12.5], 3)[0]!.after)).toEqual([13, 14, 15]);
    expect(effectWindows([], [5])).toEqual([{ before: [0, 0], after: [0, 0] }]);
  });
});
