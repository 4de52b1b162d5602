/**
 * Port states from measurements: the near-saturation flag, two-phase states from x or h (never from
 * p and T), fuels, flue gas and liquids; memoisation of the compiled evaluator.
 */
import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { entry } from '../support/present';
import {
  PHI_NATURAL_GAS,
  combustionFromO2,
  dryAir,
  fuelChemicalExergy,
  gaseousFuel,
  liquid,
  liquidFlowExergy,
  mixtureChemicalExergy,
  species,
  water,
} from '~/lib/thermo';
import {
  evaluateUnitHour,
  fuelEnthalpy298_J_per_kg,
  buildFuel,
  inputVector,
  portState,
  turbineBalance,
  type UnitModel,
} from '~/lib/equipment';

const env = { T0_K: 298.15, p0_Pa: 101325 };
const WATER = { kind: 'water' } as const;

describe('water port states', () => {
  it('self-consistency: (p, T) within the tolerance of Tsat(p) is flagged, outside it is not', () => {
    const p = 1e6;
    const ts = water.tsat(p);
    expect(portState(WATER, { p_Pa: p, T_K: ts + 0.6 }, env).flags).toContain('near-saturation');
    expect(portState(WATER, { p_Pa: p, T_K: ts - 0.6 }, env).flags).toContain('near-saturation');
    expect(portState(WATER, { p_Pa: p, T_K: ts + 1.5 }, env).flags).not.toContain('near-saturation');
    expect(portState({ kind: 'water', saturationTolerance_K: 2 }, { p_Pa: p, T_K: ts + 1.5 }, env).flags).toContain('near-saturation');
    // the flagged state is the single-phase state on the measured side
    expect(portState(WATER, { p_Pa: p, T_K: ts + 0.6 }, env).phase).toBe('vapour');
    expect(portState(WATER, { p_Pa: p, T_K: ts - 0.6 }, env).phase).toBe('liquid');
  });

  it('self-consistency: a two-phase state from x equals the one from h, and T is not used', () => {
    const p = 2e4;
    const fromX = portState(WATER, { p_Pa: p, x: 0.9, T_K: 999 }, env);
    expect(fromX.phase).toBe('two-phase');
    expectClose(fromX.T, water.tsat(p), { rtol: 1e-12 });
    const fromH = portState(WATER, { p_Pa: p, h_J_per_kg: fromX.h }, env);
    expect(fromH.phase).toBe('two-phase');
    expectClose(fromH.x!, 0.9, { rtol: 1e-9 });
    expectClose(fromH.s, fromX.s, { rtol: 1e-10 });
    expectClose(fromH.psi, fromX.psi, { rtol: 1e-8 });
  });

  it('self-consistency: psi = (h - h0) - T0 (s - s0) + V^2/2 + g z, ePh without the kinetic and potential parts', () => {
    const st = portState(WATER, { p_Pa: 4e6, T_K: 700, velocity_m_per_s: 50, elevation_m: 10 }, env);
    const d = water.pt(env.p0_Pa, env.T0_K);
    expectClose(st.ePh, st.h - d.h - env.T0_K * (st.s - d.s), { rtol: 1e-12 });
    expectClose(st.psi, st.ePh + 1250 + 98.0665, { rtol: 1e-12 });
    expect(st.eCh).toBeNull();
    expect(portState(WATER, { p_Pa: 2e5, T_K: 285 }, env).flags).toContain('below-dead-state');
  });
});

describe('gases, fuels, flue gas and liquids', () => {
  it("self-consistency: flue-gas chemical exergy is the property core's mixture value of the combustion products", () => {
    const fuel = { composition: { CH4: 0.95, C2H6: 0.03, N2: 0.02 } };
    const st = portState({ kind: 'flue-gas', fuel, o2Basis: 'wet' }, { p_Pa: 1.01e5, T_K: 430, O2_fraction: 0.03 }, env);
    const comb = combustionFromO2(gaseousFuel(fuel.composition), { O2_fraction: 0.03, basis: 'wet' });
    expectClose(st.eCh!, mixtureChemicalExergy(comb.flueMoleFractions, env.T0_K).J_per_kg, { rtol: 1e-12 });
    expectClose(st.h, comb.flueGas.h(430), { rtol: 1e-12 });
  });

  it('self-consistency: a fuel known by LHV has h(298.15 K) = LHV + sum of product formation enthalpies and e_ch = 1.04 LHV (Kotas 1985)', () => {
    const spec = { fuelType: 'natural-gas' as const, LHV_J_per_kg: 47.5e6 };
    const st = portState({ kind: 'fuel', fuel: spec }, { p_Pa: 1.01325e5, T_K: 298.15 }, env);
    const f = buildFuel(spec);
    const a = f.atoms_mol_per_kg;
    const h298 = 47.5e6 + a.C * species.CO2.hf298_J_per_mol + (a.H / 2) * species.H2O.hf298_J_per_mol + a.S * species.SO2.hf298_J_per_mol;
    expectClose(st.h, h298, { rtol: 1e-12 });
    expectClose(fuelEnthalpy298_J_per_kg(f), h298, { rtol: 1e-12 });
    expectClose(st.eCh!, PHI_NATURAL_GAS * 47.5e6, { rtol: 1e-12 });
    expectClose(st.psi, 0, { atol: 1e-6 });
  });

  it('self-consistency: a fuel gas by composition has its LHV as the enthalpy difference to its products', () => {
    const comp = { CH4: 1 };
    const st = portState({ kind: 'fuel-gas', composition: comp }, { p_Pa: 101325, T_K: 298.15 }, env);
    // NASA polynomial at 298.15 K vs the tabulated formation enthalpy: 0.4 J/mol apart (fit residual)
    expectClose(st.h, fuelEnthalpy298_J_per_kg(gaseousFuel(comp)), { rtol: 1e-5 });
    const same = portState({ kind: 'fuel', fuel: { composition: comp } }, { p_Pa: 101325, T_K: 298.15 }, env);
    expect(same.h).toBe(st.h);
  });

  it('self-consistency: a condensed fuel is taken at the dead state and flagged for entropy', () => {
    const st = portState({ kind: 'fuel', fuel: { fuelType: 'bituminous-coal', LHV_J_per_kg: 25e6 } }, {}, env);
    expect(st.psi).toBe(0);
    expect(st.flags).toContain('no-absolute-entropy');
    expect(st.eCh!).toBeGreaterThan(25e6);
  });

  it("self-consistency: liquid psi equals the property core's closed form", () => {
    const spec = { kind: 'liquid' as const, cp_J_per_kgK: 3600, rho_kg_per_m3: 1040 };
    const st = portState(spec, { p_Pa: 5e5, T_K: 360 }, env);
    expectClose(st.psi, liquidFlowExergy(liquid(spec), 360, 5e5, env.T0_K, env.p0_Pa), { rtol: 1e-10 });
  });
});

describe('boiler on a condensed fuel', () => {
  it('self-consistency: F = fuel chemical exergy (property core correlation) + air; no entropy balance, flagged', () => {
    const fuel = { fuelType: 'heavy-fuel-oil' as const, LHV_J_per_kg: 40.5e6 };
    const model: UnitModel = {
      ports: [
        { name: 'oil', role: 'fuel', direction: 'in', fluid: { kind: 'fuel', fuel }, state: 'ambient' },
        { name: 'stack', role: 'flue-gas', direction: 'out', fluid: { kind: 'flue-gas', o2Basis: 'dry' }, flow: 'fuel-ratio' },
        { name: 'fw', role: 'water', direction: 'in', fluid: WATER },
        { name: 'steam', role: 'water', direction: 'out', fluid: WATER, flow: 'mass-balance' },
      ],
    };
    const b = evaluateUnitHour('boiler', model, inputVector('boiler', model, {
      T0_K: 298.15, p0_Pa: 101325, 'oil.mDot_kg_per_s': 0.5, 'stack.p_Pa': 1.01e5, 'stack.T_K': 450, 'stack.O2_fraction': 0.035,
      'fw.mDot_kg_per_s': 7, 'fw.p_Pa': 4.5e6, 'fw.T_K': 390, 'steam.p_Pa': 4e6, 'steam.T_K': 680,
    }));
    const eCh = fuelChemicalExergy(buildFuel(fuel), 298.15);
    // the air port is implicit (ambient): its exergy is the chemical exergy of dry air
    expectClose(b.fuel_W, 0.5 * eCh + entry(b.ports, 'air', 'ports').mDot_kg_per_s * mixtureChemicalExergy(dryAir.moleFractions, 298.15).J_per_kg, { rtol: 1e-12 });
    expect(Number.isNaN(b.entropyGeneration_W_per_K)).toBe(true);
    expect(b.flags).toContain('no-entropy-balance');
    expect(b.efficiency!).toBeGreaterThan(0.2);
    expect(b.efficiency!).toBeLessThan(0.6);
    expectClose(b.fuel_W - b.product_W! - b.loss_W, b.destruction_W, { rtol: 1e-12 });
  });
});

describe('turbine wet exhaust and memoised evaluation', () => {
  const model: UnitModel = {
    powerMeasured: 'electric',
    ports: [
      { name: 'in', direction: 'in', fluid: WATER },
      { name: 'exh', direction: 'out', fluid: WATER, state: 'energy-balance', flow: 'mass-balance' },
    ],
  };
  const vals = { T0_K: 298.15, p0_Pa: 101325, 'in.mDot_kg_per_s': 12, 'in.p_Pa': 4e6, 'in.T_K': 700, 'exh.p_Pa': 1.2e4, power_W: 9e6, generatorEfficiency: 0.975 };

  it('self-consistency: one wet outlet gets h_out = h_in - W / (mDot eta_gen) (docs/domain.md s.3)', () => {
    const b = evaluateUnitHour('turbine', model, inputVector('turbine', model, vals));
    expectClose(entry(b.ports, 'exh', 'ports').state.h, water.h_pt(4e6, 700) - 9e6 / (12 * 0.975), { rtol: 1e-12 });
    expect(entry(b.ports, 'exh', 'ports').state.phase).toBe('two-phase');
    expectClose(b.product_W!, 9e6 / 0.975, { rtol: 1e-12 });
  });

  it('self-consistency: the direct balance function gives the same result as the vector path', () => {
    const a = evaluateUnitHour('turbine', model, inputVector('turbine', model, vals));
    const b = turbineBalance({
      env,
      power_W: 9e6,
      powerMeasured: 'electric',
      generatorEfficiency: 0.975,
      ports: [
        { name: 'in', direction: 'in', fluid: WATER, mDot_kg_per_s: 12, measured: { p_Pa: 4e6, T_K: 700 } },
        { name: 'exh', direction: 'out', fluid: WATER, mDot_kg_per_s: 'mass-balance', measured: { fromEnergyBalance: true, p_Pa: 1.2e4 } },
      ],
    });
    expect(b.destruction_W).toBe(a.destruction_W);
    expect(b.efficiency).toBe(a.efficiency);
    expect(b.extras.isentropicEfficiency).toBe(a.extras.isentropicEfficiency);
  });

  it('self-consistency: memoised port states never leak between different inputs', () => {
    const x1 = inputVector('turbine', model, vals);
    const x2 = inputVector('turbine', model, { ...vals, 'in.T_K': 720, 'exh.p_Pa': 1.5e4 });
    const r1 = evaluateUnitHour('turbine', model, x1).destruction_W;
    const r2 = evaluateUnitHour('turbine', model, x2).destruction_W;
    expect(r2).not.toBe(r1);
    for (const x of [x2, x1, x2, x1, x1]) {
      const fresh = evaluateUnitHour('turbine', { ...model }, x).destruction_W; // new model object: no memo
      expect(evaluateUnitHour('turbine', model, x).destruction_W).toBe(fresh);
    }
  });
});
