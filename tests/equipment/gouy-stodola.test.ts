/**
 * Gouy-Stodola identity, T0 Sgen = D, on randomised energy-closed cases of every unit kind (fast-check
 * with fixed seeds, tests/support/random.ts). Sgen comes from the entropy balance, D from the exergy balance, independently
 * (controlVolumeBalance); every case closes its energy balance through a flow or state taken from it.
 * All checks are labelled 'self-consistency': they test identities, not published numbers.
 */
import { describe, expect, it } from 'vitest';
import { expectClose } from '../support/expect-close';
import { entry } from '../support/present';
import fc from 'fast-check';
import { draws, runs } from '../support/random';
import {
  R_J_per_molK,
  SZARGUT_1988_J_per_mol,
  combustionFromO2,
  dryAir,
  gaseousFuel,
  species,
  water,
  type Composition,
  type SpeciesName,
} from '~/lib/thermo';
import { evaluateUnitHour, inputVector, type UnitBalance, type BalanceKind, type UnitModel } from '~/lib/equipment';

const T0 = 298.15;
const p0 = 101325;
const N = 20;
const WATER = { kind: 'water' } as const;
const AIR = { kind: 'air' } as const;

/** Where a case draws its numbers in [0, 1) from. */
type Source = { next(): number };

function uniform(rng: Source, lo: number, hi: number): number {
  return lo + (hi - lo) * rng.next();
}

function check(b: UnitBalance, label: string): void {
  const scale = Math.max(Math.abs(b.fuel_W), 1);
  // the energy balance closes by construction of every case
  expectClose(b.energyResidual_W, 0, { atol: 1e-9 * scale + 1e-6, label: `${label}: energy residual` });
  // Gouy-Stodola: D = T0 Sgen
  expectClose(b.destruction_W, T0 * b.entropyGeneration_W_per_K, { rtol: 1e-8, atol: 1e-9 * scale + 1e-6, label: `${label}: T0 Sgen vs D` });
  expectClose(b.gouyStodolaResidual_W, 0, { atol: 1e-9 * scale + 1e-6, label: `${label}: residual` });
  // SPECO split closes: F = P + L + D
  expectClose(b.fuel_W - (b.product_W ?? 0) - b.loss_W, b.destruction_W, { atol: 1e-9 * scale + 1e-6, label: `${label}: F - P - L` });
  expect(b.destruction_W, `${label}: D >= 0`).toBeGreaterThanOrEqual(-1e-6 * scale);
}

function run(kind: BalanceKind, model: UnitModel, make: (r: Source) => Record<string, number>, seed: number): UnitBalance[] {
  const out: UnitBalance[] = [];
  fc.assert(
    fc.property(draws(64), (d) => {
      const vals = { T0_K: T0, p0_Pa: p0, ...make(d) };
      const b = evaluateUnitHour(kind, model, inputVector(kind, model, vals));
      check(b, `${kind} #${out.length} ${d}`);
      out.push(b);
    }),
    runs(seed, N),
  );
  return out;
}

describe('self-consistency: Gouy-Stodola on randomised energy-closed cases', () => {
  it('turbine with extraction and wet exhaust from the energy balance', () => {
    const model: UnitModel = {
      powerMeasured: 'electric',
      ports: [
        { name: 'in', direction: 'in', fluid: WATER },
        { name: 'ext', direction: 'out', fluid: WATER },
        { name: 'exh', direction: 'out', fluid: WATER, state: 'energy-balance', flow: 'mass-balance' },
      ],
    };
    run('turbine', model, (r) => {
      let p1: number, T1: number, s1: number, h1: number, px: number, hx: number;
      do {
        // re-draw until the extraction is superheated (its state is measured by p and T)
        p1 = uniform(r, 3e6, 10e6);
        T1 = water.tsat(p1) + uniform(r, 80, 200);
        s1 = water.s_pt(p1, T1);
        h1 = water.h_pt(p1, T1);
        px = uniform(r, 0.3e6, 1.2e6);
        hx = h1 - uniform(r, 0.72, 0.9) * (h1 - water.h_ps(px, s1));
      } while (hx < water.px(px, 1).h + 30e3);
      const Tx = water.T_ph(px, hx);
      const pe = uniform(r, 5e3, 20e3);
      const he = h1 - uniform(r, 0.7, 0.88) * (h1 - water.h_ps(pe, s1));
      const m = uniform(r, 5, 40);
      const mx = uniform(r, 0.05, 0.4) * m;
      const eta = uniform(r, 0.95, 0.99);
      const W = eta * (m * h1 - mx * water.h_pt(px, Tx) - (m - mx) * he);
      return { 'in.mDot_kg_per_s': m, 'in.p_Pa': p1, 'in.T_K': T1, 'ext.mDot_kg_per_s': mx, 'ext.p_Pa': px, 'ext.T_K': Tx, 'exh.p_Pa': pe, power_W: W, generatorEfficiency: eta };
    }, 11);
  });

  it('expander with two outlets on a common expansion line (several states from the energy balance)', () => {
    const model: UnitModel = {
      ports: [
        { name: 'in', direction: 'in', fluid: WATER },
        { name: 'wet-ext', direction: 'out', fluid: WATER, state: 'energy-balance' },
        { name: 'exh', direction: 'out', fluid: WATER, state: 'energy-balance', flow: 'mass-balance' },
      ],
    };
    const rs = run('expander', model, (r) => {
      const p1 = uniform(r, 0.8e6, 3e6);
      const T1 = water.tsat(p1) + uniform(r, 5, 40);
      const m = uniform(r, 5, 20);
      const pe = uniform(r, 8e3, 20e3);
      const h1 = water.h_pt(p1, T1);
      const W = 0.8 * m * (h1 - water.h_ps(pe, water.s_pt(p1, T1)));
      return { 'in.mDot_kg_per_s': m, 'in.p_Pa': p1, 'in.T_K': T1, 'wet-ext.mDot_kg_per_s': 0.2 * m, 'wet-ext.p_Pa': uniform(r, 0.1e6, 0.3e6), 'exh.p_Pa': pe, power_W: W };
    }, 12);
    // both outlets lie on one line h_j = h_in - eta (h_in - h_s,j) with the reported eta
    for (const b of rs) {
      const eta = entry(b.extras, 'expansionEfficiency', 'extras');
      const inn = entry(b.ports, 'in', 'ports').state;
      for (const name of ['wet-ext', 'exh']) {
        const st = entry(b.ports, name, 'ports').state;
        expectClose(st.h, inn.h - eta * (inn.h - water.h_ps(st.p, inn.s)), { rtol: 1e-10, label: name });
      }
    }
  });

  for (const [kind, fluid] of [
    ['compressor', AIR],
    ['fan', AIR],
    ['pump', WATER],
  ] as const) {
    it(`${kind} with the outlet state from the energy balance`, () => {
      const model: UnitModel = {
        ports: [
          { name: 'in', direction: 'in', fluid },
          { name: 'out', direction: 'out', fluid, flow: 'mass-balance', state: 'energy-balance' },
        ],
      };
      run(kind, model, (r) => {
        const m = uniform(r, 1, 30);
        if (kind === 'pump') {
          const p1 = uniform(r, 1e5, 1e6);
          const T1 = uniform(r, 300, 420);
          const p2 = uniform(r, 2e6, 12e6);
          return { 'in.mDot_kg_per_s': m, 'in.p_Pa': p1, 'in.T_K': Math.min(T1, water.tsat(p1) - 5), 'out.p_Pa': p2, power_W: (m * (p2 - p1)) / 950 / uniform(r, 0.6, 0.85) };
        }
        const T1 = uniform(r, 270, 320);
        const p1 = uniform(r, 0.95e5, 1.05e5);
        const p2 = kind === 'fan' ? p1 + uniform(r, 2e3, 9e3) : uniform(r, 3e5, 9e5);
        // actual enthalpy rise from an isentropic efficiency of 0.6..0.9
        const dhs = dryAir.h(dryAir.T_ps(p2, dryAir.s(T1, p1))) - dryAir.h(T1);
        return { 'in.mDot_kg_per_s': m, 'in.p_Pa': p1, 'in.T_K': T1, 'out.p_Pa': p2, power_W: (m * dhs) / uniform(r, 0.6, 0.9) };
      }, kind.length * 7);
    });
  }

  it('heat exchanger with the cold flow from the energy balance', () => {
    const model: UnitModel = {
      ports: [
        { name: 'h-in', role: 'hot', direction: 'in', fluid: WATER },
        { name: 'h-out', role: 'hot', direction: 'out', fluid: WATER, flow: 'mass-balance' },
        { name: 'c-in', role: 'cold', direction: 'in', fluid: { kind: 'liquid', cp_J_per_kgK: 3500, rho_kg_per_m3: 1030 }, flow: 'energy-balance' },
        { name: 'c-out', role: 'cold', direction: 'out', fluid: { kind: 'liquid', cp_J_per_kgK: 3500, rho_kg_per_m3: 1030 }, flow: 'mass-balance' },
      ],
    };
    run('heat-exchanger', model, (r) => {
      const ph = uniform(r, 0.3e6, 2e6);
      const ts = water.tsat(ph);
      return {
        'h-in.mDot_kg_per_s': uniform(r, 0.5, 5), 'h-in.p_Pa': ph, 'h-in.T_K': ts + uniform(r, 5, 80), 'h-out.p_Pa': ph * 0.95, 'h-out.T_K': ts - uniform(r, 5, 30),
        'c-in.p_Pa': 4e5, 'c-in.T_K': uniform(r, 300, 330), 'c-out.p_Pa': 3.5e5, 'c-out.T_K': uniform(r, 340, 370),
      };
    }, 21);
  });

  it('valve, isenthalpic outlet, water and gas', () => {
    for (const fluid of [WATER, AIR]) {
      const model: UnitModel = { ports: [{ name: 'in', direction: 'in', fluid }, { name: 'out', direction: 'out', fluid, state: 'energy-balance', flow: 'mass-balance' }] };
      run('valve', model, (r) => {
        const p1 = uniform(r, 1e6, 10e6);
        const T1 = fluid === WATER ? water.tsat(p1) + uniform(r, 5, 200) : uniform(r, 300, 600);
        return { 'in.mDot_kg_per_s': uniform(r, 0.1, 20), 'in.p_Pa': p1, 'in.T_K': T1, 'out.p_Pa': p1 * uniform(r, 0.05, 0.8) };
      }, 31);
    }
  });

  for (const kind of ['mixer', 'deaerator', 'open-feedwater-heater'] as const) {
    it(`${kind} with the steam flow from the energy balance and a vent`, () => {
      const model: UnitModel = {
        ports: [
          { name: 'steam', direction: 'in', fluid: WATER, flow: 'energy-balance' },
          { name: 'water', direction: 'in', fluid: WATER },
          { name: 'out', direction: 'out', fluid: WATER, flow: 'mass-balance', state: 'sat-liquid' },
          { name: 'vent', role: 'vent', direction: 'out', fluid: WATER, state: 'sat-vapour' },
        ],
      };
      run(kind, model, (r) => {
        const p = uniform(r, 0.12e6, 0.8e6);
        return {
          'steam.p_Pa': p * 1.5, 'steam.T_K': water.tsat(p * 1.5) + uniform(r, 5, 100), 'water.mDot_kg_per_s': uniform(r, 2, 50),
          'water.p_Pa': p * 2, 'water.T_K': uniform(r, 300, water.tsat(p) - 20), 'out.p_Pa': p, 'vent.mDot_kg_per_s': uniform(r, 0, 0.05), 'vent.p_Pa': p,
        };
      }, 41 + kind.length);
    });
  }

  it('condenser with the cooling flow from the energy balance, and a cooler without a cooling side', () => {
    const cond: UnitModel = {
      ports: [
        { name: 'exh', role: 'process', direction: 'in', fluid: WATER, state: 'px' },
        { name: 'hw', role: 'process', direction: 'out', fluid: WATER, flow: 'mass-balance', state: 'sat-liquid' },
        { name: 'ci', role: 'cooling', direction: 'in', fluid: WATER, flow: 'energy-balance' },
        { name: 'co', role: 'cooling', direction: 'out', fluid: WATER, flow: 'mass-balance' },
      ],
    };
    run('condenser', cond, (r) => {
      const p = uniform(r, 8e3, 20e3);
      return { 'exh.mDot_kg_per_s': uniform(r, 2, 30), 'exh.p_Pa': p, 'exh.x': uniform(r, 0.85, 1), 'hw.p_Pa': p, 'ci.p_Pa': 2.5e5, 'ci.T_K': uniform(r, 299, 303), 'co.p_Pa': 2e5, 'co.T_K': uniform(r, 306, 310) };
    }, 51);
    const cooler: UnitModel = {
      ports: [
        { name: 'in', role: 'process', direction: 'in', fluid: AIR },
        { name: 'out', role: 'process', direction: 'out', fluid: AIR, flow: 'mass-balance' },
      ],
    };
    const rs = run('cooler', cooler, (r) => ({ 'in.mDot_kg_per_s': uniform(r, 1, 10), 'in.p_Pa': 7e5, 'in.T_K': uniform(r, 380, 450), 'out.p_Pa': 6.9e5, 'out.T_K': uniform(r, 300, 320) }), 52);
    for (const b of rs) expect(b.flags).toContain('loss-not-separated');
  });

  for (const kind of ['motor', 'generator'] as const) {
    it(`${kind}: losses leave at T0`, () => {
      run(kind, {}, (r) => {
        const pin = uniform(r, 1e4, 1e7);
        return { powerIn_W: pin, powerOut_W: pin * uniform(r, 0.85, 0.99) };
      }, 61 + kind.length);
    });
  }

  it('generic control volume with a state from the energy balance, heats and power', () => {
    const oil = { kind: 'liquid', cp_J_per_kgK: 2300, rho_kg_per_m3: 850 } as const;
    const model: UnitModel = {
      ports: [
        { name: 'in', role: 'fuel', direction: 'in', fluid: oil },
        { name: 'out', role: 'fuel', direction: 'out', fluid: oil, flow: 'mass-balance', state: 'energy-balance' },
      ],
      heats: [
        { name: 'q1', role: 'product', direction: 'out' },
        { name: 'q2', role: 'loss', direction: 'out' },
      ],
      powers: [{ name: 'aux', role: 'fuel', direction: 'in' }],
    };
    run('generic', model, (r) => ({
      'in.mDot_kg_per_s': uniform(r, 1, 10), 'in.p_Pa': 4e5, 'in.T_K': uniform(r, 480, 580), 'out.p_Pa': 3.5e5,
      'q1.Q_W': uniform(r, 1e5, 3e5), 'q1.Tb_K': uniform(r, 350, 450), 'q2.Q_W': uniform(r, 1e3, 2e4), 'q2.Tb_K': uniform(r, 300, 330), 'aux.power_W': uniform(r, 1e3, 1e4),
    }), 71);
  });
});

describe('self-consistency: Gouy-Stodola residual of a boiler = reference-table mismatch of the reaction', () => {
  /**
   * With total exergy (physical against the stream's own composition + Szargut chemical exergy) and
   * absolute NASA enthalpies and entropies, D - T0 Sgen = E_res + sum_i (N_in,i - N_out,i) c_i with
   * c_i = e_ch,i - g_i(T0, p0) per mole of species i: the mixing terms cancel, the water side cancels
   * when its mass closes, and what remains is the Szargut table's disagreement with the NASA Gibbs
   * energies of the reaction. The test evaluates that sum independently from the species data.
   */
  it('randomised gas-fired boilers with the steam flow from the energy balance', () => {
    const fuelX: Composition = { CH4: 0.9, C2H6: 0.05, CO2: 0.02, N2: 0.03 };
    const model: UnitModel = {
      ports: [
        { name: 'fuel', role: 'fuel', direction: 'in', fluid: { kind: 'fuel-gas', composition: fuelX } },
        { name: 'air', role: 'air', direction: 'in', fluid: AIR, flow: 'fuel-ratio' },
        { name: 'stack', role: 'flue-gas', direction: 'out', fluid: { kind: 'flue-gas', o2Basis: 'wet' }, flow: 'fuel-ratio' },
        { name: 'fw', role: 'water', direction: 'in', fluid: WATER, flow: 'mass-balance' },
        { name: 'steam', role: 'water', direction: 'out', fluid: WATER, flow: 'energy-balance' },
      ],
    };
    const fuel = gaseousFuel(fuelX);
    const c = (n: SpeciesName) =>
      SZARGUT_1988_J_per_mol[n] - (species[n].hMolar(T0) - T0 * (species[n].s0Molar(T0) - R_J_per_molK * Math.log(p0 / 1e5)));
    const moles = (x: Readonly<Composition>, mDot: number, M: number) => {
      const out: Partial<Record<SpeciesName, number>> = {};
      for (const [n, xi] of Object.entries(x) as [SpeciesName, number][]) out[n] = (mDot / M) * xi;
      return out;
    };
    fc.assert(fc.property(draws(16), (rng) => {
      const O2 = uniform(rng, 0.01, 0.06);
      const vals = {
        T0_K: T0, p0_Pa: p0, 'fuel.mDot_kg_per_s': uniform(rng, 0.2, 2), 'fuel.p_Pa': 3e5, 'fuel.T_K': uniform(rng, 285, 310),
        'air.p_Pa': 1.03e5, 'air.T_K': uniform(rng, 290, 330), 'stack.p_Pa': 1.01e5, 'stack.T_K': uniform(rng, 390, 480), 'stack.O2_fraction': O2,
        'fw.p_Pa': 8e6, 'fw.T_K': uniform(rng, 370, 490), 'steam.p_Pa': 7e6, 'steam.T_K': uniform(rng, 720, 800),
      };
      const b = evaluateUnitHour('boiler', model, inputVector('boiler', model, vals));
      expectClose(b.energyResidual_W, 0, { atol: 1e-9 * b.fuel_W, label: 'energy closes' });
      const comb = combustionFromO2(fuel, { O2_fraction: O2, basis: 'wet' });
      const nIn = [moles(fuel.moleFractions!, entry(b.ports, 'fuel', 'ports').mDot_kg_per_s, fuel.M_kg_per_mol!), moles(dryAir.moleFractions, entry(b.ports, 'air', 'ports').mDot_kg_per_s, dryAir.M_kg_per_mol)] as const;
      const nOut = moles(comb.flueGas.moleFractions, entry(b.ports, 'stack', 'ports').mDot_kg_per_s, comb.flueGas.M_kg_per_mol);
      let predicted = b.energyResidual_W;
      for (const n of Object.keys(SZARGUT_1988_J_per_mol) as SpeciesName[]) {
        if (!(n in species)) continue;
        const dn = (nIn[0][n] ?? 0) + (nIn[1][n] ?? 0) - (nOut[n] ?? 0);
        predicted += dn * c(n);
      }
      expectClose(b.gouyStodolaResidual_W, predicted, { atol: 1e-8 * b.fuel_W, label: `boiler ${rng}` });
      // and the mismatch is small: below 1e-3 of the fuel exergy
      expect(Math.abs(b.gouyStodolaResidual_W)).toBeLessThan(1e-3 * b.fuel_W);
      expectClose(b.fuel_W - b.product_W! - b.loss_W, b.destruction_W, { atol: 1e-9 * b.fuel_W });
    }), runs(81, N));
  });
});

describe('self-consistency: with mass closed, the Gouy-Stodola residual of a one-substance unit is its energy residual', () => {
  it('turbine with a measured (non-closing) exhaust state', () => {
    const model: UnitModel = {
      ports: [
        { name: 'in', direction: 'in', fluid: WATER },
        { name: 'out', direction: 'out', fluid: WATER, flow: 'mass-balance' },
      ],
    };
    fc.assert(fc.property(draws(8), (rng) => {
      const vals = { T0_K: uniform(rng, 275, 310), p0_Pa: 101325, 'in.mDot_kg_per_s': uniform(rng, 2, 20), 'in.p_Pa': 4e6, 'in.T_K': uniform(rng, 650, 780), 'out.p_Pa': 0.4e6, 'out.T_K': uniform(rng, 430, 520), power_W: uniform(rng, 1e6, 5e6) };
      const b = evaluateUnitHour('turbine', model, inputVector('turbine', model, vals));
      expectClose(b.gouyStodolaResidual_W, b.energyResidual_W, { atol: 1e-9 * Math.abs(b.fuel_W) + 1e-6 });
    }), runs(91, N));
  });
});
