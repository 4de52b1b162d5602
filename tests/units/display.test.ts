/**
 * The site's display units (src/lib/units/display.ts) and baselines in them
 * (src/lib/units/baseline-units.ts). Conversion factors: NIST SP 811 (2008) Appendix B.8
 * (1 t/h = 1000/3600 kg/s, t/°C = T/K - 273.15, 1 bar = 1e5 Pa).
 */
import { describe, expect, it } from 'vitest';
import { coefficientsInDisplay, evaluate } from '~/lib/units/baseline-units';
import { DEFAULT_DISPLAY_UNITS, deriveDisplayUnits, displayScale, resolveDisplayUnits, toShown } from '~/lib/units/display';
import { expectClose } from '../support/expect-close';

const NIST = 'NIST SP 811 (2008) B.8';

describe('display units', () => {
  it(`${NIST}: 10 kg/s is 36 t/h, 373.15 K is 100 °C, 600 kPa absolute at 100 kPa atmosphere is 5 bar(g)`, () => {
    expectClose(toShown(10, 'massFlow', DEFAULT_DISPLAY_UNITS)!, 36, { rtol: 1e-12 });
    expectClose(toShown(373.15, 'temperature', DEFAULT_DISPLAY_UNITS)!, 100, { rtol: 1e-12 });
    expectClose(toShown(600e3, 'pressure', DEFAULT_DISPLAY_UNITS, 100e3)!, 5, { rtol: 1e-10 });
    expectClose(toShown(2.5e6, 'power', { ...DEFAULT_DISPLAY_UNITS, power: 'MW' })!, 2.5, { rtol: 1e-12 });
    expect(displayScale('pressure', { ...DEFAULT_DISPLAY_UNITS, pressure: 'bar' }).unit).toBe('bar(a)');
    expect(displayScale('temperature', DEFAULT_DISPLAY_UNITS).unit).toBe('°C');
  });

  it('self-consistency: defaults follow the units most of the tags are in', () => {
    const du = deriveDisplayUnits([
      { quantity: 'power', unit: 'MW' },
      { quantity: 'power', unit: 'MW' },
      { quantity: 'power', unit: 'kW' },
      { quantity: 'massFlow', unit: 'kg/s' },
      { quantity: 'pressure', unit: 'bar(g)' },
      { quantity: 'pressure', unit: 'bara' },
      { quantity: 'pressure', unit: 'kPa' },
      { quantity: 'pressure', unit: 'kPa' },
      { quantity: 'temperature', unit: 'degF' },
    ]);
    expect(du).toMatchObject({ power: 'MW', massFlow: 'kg/s', pressure: 'kPa', temperature: 'degC' });
    expect(deriveDisplayUnits([])).toEqual(DEFAULT_DISPLAY_UNITS);
  });

  it('self-consistency: stored choices win over derived ones; unknown stored values are ignored', () => {
    expect(resolveDisplayUnits({ power: 'MW' }, DEFAULT_DISPLAY_UNITS).power).toBe('MW');
    expect(resolveDisplayUnits({ power: 'hp' }, DEFAULT_DISPLAY_UNITS).power).toBe('kW');
    expect(resolveDisplayUnits(null, DEFAULT_DISPLAY_UNITS)).toEqual(DEFAULT_DISPLAY_UNITS);
  });
});

describe('baseline coefficients in display units', () => {
  const c = { intercept: 1.2e5, load: 0.031, T_amb: 410, 'load^2': -9.19541e-12, 'T_amb^2': -0.6, 'load*T_amb': 2.1e-5 };

  it('self-consistency: the curve in kW against t/h and °C gives the same destruction as in SI', () => {
    const a = 3.6; // t/h per kg/s (NIST SP 811 B.8)
    const d = coefficientsInDisplay(c, a, -273.15, 1e-3);
    for (const [load, T] of [[12, 290], [40, 301.3], [0.5, 268]] as const) {
      expectClose(evaluate(d, load * a, T - 273.15), evaluate(c, load, T) * 1e-3, { rtol: 1e-9 });
    }
    expectClose(d['load^2']!, (-9.19541e-12 * 1e-3) / (a * a), { rtol: 1e-12 });
  });

  it('self-consistency: a linear fit in K keeps its terms and only scales', () => {
    const d = coefficientsInDisplay({ intercept: 5000, load: 0.02, T_amb: 30 }, 1e-3, 0, 1e-3);
    expect(Object.keys(d).sort()).toEqual(['T_amb', 'intercept', 'load']);
    expectClose(d.load!, 0.02, { rtol: 1e-12 });
    expectClose(d.T_amb!, 0.03, { rtol: 1e-12 });
  });
});
