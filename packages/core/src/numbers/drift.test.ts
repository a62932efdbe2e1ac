import { describe, expect, it } from 'vitest';
import { D2, D4, driftWatch, ewmaChart, imrChart, runRules, type RunRuleId } from './drift';

// NIST/SEMATECH e-Handbook of Statistical Methods, §6.3.2.2, worked individuals data (via trade-facts.md).
const IMR_DATA = [49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1];

// NIST/SEMATECH e-Handbook §6.3.2.4, worked EWMA data and its EWMA column to two places (via trade-facts.md).
const EWMA_DATA = [52.0, 47.0, 53.0, 49.3, 50.1, 47.0, 51.0, 50.1, 51.2, 50.5, 49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1];
const EWMA_TABLE = [
  50.6, 49.52, 50.56, 50.18, 50.16, 49.21, 49.75, 49.85, 50.26, 50.33, 50.11, 49.36, 49.52, 50.05, 49.38, 49.92, 50.73, 51.23, 51.94, 51.99,
];

// A made-up station in control around level: alternating scatter of about ±1 thou, in nm.
const STABLE = [1200, -800, 300, -1500, 900, 100, -600, 1400, -300, -1000, 700, -200, 1100, -900, 400, -100, 600, -1300, 200, -400];

describe('imrChart', () => {
  it('uses d₂ = 1.128 and D₄ = 3.267', () => {
    // NIST e-Handbook §6.3.2.1, table of control-chart constants, n = 2 row.
    expect(D2).toBe(1.128);
    expect(D4).toBe(3.267);
  });

  it('reproduces the Handbook\u2019s worked individuals chart', () => {
    const chart = imrChart(IMR_DATA);
    // NIST e-Handbook §6.3.2.2 worked example: x̄ = 50.81, MR̄ = 1.8778, UCL = 55.8041, LCL = 45.8159 (with 3/1.128).
    expect(chart.mean).toBeCloseTo(50.81, 10);
    expect(chart.mrBar).toBeCloseTo(1.8778, 4);
    expect(chart.ucl).toBeCloseTo(55.8041, 4);
    expect(chart.lcl).toBeCloseTo(45.8159, 4);
    // NIST e-Handbook §6.3.2.2: MR chart upper limit D₄·MR̄ = 3.267 × 1.8778 = 6.1347.
    expect(chart.mrUcl).toBeCloseTo(6.1347, 4);
    expect(chart.movingRanges).toHaveLength(9);
    expect(chart.movingRanges[0]).toBeCloseTo(2, 10);
    expect(chart.outOfControl).toEqual([]);
    expect(chart.mrOutOfControl).toEqual([]);
  });

  it('flags values beyond the limits and jumps beyond the moving-range limit', () => {
    const spiked = imrChart([0, 1, 0, 1, 0, 1, 0, 1, 0, 12]);
    expect(spiked.outOfControl).toEqual([9]);
    expect(spiked.mrOutOfControl).toEqual([9]);
    expect(imrChart([0, 1, 0, 1, 0, 1, 0, 1, 0, 3]).outOfControl).toEqual([]);
  });

  it('needs two values for a moving range', () => {
    expect(() => imrChart([])).toThrow(RangeError);
    expect(() => imrChart([1])).toThrow(RangeError);
    expect(() => imrChart([1, Number.NaN])).toThrow(RangeError);
  });
});

describe('ewmaChart', () => {
  it('reproduces the Handbook\u2019s worked EWMA series and limits', () => {
    const chart = ewmaChart(EWMA_DATA, { lambda: 0.3, start: 50, sigma: 2.0539, k: 3 });
    // NIST e-Handbook §6.3.2.4 worked example, EWMA column given to two places: each value rounds to it.
    chart.ewma.forEach((value, i) => expect(value).toBeCloseTo(EWMA_TABLE[i] as number, 2));
    expect(chart.ewma).toHaveLength(20);
    // NIST e-Handbook §6.3.2.4: UCL = 52.5884, LCL = 47.4115 (compared within 1e-3).
    expect(Math.abs(chart.ucl - 52.5884)).toBeLessThan(1e-3);
    expect(Math.abs(chart.lcl - 47.4115)).toBeLessThan(1e-3);
    expect(chart.outOfControl).toEqual([]);
  });

  it('defaults to λ = 0.2 and k = 3', () => {
    // √(0.2 / 1.8) = 1/3 exactly, so σ = 1 gives limits ±1 (arithmetic).
    const chart = ewmaChart([], { sigma: 1, start: 0 });
    expect(chart.ucl).toBeCloseTo(1, 12);
    expect(chart.lcl).toBeCloseTo(-1, 12);
  });

  it('flags the points where the EWMA leaves its limits', () => {
    const chart = ewmaChart([0, 0, 3, 3, 3, 0], { sigma: 1, start: 0 });
    // EWMA: 0, 0, 0.6, 1.08, 1.464, 1.1712 against a limit of 1 (λ = 0.2 arithmetic).
    expect(chart.ewma[4]).toBeCloseTo(1.464, 12);
    expect(chart.outOfControl).toEqual([3, 4, 5]);
  });

  it('refuses λ outside (0, 1] and a negative σ', () => {
    expect(() => ewmaChart([1], { sigma: 1, start: 0, lambda: 0 })).toThrow(RangeError);
    expect(() => ewmaChart([1], { sigma: 1, start: 0, lambda: 1.5 })).toThrow(RangeError);
    expect(() => ewmaChart([1], { sigma: -1, start: 0 })).toThrow(RangeError);
  });
});

describe('runRules', () => {
  // Western Electric Statistical Quality Control Handbook (1956), as also listed in NIST e-Handbook §6.3.2 — from
  // memory: 1 point beyond 3σ; 2 of 3 beyond 2σ on one side; 4 of 5 beyond 1σ on one side; 8 in a row on one side.
  const fired = (values: number[], rule: RunRuleId) =>
    runRules(values, { center: 0, sigma: 1 })
      .filter((v) => v.rule === rule)
      .map((v) => [v.index, v.side]);

  it('rule 1: one point beyond 3σ, strictly', () => {
    expect(fired([0, 3.01, -3.5], 'beyond_3_sigma')).toEqual([
      [1, 'above'],
      [2, 'below'],
    ]);
    expect(fired([3, -3], 'beyond_3_sigma')).toEqual([]);
  });

  it('rule 2: two of three beyond 2σ on the same side, fired at the point that completes it', () => {
    expect(fired([0, 2.1, 0, 2.1], 'two_of_three_beyond_2_sigma')).toEqual([[3, 'above']]);
    expect(fired([-2.1, -2.1, 0], 'two_of_three_beyond_2_sigma')).toEqual([[1, 'below']]);
    expect(fired([2.1, 0, 0, 2.1], 'two_of_three_beyond_2_sigma')).toEqual([]);
    expect(fired([2.1, -2.1, 0], 'two_of_three_beyond_2_sigma')).toEqual([]);
    expect(fired([2, 2, 2], 'two_of_three_beyond_2_sigma')).toEqual([]);
  });

  it('rule 3: four of five beyond 1σ on the same side', () => {
    expect(fired([1.1, 1.1, 0, 1.1, 1.1], 'four_of_five_beyond_1_sigma')).toEqual([[4, 'above']]);
    expect(fired([1.1, 1.1, 1.1, 0.5, 0.5], 'four_of_five_beyond_1_sigma')).toEqual([]);
    expect(fired([-1.1, -1.1, 1.1, -1.1, -1.1], 'four_of_five_beyond_1_sigma')).toEqual([[4, 'below']]);
  });

  it('rule 4: eight in a row on one side, again at each point that extends the run', () => {
    expect(fired(Array<number>(8).fill(0.1), 'eight_on_one_side')).toEqual([[7, 'above']]);
    expect(fired(Array<number>(9).fill(-0.1), 'eight_on_one_side')).toEqual([
      [7, 'below'],
      [8, 'below'],
    ]);
    expect(fired(Array<number>(7).fill(0.1), 'eight_on_one_side')).toEqual([]);
    // A point on the centre line breaks the run.
    expect(fired([0.1, 0.1, 0.1, 0, 0.1, 0.1, 0.1, 0.1, 0.1], 'eight_on_one_side')).toEqual([]);
  });

  it('finds nothing in a station in control', () => {
    const sigma = imrChart(STABLE).sigma;
    expect(runRules(STABLE, { center: 0, sigma })).toEqual([]);
  });
});

describe('driftWatch', () => {
  it('waits for enough readings', () => {
    expect(driftWatch(STABLE.slice(0, 9))).toEqual({ status: 'not_enough_data', alert: false, reasons: [], readingsCount: 9, minReadings: 10 });
    expect(driftWatch(STABLE.slice(0, 10)).status).toBe('watching');
  });

  it('raises no alert for a station in control', () => {
    const watch = driftWatch(STABLE);
    expect(watch.alert).toBe(false);
    expect(watch.reasons).toEqual([]);
  });

  it('raises an alert when the readings drift off level, from the EWMA and the run rules', () => {
    const watch = driftWatch([...STABLE, 2500, 3000, 2800, 3500, 3200, 3900, 3600, 4200]);
    expect(watch.alert).toBe(true);
    if (watch.status !== 'watching') return;
    const charts = new Set(watch.reasons.map((r) => r.chart));
    expect(charts.has('ewma')).toBe(true);
    expect(watch.reasons.some((r) => r.rule === 'eight_on_one_side' && r.index === 27)).toBe(true);
    expect(watch.reasons.every((r) => r.index >= 28 - 5)).toBe(true);
  });

  it('lets an old spike stay on the chart without keeping the alert up', () => {
    const spiked = [...STABLE];
    spiked[3] = 9000;
    const watch = driftWatch(spiked);
    if (watch.status !== 'watching') throw new Error('expected a chart');
    expect(watch.imr.outOfControl).toEqual([3]);
    expect(watch.alert).toBe(false);
    // The same spike among the last five readings raises it.
    const recent = [...STABLE];
    recent[17] = 9000;
    expect(driftWatch(recent).alert).toBe(true);
  });

  it('uses a given σ instead of the moving-range estimate', () => {
    const watch = driftWatch(STABLE, { sigma: 100 });
    if (watch.status !== 'watching') throw new Error('expected a chart');
    expect(watch.sigma).toBe(100);
    expect(watch.alert).toBe(true);
  });
});
