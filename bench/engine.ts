/**
 * Speed of the hourly engine end to end, pure (no database): a synthetic 50-unit site (invented)
 * computed hour by hour through computeUnitHour (mapping of links and tag hours to SI, the balance,
 * GUM uncertainty, hour state, cost, audit trail and hashes), the unit the worker stores.
 *
 *   npm run bench:engine                       sample of 400 hours per unit, then 2 threads
 *   npm run bench:engine -- --hours=8760       a full year per unit on 2 threads
 *   npm run bench:engine -- --profile          also where the time goes (V8 CPU profile by file)
 *
 * The site: 4 boilers, 6 extraction turbines, 8 let-down valves, 14 feed pumps and 18 heat exchangers,
 * each a copy of one of the engine tests' reference units (tests/engine/cases.ts) with its own tags.
 * Every hour moves the load (flows and powers together, +-12 % over the day) and every reading by a
 * small pseudo-random amount, so that memoised port states do not carry over from hour to hour.
 *
 * Prints unit_hours_per_s with and without uncertainty (one thread), with uncertainty on two worker
 * threads (this machine has 2 cores), and the projected time of the full year with uncertainty.
 * Target: 50 units x 8760 hours = 438,000 unit hours with uncertainty in under a minute.
 */
import { Session } from 'node:inspector';
import { availableParallelism, loadavg } from 'node:os';
import { Worker, isMainThread, parentPort, workerData } from 'node:worker_threads';
import { computeUnitHour, type EngineSite, type TagHour, type UnitHourInput } from '~/lib/engine';
import { water } from '~/lib/thermo/water/index';
import { boilerCase, heatExchangerCase, pumpCase, turbineCase, valveCase, type EngineCase } from '../tests/engine/cases';

const YEAR_HOURS = 8760;
const UNITS = 50;
const H = 3_600_000;
const T_START = Date.UTC(2025, 0, 1);

export const MIX: [() => EngineCase, number][] = [
  [boilerCase, 4],
  [turbineCase, 6],
  [valveCase, 8],
  [pumpCase, 14],
  [heatExchangerCase, 18],
];

interface SynthUnit {
  input: Omit<UnitHourInput, 'tagHours' | 'hourStartMs'>;
  /** per tag: the reading and whether it follows the load */
  tags: { name: string; reading: number; load: boolean }[];
  phase: number;
}

/** A small deterministic generator (mulberry32), so every run computes the same hours. */
export function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function site(): EngineSite {
  return {
    p_atm_Pa: 101325,
    T0_K: 298.15,
    p0_Pa: 101325,
    t0Tag: null,
    currency: 'EUR',
    prices: [],
  };
}

/** The 50 units: copies of the reference units, tags prefixed with the unit's number. */
export function buildSite(): SynthUnit[] {
  const out: SynthUnit[] = [];
  const s = site();
  for (const [make, n] of MIX) {
    for (let k = 0; k < n; k++) {
      const c = make();
      const i = out.length;
      const prefix = `U${String(i).padStart(2, '0')}_`;
      out.push({
        input: {
          unit: {
            id: `unit-${i}`,
            name: `${c.id} ${k + 1}`,
            kind: c.kind,
            parameters: c.parameters,
            fuel: c.fuel ?? null,
            ports: c.ports.map((p) => ({ name: p.name, slot: p.slot, fluid: p.fluid, boundaryT_K: null, account: null })),
          },
          links: c.links.map((l, j) => ({
            id: `link-${i}-${j}`,
            portName: l.port ?? null,
            quantity: l.quantity,
            tagName: prefix + l.tag,
            engUnit: l.unit,
            basis: l.basis ?? null,
            uncertaintyMode: l.uncertainty?.mode ?? (l.quantity === 'temperature' || l.quantity === 'o2Fraction' ? 'absolute' : 'relative'),
            uncertainty: l.uncertainty?.value ?? (l.quantity === 'temperature' ? 1 : l.quantity === 'o2Fraction' ? 0.2 : l.quantity === 'pressure' ? 0.5 : 1),
            validMin: null,
            validMax: null,
            validFromMs: 0,
            validToMs: null,
          })),
          site: s,
          cost: { cF_per_J: 30 / 3.6e9, basis: 'bench' },
        },
        tags: c.links.map((l) => ({ name: prefix + l.tag, reading: l.reading, load: l.quantity === 'massFlow' || l.quantity === 'power' || l.quantity === 'standardVolumeFlow' })),
        phase: (i * 0.37) % (2 * Math.PI),
      });
    }
  }
  return out;
}

/** The tag hours of one unit in hour h (a fresh Map per hour, as the database read gives). */
export function hourOf(u: SynthUnit, h: number, r: () => number): Map<string, TagHour> {
  const load = 1 + 0.12 * Math.sin((2 * Math.PI * (h % 24)) / 24 + u.phase);
  const m = new Map<string, TagHour>();
  for (const t of u.tags) {
    const mean = (t.load ? t.reading * load : t.reading) * (1 + 2e-4 * (r() - 0.5));
    const half = Math.abs(mean) * 0.004;
    m.set(t.name, { mean, min: mean - half, max: mean + half, std: half / 2, samples: 60, coveredFraction: 1, nonNumeric: 0, outOfRange: 0, flatline: false });
  }
  return m;
}

/** Computes `hours` hours of the given units; returns the time spent in the engine [ms] and states. */
function run(units: SynthUnit[], hours: number, uncertainty: boolean, firstHour = 0) {
  const r = rng(12345 + firstHour);
  const states: Record<string, number> = {};
  let engineMs = 0;
  let n = 0;
  for (let h = firstHour; h < firstHour + hours; h++) {
    for (const u of units) {
      const tagHours = hourOf(u, h, r);
      const t0 = performance.now();
      const res = computeUnitHour({ ...u.input, tagHours, hourStartMs: T_START + h * H }, { uncertainty });
      engineMs += performance.now() - t0;
      states[res.state] = (states[res.state] ?? 0) + 1;
      n++;
    }
  }
  return { n, engineMs, states };
}

/** The inputs of `hours` hours of the given units, made before timing (their synthesis is not timed). */
function inputsOf(units: SynthUnit[], hours: number, firstHour = 0): UnitHourInput[] {
  const r = rng(12345 + firstHour);
  const out: UnitHourInput[] = [];
  for (let h = firstHour; h < firstHour + hours; h++) for (const u of units) out.push({ ...u.input, tagHours: hourOf(u, h, r), hourStartMs: T_START + h * H });
  return out;
}

/** CPU time of this process [ms] (user + system): unlike wall time, not stretched by other processes on the machine. */
const cpuMs = () => {
  const c = process.cpuUsage();
  return (c.user + c.system) / 1e3;
};

/** Computes the prepared hours; CPU time [ms] of the engine and the hour states. */
function timed(inputs: UnitHourInput[], uncertainty: boolean) {
  const states: Record<string, number> = {};
  const t0 = cpuMs();
  for (const input of inputs) {
    const res = computeUnitHour(input, { uncertainty });
    states[res.state] = (states[res.state] ?? 0) + 1;
  }
  return { n: inputs.length, engineMs: cpuMs() - t0, states };
}

/** Time of one water.pt call [us]: (p, T) states of the bench's units (liquid and steam), best of three. */
function waterPtMicros(): number {
  const n = 200_000;
  const p = new Float64Array(n);
  const T = new Float64Array(n);
  const r = rng(99);
  for (let i = 0; i < n; i++) {
    if (i % 2) {
      T[i] = 300 + r() * 150; // feedwater, condensate
      p[i] = Math.max(water.psat(T[i]!) * 1.05, 2e5) + r() * 15e6;
    } else {
      T[i] = 480 + r() * 300; // live and extraction steam
      p[i] = 2e5 + r() * 8e6;
      if (p[i]! > water.psat(Math.min(T[i]!, 640)) * 0.95) p[i] = water.psat(Math.min(T[i]!, 640)) * 0.9;
    }
  }
  let best = Infinity;
  let sink = 0;
  for (let k = 0; k < 3; k++) {
    const t0 = cpuMs();
    for (let i = 0; i < n; i++) sink += water.pt(p[i]!, T[i]!).h;
    best = Math.min(best, ((cpuMs() - t0) * 1e3) / n);
  }
  if (!Number.isFinite(sink)) console.log('(check sum)');
  return best;
}

const CATEGORIES: [RegExp, string][] = [
  [/src\/lib\/thermo\//, 'property calls (IF97 water, NASA gases, combustion)'],
  [/src\/lib\/equipment\//, 'balances and the central-difference sweep (equipment)'],
  [/src\/lib\/engine\/hash/, 'hashing (model version, inputs hash)'],
  [/src\/lib\/engine\//, 'mapping, checks, audit trail (engine)'],
  [/src\/lib\/analytics\//, 'hour state (classifyHour) and cost'],
  [/src\/lib\/units\//, 'unit conversion'],
];

async function profiled<T>(fn: () => T): Promise<{ out: T; byCategory: [string, number][] }> {
  const session = new Session();
  session.connect();
  const post = (method: string, params?: object) =>
    new Promise<any>((resolve, reject) => session.post(method, params ?? {}, (err, res) => (err ? reject(err) : resolve(res))));
  await post('Profiler.enable');
  await post('Profiler.setSamplingInterval', { interval: 200 });
  await post('Profiler.start');
  const out = fn();
  const { profile } = await post('Profiler.stop');
  session.disconnect();
  const nodes = new Map<number, { callFrame: { url: string; functionName: string } }>(profile.nodes.map((x: any) => [x.id, x]));
  const self = new Map<number, number>();
  profile.samples.forEach((id: number, i: number) => self.set(id, (self.get(id) ?? 0) + profile.timeDeltas[i]));
  const cat = new Map<string, number>();
  let total = 0;
  for (const [id, t] of self) {
    const cf = nodes.get(id)!.callFrame;
    if (cf.functionName === '(idle)' || cf.functionName === '(program)') continue;
    total += t;
    const name =
      cf.functionName === '(garbage collector)'
        ? 'garbage collection'
        : (CATEGORIES.find(([re]) => re.test(cf.url))?.[1] ?? (/bench\/engine/.test(cf.url) ? 'the bench (synthetic tag hours)' : 'runtime and other'));
    cat.set(name, (cat.get(name) ?? 0) + t);
  }
  return { out, byCategory: [...cat.entries()].map(([k, v]) => [k, v / total] as [string, number]).sort((a, b) => b[1] - a[1]) };
}

/** A worker thread that loads this TypeScript file through tsx's loader. */
const BOOT = new URL(
  'data:text/javascript,' +
    encodeURIComponent(`import { register } from ${JSON.stringify(import.meta.resolve('tsx/esm/api'))}; register(); await import(${JSON.stringify(import.meta.url)});`),
);

async function main() {
  const args = new Map(process.argv.slice(2).map((a) => [a.replace(/^--/, '').split('=')[0]!, a.split('=')[1] ?? 'true']));
  const sample = Number(args.get('sample') ?? 400);
  const hours2 = Number(args.get('hours') ?? 1000);
  const threads = Number(args.get('threads') ?? 2);
  const units = buildSite();
  console.log(`synthetic site: ${units.length} units (${MIX.map(([f, n]) => `${n} ${f().kind}`).join(', ')}); ${availableParallelism()} cores available`);

  // Warm-up (JIT), then rounds of: the sample without uncertainty, with uncertainty, and water.pt calls,
  // taking the best of each over the rounds, all in CPU time of this process. Other processes share the machine: interleaving the
  // three keeps the ratio unit hour / water.pt call fair when the load changes during the run (the
  // load average is printed with the figures).
  run(units, 100, true, 5000);
  run(units, 50, false, 5500);
  const rounds = Number(args.get('rounds') ?? 4);
  const inputs = inputsOf(units, sample);
  let noU = timed(inputs, false);
  let withU = timed(inputs, true);
  let ptUs = waterPtMicros();
  for (let k = 1; k < rounds; k++) {
    const a = timed(inputs, false);
    const b = timed(inputs, true);
    const c = waterPtMicros();
    if (a.engineMs < noU.engineMs) noU = a;
    if (b.engineMs < withU.engineMs) withU = b;
    ptUs = Math.min(ptUs, c);
  }
  const rate0 = noU.n / (noU.engineMs / 1e3);
  const rate1 = withU.n / (withU.engineMs / 1e3);
  console.log(`load average (1 min) before the threads: ${loadavg()[0]!.toFixed(2)} on ${availableParallelism()} cores`);
  console.log(`hour states in the sample: ${JSON.stringify(withU.states)}`);
  console.log(`unit_hours_per_s without uncertainty (1 thread): ${rate0.toFixed(0)}  (${(1e6 / rate0).toFixed(1)} us per unit hour)`);
  console.log(`unit_hours_per_s with uncertainty (1 thread):    ${rate1.toFixed(0)}  (${(1e6 / rate1).toFixed(1)} us per unit hour)`);
  console.log(`water_pt_us ${ptUs.toFixed(3)}  (one IAPWS-IF97 water.pt call, regions 1 and 2 mixed, same run, best of ${3 * rounds})`);
  console.log(`unit_hour_cost_in_water_pt_calls ${(1e6 / rate1 / ptUs).toFixed(0)}  (one unit hour with uncertainty / one water.pt call; target <= 150)`);
  console.log(`uncertainty share of the time: ${(100 * (1 - rate1 / rate0)).toFixed(0)} %`);

  if (args.has('profile')) {
    const { byCategory } = await profiled(() => run(units, Math.min(sample, 200), true, 7000));
    console.log('where the time goes (self time, V8 sampling profile, with uncertainty):');
    for (const [k, v] of byCategory) console.log(`  ${(100 * v).toFixed(1).padStart(5)} %  ${k}`);
  }

  if (threads < 1) return;
  // Two threads: half the units each, `hours2` hours, wall time.
  const parts: SynthUnit[][] = Array.from({ length: threads }, () => []);
  units.forEach((u, i) => parts[i % threads]!.push(u));
  const t0 = performance.now();
  const cpu0 = process.cpuUsage();
  const results = await Promise.all(
    parts.map(
      (_, k) =>
        new Promise<{ n: number; engineMs: number }>((resolve, reject) => {
          const w = new Worker(BOOT, { workerData: { part: k, threads, hours: hours2 } });
          w.once('message', resolve);
          w.once('error', reject);
        }),
    ),
  );
  const cpu = process.cpuUsage(cpu0);
  const wallS = (performance.now() - t0) / 1e3;
  const cpuS = (cpu.user + cpu.system) / 1e6;
  const n = results.reduce((s, r) => s + r.n, 0);
  const engineS = Math.max(...results.map((r) => r.engineMs)) / 1e3;
  const rate2 = n / engineS;
  const full = UNITS * YEAR_HOURS;
  console.log(`unit_hours_per_s with uncertainty (${threads} threads): ${rate2.toFixed(0)}  (${n} unit hours in ${engineS.toFixed(1)} s of engine time per thread; ${wallS.toFixed(1)} s wall, ${cpuS.toFixed(1)} s CPU, thread start-up and tag-hour synthesis included)`);
  console.log(`projected full year (${full} unit hours) with uncertainty on ${threads} threads: ${(full / rate2).toFixed(1)} s (target < 60 s)`);
  console.log(`  the same from CPU time, as if each thread had a core to itself: ${((full * cpuS) / n / threads).toFixed(1)} s`);
}

if (isMainThread) {
  if (process.argv[1]?.endsWith('engine.ts')) await main();
} else {
  const { part, threads, hours } = workerData as { part: number; threads: number; hours: number };
  const mine = buildSite().filter((_, i) => i % threads === part);
  run(mine, 20, true, 6000);
  const out = run(mine, hours, true);
  parentPort!.postMessage({ n: out.n, engineMs: out.engineMs });
}
