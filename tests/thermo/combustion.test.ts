import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { expectClose } from '../support/expect-close';
import { draws, runs } from '../support/random';
import {
  ATOMIC_MASS_kg_per_mol,
  DH_VAP_H2O_298_J_per_mol,
  TYPICAL_FUELS,
  combustionAtLambda,
  combustionFromO2,
  condensedFuel,
  fuelByHeatingValue,
  gaseousFuel,
  heatingValues,
  type CombustionResult,
  type Fuel,
} from '~/lib/thermo/combustion';
import { DRY_AIR_MOLE_FRACTIONS, dryAir, species, type SpeciesName } from '~/lib/thermo/gas';
import { ThermoRangeError } from '~/lib/thermo/errors';
import type { Element } from '~/lib/thermo/species-data';

const ISO2016 = 'ISO 6976:2016 ideal molar calorific values at 25 degC (check-values.md, heating values)';
const COMPUTED = 'check-values.md heating values, column computed from NASA Hf and H2O(l) -285.830';

// fuel, HHV kJ/mol, LHV kJ/mol (ISO 6976:2016), HHV, LHV computed, M g/mol (ISO 2016)
const HV_ROWS: [SpeciesName, number, number, number, number, number][] = [
  ['CH4', 890.58, 802.6, 890.57, 802.56, 16.04246],
  ['C2H6', 1560.69, 1428.64, 1560.66, 1428.65, 30.06904],
  ['C3H8', 2219.17, 2043.11, 2219.17, 2043.15, 44.09562],
  ['H2', 285.83, 241.81, 285.83, 241.83, 2.01588],
];

describe('heating values', () => {
  // NASA formation enthalpies differ from the ISO 6976 data by up to 0.04 kJ/mol (5e-5 relative),
  // so the ISO rows are checked to 1e-4; the computed column to half a unit of its last digit.
  it.each(HV_ROWS.map(([name, hhv, lhv]) => ({ source: ISO2016, name, hhv, lhv })))(
    '$source: $name HHV and LHV per mol',
    ({ name, hhv, lhv }) => {
      const hv = heatingValues(name);
      expectClose(hv.HHV_J_per_mol / 1000, hhv, { rtol: 1e-4, label: 'HHV' });
      expectClose(hv.LHV_J_per_mol / 1000, lhv, { rtol: 1e-4, label: 'LHV' });
    },
  );

  it.each(HV_ROWS.map(([name, , , hhv, lhv]) => ({ source: COMPUTED, name, hhv, lhv })))(
    '$source: $name HHV and LHV per mol',
    ({ name, hhv, lhv }) => {
      const hv = heatingValues(name);
      expectClose(hv.HHV_J_per_mol / 1000, hhv, { atol: 0.0051, label: 'HHV' });
      expectClose(hv.LHV_J_per_mol / 1000, lhv, { atol: 0.0051, label: 'LHV' });
    },
  );

  it.each(HV_ROWS.map(([name, hhv, lhv, , , M]) => ({ source: ISO2016, name, hhv, lhv, M })))(
    '$source: $name HHV and LHV per kg (per-mol value / ISO 2016 molar mass)',
    ({ name, hhv, lhv, M }) => {
      const hv = heatingValues(name);
      expectClose(hv.HHV_J_per_kg, (hhv * 1e3) / (M * 1e-3), { rtol: 1e-4, label: 'HHV' });
      expectClose(hv.LHV_J_per_kg, (lhv * 1e3) / (M * 1e-3), { rtol: 1e-4, label: 'LHV' });
    },
  );

  it('docs/domain.md s.4 (ISO 6976, from memory): CH4 LHV about 50.0 MJ/kg', () => {
    expectClose(heatingValues('CH4').LHV_J_per_kg, 50.0e6, { rtol: 2e-3 });
  });

  it('self-consistency: inert species have zero heating value; mixture value is mole-weighted', () => {
    for (const n of ['CO2', 'H2O', 'N2', 'O2', 'Ar', 'SO2'] as SpeciesName[]) {
      expect(Math.abs(heatingValues(n).LHV_J_per_mol)).toBeLessThan(1e-9);
    }
    const f = gaseousFuel({ CH4: 0.9, C2H6: 0.05, N2: 0.05 });
    expectClose(f.LHV_J_per_mol!, 0.9 * heatingValues('CH4').LHV_J_per_mol + 0.05 * heatingValues('C2H6').LHV_J_per_mol, { rtol: 1e-12 });
    expectClose(f.LHV_J_per_kg, f.LHV_J_per_mol! / f.M_kg_per_mol!, { rtol: 1e-12 });
    // HHV - LHV = water formed * 44.004 kJ/mol (2 mol per mol CH4, 3 per C2H6)
    expectClose(f.HHV_J_per_mol! - f.LHV_J_per_mol!, (0.9 * 2 + 0.05 * 3) * DH_VAP_H2O_298_J_per_mol, { rtol: 1e-12 });
    expectClose(DH_VAP_H2O_298_J_per_mol, 44004, { rtol: 1e-12 });
  });
});

function randomGasFuel(r: () => number): Fuel {
  const raw: Partial<Record<SpeciesName, number>> = {
    CH4: 0.5 + r(),
    C2H6: 0.2 * r(),
    C3H8: 0.1 * r(),
    H2: 0.3 * r(),
    CO: 0.2 * r(),
    CO2: 0.1 * r(),
    N2: 0.1 * r(),
    Ar: 0.01 * r(),
    H2O: 0.02 * r(),
  };
  const sum = Object.values(raw).reduce((s, v) => s + v!, 0);
  for (const k of Object.keys(raw) as SpeciesName[]) raw[k] = raw[k]! / sum;
  return gaseousFuel(raw, 'random gas');
}

function atomsOut(res: CombustionResult): Record<Element, number> {
  const out: Record<Element, number> = { C: 0, H: 0, O: 0, N: 0, S: 0, Ar: 0 };
  for (const [n, v] of Object.entries(res.flue_mol_per_kgFuel) as [SpeciesName, number][]) {
    for (const [el, k] of Object.entries(species[n].elements) as [Element, number][]) out[el] += v * k;
  }
  return out;
}

function atomsIn(fuel: Fuel, res: CombustionResult, w: number): Record<Element, number> {
  const A = res.airDry_mol_per_kgFuel;
  const x = DRY_AIR_MOLE_FRACTIONS;
  const a = fuel.atoms_mol_per_kg;
  return {
    C: a.C + A * x.CO2!,
    H: a.H + 2 * A * w,
    O: a.O + A * (2 * x.O2! + 2 * x.CO2!) + A * w,
    N: a.N + 2 * A * x.N2!,
    S: a.S,
    Ar: a.Ar + A * x.Ar!,
  };
}

describe('combustion balance', () => {
  it('self-consistency: element and mass balances close for random fuels, lambda and humidity', () => {
    fc.assert(
      fc.property(fc.nat(39), draws(24), (i, { next: r }) => {
        const fuel =
          i % 4 === 3
            ? fuelByHeatingValue(['light-fuel-oil', 'heavy-fuel-oil', 'bituminous-coal'][i % 3] as never, 30e6 + 15e6 * r())
            : randomGasFuel(r);
        const lambda = 1 + 2 * r();
        const w = 0.03 * r();
        const res = combustionAtLambda(fuel, lambda, { H2O_mol_per_molDryAir: w });
        const ain = atomsIn(fuel, res, w);
        const aout = atomsOut(res);
        for (const el of ['C', 'H', 'O', 'N', 'S', 'Ar'] as Element[]) {
          expectClose(aout[el], ain[el], { rtol: 1e-12, atol: 1e-12, label: `${fuel.label} ${el}` });
        }
        // mass: 1 kg fuel + humid air = flue gas + ash
        expectClose(res.flue_kg_per_kgFuel + res.ash_kg_per_kgFuel, 1 + res.air_kg_per_kgFuel, { rtol: 1e-12 });
        expectClose(res.lambda, lambda, { rtol: 1e-12 });
        const sumWet = Object.values(res.flueMoleFractions).reduce((s, v) => s + v!, 0);
        const sumDry = Object.values(res.flueDryMoleFractions).reduce((s, v) => s + v!, 0);
        expectClose(sumWet, 1, { rtol: 1e-12 });
        expectClose(sumDry, 1, { rtol: 1e-12 });
        expectClose(res.flueGas.M_kg_per_mol * res.flueWet_mol_per_kgFuel, res.flue_kg_per_kgFuel, { rtol: 1e-12 });
      }),
      runs(20240611, 40),
    );
  });

  it('self-consistency: the O2 of a balance, fed back on dry and wet basis, reproduces lambda', () => {
    fc.assert(
      fc.property(fc.nat(29), draws(16), (i, { next: r }) => {
        const fuel = i % 3 === 0 ? fuelByHeatingValue('heavy-fuel-oil', 40.5e6) : randomGasFuel(r);
        const lambda = 1 + 1.5 * r();
        const air = { humidityRatio_kg_per_kg: 0.015 * r() };
        const fwd = combustionAtLambda(fuel, lambda, air);
        const dry = combustionFromO2(fuel, { O2_fraction: fwd.O2_dry, basis: 'dry' }, air);
        const wet = combustionFromO2(fuel, { O2_fraction: fwd.O2_wet, basis: 'wet' }, air);
        expectClose(dry.lambda, lambda, { rtol: 1e-10 });
        expectClose(wet.lambda, lambda, { rtol: 1e-10 });
        expectClose(dry.O2_dry, fwd.O2_dry, { rtol: 1e-10 });
        expectClose(wet.O2_wet, fwd.O2_wet, { rtol: 1e-10 });
      }),
      runs(7, 30),
    );
  });

  it('self-consistency (hand calculation): methane at lambda = 1 in standard dry air', () => {
    // CH4 + 2 O2: dry air = 2 / 0.209476 = 9.54763 mol per mol CH4;
    // mass ratio = 9.54763 * 28.9651 / 16.04246 = 17.2385 kg/kg;
    // dry flue: CO2 = 1 + 9.54763 * 0.000319, N2 = 9.54763 * 0.78084, Ar = 9.54763 * 0.009365, O2 = 0
    const res = combustionAtLambda(gaseousFuel({ CH4: 1 }), 1);
    const nAir = 2 / 0.209476;
    expectClose(res.airDry_kg_per_kgFuel, (nAir * 28.9651159) / 16.04246, { rtol: 1e-8 }); // M of air printed to 9 digits
    expectClose(res.airStoichDry_kg_per_kgFuel, 17.2385, { rtol: 1e-5 });
    const co2 = 1 + nAir * 0.000319;
    const dry = co2 + nAir * 0.78084 + nAir * 0.009365;
    expectClose(res.flueDryMoleFractions.CO2!, co2 / dry, { rtol: 1e-9 });
    expectClose(res.O2_dry, 0, { atol: 1e-15 });
    expectClose(res.flueMoleFractions.H2O!, 2 / (dry + 2), { rtol: 1e-9 });
  });

  it('common practice: CO2max of natural gas (methane) is about 11.7 % dry', () => {
    const res = combustionAtLambda(gaseousFuel({ CH4: 1 }), 1);
    expectClose(res.flueDryMoleFractions.CO2!, 0.117, { rtol: 5e-3 });
  });

  it('self-consistency (hand calculation): methane with 3 % O2 dry', () => {
    // per mol CH4: O2 = A x_O2 - 2, dry flue = 1 + A (1 - x_O2) + O2 with x_CO2 carried in A;
    // 0.03 = (A*0.209476 - 2) / (1 + A - 2)  =>  A = (2 - 0.03) / (0.209476 - 0.03) per mol CH4
    const A = (2 - 0.03) / (0.209476 - 0.03);
    const res = combustionFromO2(gaseousFuel({ CH4: 1 }), { O2_fraction: 0.03, basis: 'dry' });
    expectClose(res.airDry_mol_per_kgFuel * species.CH4.M_kg_per_mol, A, { rtol: 1e-12 });
    expectClose(res.lambda, (A * 0.209476) / 2, { rtol: 1e-12 });
    // common practice rule of thumb lambda ~ 0.21 / (0.21 - O2dry) = 1.167 ignores the shrinkage of the
    // dry flue gas when water is removed; for methane it is 1.5 % high
    expectClose(res.lambda, 0.21 / 0.18, { rtol: 2e-2 });
  });

  it('sulphur in the fuel leaves as SO2', () => {
    const res = combustionAtLambda(fuelByHeatingValue('heavy-fuel-oil', 40e6), 1.1);
    expectClose(res.flue_mol_per_kgFuel.SO2!, TYPICAL_FUELS['heavy-fuel-oil'].S! / ATOMIC_MASS_kg_per_mol.S, { rtol: 1e-12 });
    expect(res.flueMoleFractions.SO2!).toBeGreaterThan(0);
    expect(combustionAtLambda(gaseousFuel({ CH4: 1 }), 1.1).flueMoleFractions.SO2).toBeUndefined();
  });

  it('self-consistency: humid air carries its water into the flue gas and the air mixture', () => {
    const f = gaseousFuel({ CH4: 1 });
    const dryRes = combustionAtLambda(f, 1.2);
    const wetRes = combustionAtLambda(f, 1.2, { humidityRatio_kg_per_kg: 0.01 });
    const extraH2O = wetRes.flue_mol_per_kgFuel.H2O! - dryRes.flue_mol_per_kgFuel.H2O!;
    expectClose(extraH2O * species.H2O.M_kg_per_mol, 0.01 * wetRes.airDry_kg_per_kgFuel, { rtol: 1e-12 });
    expectClose(wetRes.combustionAir.massFractions.H2O!, 0.01 / 1.01, { rtol: 1e-12 });
    expect(dryRes.combustionAir).toBe(dryAir);
    // humidity does not change the dry-basis O2 at a given lambda
    expectClose(wetRes.O2_dry, dryRes.O2_dry, { rtol: 1e-12 });
  });

  it('fuels known by heating value keep the given LHV and a typical stoichiometry', () => {
    const ng = fuelByHeatingValue('natural-gas', 47e6);
    expect(ng.LHV_J_per_kg).toBe(47e6);
    expect(ng.phase).toBe('gas');
    expectClose(ng.LHV_J_per_mol!, 47e6 * ng.M_kg_per_mol!, { rtol: 1e-12 });
    const coal = fuelByHeatingValue('bituminous-coal', 25e6);
    expect(coal.ash_kg_per_kg).toBe(0.11);
    // HHV - LHV = water formed (H and moisture) * 44.004 kJ/mol
    const nH2O = TYPICAL_FUELS['bituminous-coal'].H / ATOMIC_MASS_kg_per_mol.H / 2 + 0.1 / species.H2O.M_kg_per_mol;
    expectClose(coal.HHV_J_per_kg - coal.LHV_J_per_kg, nH2O * DH_VAP_H2O_298_J_per_mol, { rtol: 1e-12 });
  });

  it('rejects impossible inputs with ThermoRangeError', () => {
    const f = gaseousFuel({ CH4: 1 });
    expect(() => combustionFromO2(f, { O2_fraction: 0.25, basis: 'dry' })).toThrow(ThermoRangeError);
    expect(() => combustionFromO2(f, { O2_fraction: -0.01, basis: 'wet' })).toThrow(ThermoRangeError);
    expect(() => combustionFromO2(f, { O2_fraction: 0.2094, basis: 'dry' })).toThrow(ThermoRangeError);
    expect(() => combustionAtLambda(f, 0.9)).toThrow(ThermoRangeError);
    expect(() => gaseousFuel({ N2: 0.5, CO2: 0.5 })).toThrow(ThermoRangeError);
    // Nothing to oxidise: the stoichiometric O2 demand C + H/4 + S - O/2 is zero (water: H/4 = O/2).
    expect(() => gaseousFuel({ N2: 0.5, CO2: 0.5 }, 'flue gas')).toThrow(/flue gas does not burn/);
    expect(() => condensedFuel({ C: 0, H: 0, moisture: 0.5, ash: 0.5 }, 1e6, 'wet ash')).toThrow(/wet ash does not burn/);
    expect(() => condensedFuel({ C: 0.8, H: 0.1 }, 40e6)).toThrow(ThermoRangeError);
    expect(() => combustionAtLambda(f, 1.1, { H2O_mol_per_molDryAir: 0.01, humidityRatio_kg_per_kg: 0.01 })).toThrow(ThermoRangeError);
  });
});
