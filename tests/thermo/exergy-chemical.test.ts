import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import {
  PHI_NATURAL_GAS,
  SZARGUT_1988_J_per_mol,
  fuelChemicalExergy,
  mixtureChemicalExergy,
  phiLiquidFuel,
  phiSolidFuel,
  standardChemicalExergy,
  type ChemicalExergySubstance,
} from '~/lib/thermo/chemical-exergy';
import { TYPICAL_FUELS, fuelByHeatingValue, gaseousFuel, heatingValues } from '~/lib/thermo/combustion';
import { R_J_per_molK, dryAir, species } from '~/lib/thermo/gas';
import { ThermoRangeError } from '~/lib/thermo/errors';

const SMS1988 = 'Szargut, Morris & Steward 1988 (check-values.md s.3, 1988 column)';
// kJ/mol as printed in the 1988 column
const TABLE: [ChemicalExergySubstance, number][] = [
  ['N2', 0.72],
  ['O2', 3.97],
  ['CO2', 19.87],
  ['H2O', 9.5],
  ['H2O(l)', 0.9],
  ['Ar', 11.69],
  ['CH4', 831.65],
  ['C2H6', 1495.84],
  ['C3H8', 2154.0],
  ['H2', 236.1],
  ['CO', 275.1],
  ['C(graphite)', 410.26], // from memory in check-values.md; reproduced by the dGf check below
];

const T0 = 298.15;
const RT0_kJ = (R_J_per_molK * T0) / 1000;
// dGf at 298.15 K, kJ/mol: H2O(g) confirmed from JANAF; the others JANAF 4th ed. from memory (check-values.md s.3)
const DGF = { CO2: -394.359, 'H2O(l)': -237.129, 'H2O(g)': -228.582, CH4: -50.768, CO: -137.163 };
const e = (n: ChemicalExergySubstance) => standardChemicalExergy(n) / 1000;

describe('standard chemical exergy table', () => {
  it.each(TABLE.map(([name, kJ]) => ({ source: SMS1988, name, kJ })))('$source: $name', ({ name, kJ }) => {
    expectClose(standardChemicalExergy(name), kJ * 1000, { rtol: 1e-12 });
  });

  it('SO2 313.4 kJ/mol: Szargut, Morris & Steward 1988 as tabulated in libChemExSzargut1988 (TU Berlin)', () => {
    expectClose(standardChemicalExergy('SO2'), 313.4e3, { rtol: 1e-12 });
  });

  it('computed (check-values.md s.3): reference-gas values follow from standard-atmosphere partial pressures (from memory)', () => {
    // ex = -R T0 ln(p_i / p0), p in kPa, p0 = 101.325 kPa; table printed to 0.01 kJ/mol
    const p = { N2: 75.78, O2: 20.39, CO2: 0.0335, H2O: 2.2, Ar: 0.906 } as const;
    for (const [n, pi] of Object.entries(p) as [keyof typeof p, number][]) {
      expectClose(e(n), -RT0_kJ * Math.log(pi / 101.325), { atol: 0.01, label: n });
    }
  });

  it('computed (check-values.md s.3): C(graphite) 410.259, H2 236.097, CO 275.081, CH4 831.579 kJ/mol from dGf', () => {
    // C + O2 -> CO2:           e_C   = e_CO2 - e_O2 - dGf(CO2)
    expectClose(e('CO2') - e('O2') - DGF.CO2, 410.259, { atol: 1e-3 });
    expectClose(e('C(graphite)'), e('CO2') - e('O2') - DGF.CO2, { atol: 0.005 });
    // H2 + 1/2 O2 -> H2O(g):   e_H2  = e_H2O(g) - e_O2/2 - dGf(H2O,g)
    expectClose(e('H2O') - e('O2') / 2 - DGF['H2O(g)'], 236.097, { atol: 1e-3 });
    expectClose(e('H2'), e('H2O') - e('O2') / 2 - DGF['H2O(g)'], { atol: 0.005 });
    // CO + 1/2 O2 -> CO2:      e_CO  = e_CO2 - e_O2/2 - dGf(CO2) + dGf(CO)
    expectClose(e('CO2') - e('O2') / 2 - DGF.CO2 + DGF.CO, 275.081, { atol: 1e-3 });
    expectClose(e('CO'), 275.081, { atol: 0.02 });
    // CH4 + 2 O2 -> CO2 + 2 H2O(l)
    const ch4 = e('CO2') + 2 * e('H2O(l)') - 2 * e('O2') - DGF.CO2 - 2 * DGF['H2O(l)'] + DGF.CH4;
    expectClose(ch4, 831.579, { atol: 1e-3 });
    expectClose(e('CH4'), ch4, { atol: 0.08 }); // 1988 table vs its own dGf data: 0.07 kJ/mol
  });

  it('rejects substances outside the table', () => {
    expect(() => standardChemicalExergy('Xe' as never)).toThrow(ThermoRangeError);
    expect(Object.keys(SZARGUT_1988_J_per_mol)).toContain('C(graphite)');
  });
});

describe('mixtures and fuels', () => {
  it('self-consistency: a pure gas has its table value; mixing lowers the exergy by -R T0 sum x ln x', () => {
    expectClose(mixtureChemicalExergy({ CH4: 1 }).J_per_mol, 831650, { rtol: 1e-12 });
    expectClose(mixtureChemicalExergy({ CH4: 1 }).J_per_kg, 831650 / species.CH4.M_kg_per_mol, { rtol: 1e-12 });
    const m = mixtureChemicalExergy({ CH4: 0.5, N2: 0.5 });
    expectClose(m.J_per_mol, 0.5 * 831650 + 0.5 * 720 + R_J_per_molK * T0 * Math.log(0.5), { rtol: 1e-12 });
    expect(m.J_per_mol).toBeLessThan(0.5 * 831650 + 0.5 * 720);
  });

  it('self-consistency: dry air is close to the reference environment (|e_ch| < 0.2 kJ/mol)', () => {
    const air = mixtureChemicalExergy(dryAir.moleFractions);
    expect(Math.abs(air.J_per_mol)).toBeLessThan(200);
  });

  it('Kotas 1985 (from memory): e_ch/LHV of natural gas about 1.04; computed for CH4 with the 1988 table and ISO LHV', () => {
    const phi = standardChemicalExergy('CH4') / heatingValues('CH4').LHV_J_per_mol;
    expectClose(phi, 1.04, { rtol: 1e-2 }); // computed 1.036
    expectClose(831.65 / 802.6, 1.04, { rtol: 1e-2 }); // with ISO 6976:2016 LHV 802.60 kJ/mol
    const ng = gaseousFuel(TYPICAL_FUELS['natural-gas']);
    expectClose(fuelChemicalExergy(ng) / ng.LHV_J_per_kg, PHI_NATURAL_GAS, { rtol: 1.5e-2 });
  });

  it('self-consistency: fuels known by LHV use phi * LHV', () => {
    const ng = fuelByHeatingValue('natural-gas', 46e6);
    expectClose(fuelChemicalExergy(ng), 1.04 * 46e6, { rtol: 1e-12 });
    const hfo = fuelByHeatingValue('heavy-fuel-oil', 40.5e6);
    expectClose(fuelChemicalExergy(hfo), phiLiquidFuel(TYPICAL_FUELS['heavy-fuel-oil']) * 40.5e6, { rtol: 1e-12 });
    const coal = fuelByHeatingValue('bituminous-coal', 25e6);
    expectClose(fuelChemicalExergy(coal), phiSolidFuel(TYPICAL_FUELS['bituminous-coal']) * (25e6 + 0.1 * 2442.5e3), { rtol: 1e-4 });
  });

  it('common practice (Kotas 1985, from memory): phi of fuel oil about 1.06-1.08, of bituminous coal about 1.06-1.10', () => {
    for (const t of ['light-fuel-oil', 'heavy-fuel-oil'] as const) {
      const phi = phiLiquidFuel(TYPICAL_FUELS[t]);
      expect(phi).toBeGreaterThan(1.06);
      expect(phi).toBeLessThan(1.08);
    }
    const phiCoal = phiSolidFuel(TYPICAL_FUELS['bituminous-coal']);
    expect(phiCoal).toBeGreaterThan(1.06);
    expect(phiCoal).toBeLessThan(1.1);
    expect(() => phiSolidFuel({ C: 0.5, H: 0.06, O: 0.44 })).toThrow(ThermoRangeError);
  });
});
