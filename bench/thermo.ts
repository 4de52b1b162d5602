/**
 * Speed of the property core.
 *
 *   node --import tsx bench/thermo.ts
 *
 * Times water.pt in region 1 and in region 2, water.ph (regions 1 and 2 mixed), the allocation-free
 * water.h_pt, and the gas mixture h(T) of src/lib/thermo/gas.ts when that module exists. For
 * comparison it spawns the Debian system python3 (override with LOSSLINE_PYTHON) to time the same
 * (p, T) states with python3-iapws IAPWS97(P=, T=), and prints water_pt_vs_iapws, the ratio of
 * evaluations per second (regions 1 and 2 together). Figures are printed as `name: value` lines.
 */
import { spawnSync } from 'node:child_process';
import { water } from '~/lib/thermo/water/index';

const N = 200_000;
const PYTHON = process.env.LOSSLINE_PYTHON ?? '/usr/bin/python3';

/** Deterministic inputs (mulberry32) so that runs are comparable. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function states(n: number, region: 1 | 2, seed: number): { p: Float64Array; T: Float64Array } {
  const r = rng(seed);
  const p = new Float64Array(n);
  const T = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let Ti: number;
    let pi: number;
    if (region === 1) {
      Ti = 280 + 320 * r();
      pi = Math.max(water.psat(Ti) * 1.01, 1e5) + r() * 20e6; // compressed liquid
    } else {
      Ti = 550 + 450 * r();
      pi = 1e4 + r() * 3e6; // superheated steam below 3 MPa
    }
    if (water.pt(pi, Ti).region !== region) throw new Error(`bench input ${i} is not in region ${region}`);
    T[i] = Ti;
    p[i] = pi;
  }
  return { p, T };
}

/** Item i of a bench input, outside the timed loops (an index out of range fails loudly). */
function item(a: Float64Array, i: number): number {
  const v = a[i];
  if (v === undefined) throw new Error(`bench input ${i} is out of range (${a.length} inputs)`);
  return v;
}

/**
 * Runs fn over the input pairs (a[i], b[i]) `rounds` times after a warm-up; returns evaluations per
 * second. The lengths are checked once here, so the timed loops read without a check per item.
 */
function time(fn: (a: number, b: number) => number, a: Float64Array, b: Float64Array = a, rounds = 5): number {
  if (a.length !== b.length) throw new Error(`bench inputs of different lengths (${a.length} and ${b.length})`);
  const n = a.length;
  let sink = 0;
  for (let i = 0; i < n; i++) sink += fn(a[i]!, b[i]!); // warm-up (JIT); i < n, the length of both
  let best = 0;
  for (let k = 0; k < rounds; k++) {
    const t0 = process.hrtime.bigint();
    for (let i = 0; i < n; i++) sink += fn(a[i]!, b[i]!);
    const dt = Number(process.hrtime.bigint() - t0) / 1e9;
    best = Math.max(best, n / dt);
  }
  if (!Number.isFinite(sink)) throw new Error('non-finite result in bench');
  return best;
}

const fmt = (x: number): string => Math.round(x).toString();

const s1 = states(N, 1, 1);
const s2 = states(N, 2, 2);
const r1 = time((p, T) => water.pt(p, T).h, s1.p, s1.T);
const r2 = time((p, T) => water.pt(p, T).h, s2.p, s2.T);
const rh = time((p, T) => water.h_pt(p, T), s1.p, s1.T);
const hMix = new Float64Array(N);
const pMix = new Float64Array(N);
for (let i = 0; i < N; i++) {
  const a = i & 1 ? s1 : s2;
  pMix[i] = item(a.p, i);
  hMix[i] = water.pt(item(a.p, i), item(a.T, i)).h;
}
const rph = time((p, h) => water.ph(p, h).T, pMix, hMix);

console.log(`water_pt_region1_per_s: ${fmt(r1)}`);
console.log(`water_pt_region2_per_s: ${fmt(r2)}`);
console.log(`water_h_pt_region1_per_s: ${fmt(rh)}`);
console.log(`water_ph_per_s: ${fmt(rph)}`);

// Gas mixture h(T), if the gas module is present.
try {
  const gas = (await import('~/lib/thermo/gas')) as {
    mixture?: (x: Record<string, number>, basis: 'mole' | 'mass') => { h(T_K: number): number };
  };
  if (typeof gas.mixture === 'function') {
    const flue = gas.mixture({ N2: 0.75, O2: 0.03, CO2: 0.08, H2O: 0.13, Ar: 0.01 }, 'mole');
    const Tg = new Float64Array(N);
    const r = rng(3);
    for (let i = 0; i < N; i++) Tg[i] = 300 + 1200 * r();
    console.log(`gas_mixture_h_per_s: ${fmt(time((T) => flue.h(T), Tg))}`);
  } else {
    console.log('gas_mixture_h_per_s: n/a (src/lib/thermo/gas.ts has no mixture export)');
  }
} catch (e) {
  console.log(`gas_mixture_h_per_s: n/a (${(e as Error).message.split('\n')[0]})`);
}

// The same (p, T) work in python3-iapws, in a child process.
const M = 2000;
const pyStates = (s: { p: Float64Array; T: Float64Array }) =>
  Array.from({ length: M }, (_, i) => [item(s.p, i) / 1e6, item(s.T, i)]);
const script = `
import json, sys, time
from iapws import IAPWS97
import iapws
data = json.load(sys.stdin)
out = {'version': iapws.__version__}
for key in ('r1', 'r2'):
    pts = data[key]
    IAPWS97(P=pts[0][0], T=pts[0][1])
    t0 = time.perf_counter()
    for P, T in pts:
        IAPWS97(P=P, T=T).h
    out[key] = len(pts) / (time.perf_counter() - t0)
print(json.dumps(out))
`;
const py = spawnSync(PYTHON, ['-c', script], {
  input: JSON.stringify({ r1: pyStates(s1), r2: pyStates(s2) }),
  encoding: 'utf8',
  maxBuffer: 1 << 24,
});
if (py.status === 0) {
  const res = JSON.parse(py.stdout) as { version: string; r1: number; r2: number };
  const iapwsBoth = 2 / (1 / res.r1 + 1 / res.r2);
  const oursBoth = 2 / (1 / r1 + 1 / r2);
  console.log(`iapws_version: ${res.version}`);
  console.log(`iapws_pt_region1_per_s: ${fmt(res.r1)}`);
  console.log(`iapws_pt_region2_per_s: ${fmt(res.r2)}`);
  console.log(`water_pt_vs_iapws: ${(oursBoth / iapwsBoth).toFixed(0)}`);
} else {
  console.log(`water_pt_vs_iapws: n/a (${PYTHON} with python3-iapws not available: ${(py.stderr || String(py.error)).split('\n').filter(Boolean).pop()})`);
}
