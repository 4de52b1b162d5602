/**
 * The hour table's range, address and state counts (src/lib/views/unit-hours-range.ts). Instants
 * follow the IANA zone rules (Europe/Berlin: UTC+1 in winter, UTC+2 from the last Sunday of March).
 */
import { describe, expect, it } from 'vitest';
import { dayRange, stateCountsText, unitHoursUrl } from '~/lib/views/unit-hours-range';

describe('a range of site-local days', () => {
  it('starts at the local midnight of the first day and ends 24 h after that of the last', () => {
    expect(dayRange('2024-01-10', '2024-01-11', 'Europe/Berlin')).toEqual({ from: '2024-01-09T23:00:00.000Z', to: '2024-01-11T23:00:00.000Z' });
  });
  it('adds 24 hours, not one local day, across the spring clock change', () => {
    // 2024-03-31 is 23 hours long in Berlin; the range ends 24 h after its midnight, at 01:00 local on 1 April.
    expect(dayRange('2024-03-31', '2024-03-31', 'Europe/Berlin')).toEqual({ from: '2024-03-30T23:00:00.000Z', to: '2024-03-31T23:00:00.000Z' });
  });
  it('throws on a day that is no date', () => {
    expect(() => dayRange('', '2024-01-01', 'UTC')).toThrow();
  });
});

describe('the address of the hours', () => {
  it('encodes the instants and asks for CSV when told', () => {
    const r = { from: '2024-01-01T00:00:00.000Z', to: '2024-01-02T00:00:00.000Z' };
    expect(unitHoursUrl('u1', r)).toBe('/api/v1/units/u1/hours?from=2024-01-01T00%3A00%3A00.000Z&to=2024-01-02T00%3A00%3A00.000Z');
    expect(unitHoursUrl('u1', r, true)).toBe('/api/v1/units/u1/hours?from=2024-01-01T00%3A00%3A00.000Z&to=2024-01-02T00%3A00%3A00.000Z&format=csv');
  });
});

describe('the hours by state', () => {
  it('counts each state present in the list order of states', () => {
    const rows = [{ state: 'idle' }, { state: 'steady' }, { state: 'steady' }, { state: 'suspect' }];
    expect(stateCountsText(rows)).toBe('4 hours: 2 steady, 1 idle, 1 suspect');
  });
  it('writes one hour in the singular', () => {
    expect(stateCountsText([{ state: 'unsettled' }])).toBe('1 hour: 1 unsettled');
  });
});
