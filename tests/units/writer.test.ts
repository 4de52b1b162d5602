/**
 * Numbers of a site for people (src/lib/units/writer.ts): SI in, display unit and locale out.
 * Factors: NIST SP 811 (2008) Appendix B.8; uncertainty decimals: JCGM 100:2008 7.2.6.
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_DISPLAY_UNITS } from '~/lib/units/display';
import { siteWriter } from '~/lib/units/writer';
import { findCode } from '~/lib/words';

describe('a site writer', () => {
  const w = siteWriter({ ...DEFAULT_DISPLAY_UNITS, power: 'MW', locale: 'en-GB' }, 100e3);

  it('NIST SP 811 B.8 and GUM 7.2.6: 1 567 300 W ± 69 950 W in MW reads 1.567 MW ± 0.070 MW', () => {
    expect(w.withU(1_567_300, 69_950, 'power')).toBe('1.567 MW ± 0.070 MW');
  });

  it('NIST SP 811 B.8: a gauge pressure, a temperature and a mass flow in the engineer\'s units, grouped in the locale', () => {
    expect(w.value(600e3, 'pressure', 2)).toBe('5.00');
    expect(w.unit('pressure')).toBe('bar(g)');
    expect(w.deltaUnit('pressure')).toBe('bar');
    expect(w.delta(20e3, 'pressure', 2)).toBe('0.20');
    expect(w.value(773.15, 'temperature', 1)).toBe('500.0');
    expect(w.value(1000, 'massFlow', 0)).toBe('3,600');
    expect(w.value(0.7134, 'ratio', 1)).toBe('71.3');
  });

  it('self-consistency: nothing written carries a code, an e-notation or a "-0.0"', () => {
    for (const s of [w.value(-9.19541e-12, 'power'), w.withU(-0.00001, null, 'power'), w.number(-0.04, 1)]) {
      expect(findCode(s)).toBeNull();
      expect(s).not.toMatch(/^-0(\.0+)?$/);
    }
  });
});
