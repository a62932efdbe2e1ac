import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import {
  COMMON_HOLLOWS,
  formatLength,
  hundredthsMmToNm,
  inchesToNm,
  mmToNm,
  nmToHundredthsMm,
  nmToInches,
  nmToMm,
  nmToThousandths,
  thousandthsToNm,
} from './units';

// What a technician would type for each common hollow in a millimetre rink: the exact decimal of the fraction.
const HOLLOW_MM = ['9.525', '11.1125', '12.7', '15.875', '19.05', '25.4'];

describe('length units', () => {
  it('holds 1 in = 25.4 mm exactly', () => {
    // NIST, "Length" (nist.gov/pml/wmd/metric/length.cfm), citing the Federal Register notice of 30 June 1959.
    expect(inchesToNm(1)).toBe(25_400_000);
    expect(mmToNm(25.4)).toBe(25_400_000);
    expect(nmToMm(inchesToNm(1))).toBe(25.4);
  });

  it('agrees with an independent unit library on inch and millimetre conversions', () => {
    for (const inches of [0.001, 0.1142, 0.375, 0.4375, 0.5, 0.625, 0.75, 1, 6, 8.25]) {
      // mathjs unit conversion (independent implementation of the 1959 inch).
      expect(nmToMm(inchesToNm(inches))).toBeCloseTo(unit(inches, 'inch').toNumber('mm'), 9);
    }
    for (const mm of [0.01, 2.9, 3, 4, 152.4, 200]) {
      expect(nmToInches(mmToNm(mm))).toBeCloseTo(unit(mm, 'mm').toNumber('inch'), 12);
    }
  });

  it('lands every common hollow on the same whole nanometres from inches and from millimetres', () => {
    expect(COMMON_HOLLOWS.map((h) => h.label)).toEqual(['3/8"', '7/16"', '1/2"', '5/8"', '3/4"', '1"']);
    COMMON_HOLLOWS.forEach((h, i) => {
      expect(Number.isInteger(h.nm)).toBe(true);
      expect(inchesToNm(h.inches)).toBe(h.nm);
      expect(mmToNm(Number(HOLLOW_MM[i]))).toBe(h.nm);
      // Both directions of the round trip, exact in nm.
      expect(inchesToNm(nmToInches(h.nm))).toBe(h.nm);
      expect(mmToNm(nmToMm(h.nm))).toBe(h.nm);
      expect(mmToNm(nmToMm(inchesToNm(h.inches)))).toBe(h.nm);
      expect(inchesToNm(nmToInches(mmToNm(Number(HOLLOW_MM[i]))))).toBe(h.nm);
    });
  });

  it('round-trips any whole number of nanometres through inches, millimetres and the reading units', () => {
    // Steps of a prime so the sample covers residues that are not round in either unit, up to a 10 m length.
    for (let nm = -1_000_000_007; nm <= 10_000_000_000; nm += 99_999_989) {
      expect(inchesToNm(nmToInches(nm))).toBe(nm);
      expect(mmToNm(nmToMm(nm))).toBe(nm);
      expect(thousandthsToNm(nmToThousandths(nm))).toBe(nm);
      expect(hundredthsMmToNm(nmToHundredthsMm(nm))).toBe(nm);
    }
  });

  it('converts the level reading units', () => {
    // 0.001 in = 25,400 nm and 0.01 mm = 10,000 nm follow from 1 in = 25.4 mm (NIST, "Length").
    expect(thousandthsToNm(1)).toBe(25_400);
    expect(thousandthsToNm(1.2)).toBe(30_480);
    expect(hundredthsMmToNm(1)).toBe(10_000);
    expect(nmToThousandths(-50_800)).toBe(-2);
    expect(nmToHundredthsMm(25_400)).toBeCloseTo(2.54, 12);
  });

  it('rounds to the nearest nanometre symmetrically, so mirror readings stay mirrors', () => {
    expect(mmToNm(0.0000025)).toBe(3);
    expect(mmToNm(-0.0000025)).toBe(-3);
    expect(mmToNm(0.0000004)).toBe(0);
    expect(Object.is(mmToNm(-0.0000004), 0)).toBe(true);
  });

  it('refuses what is not a length', () => {
    expect(() => inchesToNm(Number.NaN)).toThrow(RangeError);
    expect(() => mmToNm(Number.POSITIVE_INFINITY)).toThrow(RangeError);
    expect(() => formatLength(Number.NaN, 'in', 'width')).toThrow(RangeError);
  });
});

describe('formatLength', () => {
  it('shows the common hollows as fractions in an inch rink, whichever unit they were typed in', () => {
    expect(COMMON_HOLLOWS.map((h) => formatLength(h.nm, 'in', 'hollow').value)).toEqual(['3/8', '7/16', '1/2', '5/8', '3/4', '1']);
    expect(formatLength(mmToNm(12.7), 'in', 'hollow')).toEqual({ value: '1/2', unit: 'in', text: '1/2"' });
  });

  it('shows other hollows as decimals, and every hollow in millimetres in a mm rink', () => {
    expect(formatLength(inchesToNm(0.55), 'in', 'hollow')).toEqual({ value: '0.55', unit: 'in', text: '0.55"' });
    expect(formatLength(inchesToNm(0.5625), 'in', 'hollow').value).toBe('0.5625');
    expect(formatLength(inchesToNm(0.5), 'mm', 'hollow')).toEqual({ value: '12.7', unit: 'mm', text: '12.7 mm' });
    expect(formatLength(inchesToNm(0.375), 'mm', 'hollow').value).toBe('9.525');
    expect(formatLength(mmToNm(10), 'mm', 'hollow').value).toBe('10');
  });

  it('shows readings signed, in thousandths of an inch or hundredths of a millimetre', () => {
    expect(formatLength(thousandthsToNm(1.2), 'in', 'reading')).toEqual({
      value: '+1.2',
      unit: 'thousandths of an inch',
      text: '+1.2 thou',
    });
    expect(formatLength(thousandthsToNm(-0.8), 'in', 'reading').value).toBe('\u22120.8');
    expect(formatLength(25_400, 'mm', 'reading')).toEqual({ value: '+2.5', unit: 'hundredths of a millimetre', text: '+2.5 hundredths mm' });
    expect(formatLength(0, 'in', 'reading').value).toBe('0.0');
  });

  it('never shows a signed zero for a reading that rounds to zero', () => {
    expect(formatLength(-1_000, 'in', 'reading').value).toBe('0.0');
    expect(formatLength(-400, 'mm', 'reading').value).toBe('0.0');
  });

  it('shows widths and diameters with fixed decimals so columns line up', () => {
    expect(formatLength(mmToNm(2.9), 'mm', 'width')).toEqual({ value: '2.90', unit: 'mm', text: '2.90 mm' });
    expect(formatLength(mmToNm(2.9), 'in', 'width').value).toBe('0.1142');
    expect(formatLength(inchesToNm(6), 'in', 'diameter').value).toBe('6.000');
    expect(formatLength(inchesToNm(6), 'mm', 'diameter').value).toBe('152.4');
  });
});
