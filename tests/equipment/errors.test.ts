/**
 * Range and bad-input errors: each is a typed BalanceInputError with a permanent code and a message
 * that names the input (or a ThermoRangeError from the property core for property ranges).
 */
import { describe, expect, it } from 'vitest';
import { ThermoRangeError } from '~/lib/thermo';
import {
  BalanceInputError,
  boilerBalance,
  evaluateUnitHour,
  inputNames,
  inputVector,
  portState,
  turbineBalance,
  unitHourWithUncertainty,
  type BalanceErrorCode,
  type BalanceKind,
  type UnitModel,
} from '~/lib/equipment';

const WATER = { kind: 'water' } as const;
const env = { T0_K: 298.15, p0_Pa: 101325 };

function expectBalanceError(f: () => unknown, code: BalanceErrorCode, input: string | RegExp, message: RegExp): void {
  let err: unknown;
  try {
    f();
  } catch (e) {
    err = e;
  }
  expect(err, 'expected a BalanceInputError').toBeInstanceOf(BalanceInputError);
  const e = err as BalanceInputError;
  expect(e.code).toBe(code);
  if (typeof input === 'string') expect(e.input).toBe(input);
  else expect(e.input).toMatch(input);
  expect(e.message).toMatch(message);
}

const turbine: UnitModel = {
  ports: [
    { name: 'in', direction: 'in', fluid: WATER },
    { name: 'ext', direction: 'out', fluid: WATER },
    { name: 'exh', direction: 'out', fluid: WATER, state: 'energy-balance', flow: 'mass-balance' },
  ],
  powerMeasured: 'electric',
};
const tv = { T0_K: 298.15, p0_Pa: 101325, 'in.mDot_kg_per_s': 10, 'in.p_Pa': 6e6, 'in.T_K': 753.15, 'ext.mDot_kg_per_s': 2, 'ext.p_Pa': 0.5e6, 'ext.T_K': 473.15, 'exh.p_Pa': 1e4, power_W: 7e6, generatorEfficiency: 0.98 };
const tx = (over: Record<string, number> = {}) => inputVector('turbine', turbine, { ...tv, ...over });

describe('bad inputs give typed errors naming the input', () => {
  it('the vector layout is documented by name and order', () => {
    expect(inputNames('turbine', turbine)).toEqual([
      'T0_K', 'p0_Pa', 'in.mDot_kg_per_s', 'in.p_Pa', 'in.T_K', 'ext.mDot_kg_per_s', 'ext.p_Pa', 'ext.T_K', 'exh.p_Pa', 'power_W', 'generatorEfficiency',
    ]);
  });

  it('a missing named value', () => {
    const { power_W: _omit, ...rest } = tv;
    expectBalanceError(() => inputVector('turbine', turbine, rest), 'MISSING_INPUT', 'power_W', /no value given/);
  });

  it('a vector of the wrong length', () => {
    expectBalanceError(() => evaluateUnitHour('turbine', turbine, new Float64Array(3)), 'INVALID_MODEL', 'x', /has 11 inputs/);
  });

  it('NaN (a missing tag hour) names the entry', () => {
    expectBalanceError(() => evaluateUnitHour('turbine', turbine, tx({ 'in.T_K': NaN })), 'MISSING_INPUT', 'in.T_K', /finite/);
  });

  it('a negative mass flow', () => {
    expectBalanceError(() => evaluateUnitHour('turbine', turbine, tx({ 'ext.mDot_kg_per_s': -1 })), 'IMPOSSIBLE_INPUT', 'ext.mDot_kg_per_s', /= -1 is outside 0\.\.1 × 10⁶ kg\/s/);
  });

  it('a mass balance that gives a negative flow (extraction larger than the inlet)', () => {
    expectBalanceError(() => evaluateUnitHour('turbine', turbine, tx({ 'ext.mDot_kg_per_s': 12 })), 'IMPOSSIBLE_INPUT', 'exh.mDot_kg_per_s', /mass balance gives a negative flow/);
  });

  it('a generator efficiency above 1', () => {
    expectBalanceError(() => evaluateUnitHour('turbine', turbine, tx({ generatorEfficiency: 1.2 })), 'IMPOSSIBLE_INPUT', 'generatorEfficiency', /1\.2 is outside/);
  });

  it('electric power without a generator efficiency (direct API)', () => {
    expectBalanceError(
      () => turbineBalance({ env, power_W: 1e6, powerMeasured: 'electric', ports: [
        { name: 'in', direction: 'in', fluid: WATER, mDot_kg_per_s: 5, measured: { p_Pa: 4e6, T_K: 700 } },
        { name: 'out', direction: 'out', fluid: WATER, mDot_kg_per_s: 5, measured: { p_Pa: 4e5, T_K: 450 } },
      ] }),
      'MISSING_INPUT', 'generatorEfficiency', /generator efficiency/,
    );
  });

  it('a power the energy balance cannot place in the property range (exhaust enthalpy too low)', () => {
    expectBalanceError(() => evaluateUnitHour('turbine', turbine, tx({ power_W: 4e7 })), 'UNSOLVABLE', 'exh', /energy balance gives h = .* outside the property range/);
  });

  it('a turbine without an outlet', () => {
    expectBalanceError(
      () => evaluateUnitHour('turbine', { ports: [{ name: 'in', direction: 'in', fluid: WATER }] }, Float64Array.of(298.15, 101325, 1, 1e6, 600, 1e5)),
      'MISSING_INPUT', 'ports', /a turbine needs at least 1 outlet port\(s\), got 0/,
    );
  });

  it('an unknown unit kind', () => {
    expectBalanceError(() => inputNames('reactor' as BalanceKind, {}), 'INVALID_MODEL', 'kind', /unknown unit kind 'reactor'/);
  });

  it('a vapour fraction on a gas port', () => {
    expectBalanceError(() => inputNames('fan', { ports: [{ name: 'in', direction: 'in', fluid: { kind: 'air' }, state: 'px' }] }), 'INVALID_MODEL', 'in.state', /water only/);
  });

  it('a condensed fuel with a measured temperature', () => {
    expectBalanceError(
      () => inputNames('boiler', { ports: [{ name: 'coal', role: 'fuel', direction: 'in', fluid: { kind: 'fuel', fuel: { fuelType: 'bituminous-coal', LHV_J_per_kg: 25e6 } } }] }),
      'INVALID_MODEL', 'coal.state', /use state 'ambient'/,
    );
  });

  it('two flows from one energy balance', () => {
    const m: UnitModel = { ports: [
      { name: 'a', direction: 'in', fluid: WATER, flow: 'energy-balance' },
      { name: 'b', direction: 'in', fluid: WATER, flow: 'energy-balance' },
      { name: 'c', direction: 'out', fluid: WATER },
    ] };
    const x = inputVector('mixer', m, { T0_K: 298.15, p0_Pa: 101325, 'a.p_Pa': 5e5, 'a.T_K': 450, 'b.p_Pa': 5e5, 'b.T_K': 320, 'c.mDot_kg_per_s': 5, 'c.p_Pa': 4e5, 'c.T_K': 360 });
    expectBalanceError(() => evaluateUnitHour('mixer', m, x), 'INVALID_MODEL', 'b', /only one flow may come from the energy balance/);
  });

  it('an energy balance that needs a negative flow', () => {
    const m: UnitModel = { ports: [
      { name: 'steam', direction: 'in', fluid: WATER, flow: 'energy-balance' },
      { name: 'water', direction: 'in', fluid: WATER },
      { name: 'out', direction: 'out', fluid: WATER, flow: 'mass-balance' },
    ] };
    // outlet colder than the cold inlet: no positive steam flow can do that
    const x = inputVector('deaerator', m, { T0_K: 298.15, p0_Pa: 101325, 'steam.p_Pa': 5e5, 'steam.T_K': 450, 'water.mDot_kg_per_s': 5, 'water.p_Pa': 5e5, 'water.T_K': 330, 'out.p_Pa': 4e5, 'out.T_K': 320 });
    expectBalanceError(() => evaluateUnitHour('deaerator', m, x), 'IMPOSSIBLE_INPUT', 'steam.mDot_kg_per_s', /energy balance gives a negative flow/);
  });

  it('a heat exchanger stream below T0 is refused with the reason, or flagged on request', () => {
    const ports = [
      { name: 'hi', role: 'hot', direction: 'in', fluid: WATER },
      { name: 'ho', role: 'hot', direction: 'out', fluid: WATER, flow: 'mass-balance' },
      { name: 'ci', role: 'cold', direction: 'in', fluid: WATER },
      { name: 'co', role: 'cold', direction: 'out', fluid: WATER, flow: 'mass-balance' },
    ] as UnitModel['ports'];
    const vals = { T0_K: 298.15, p0_Pa: 101325, 'hi.mDot_kg_per_s': 2, 'hi.p_Pa': 3e5, 'hi.T_K': 360, 'ho.p_Pa': 2.9e5, 'ho.T_K': 320, 'ci.mDot_kg_per_s': 3, 'ci.p_Pa': 3e5, 'ci.T_K': 288.15, 'co.p_Pa': 2.9e5, 'co.T_K': 315 };
    const refuse: UnitModel = { ports };
    expectBalanceError(() => evaluateUnitHour('heat-exchanger', refuse, inputVector('heat-exchanger', refuse, vals)), 'BELOW_DEAD_STATE', 'ci', /below T0 = 298\.15 K/);
    const flag: UnitModel = { ports, belowDeadState: 'flag' };
    const b = evaluateUnitHour('heat-exchanger', flag, inputVector('heat-exchanger', flag, vals));
    expect(b.flags).toContain('below-dead-state-definitions');
    expect(b.flags).toContain('below-dead-state:ci');
  });

  it('a heat-exchanger port without a side', () => {
    expectBalanceError(
      () => evaluateUnitHour('heat-exchanger', { ports: [
        { name: 'a', direction: 'in', fluid: WATER },
        { name: 'b', direction: 'out', fluid: WATER, flow: 'mass-balance' },
        { name: 'c', role: 'cold', direction: 'in', fluid: WATER },
        { name: 'd', role: 'cold', direction: 'out', fluid: WATER, flow: 'mass-balance' },
      ] }, Float64Array.of(298.15, 101325, 1, 3e5, 350, 3e5, 340, 1, 3e5, 300, 3e5, 310)),
      'INVALID_MODEL', 'a', /role 'hot' or 'cold'/,
    );
  });

  it('a boiler without its flue-gas O2 (direct API) or without a fuel port', () => {
    const fuel = { kind: 'fuel-gas', composition: { CH4: 1 } } as const;
    expectBalanceError(
      () => boilerBalance({ env, ports: [
        { name: 'f', role: 'fuel', direction: 'in', fluid: fuel, mDot_kg_per_s: 1, measured: { p_Pa: 2e5, T_K: 300 } },
        { name: 'g', role: 'flue-gas', direction: 'out', fluid: { kind: 'flue-gas', o2Basis: 'dry' }, mDot_kg_per_s: 'fuel-ratio', measured: { p_Pa: 1e5, T_K: 420 } },
        { name: 'w', role: 'water', direction: 'in', fluid: WATER, mDot_kg_per_s: 10, measured: { p_Pa: 5e6, T_K: 400 } },
        { name: 's', role: 'water', direction: 'out', fluid: WATER, mDot_kg_per_s: 'mass-balance', measured: { p_Pa: 4.5e6, T_K: 700 } },
      ] }),
      'MISSING_INPUT', 'g.O2_fraction', /measured O2 fraction/,
    );
    expectBalanceError(
      () => boilerBalance({ env, ports: [{ name: 'w', role: 'water', direction: 'in', fluid: WATER, mDot_kg_per_s: 10, measured: { p_Pa: 5e6, T_K: 400 } }] }),
      'MISSING_INPUT', 'fuel', /exactly one fuel inlet/,
    );
  });

  it('a dead state outside 200..400 K, and a water dead state below 0 degC', () => {
    expectBalanceError(() => evaluateUnitHour('turbine', turbine, tx({ T0_K: 150 })), 'IMPOSSIBLE_INPUT', 'T0_K', /dead-state temperature = 150 is outside 200\.\.400 K/);
    expectBalanceError(() => evaluateUnitHour('turbine', turbine, tx({ T0_K: 263.15 })), 'IMPOSSIBLE_INPUT', 'T0_K', /water's dead state needs T0 >= 273\.15 K/);
  });

  it('a water state outside IAPWS-IF97 is the property core typed range error', () => {
    expect(() => evaluateUnitHour('turbine', turbine, tx({ 'in.T_K': 2500 }))).toThrow(ThermoRangeError);
    expect(() => evaluateUnitHour('turbine', turbine, tx({ 'in.T_K': 2500 }))).toThrow(/T_K = 2500 is outside the valid range/);
  });

  it('a motor with no power in', () => {
    expectBalanceError(() => evaluateUnitHour('motor', {}, Float64Array.of(298.15, 101325, 0, 10)), 'IMPOSSIBLE_INPUT', 'powerIn_W', /power in = 0/);
  });

  it('bad standard uncertainties', () => {
    const x = tx();
    expectBalanceError(() => unitHourWithUncertainty('turbine', turbine, x, new Float64Array(3)), 'INVALID_MODEL', 'u', /needs 11 uncertainties/);
    const u = new Float64Array(x.length);
    u[3] = -1;
    expectBalanceError(() => unitHourWithUncertainty('turbine', turbine, x, u), 'IMPOSSIBLE_INPUT', 'u(in.p_Pa)', />= 0/);
  });

  it('a flue-gas port state needs its O2 fraction', () => {
    expectBalanceError(() => portState({ kind: 'flue-gas', fuel: { composition: { CH4: 1 } }, o2Basis: 'dry' }, { p_Pa: 1e5, T_K: 400 }, env), 'MISSING_INPUT', 'O2_fraction', /flue gas/);
    expectBalanceError(() => portState({ kind: 'flue-gas', fuel: { composition: { CH4: 1 } }, o2Basis: 'dry' }, { p_Pa: 1e5, T_K: 400, O2_fraction: 0.3 }, env), 'IMPOSSIBLE_INPUT', 'O2_fraction', /0\.3 is outside 0\.\.0\.2/);
  });

  it('a water port without temperature, quality or enthalpy', () => {
    expectBalanceError(() => portState(WATER, { p_Pa: 1e6 }, env), 'MISSING_INPUT', 'T_K', /give T_K, or x or h_J_per_kg/);
  });
});
