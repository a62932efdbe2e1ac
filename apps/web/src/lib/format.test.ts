import { describe, expect, it } from 'vitest';
import { formatMoney, minorDigits, moneyInput, parseMoney } from './format';

describe('money in the rink currency', () => {
  it('knows the decimals of a currency (ISO 4217 minor units: CAD 2, JPY 0)', () => {
    expect(minorDigits('CAD')).toBe(2);
    expect(minorDigits('JPY')).toBe(0);
  });

  it('parses typed amounts into minor units and refuses extra decimals', () => {
    expect(parseMoney('12.5', 'CAD')).toBe(1250);
    expect(parseMoney('12.50', 'CAD')).toBe(1250);
    expect(parseMoney('12,50', 'EUR')).toBe(1250);
    expect(parseMoney('0', 'CAD')).toBe(0);
    expect(parseMoney('.5', 'CAD')).toBe(50);
    expect(parseMoney('12.505', 'CAD')).toBeNull();
    expect(parseMoney('1200', 'JPY')).toBe(1200);
    expect(parseMoney('12.5', 'JPY')).toBeNull();
    expect(parseMoney('-3', 'CAD')).toBeNull();
    expect(parseMoney('', 'CAD')).toBeNull();
  });

  it('round-trips minor units through the typed form', () => {
    for (const minor of [0, 5, 99, 1375, 100000]) expect(parseMoney(moneyInput(minor, 'CAD'), 'CAD')).toBe(minor);
    expect(moneyInput(1250, 'CAD')).toBe('12.50');
    expect(moneyInput(1200, 'JPY')).toBe('1200');
  });

  it('formats minor units with the currency’s own decimals', () => {
    expect(formatMoney(1250, 'CAD')).toMatch(/12\.50/);
    expect(formatMoney(1200, 'JPY')).toMatch(/1,?200/);
    expect(formatMoney(1200, 'JPY')).not.toMatch(/12\.00/);
  });
});
