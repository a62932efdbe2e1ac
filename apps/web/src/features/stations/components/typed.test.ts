import { describe, expect, it } from 'vitest';
import { adjustText, limitText, milliInput, readingText, toInteger, toMilli } from './typed';

describe('typed amounts', () => {
  it('reads a signed decimal of up to three places as thousandths, and refuses anything finer', () => {
    expect(toMilli('+0.250')).toBe(250);
    expect(toMilli('-1.125')).toBe(-1125);
    expect(toMilli('\u22120.5')).toBe(-500);
    expect(toMilli('.5')).toBe(500);
    expect(toMilli('1,5')).toBe(1500);
    expect(toMilli('3')).toBe(3000);
    expect(toMilli('0.1234')).toBeNull();
    expect(toMilli('')).toBeNull();
    expect(toMilli('one')).toBeNull();
  });

  it('shows thousandths back as they would be typed', () => {
    expect(milliInput(125)).toBe('0.125');
    expect(milliInput(3000)).toBe('3');
    expect(milliInput(-1250)).toBe('-1.25');
    for (const milli of [1, 50, 200, 999, 1000, 4321]) expect(toMilli(milliInput(milli))).toBe(milli);
  });

  it('takes whole numbers only where a count is asked for', () => {
    expect(toInteger('3,450')).toBe(3450);
    expect(toInteger('3450.5')).toBeNull();
    expect(toInteger('')).toBeNull();
  });

  it('signs adjustments with a real minus and names the unit', () => {
    expect(adjustText(250, 'turns')).toBe('+0.250 turn');
    expect(adjustText(1000, 'turns')).toBe('+1.000 turn');
    expect(adjustText(-1875, 'turns')).toBe('\u22121.875 turns');
    expect(adjustText(50, 'mm')).toBe('+0.050 mm');
  });

  it('writes readings and limits in the rink unit (0.001" = 25,400 nm; 0.01 mm = 10,000 nm)', () => {
    expect(readingText(61_000, 'in')).toBe('+2.4 thou');
    expect(readingText(-30_000, 'mm')).toBe('\u22123.0 hundredths mm');
    expect(limitText(25_400, 'in')).toBe('1.0 thou');
  });
});
