/**
 * Speed of the pure equipment engine: unit hours per second with and without uncertainty, for a mix of
 * unit kinds of an invented plant (no database, no I/O beyond printing).
 *
 *   node --import tsx bench/engine-core.ts [hoursPerUnit=2000] [per-kind [kind]]
 *
 * Single-threaded; unit hours are independent, so the 2-core figure printed is the 1-core time halved
 * (an estimate: hours split over two worker processes). 'per-kind' also prints each kind alone.
 *
 * Each simulated hour moves every measurement by a small pseudo-random amount so that memoised port
 * states cannot carry over from one hour to the next. The product target: a 50-unit site for a year
 * (438,000 unit hours) with uncertainty in under a minute on 2 cores, i.e. >= 3,650 unit hours/s per core.
 */
import { evaluateUnitHour, inputNames, unitHourWithUncertainty, type BalanceKind, type UnitModel } from '~/lib/equipment';

interface Case {
  kind: BalanceKind;
  model: UnitModel;
  values: Record<string, number>;
  /** relative standard uncertainty per input name pattern (suffix) */
}

const water = { kind: 'water' } as const;
const gasFuel = { kind: 'fuel-gas', composition: { CH4: 0.93, C2H6: 0.04, CO2: 0.01, N2: 0.02 } } as const;

/** The invented plant: a gas-fired steam plant with an extraction turbine. */
const CASES: Case[] = [
  {
    kind: 'turbine',
    model: {
      powerMeasured: 'electric',
      ports: [
        { name: 'main-steam', direction: 'in', fluid: water },
        { name: 'extraction', direction: 'out', fluid: water },
        { name: 'exhaust', direction: 'out', fluid: water, state: 'energy-balance', flow: 'mass-balance' },
      ],
    },
    values: {
      'main-steam.mDot_kg_per_s': 14, 'main-steam.p_Pa': 6.0e6, 'main-steam.T_K': 758.15,
      'extraction.mDot_kg_per_s': 3.5, 'extraction.p_Pa': 0.5e6, 'extraction.T_K': 468.15,
      'exhaust.p_Pa': 9e3, power_W: 11.2e6, generatorEfficiency: 0.978,
    },
  },
  {
    kind: 'boiler',
    model: {
      ports: [
        { name: 'fuel', role: 'fuel', direction: 'in', fluid: gasFuel },
        { name: 'air', role: 'air', direction: 'in', fluid: { kind: 'air' }, flow: 'fuel-ratio' },
        { name: 'stack', role: 'flue-gas', direction: 'out', fluid: { kind: 'flue-gas', o2Basis: 'dry' }, flow: 'fuel-ratio' },
        { name: 'feedwater', role: 'water', direction: 'in', fluid: water },
        { name: 'steam', role: 'water', direction: 'out', fluid: water, flow: 'mass-balance' },
      ],
    },
    values: {
      'fuel.mDot_kg_per_s': 0.95, 'fuel.p_Pa': 3e5, 'fuel.T_K': 293.15, 'air.p_Pa': 1.03e5, 'air.T_K': 303.15,
      'stack.p_Pa': 1.01e5, 'stack.T_K': 418.15, 'stack.O2_fraction': 0.032,
      'feedwater.mDot_kg_per_s': 14, 'feedwater.p_Pa': 7.2e6, 'feedwater.T_K': 378.15, 'steam.p_Pa': 6.2e6, 'steam.T_K': 763.15,
    },
  },
  {
    kind: 'pump',
    model: { powerMeasured: 'electric', ports: [
      { name: 'suction', direction: 'in', fluid: water },
      { name: 'discharge', direction: 'out', fluid: water, flow: 'mass-balance' },
    ] },
    values: { 'suction.mDot_kg_per_s': 14, 'suction.p_Pa': 0.3e6, 'suction.T_K': 377.15, 'discharge.p_Pa': 7.3e6, 'discharge.T_K': 378.35, power_W: 145e3, motorEfficiency: 0.95 },
  },
  {
    kind: 'fan',
    model: { ports: [
      { name: 'inlet', direction: 'in', fluid: { kind: 'air' } },
      { name: 'outlet', direction: 'out', fluid: { kind: 'air' }, flow: 'mass-balance' },
    ] },
    values: { 'inlet.mDot_kg_per_s': 16, 'inlet.p_Pa': 1.0e5, 'inlet.T_K': 298.15, 'outlet.p_Pa': 1.06e5, 'outlet.T_K': 304.0, power_W: 120e3 },
  },
  {
    kind: 'heat-exchanger',
    model: { ports: [
      { name: 'steam-in', role: 'hot', direction: 'in', fluid: water },
      { name: 'condensate-out', role: 'hot', direction: 'out', fluid: water, flow: 'mass-balance', state: 'sat-liquid' },
      { name: 'water-in', role: 'cold', direction: 'in', fluid: water },
      { name: 'water-out', role: 'cold', direction: 'out', fluid: water, flow: 'mass-balance' },
    ] },
    values: {
      'steam-in.mDot_kg_per_s': 1.2, 'steam-in.p_Pa': 0.5e6, 'steam-in.T_K': 470, 'condensate-out.p_Pa': 0.48e6,
      'water-in.mDot_kg_per_s': 14, 'water-in.p_Pa': 0.8e6, 'water-in.T_K': 333.15, 'water-out.p_Pa': 0.75e6, 'water-out.T_K': 378.15,
    },
  },
  {
    kind: 'valve',
    model: { ports: [
      { name: 'inlet', direction: 'in', fluid: water },
      { name: 'outlet', direction: 'out', fluid: water, flow: 'mass-balance', state: 'energy-balance' },
    ] },
    values: { 'inlet.mDot_kg_per_s': 2.0, 'inlet.p_Pa': 6.0e6, 'inlet.T_K': 758.15, 'outlet.p_Pa': 0.5e6 },
  },
  {
    kind: 'deaerator',
    model: { ports: [
      { name: 'heating-steam', direction: 'in', fluid: water, flow: 'energy-balance' },
      { name: 'condensate', direction: 'in', fluid: water },
      { name: 'feedwater', direction: 'out', fluid: water, flow: 'mass-balance', state: 'sat-liquid' },
    ] },
    values: { 'heating-steam.p_Pa': 0.5e6, 'heating-steam.T_K': 468.15, 'condensate.mDot_kg_per_s': 12.5, 'condensate.p_Pa': 0.6e6, 'condensate.T_K': 318.15, 'feedwater.p_Pa': 0.12e6 },
  },
  {
    kind: 'condenser',
    model: { ports: [
      { name: 'exhaust', role: 'process', direction: 'in', fluid: water, state: 'px' },
      { name: 'hotwell', role: 'process', direction: 'out', fluid: water, flow: 'mass-balance', state: 'sat-liquid' },
      { name: 'cw-in', role: 'cooling', direction: 'in', fluid: water },
      { name: 'cw-out', role: 'cooling', direction: 'out', fluid: water, flow: 'mass-balance' },
    ] },
    values: {
      'exhaust.mDot_kg_per_s': 10.5, 'exhaust.p_Pa': 9e3, 'exhaust.x': 0.93, 'hotwell.p_Pa': 9e3,
      'cw-in.mDot_kg_per_s': 600, 'cw-in.p_Pa': 2.5e5, 'cw-in.T_K': 299.15, 'cw-out.p_Pa': 1.8e5, 'cw-out.T_K': 308.15,
    },
  },
  { kind: 'motor', model: {}, values: { powerIn_W: 150e3, powerOut_W: 142e3 } },
  {
    kind: 'generic',
    model: {
      ports: [
        { name: 'oil-in', role: 'fuel', direction: 'in', fluid: { kind: 'liquid', cp_J_per_kgK: 2300, rho_kg_per_m3: 850 } },
        { name: 'oil-out', role: 'fuel', direction: 'out', fluid: { kind: 'liquid', cp_J_per_kgK: 2300, rho_kg_per_m3: 850 }, flow: 'mass-balance' },
      ],
      heats: [{ name: 'dryer-heat', role: 'product', direction: 'out' }],
    },
    values: { 'oil-in.mDot_kg_per_s': 5, 'oil-in.p_Pa': 4e5, 'oil-in.T_K': 553.15, 'oil-out.p_Pa': 3.5e5, 'oil-out.T_K': 513.15, 'dryer-heat.Q_W': 460e3, 'dryer-heat.Tb_K': 423.15 },
  },
];

/** Standard uncertainty of an input, common practice (docs/domain.md s.6). */
function defaultU(name: string, v: number): number {
  if (name === 'T0_K' || name === 'p0_Pa') return 0;
  if (name.endsWith('.T_K') || name.endsWith('.Tb_K')) return 0.5;
  if (name.endsWith('.p_Pa')) return 0.0025 * v;
  if (name.endsWith('.mDot_kg_per_s')) return 0.01 * v;
  if (name.endsWith('.x')) return 0.01;
  if (name.endsWith('.O2_fraction')) return 0.002;
  if (name.endsWith('Efficiency')) return 0.003;
  if (name.endsWith('_W')) return 0.005 * Math.abs(v);
  return 0;
}

function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

interface Prepared {
  kind: BalanceKind;
  model: UnitModel;
  x0: Float64Array;
  u: Float64Array;
  jitter: Float64Array;
}

function prepare(c: Case): Prepared {
  const names = inputNames(c.kind, c.model);
  const vals: Record<string, number> = { T0_K: 298.15, p0_Pa: 101325, ...c.values };
  const inputs = names.map((n) => {
    const v = vals[n];
    if (v === undefined) throw new Error(`bench case ${c.kind}: no value for ${n}`);
    return { n, v };
  });
  const x0 = Float64Array.from(inputs, ({ v }) => v);
  const u = Float64Array.from(inputs, ({ n, v }) => defaultU(n, v));
  // Hour-to-hour variation: temperatures +-0.3 K, others +-0.2 %, fixed fractions untouched.
  const jitter = Float64Array.from(inputs, ({ n, v }) => (n.endsWith('_K') ? 0.3 : n.endsWith('.x') || n.endsWith('Efficiency') || n.endsWith('O2_fraction') ? 0 : 0.002 * Math.abs(v)));
  return { kind: c.kind, model: c.model, x0, u, jitter };
}

function run(units: Prepared[], hours: number, withU: boolean): { rate: number; failed: number } {
  const rnd = mulberry32(7);
  // each unit with its own input buffer; x0, jitter and the buffer have one length (prepare)
  const work = units.map((p) => ({ p, xk: new Float64Array(p.x0.length) }));
  let failed = 0;
  const t0 = performance.now();
  for (let h = 0; h < hours; h++) {
    for (const { p, xk } of work) {
      for (let i = 0; i < xk.length; i++) xk[i] = p.x0[i]! + (2 * rnd() - 1) * p.jitter[i]!;
      try {
        if (withU) unitHourWithUncertainty(p.kind, p.model, xk, p.u);
        else evaluateUnitHour(p.kind, p.model, xk);
      } catch {
        failed++;
      }
    }
  }
  const dt = (performance.now() - t0) / 1000;
  return { rate: (hours * units.length) / dt, failed };
}

const hours = Number(process.argv[2] ?? 2000);
const units = CASES.map(prepare);
if (process.argv[3] === 'per-kind') {
  const only = process.argv[4];
  for (const p of units.filter((q) => !only || q.kind === only)) {
    run([p], 200, true); // warm-up
    const a = run([p], hours, false);
    const b = run([p], hours, true);
    console.log(`${p.kind.padEnd(16)} plain ${a.rate.toFixed(0).padStart(7)}/s  with u ${b.rate.toFixed(0).padStart(6)}/s  (${p.x0.length} inputs)`);
  }
}
run(units, 20, true); // warm-up
const plain = run(units, hours, false);
const withU = run(units, hours, true);
const inputs = units.reduce((a, p) => a + p.x0.length, 0) / units.length;
console.log(`kinds: ${units.map((p) => p.kind).join(', ')} (mean ${inputs.toFixed(1)} inputs per unit)`);
console.log(`unit_hours_per_s without uncertainty: ${plain.rate.toFixed(0)} (failed ${plain.failed})`);
console.log(`unit_hours_per_s with uncertainty:    ${withU.rate.toFixed(0)} (failed ${withU.failed})`);
const siteYear = 50 * 8760;
console.log(`50-unit site-year (${siteYear} unit hours) with uncertainty: ${(siteYear / withU.rate).toFixed(1)} s on 1 core, about ${(siteYear / withU.rate / 2).toFixed(1)} s on 2 cores (target < 60 s)`);
