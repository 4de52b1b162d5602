/**
 * The one number formatter (src/lib/format.ts). Rules: JCGM 100:2008 (GUM) 7.2.6 (U with at most two
 * significant digits, the value rounded to the same place); SI Brochure 9th ed. 5.4.4 (digits in
 * groups of three separated by a thin space).
 */
import { describe, expect, it } from 'vitest';
import { THIN_SPACE as T, decimalsForU, figures, fixed, localeStyle, significant, sizeDecimals, upTo, withU } from '~/lib/format';

describe('numbers as people read them', () => {
  it('GUM 7.2.6: 1567.3 with U = 69.95 reads 1 567 ± 70, not 1 567 ± 69.95', () => {
    expect(withU(1567.3, 69.95)).toBe(`1${T}567 ± 70`);
  });

  it('GUM 7.2.6: the value takes the decimals of U: 0.7134 ± 0.0123 -> 0.713 ± 0.012; 71.34 % ± 1.23 % -> 71.3 % ± 1.2 %', () => {
    expect(withU(0.7134, 0.0123)).toBe('0.713 ± 0.012');
    expect(withU(71.34, 1.23, { unit: '%' })).toBe('71.3 % ± 1.2 %');
    expect(decimalsForU(9.96)).toBe(1);
    expect(decimalsForU(10)).toBe(0);
  });

  it('a value that rounds to zero never shows "-0.0"', () => {
    expect(fixed(-0.04, 1)).toBe('0.0');
    expect(fixed(-0.4, 0)).toBe('0');
    expect(fixed(-0.06, 1)).toBe('-0.1');
  });

  it('SI 5.4.4: thousands grouped with a thin space, or the separator asked for; none for machine-read files', () => {
    expect(fixed(-1234567.891, 2)).toBe(`-1${T}234${T}567.89`);
    expect(fixed(96000, 0, { group: ' ' })).toBe('96 000');
    expect(fixed(96000, 0, { group: '' })).toBe('96000');
  });

  it('without an uncertainty the value alone; an absent value shows the caller’s mark', () => {
    expect(withU(412.34, null, { unit: 'kW', decimals: 0 })).toBe('412 kW');
    expect(withU(null, 1)).toBe('—');
    expect(fixed(Number.NaN, 1, { none: '' })).toBe('');
  });

  it('self-consistency: about three significant figures by size', () => {
    expect([250, 25, 2.5, 0.25].map(sizeDecimals)).toEqual([0, 1, 2, 3]);
  });
});

describe("numbers in the site's locale", () => {
  it('CLDR: en-GB groups with a comma, de-DE with a point and marks decimals with a comma', () => {
    expect(fixed(1234567.891, 1, localeStyle('en-GB'))).toBe('1,234,567.9');
    expect(fixed(-1234.5, 1, localeStyle('de-DE'))).toBe('-1.234,5');
    expect(withU(1567.3, 69.95, { ...localeStyle('en-GB'), unit: 'kW' })).toBe('1,567 kW ± 70 kW');
  });
  it('CLDR: a locale that groups with a no-break space (fr-FR) gets the thin space; an unknown tag falls back to it', () => {
    expect(fixed(96000, 0, localeStyle('fr-FR'))).toBe(`96${T}000`);
    expect(localeStyle('not a locale')).toEqual({ group: T, decimal: '.' });
  });
});

describe('significant figures without e-notation', () => {
  it('SI Brochure 9th ed. 5.4.4 (powers of ten written with ×): small and large coefficients', () => {
    expect(significant(-9.19541e-12, 3)).toBe('−9.20 × 10⁻¹²');
    expect(significant(4.2e7, 2)).toBe('4.2 × 10⁷');
    expect(significant(0.031234, 3)).toBe('0.0312');
    expect(significant(123.456, 4)).toBe('123.5');
    expect(significant(9.9996e-5, 3)).toBe('1.00 × 10⁻⁴');
    expect(significant(0, 3)).toBe('0.00');
  });
});

describe('limits and settings without trailing zeros', () => {
  it('upTo: at most the decimals asked for, trailing zeros dropped, grouped, never "-0"', () => {
    expect(upTo(400, 2)).toBe('400');
    expect(upTo(62.5, 1)).toBe('62.5');
    expect(upTo(1250.756, 2)).toBe(`1${T}250.76`);
    expect(upTo(1000.004, 2)).toBe(`1${T}000`);
    expect(upTo(-0.001, 2)).toBe('0');
    expect(upTo(-1234.5, 2, localeStyle('de-DE'))).toBe('-1.234,5');
    expect(upTo(1234, 2, localeStyle('de-DE'))).toBe('1.234');
    expect(upTo(null, 2)).toBe('—');
  });
  it('figures: significant figures without the trailing zeros nobody set', () => {
    expect(figures(0.05, 3)).toBe('0.05');
    expect(figures(0.0512345, 3)).toBe('0.0512');
    expect(figures(1.0000004, 6)).toBe('1');
    expect(figures(0.99999996, 6)).toBe('1');
    expect(figures(1234.5, 3)).toBe(`1${T}235`); // as significant: whole digits are kept
    expect(figures(2.5e-9, 3)).toBe('2.5 × 10⁻⁹');
    expect(figures(-0.00012, 2)).toBe('−1.2 × 10⁻⁴');
    expect(figures(0, 3)).toBe('0');
    // Number.MIN_VALUE = 2^-1074 = 4.940656...e-324 (IEEE 754 binary64, smallest subnormal): 10 ** -324 underflows to 0.
    expect(figures(Number.MIN_VALUE, 3)).toBe('4.94 × 10⁻³²⁴');
    expect(significant(Number.MIN_VALUE, 3)).toBe('4.94 × 10⁻³²⁴');
  });
});
