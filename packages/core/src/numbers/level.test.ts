import { describe, expect, it } from 'vitest';
import {
  bandsFor,
  barEndRiseNm,
  classifyLevel,
  levelBandsSchema,
  levelFromTilt,
  levelPosition,
  tiltFromLevel,
  validateBands,
  type LevelBands,
} from './level';
import { inchesToNm, mmToNm, nmToMm, thousandthsToNm } from './units';

const width = mmToNm(2.9);
const thou = thousandthsToNm(1);
// Made-up rink limits: true within 1 thou, fair within 2 thou.
const bands: LevelBands = { trueNm: thou, fairNm: 2 * thou };

describe('tilt and level', () => {
  it('reproduces the worked example: 0.001" on a 2.9 mm blade is a tilt of 0.5018°', () => {
    // trade-facts.md, "Edge level": Δh = w·tan θ; w = 2.9 mm, Δh = 0.001" gives θ = 0.5018°.
    expect(tiltFromLevel(width, thou)).toBeCloseTo(0.5018, 4);
    // trade-facts.md, same example: θ = 0.5018° back to Δh, within the rounding of the angle to four places.
    expect(Math.abs(levelFromTilt(width, 0.5018) - thou)).toBeLessThanOrEqual(3);
    expect(levelFromTilt(width, tiltFromLevel(width, thou))).toBe(thou);
  });

  it('reproduces the bar example: a 6" bar magnifies that 0.001" to 1.335 mm between its ends', () => {
    // trade-facts.md, "Edge level": L·Δh/w for L = 6", w = 2.9 mm, Δh = 0.001" → 1.335 mm.
    expect(nmToMm(barEndRiseNm(inchesToNm(6), width, thou))).toBeCloseTo(1.335, 3);
  });

  it('keeps the sign: a tilt the other way is the mirror reading', () => {
    expect(levelFromTilt(width, -0.5018)).toBe(-levelFromTilt(width, 0.5018));
    expect(tiltFromLevel(width, -thou)).toBeCloseTo(-tiltFromLevel(width, thou), 12);
    expect(levelFromTilt(width, 0)).toBe(0);
  });

  it('refuses impossible tilts and widths', () => {
    expect(() => levelFromTilt(width, 90)).toThrow(RangeError);
    expect(() => levelFromTilt(0, 1)).toThrow(RangeError);
    expect(() => tiltFromLevel(width, Number.NaN)).toThrow(RangeError);
    expect(() => barEndRiseNm(0, width, thou)).toThrow(RangeError);
  });
});

describe('classifyLevel', () => {
  it('puts a reading exactly on a limit in the better band, on either side of zero', () => {
    expect(classifyLevel(0, bands)).toBe('true');
    expect(classifyLevel(thou, bands)).toBe('true');
    expect(classifyLevel(-thou, bands)).toBe('true');
    expect(classifyLevel(thou + 1, bands)).toBe('fair');
    expect(classifyLevel(-(thou + 1), bands)).toBe('fair');
    expect(classifyLevel(2 * thou, bands)).toBe('fair');
    expect(classifyLevel(-2 * thou, bands)).toBe('fair');
    expect(classifyLevel(2 * thou + 1, bands)).toBe('off');
    expect(classifyLevel(-(2 * thou + 1), bands)).toBe('off');
  });

  it('allows equal limits, which leave no fair band', () => {
    const tight = { trueNm: thou, fairNm: thou };
    expect(classifyLevel(thou, tight)).toBe('true');
    expect(classifyLevel(thou + 1, tight)).toBe('off');
  });

  it('throws on limits that are not 0 < true ≤ fair, and on a reading that is not a number', () => {
    for (const bad of [
      { trueNm: 0, fairNm: thou },
      { trueNm: -thou, fairNm: thou },
      { trueNm: 2 * thou, fairNm: thou },
      { trueNm: Number.NaN, fairNm: thou },
      { trueNm: thou, fairNm: Number.POSITIVE_INFINITY },
    ]) {
      expect(() => classifyLevel(0, bad)).toThrow(RangeError);
    }
    expect(() => classifyLevel(Number.NaN, bands)).toThrow(RangeError);
  });
});

describe('validateBands and levelBandsSchema', () => {
  it('says nothing about good limits and names the field at fault otherwise', () => {
    expect(validateBands(bands)).toEqual({});
    expect(validateBands({ trueNm: 0, fairNm: thou })).toEqual({ trueNm: ['The true limit must be a number greater than zero'] });
    expect(validateBands({ trueNm: 2 * thou, fairNm: thou })).toEqual({ fairNm: ['The fair limit must be at least the true limit'] });
    expect(Object.keys(validateBands({ trueNm: Number.NaN, fairNm: -1 })).sort()).toEqual(['fairNm', 'trueNm']);
  });

  it('gives the same messages through zod, on the field at fault', () => {
    expect(levelBandsSchema.safeParse(bands).success).toBe(true);
    const result = levelBandsSchema.safeParse({ trueNm: 2 * thou, fairNm: thou });
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => [i.path, i.message])).toEqual([[['fairNm'], 'The fair limit must be at least the true limit']]);
  });
});

describe('levelPosition', () => {
  it('tells dead level from just inside a limit', () => {
    expect(levelPosition(0, bands)).toEqual({
      band: 'true',
      fractionOfLimit: 0,
      signedFraction: 0,
      trueLimitFraction: 0.5,
      side: 'level',
      marginToNextBandNm: thou,
      pastBetterBandNm: null,
    });
    const justInsideTrue = levelPosition(thou - 1, bands);
    expect(justInsideTrue.band).toBe('true');
    expect(justInsideTrue.marginToNextBandNm).toBe(1);
    expect(justInsideTrue.side).toBe('right');

    const onFair = levelPosition(-2 * thou, bands);
    expect(onFair).toMatchObject({ band: 'fair', fractionOfLimit: 1, signedFraction: -1, side: 'left', marginToNextBandNm: 0, pastBetterBandNm: thou });
  });

  it('says how far an off reading is past the fair limit', () => {
    const off = levelPosition(2 * thou + 500, bands);
    expect(off).toMatchObject({ band: 'off', marginToNextBandNm: null, pastBetterBandNm: 500, side: 'right' });
    expect(off.fractionOfLimit).toBeGreaterThan(1);
  });
});

describe('bandsFor', () => {
  const rink = { trueNm: thou, fairNm: 2 * thou, precisionTrueNm: thou / 2, precisionFairNm: thou };

  it('takes the station\u2019s own pair when both limits are set, else the rink\u2019s', () => {
    expect(bandsFor({ rink, station: { ownTrueNm: 2 * thou, ownFairNm: 3 * thou }, precision: false })).toEqual({
      trueNm: 2 * thou,
      fairNm: 3 * thou,
      source: 'station',
      precision: false,
    });
    expect(bandsFor({ rink, station: { ownTrueNm: 2 * thou, ownFairNm: null }, precision: false })).toMatchObject({ trueNm: thou, fairNm: 2 * thou, source: 'rink' });
    expect(bandsFor({ rink, station: null, precision: false })).toMatchObject({ trueNm: thou, fairNm: 2 * thou, source: 'rink' });
  });

  it('takes the rink\u2019s precision pair when precision is on', () => {
    expect(bandsFor({ rink, station: { ownTrueNm: 2 * thou, ownFairNm: 3 * thou }, precision: true })).toEqual({
      trueNm: thou / 2,
      fairNm: thou,
      source: 'rink',
      precision: true,
    });
  });

  it('refuses a chosen pair that is not valid', () => {
    expect(() => bandsFor({ rink: { ...rink, precisionTrueNm: 2 * thou }, precision: true })).toThrow(RangeError);
  });
});
