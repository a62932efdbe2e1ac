import { median as ssMedian, quantile } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import {
  firstPassTrueShare,
  meanAbsoluteReading,
  median,
  medianTurnaroundMinutes,
  pairsPerStaffedHour,
  percentile,
  reRunRate,
} from './throughput';
import { thousandthsToNm } from './units';

// Made-up turnaround minutes for a day at the counter, unsorted, with repeats.
const MINUTES = [42, 18, 95, 33, 27, 61, 18, 240, 55, 39, 47, 12, 70, 33];

describe('median and percentile', () => {
  it('agree with a general statistics library at every fifth percentile', () => {
    for (let p = 0; p <= 100; p += 5) {
      // simple-statistics quantile (7.12: linear interpolation, R/NumPy type 7).
      expect(percentile(MINUTES, p)).toBeCloseTo(quantile(MINUTES, p / 100), 10);
    }
    expect(median(MINUTES)).toBe(ssMedian(MINUTES));
    expect(median(MINUTES.slice(1))).toBe(ssMedian(MINUTES.slice(1)));
  });

  it('interpolate between closest ranks (Hyndman and Fan definition 7)', () => {
    // Hyndman & Fan (1996), "Sample quantiles in statistical packages", definition 7, worked by hand (from memory
    // of the definition): rank (n − 1)p = 0.75 → 1 + 0.75 × (2 − 1).
    expect(percentile([4, 1, 3, 2], 25)).toBe(1.75);
    expect(percentile([4, 1, 3, 2], 100)).toBe(4);
    expect(percentile([7], 90)).toBe(7);
  });

  it('give null for no data and refuse a percentile outside 0–100', () => {
    expect(median([])).toBeNull();
    expect(percentile([], 50)).toBeNull();
    expect(() => percentile(MINUTES, 101)).toThrow(RangeError);
    expect(() => percentile(MINUTES, -1)).toThrow(RangeError);
  });
});

describe('quality figures', () => {
  const bands = { trueNm: thousandthsToNm(1), fairNm: thousandthsToNm(2) };
  const readings = [
    { attempt: 1, readingNm: thousandthsToNm(0.4) },
    { attempt: 1, readingNm: thousandthsToNm(-1) },
    { attempt: 1, readingNm: thousandthsToNm(1.6) },
    { attempt: 2, readingNm: thousandthsToNm(0.2) },
    { attempt: 1, readingNm: thousandthsToNm(-2.5) },
    { attempt: 2, readingNm: thousandthsToNm(1.4) },
    { attempt: 3, readingNm: thousandthsToNm(0.1) },
  ];

  it('counts first readings only for the first-pass true share', () => {
    // Four first readings: 0.4 and −1.0 (on the limit) are true, 1.6 and −2.5 are not.
    expect(firstPassTrueShare(readings, bands)).toBe(0.5);
    expect(firstPassTrueShare(readings.filter((r) => r.attempt > 1), bands)).toBeNull();
  });

  it('classifies each reading by the limits it was taken under when given', () => {
    const precision = { trueNm: thousandthsToNm(0.5), fairNm: thousandthsToNm(1) };
    const underPrecision = readings.map((r) => ({ ...r, bands: precision }));
    expect(firstPassTrueShare(underPrecision, bands)).toBe(0.25);
  });

  it('counts a re-run blade once, however many attempts it took', () => {
    // Four blades, two of them re-run (one twice).
    expect(reRunRate(readings)).toBe(0.5);
    expect(reRunRate([])).toBeNull();
  });

  it('averages readings without letting the edges cancel', () => {
    expect(meanAbsoluteReading([thousandthsToNm(-2), thousandthsToNm(4)])).toBe(thousandthsToNm(3));
    expect(meanAbsoluteReading([])).toBeNull();
  });
});

describe('throughput figures', () => {
  it('gives pairs per staffed hour, and null for no staffed time', () => {
    expect(pairsPerStaffedHour(30, 240)).toBe(7.5);
    expect(pairsPerStaffedHour(0, 60)).toBe(0);
    expect(pairsPerStaffedHour(5, 0)).toBeNull();
    expect(() => pairsPerStaffedHour(5, -1)).toThrow(RangeError);
  });

  it('gives the median turnaround of the tickets that are ready', () => {
    const drop = new Date('2025-03-01T14:00:00Z');
    const after = (m: number) => new Date(drop.getTime() + m * 60_000);
    const tickets = [
      { droppedOffAt: drop, readyAt: after(20) },
      { droppedOffAt: drop, readyAt: after(45) },
      { droppedOffAt: drop, readyAt: null },
      { droppedOffAt: drop, readyAt: after(30) },
      { droppedOffAt: drop, readyAt: after(-5) },
    ];
    expect(medianTurnaroundMinutes(tickets)).toBe(30);
    expect(medianTurnaroundMinutes([])).toBeNull();
  });
});
