import { describe, expect, it } from 'vitest';
import { addDays, parseFilters, previousPeriod, queryInput, searchFromValues, valuesFromSearch } from './filters';

// Calendar facts below (February 2026 has 28 days, 2028 is a leap year) are from the Gregorian calendar rules.

describe('report periods', () => {
  it('moves plain days across months and leap days without a time zone', () => {
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28');
    expect(addDays('2028-03-01', -1)).toBe('2028-02-29');
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
  });

  it('compares with the period of the same length just before', () => {
    // March has 31 days, so the 31 before it run from 29 January to 28 February.
    expect(previousPeriod('2026-03-01', '2026-03-31')).toEqual({ compareFrom: '2026-01-29', compareTo: '2026-02-28' });
    expect(previousPeriod('2028-03-01', '2028-03-01')).toEqual({ compareFrom: '2028-02-29', compareTo: '2028-02-29' });
  });

  it('defaults to the 30 days ending on the rink’s today', () => {
    const values = valuesFromSearch(new URLSearchParams(), '2026-12-01');
    expect(values).toMatchObject({ from: '2026-11-02', to: '2026-12-01', compare: 'none', stationId: '' });
  });
});

describe('filters in the address', () => {
  const today = '2026-12-01';

  it('reads back what it wrote, so a link reproduces the view', () => {
    const values = { ...valuesFromSearch(new URLSearchParams(), today), stationId: 'st-2', compare: 'previous' as const };
    const search = searchFromValues(values);
    expect(search.toString()).toBe('from=2026-11-02&to=2026-12-01&stationId=st-2&compare=previous');
    expect(valuesFromSearch(search, today)).toEqual(values);
  });

  it('sends each report only the filters it takes', () => {
    const values = { ...valuesFromSearch(new URLSearchParams('stationId=st-2&technicianId=t-1&compare=previous'), today) };
    expect(queryInput(values, 'throughput')).toMatchObject({ stationId: 'st-2', technicianId: 't-1', compareFrom: '2026-10-03', compareTo: '2026-11-01' });
    expect(queryInput(values, 'money')).toMatchObject({ stationId: undefined, technicianId: undefined, compareTo: '2026-11-01' });
    expect(queryInput(values, 'leagues')).toEqual({ from: '2026-11-02', to: '2026-12-01', stationId: undefined, technicianId: undefined });
  });

  it('puts the route schema’s messages on the fields they belong to', () => {
    const backwards = parseFilters(valuesFromSearch(new URLSearchParams('from=2026-12-01&to=2026-11-01'), today), 'throughput');
    expect(backwards).toEqual({ ok: false, fields: { to: ['The end date must not be before the start date'] } });
    const half = parseFilters(valuesFromSearch(new URLSearchParams('compareFrom=2026-10-01'), today), 'quality');
    expect(half).toEqual({ ok: false, fields: { compareTo: ['Use a date like 2026-11-30'] } });
    expect(parseFilters(valuesFromSearch(new URLSearchParams(), today), 'money')).toEqual({ ok: true, query: { from: '2026-11-02', to: '2026-12-01' } });
  });
});
