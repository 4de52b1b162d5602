/**
 * The baseline builder's shaping (src/lib/views/baseline-fit-text.ts). Days follow the IANA zone
 * rules (America/New_York is UTC−5 in January).
 */
import { describe, expect, it } from 'vitest';
import { periodDaysText, spanText, toggledTerms } from '~/lib/views/baseline-fit-text';

describe('the unit’s hours in a sentence', () => {
  it('says it is looking them up, or that there are none', () => {
    expect(spanText(null, 'UTC')).toBe('Looking up the unit’s hours…');
    expect(spanText({ first: null, last: null, hours: 0, steady: 0 }, 'UTC')).toBe('This unit has no computed hours yet.');
  });
  it('gives the span in site-local days and the steady hours', () => {
    const span = { first: '2024-01-01T03:00:00.000Z', last: '2024-01-31T04:00:00.000Z', hours: 700, steady: 650 };
    expect(spanText(span, 'America/New_York')).toBe('700 computed hours from 2023-12-31 to 2024-01-30, 650 of them steady. Only steady hours are fitted.');
  });
});

describe('switching a term', () => {
  it('takes a present term out and keeps the others in their order', () => {
    expect(toggledTerms(['load', 'T_amb', 'load^2'], 'T_amb')).toEqual(['load', 'load^2']);
  });
  it('puts a term in at its place in the fixed order, not at the end', () => {
    expect(toggledTerms(['load', 'load^2'], 'T_amb')).toEqual(['load', 'T_amb', 'load^2']);
    expect(toggledTerms([], 'load*T_amb')).toEqual(['load*T_amb']);
  });
});

describe('a reference period in days', () => {
  it('names the last day as the day before the exclusive end', () => {
    expect(periodDaysText('2024-01-01T05:00:00.000Z', '2024-02-01T05:00:00.000Z', 'America/New_York')).toBe('2024-01-01 to 2024-01-31');
  });
});
