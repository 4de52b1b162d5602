import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import {
  aliases,
  canConvert,
  converterFor,
  fromSI,
  isGaugeUnit,
  parseUnit,
  describeUnit,
  quantities,
  quantityList,
  referenceConditionsOf,
  registry,
  toSI,
  uncertaintyToSI,
  UnitError,
  unitsFor,
  volumeFlowToMassFlow,
  type Quantity,
} from '~/lib/units';

describe('parseUnit: spellings found in historian exports', () => {
  it.each([
    ['°C', 'degC'], ['degC', 'degC'], ['C', 'degC'], ['deg C', 'degC'], ['DEG C', 'degC'], ['℃', 'degC'],
    ['°F', 'degF'], ['K', 'K'], ['°R', 'degR'], ['Δ°C', 'degC-diff'], ['delta degF', 'degF-diff'],
    ['bar(g)', 'barg'], ['barg', 'barg'], ['bar g', 'barg'], ['BARG', 'barg'], ['bar (a)', 'bara'], ['bara', 'bara'],
    ['psig', 'psig'], ['psi(g)', 'psig'], ['PSIA', 'psia'], ['kPa(g)', 'kPag'], ['kPaa', 'kPaa'], ['MPa(g)', 'MPag'],
    ['kg/cm²', 'kg/cm2'], ['kgf/cm2', 'kg/cm2'], ['kg/cm2g', 'kg/cm2g'], ['kg/cm²(g)', 'kg/cm2g'], ['at', 'kg/cm2'],
    ['mm H2O', 'mmH2O'], ['inWC', 'inH2O'], ['mmHg', 'mmHg'],
    ['t/h', 't/h'], ['T/H', 't/h'], ['tph', 't/h'], ['kg/hr', 'kg/h'], ['KG/H', 'kg/h'], ['lb/hr', 'lb/h'], ['klb/h', 'klb/h'],
    ['m³/h', 'm3/h'], ['m3/hr', 'm3/h'], ['M3/H', 'm3/h'], ['Nm3/h', 'Nm3/h'], ['Nm³/h', 'Nm3/h'], ['NM3/HR', 'Nm3/h'],
    ['Sm3/d', 'Sm3/d'], ['SCFM', 'scfm'], ['acfm', 'ft3/min'],
    ['%', '%'], ['kW', 'kW'], ['KW', 'kW'], ['MW', 'MW'], ['MMBTU/HR', 'MMBtu/h'], ['Btu/hr', 'Btu/h'], ['Gcal/h', 'Gcal/h'],
    ['kJ/kg', 'kJ/kg'], ['BTU/LB', 'Btu/lb'], ['kWh', 'kWh'], ['kW.h', 'kWh'], ['[bar]', 'bar'], ['(kg/h)', 'kg/h'], ['-', '1'],
  ])('common practice spelling %j -> %j', (text, unit) => {
    expect(parseUnit(text)).toBe(unit);
  });

  it('single letters match exactly only: C, F, K, m are units, c, f, k, M are not', () => {
    expect(['C', 'F', 'K', 'm', 'W'].map(parseUnit)).toEqual(['degC', 'degF', 'K', 'm', 'W']);
    expect(['c', 'f', 'k', 'M', 'w'].map(parseUnit)).toEqual([null, null, null, null, null]);
  });

  it.each(['', 'foo', 'barrels of joy', 'kg/cm3g', 'Mlb/h'])('unknown or ambiguous text %j -> null', (text) => {
    expect(parseUnit(text)).toBeNull();
  });

  it('common practice: dry/wet basis and the kind of fraction are flags beside the unit', () => {
    expect(describeUnit('vol% dry')).toEqual({ unit: '%', basis: 'dry', fractionKind: 'volume' });
    expect(describeUnit('%vol')).toEqual({ unit: '%', fractionKind: 'volume' });
    expect(describeUnit('mol% (wet)')).toEqual({ unit: '%', basis: 'wet', fractionKind: 'mole' });
    expect(describeUnit('wt%')).toEqual({ unit: '%', fractionKind: 'mass' });
    expect(describeUnit('ppmvd')).toEqual({ unit: 'ppm', basis: 'dry', fractionKind: 'volume' });
    expect(describeUnit('O2 % db')).toEqual({ unit: null, basis: 'dry' });
    expect(describeUnit('Nm3/h (dry)')).toEqual({ unit: 'Nm3/h', basis: 'dry' });
    expect(describeUnit('%')).toEqual({ unit: '%' });
  });

  it('self-consistency: every alias and every canonical unit parses back to its canonical unit', () => {
    for (const entries of Object.values(registry)) for (const e of entries) expect(parseUnit(e.unit)).toBe(e.unit);
    for (const [unit, spellings] of Object.entries(aliases)) for (const s of spellings) expect(parseUnit(s), s).toBe(unit);
  });
});

describe('toSI / fromSI', () => {
  const ctx = { p_atm_Pa: 95_000 }; // invented site at about 550 m

  it('self-consistency: gauge pressure round trip with the site atmosphere', () => {
    // 10 barg at p_atm = 95 kPa is 10e5 + 95e3 = 1.095e6 Pa absolute.
    expectClose(toSI(10, 'barg', 'pressure', ctx), 1.095e6, { rtol: 1e-15 });
    expectClose(fromSI(1.095e6, 'bar(g)', 'pressure', ctx), 10, { rtol: 1e-14 });
    // The same absolute pressure read as bara is 10.95.
    expectClose(fromSI(toSI(10, 'barg', 'pressure', ctx), 'bara', 'pressure'), 10.95, { rtol: 1e-14 });
    // 0 psig is the site atmosphere itself.
    expectClose(toSI(0, 'psig', 'pressure', ctx), 95_000, { rtol: 1e-15 });
    expect(isGaugeUnit('kg/cm2(g)')).toBe(true);
    expect(isGaugeUnit('bara')).toBe(false);
  });

  it('self-consistency: uncertainty of a gauge pressure has no atmosphere shift; of degF no offset', () => {
    expectClose(uncertaintyToSI(0.1, 'barg', 'pressure'), 1e4, { rtol: 1e-15 });
    expectClose(uncertaintyToSI(0.9, '°F', 'temperature'), 0.5, { rtol: 1e-14 });
    expect(() => uncertaintyToSI(-1, 'K', 'temperature')).toThrow(UnitError);
  });

  it('a gauge unit without the site atmosphere is refused, naming the unit and what to pass', () => {
    const err = (() => {
      try {
        toSI(5, 'barg', 'pressure');
      } catch (e) {
        return e as UnitError;
      }
      return null;
    })();
    expect(err).toBeInstanceOf(UnitError);
    expect(err!.code).toBe('MISSING_CONTEXT');
    expect(err!.message).toMatch(/barg/);
    expect(err!.message).toMatch(/p_atm_Pa/);
    expect(() => toSI(5, 'barg', 'pressure', { p_atm_Pa: 1.01325 })).toThrow(/outside/);
  });

  it('an unknown unit is refused with the unit, the quantity and suggestions', () => {
    try {
      toSI(1, 'barq', 'pressure');
      expect.fail('should have thrown');
    } catch (e) {
      const err = e as UnitError;
      expect(err.code).toBe('UNKNOWN_UNIT');
      expect(err.message).toContain("'barq'");
      expect(err.message).toContain('pressure');
      expect(err.suggestions).toContain('barg');
    }
  });

  it('a unit of another quantity is refused and the message says which quantity it belongs to', () => {
    try {
      toSI(1, 'Nm3/h', 'volumeFlow');
      expect.fail('should have thrown');
    } catch (e) {
      const err = e as UnitError;
      expect(err.code).toBe('WRONG_QUANTITY');
      expect(err.message).toContain('standardVolumeFlow');
    }
    expect(() => toSI(1, 'kg/h', 'nonsense' as Quantity)).toThrow(/Unknown quantity 'nonsense'/);
  });

  it('self-consistency: toSI then fromSI returns the value for every unit of every quantity', () => {
    for (const q of Object.keys(registry) as Quantity[]) {
      for (const unit of unitsFor(q)) {
        const v = 12.5;
        expectClose(fromSI(toSI(v, unit, q, ctx), unit, q, ctx), v, { rtol: 1e-13, label: `${unit} (${q})` });
      }
    }
  });

  it('self-consistency: converterFor gives the factor/offset that toSI applies', () => {
    const c = converterFor('°F', 'temperature');
    expectClose(c.factor, 5 / 9, { rtol: 1e-15 });
    expectClose(c.offset, 459.67 / 1.8, { rtol: 1e-15 });
    expectClose(c.toSI(212), toSI(212, 'degF', 'temperature'), { rtol: 1e-15 });
    const g = converterFor('psig', 'pressure', ctx);
    expectClose(g.offset, 95_000, { rtol: 1e-15 });
    expectClose(g.fromSI(g.toSI(150)), 150, { rtol: 1e-14 });
  });

  it('self-consistency: a difference-quantity reading of degC has no offset; pressureDifference has no gauge units', () => {
    expectClose(toSI(5, 'degC', 'temperatureDifference'), 5, { rtol: 1e-15 });
    expect(canConvert('barg', 'pressureDifference')).toBe(false);
    expect(canConvert('mbar', 'pressureDifference')).toBe(true);
    expect(canConvert('degC-diff', 'temperature')).toBe(false);
    expect(canConvert('kW', 'heatFlow')).toBe(true);
    expect(canConvert('kW', 'nope')).toBe(false);
  });

  it('quantities are JSON-friendly with their SI unit names', () => {
    expect(quantities).toMatchObject({
      pressure: 'Pa',
      temperature: 'K',
      massFlow: 'kg/s',
      volumeFlow: 'm3/s',
      power: 'W',
      heatFlow: 'W',
      fraction: '1',
      specificEnthalpy: 'J/kg',
    });
    expect(JSON.parse(JSON.stringify(quantityList))).toEqual(quantityList);
    expect(unitsFor('pressure')).toContain('kg/cm2g');
  });
});

describe('gas volume at reference conditions', () => {
  it('ideal gas by hand: 1 Nm3/h of CH4 (M = 16.04246 g/mol, ISO 6976:2016 molar mass) in kg/s', () => {
    // rho_N = p M / (R T) at 0 degC, 101.325 kPa:
    //   p M = 101325 Pa x 0.01604246 kg/mol             = 1625.5022595 Pa kg/mol
    //   R T = 8.31446261815324 J/(mol K) x 273.15 K      = 2271.0954641 J/mol
    //   rho_N = 1625.5022595 / 2271.0954641             = 0.71573465 kg/m3
    //   mDot  = 1 m3/h x 0.71573465 kg/m3 / 3600 s/h     = 1.9881518e-4 kg/s
    const expected = 1625.5022595 / 2271.0954641 / 3600;
    expectClose(volumeFlowToMassFlow(1, 'Nm3/h', { M_kg_per_mol: 16.04246e-3 }), expected, { rtol: 1e-9 });
    // with the reference density given directly, the same answer
    expectClose(volumeFlowToMassFlow(1, 'Nm3/h', { rhoRef_kg_per_m3: 1625.5022595 / 2271.0954641 }), expected, { rtol: 1e-9 });
  });

  it('self-consistency: the same mass of gas stated at 0 degC and 15 degC references scales with T_ref', () => {
    // Ideal gas at equal pressure: V_15 / V_0 = 288.15 / 273.15.
    const n_N = toSI(1000, 'Nm3/h', 'standardVolumeFlow');
    expectClose(fromSI(n_N, 'Sm3/h', 'standardVolumeFlow'), (1000 * 288.15) / 273.15, { rtol: 1e-12 });
    const ref = referenceConditionsOf('scfm')!;
    expectClose(ref.T_K, (60 + 459.67) / 1.8, { rtol: 1e-15 });
    expect(ref.label).toBe('60 degF, 14.696 psia');
    expect(referenceConditionsOf('Nm3/h')!.label).toBe('0 degC, 101.325 kPa');
    expect(referenceConditionsOf('m3/h')).toBeNull();
  });

  it('an actual volume flow needs the actual density; a standard one refuses it', () => {
    // 36 m3/h at 2 kg/m3 = 0.01 m3/s x 2 = 0.02 kg/s (worked by hand)
    expectClose(volumeFlowToMassFlow(36, 'm3/h', { rho_kg_per_m3: 2 }), 0.02, { rtol: 1e-14 });
    expect(() => volumeFlowToMassFlow(36, 'm3/h', { M_kg_per_mol: 0.016 })).toThrow(/density at flowing conditions/);
    expect(() => volumeFlowToMassFlow(36, 'Nm3/h', { rho_kg_per_m3: 2 })).toThrow(/reference conditions/);
    expect(() => volumeFlowToMassFlow(36, 'kg/h', { rho_kg_per_m3: 2 })).toThrow(UnitError);
    expect(() => volumeFlowToMassFlow(36, 'Nm3/h', { M_kg_per_mol: -1 })).toThrow(/> 0/);
  });
});
