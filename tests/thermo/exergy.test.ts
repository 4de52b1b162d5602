import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { expectClose } from '../support/expect-close';
import { draws, runs } from '../support/random';
import {
  G_m_per_s2,
  controlVolumeBalance,
  deadState,
  flowExergy,
  heatExergy,
  type BalanceStream,
  type DeadState,
} from '~/lib/thermo/exergy';
import { dryAir, mixture, type GasMixture } from '~/lib/thermo/gas';
import { liquid } from '~/lib/thermo/liquid';
import { water } from '~/lib/thermo/water';
import { ThermoRangeError } from '~/lib/thermo/errors';

const T0 = 298.15;
const p0 = 101325;

function gasStream(mix: GasMixture, dead: DeadState, T: number, p: number, m: number, direction: 'in' | 'out', V = 0, z = 0): BalanceStream {
  const h = mix.h(T);
  const s = mix.s(T, p);
  return {
    mDot_kg_per_s: m,
    h_J_per_kg: h,
    s_J_per_kgK: s,
    psi_J_per_kg: flowExergy({ h, s }, dead, { velocity_m_per_s: V, elevation_m: z }),
    direction,
    velocity_m_per_s: V,
    elevation_m: z,
  };
}

function waterStream(dead: DeadState, st: { h: number; s: number }, m: number, direction: 'in' | 'out'): BalanceStream {
  return { mDot_kg_per_s: m, h_J_per_kg: st.h, s_J_per_kgK: st.s, psi_J_per_kg: flowExergy(st, dead), direction };
}

describe('flow and heat exergy', () => {
  it('self-consistency: psi is zero at the dead state and adds V^2/2 + g z', () => {
    const dead = deadState.gas(dryAir, T0, p0);
    expectClose(flowExergy({ h: dead.h0, s: dead.s0 }, dead), 0, { atol: 1e-9 });
    expectClose(flowExergy({ h: dead.h0, s: dead.s0 }, dead, { velocity_m_per_s: 30, elevation_m: 12 }), 450 + 12 * G_m_per_s2, { rtol: 1e-12 });
    expect(G_m_per_s2).toBe(9.80665);
  });

  it('self-consistency (formula: ideal gas at constant T): throttling air from 10 to 2 bar loses R T0 ln(p1/p2)', () => {
    // h is a function of T only, so an adiabatic valve keeps T; psi1 - psi2 = -T0 (s1 - s2) = R T0 ln(p1/p2).
    // By hand: R = 8.314462618 / 0.0289651 = 287.051 J/(kg K); 287.051 * 298.15 * ln 5 = 137 742 J/kg.
    const dead = deadState.gas(dryAir, T0, p0);
    const T = 450;
    const psi1 = flowExergy({ h: dryAir.h(T), s: dryAir.s(T, 10e5) }, dead);
    const psi2 = flowExergy({ h: dryAir.h(T), s: dryAir.s(T, 2e5) }, dead);
    expectClose(psi1 - psi2, dryAir.R_J_per_kgK * T0 * Math.log(5), { rtol: 1e-12 });
    expectClose(psi1 - psi2, 137742, { rtol: 1e-5 });
    const bal = controlVolumeBalance({
      T0_K: T0,
      streams: [gasStream(dryAir, dead, T, 10e5, 2, 'in'), gasStream(dryAir, dead, T, 2e5, 2, 'out')],
    });
    expectClose(bal.exergyDestroyed_W, 2 * 137742.498, { rtol: 1e-8 });
    expectClose(bal.entropyGeneration_W_per_K * T0, bal.exergyDestroyed_W, { rtol: 1e-12 });
  });

  it('self-consistency (Carnot factor): heat exergy (1 - T0/Tb) Q, negative below T0', () => {
    expectClose(heatExergy(1e6, 600, 300), 5e5, { rtol: 1e-15 });
    expectClose(heatExergy(1e6, 300, 300), 0, { atol: 1e-9 });
    expectClose(heatExergy(1e5, 250, 300), -2e4, { rtol: 1e-12 });
    expect(() => heatExergy(1, 0, 300)).toThrow(ThermoRangeError);
  });
});

describe('control-volume balance', () => {
  it('hand calculation with constant cp = 1005 J/(kg K) (common practice): adiabatic mixing of two air streams', () => {
    // 1 kg/s at 400 K + 1 kg/s at 300 K, both 1 bar -> 2 kg/s at about 350 K.
    // By hand: Sgen = 1005 [ln(350/400) + ln(350/300)] = 1005 * 0.020619 = 20.72 W/K; X_D = T0 Sgen = 6178 W.
    // The NASA cp varies with T, so the model is compared within 1 %.
    const dead = deadState.gas(dryAir, T0, p0);
    const T3 = dryAir.T_h((dryAir.h(400) + dryAir.h(300)) / 2);
    const bal = controlVolumeBalance({
      T0_K: T0,
      streams: [
        { ...gasStream(dryAir, dead, 400, 1e5, 1, 'in'), label: 'hot' },
        { ...gasStream(dryAir, dead, 300, 1e5, 1, 'in'), label: 'cold' },
        { ...gasStream(dryAir, dead, T3, 1e5, 2, 'out'), label: 'mixed' },
      ],
    });
    expectClose(T3, 350, { rtol: 1e-3 });
    expectClose(bal.entropyGeneration_W_per_K, 20.72, { rtol: 1e-2 });
    expectClose(bal.exergyDestroyed_W, 6178, { rtol: 1e-2 });
    expectClose(bal.energyResidual_W, 0, { atol: 1e-6 });
    expectClose(bal.massResidual_kg_per_s, 0, { atol: 1e-15 });
    expectClose(bal.gouyStodolaGap_W, 0, { atol: 1e-6 });
    expect(bal.terms.map((t) => t.label)).toEqual(['hot', 'cold', 'mixed']);
    expectClose(bal.exergyIn_W - bal.exergyOut_W, bal.exergyDestroyed_W, { rtol: 1e-12 });
  });

  it('self-consistency (Gouy-Stodola): X_D = T0 S_gen on random energy-closed gas balances', () => {
    const flue = mixture({ N2: 0.72, CO2: 0.09, H2O: 0.16, O2: 0.025, Ar: 0.005 }, 'mole');
    fc.assert(
      fc.property(fc.nat(199), draws(40), (i, { next: r }) => {
        const mix = i % 2 ? flue : dryAir;
        const T0i = 270 + 40 * r();
        const p0i = 95e3 + 10e3 * r();
        const dead = deadState.gas(mix, T0i, p0i);
        const nIn = 1 + Math.floor(3 * r());
        const streams: BalanceStream[] = [];
        let mTot = 0;
        let Ein = 0;
        for (let k = 0; k < nIn; k++) {
          const m = 0.1 + 10 * r();
          const V = 60 * r();
          const z = 20 * r();
          const st = gasStream(mix, dead, 250 + 1500 * r(), 5e4 + 3e6 * r(), m, 'in', V, z);
          streams.push(st);
          mTot += m;
          Ein += m * (st.h_J_per_kg + V * V / 2 + G_m_per_s2 * z);
        }
        // two outlets share the mass; heat at a random boundary temperature; power closes the energy balance
        const split = 0.2 + 0.6 * r();
        const outA = gasStream(mix, dead, 250 + 1500 * r(), 5e4 + 3e6 * r(), split * mTot, 'out', 40 * r(), 0);
        const outB = gasStream(mix, dead, 250 + 1500 * r(), 5e4 + 3e6 * r(), (1 - split) * mTot, 'out');
        streams.push(outA, outB);
        const Eout = outA.mDot_kg_per_s * (outA.h_J_per_kg + outA.velocity_m_per_s! ** 2 / 2) + outB.mDot_kg_per_s * outB.h_J_per_kg;
        const Q = (r() - 0.5) * 2e6;
        const Tb = 200 + 1500 * r();
        const W = Q + Ein - Eout;
        const bal = controlVolumeBalance({
          T0_K: T0i,
          streams,
          heat: [{ Q_W: Q, Tb_K: Tb }],
          power_W: [{ power_W: W * 0.3, label: 'shaft' }, { power_W: W * 0.7, label: 'generator' }],
        });
        const scale = bal.exergyIn_W + bal.exergyOut_W;
        expect(Math.abs(bal.energyResidual_W)).toBeLessThan(1e-9 * (Math.abs(Ein) + Math.abs(Eout) + Math.abs(Q)));
        expectClose(bal.exergyDestroyed_W, T0i * bal.entropyGeneration_W_per_K, { atol: 1e-9 * scale, label: `case ${i}` });
      }),
      runs(42, 200),
    );
  });

  it('self-consistency: the Gouy-Stodola gap equals the energy residual when mass closes', () => {
    const dead = deadState.gas(dryAir, T0, p0);
    const bal = controlVolumeBalance({
      T0_K: T0,
      streams: [gasStream(dryAir, dead, 500, 3e5, 1, 'in'), gasStream(dryAir, dead, 420, 1.5e5, 1, 'out')],
      power_W: 10_000, // deliberately not the enthalpy drop
    });
    expectClose(bal.gouyStodolaGap_W, bal.energyResidual_W, { rtol: 1e-9 });
    expect(Math.abs(bal.energyResidual_W)).toBeGreaterThan(1000);
  });

  it('self-consistency (Gouy-Stodola): random energy-closed water and steam balances (turbines, valves, heaters)', () => {
    const dead = deadState.water(T0, p0);
    fc.assert(
      fc.property(fc.nat(149), draws(12), (i, { next: r }) => {
        const m = 1 + 50 * r();
        const p1 = 0.5e6 + 15e6 * r();
        const T1 = water.tsat(p1) + 20 + 300 * r(); // superheated steam
        const s1 = water.pt(p1, T1);
        const p2 = 5e3 + (p1 - 5e3) * r();
        const kind = i % 3; // 0 turbine with heat loss, 1 let-down valve, 2 heater with heat in
        const Q = kind === 0 ? -1e4 * m * r() : kind === 2 ? 5e5 * m * r() : 0;
        const dh = kind === 0 ? -(0.05 + 0.3 * r()) * 1e6 : kind === 2 ? Q / m : 0;
        const W = kind === 0 ? Q - m * dh : 0; // energy closes: Q - W + m (h1 - h2) = 0
        const s2 = water.ph(p2, s1.h + (kind === 0 ? (Q - W) / m : dh));
        const bal = controlVolumeBalance({
          T0_K: T0,
          streams: [waterStream(dead, s1, m, 'in'), waterStream(dead, s2, m, 'out')],
          heat: Q !== 0 ? [{ Q_W: Q, Tb_K: kind === 0 ? 320 : 900 }] : [],
          power_W: W,
        });
        const scale = bal.exergyIn_W + bal.exergyOut_W;
        expect(Math.abs(bal.energyResidual_W)).toBeLessThan(1e-9 * m * s1.h);
        expectClose(bal.exergyDestroyed_W, T0 * bal.entropyGeneration_W_per_K, { atol: 1e-9 * scale, label: `case ${i}` });
        if (kind === 1) {
          // let-down valve: h1 = h2, so psi1 - psi2 = T0 (s2 - s1) >= 0
          expectClose(bal.exergyDestroyed_W, m * T0 * (s2.s - s1.s), { rtol: 1e-9, atol: 1e-6 });
          expect(bal.exergyDestroyed_W).toBeGreaterThanOrEqual(0);
        }
      }),
      runs(97, 150),
    );
  });

  it('self-consistency: mixed substances (air heating a liquid loop) close when each substance keeps its dead state', () => {
    const oil = liquid({ cp_J_per_kgK: 2300, rho_kg_per_m3: 850 });
    const dAir = deadState.gas(dryAir, T0, p0);
    const dOil = deadState.liquid(oil, T0, p0);
    const mAir = 5;
    const mOil = 3;
    const hAir1 = dryAir.h(700);
    const hAir2 = dryAir.h(450);
    const qOil = (mAir * (hAir1 - hAir2)) / mOil;
    const Toil1 = 400;
    const Toil2 = oil.T_ph(4e5, oil.h(Toil1, 5e5) + qOil);
    const oilStream = (T: number, p: number, dir: 'in' | 'out'): BalanceStream => {
      const h = oil.h(T, p);
      const s = oil.s(T);
      return { mDot_kg_per_s: mOil, h_J_per_kg: h, s_J_per_kgK: s, psi_J_per_kg: flowExergy({ h, s }, dOil), direction: dir };
    };
    const bal = controlVolumeBalance({
      T0_K: T0,
      streams: [
        gasStream(dryAir, dAir, 700, 1.1e5, mAir, 'in'),
        gasStream(dryAir, dAir, 450, 1.05e5, mAir, 'out'),
        oilStream(Toil1, 5e5, 'in'),
        oilStream(Toil2, 4e5, 'out'),
      ],
    });
    expectClose(bal.energyResidual_W, 0, { atol: 1e-6 });
    expectClose(bal.exergyDestroyed_W, T0 * bal.entropyGeneration_W_per_K, { rtol: 1e-9 });
    expect(bal.exergyDestroyed_W).toBeGreaterThan(0);
  });

  it('deadState.water is the IF97 state at (p0, T0)', () => {
    const d = deadState.water(T0, p0);
    const st = water.pt(p0, T0);
    expect(d).toEqual({ T0, p0, h0: st.h, s0: st.s });
    expect(() => deadState.water(500, p0)).toThrow(ThermoRangeError);
  });

  it('rejects bad balance input with ThermoRangeError', () => {
    const base = { mDot_kg_per_s: 1, h_J_per_kg: 1, s_J_per_kgK: 1, psi_J_per_kg: 1, direction: 'in' as const };
    expect(() => controlVolumeBalance({ T0_K: T0, streams: [{ ...base, mDot_kg_per_s: -1 }] })).toThrow(ThermoRangeError);
    expect(() => controlVolumeBalance({ T0_K: T0, streams: [{ ...base, h_J_per_kg: Number.NaN }] })).toThrow(ThermoRangeError);
    expect(() => controlVolumeBalance({ T0_K: T0, streams: [base], heat: [{ Q_W: 1, Tb_K: 0 }] })).toThrow(ThermoRangeError);
    expect(() => controlVolumeBalance({ T0_K: 1000, streams: [base] })).toThrow(ThermoRangeError);
    expect(() => controlVolumeBalance({ T0_K: T0, streams: [{ ...base, direction: 'sideways' as never }] })).toThrow(ThermoRangeError);
  });
});
