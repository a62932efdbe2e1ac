import { describe, expect, it } from 'vitest';
import { createRinkInput, rinkSlug } from './rinks';

describe('rinkSlug', () => {
  it('accepts lower-case words joined by single dashes and normalises case', () => {
    expect(rinkSlug.parse('ice-harbor')).toBe('ice-harbor');
    expect(rinkSlug.parse('  North-Pond-Arena ')).toBe('north-pond-arena');
  });

  it.each(['ab', 'ice--harbor', '-ice', 'ice_harbor', 'api', 'x'.repeat(49)])('refuses %s', (slug) => {
    expect(rinkSlug.safeParse(slug).success).toBe(false);
  });
});

describe('createRinkInput', () => {
  const valid = { name: 'Ice Harbor', slug: 'ice-harbor', timeZone: 'America/Halifax', currency: 'cad', unitPreference: 'in' };

  it('takes an IANA time zone and an ISO 4217 currency, upper-casing the code', () => {
    expect(createRinkInput.parse(valid).currency).toBe('CAD');
  });

  it('accepts zones Intl knows but does not list, such as UTC', () => {
    expect(createRinkInput.safeParse({ ...valid, timeZone: 'UTC' }).success).toBe(true);
  });

  it('names each bad field', () => {
    const result = createRinkInput.safeParse({ ...valid, timeZone: 'Mars/Olympus', currency: 'XYZQ', unitPreference: 'cm' });
    expect(result.success).toBe(false);
    const fields = result.error?.issues.map((i) => i.path.join('.')).sort();
    expect(fields).toEqual(['currency', 'timeZone', 'unitPreference']);
  });
});
