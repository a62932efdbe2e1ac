import { describe, expect, it } from 'vitest';
import { minorDigits, parsePrice, priceInput } from './money';

describe('prices typed in the rink currency', () => {
  it('knows how many decimals a currency has (ISO 4217: CAD 2, JPY 0)', () => {
    expect(minorDigits('CAD')).toBe(2);
    expect(minorDigits('JPY')).toBe(0);
  });

  it('turns a typed amount into minor units, and refuses more decimals than the currency has', () => {
    expect(parsePrice('12.5', 'CAD')).toBe(1250);
    expect(parsePrice('12.50', 'CAD')).toBe(1250);
    expect(parsePrice('12,50', 'EUR')).toBe(1250);
    expect(parsePrice('.5', 'CAD')).toBe(50);
    expect(parsePrice('0', 'CAD')).toBe(0);
    expect(parsePrice('12.505', 'CAD')).toBeNull();
    expect(parsePrice('1200', 'JPY')).toBe(1200);
    expect(parsePrice('12.5', 'JPY')).toBeNull();
    expect(parsePrice('-3', 'CAD')).toBeNull();
    expect(parsePrice('', 'CAD')).toBeNull();
  });

  it('shows minor units back as a typed amount', () => {
    expect(priceInput(1250, 'CAD')).toBe('12.50');
    expect(priceInput(1200, 'JPY')).toBe('1200');
    for (const minor of [0, 5, 99, 1375, 100000]) expect(parsePrice(priceInput(minor, 'CAD'), 'CAD')).toBe(minor);
  });
});
