/**
 * What the drift check's default settings give on hourly residuals, by simulation through the
 * product's own code (src/lib/analytics: fitAr1, ar1Innovation, cusumStep with the minimum run
 * length), no database.
 *
 *   npm run bench:drift                  default effort (about a minute on one core)
 *   npm run bench:drift -- --runs=3000   more runs per in-control case (tighter figures)
 *
 * Residual series (in units of the residual spread s, the baseline's spread of one hour):
 * - independent: N(0, 1) per steady hour;
 * - AR(1): r_t = phi r_(t-1) + e_t, stationary spread 1, with the phi the demo's baselines show
 *   (DEMO_PHI below, measured with scripts/drift-demo-check.ts).
 * Each run first simulates a reference period of REFERENCE_HOURS steady hours and fits phi and the
 * innovation spread on it (fitAr1), as a baseline does; the CUSUM then runs on the standardised
 * innovations of the following hours, as the drift check does. "unwhitened" runs the same CUSUM on
 * r / s directly (what Lossline did before), to show why the pre-whitening is there.
 *
 * Prints `name value` lines:
 * - arl0_* : in-control average run length [steady hours] to the first signal of either direction
 *   (target >= 8760: at most one chance notice per unit per year), with its standard error;
 * - markov_arl0_two_sided: the same for independent innovations without the minimum run length,
 *   from the Brook & Evans chain (src/lib/analytics/arl.ts), for comparison;
 * - delay_* : mean detection delay [steady hours] from the first shifted hour to the signal, for
 *   steps of 1, 2 and 3 residual spreads and for a ramp of 1 spread per 24 steady hours, the shift
 *   starting after WARMUP in-control hours (runs with a chance signal before it are drawn again).
 */
import { fitAr1, ar1Innovation, type Ar1Model } from '~/lib/analytics/autocorrelation';
import { cusumArlTwoSided } from '~/lib/analytics/arl';
import { DRIFT_CHECK_DEFAULTS, cusumInit, cusumStep, type CusumOptions } from '~/lib/analytics/drift';
import { createRng, type Rng } from '~/lib/analytics/rng';

/**
 * Lag-one autocorrelation of the destruction residuals of the demo's baselines (seed 7, reference
 * period 2025-01-06 to 2025-08-31, scripts/drift-demo-check.ts): Boiler B1 0.07, FWP1 0.10, TG1 0.17,
 * AC1 0.21, E601 0.28, DA1 at the clamp 0.95 (its residual follows the seasons' make-up water).
 */
const DEMO_PHI = { typical: 0.21, highest_below_clamp: 0.28, DA1: 0.95 } as const;
const REFERENCE_HOURS = 4000;
const WARMUP = 48;
const MAX_HOURS = 400_000;

const args = Object.fromEntries(process.argv.slice(2).map((a) => a.replace(/^--/, '').split('=')) as [string, string][]);
const RUNS = Number(args.runs ?? 1000);
const DELAY_RUNS = Number(args.delayRuns ?? 1000);

const options: CusumOptions = { k: DRIFT_CHECK_DEFAULTS.k, h: DRIFT_CHECK_DEFAULTS.h, minRunLength: DRIFT_CHECK_DEFAULTS.sustainedHours, resetOnSignal: true };

/** One AR(1) path, stationary spread 1 (phi = 0: independent). */
function ar1Source(rng: Rng, phi: number) {
  const se = Math.sqrt(1 - phi * phi);
  let r = rng.normal();
  return () => {
    r = phi * r + se * rng.normal();
    return r;
  };
}

/** A fitted reference period: the model the drift check would get from the baseline. */
function reference(next: () => number, whiten: boolean): Ar1Model {
  const xs = new Array<number>(REFERENCE_HOURS);
  for (let i = 0; i < REFERENCE_HOURS; i++) xs[i] = next();
  if (!whiten) {
    let ss = 0;
    for (const x of xs) ss += x * x;
    return { phi: 0, sInnovation: Math.sqrt(ss / (REFERENCE_HOURS - 1)) };
  }
  const f = fitAr1(xs);
  return { phi: f.phi, sInnovation: f.sInnovation };
}

/**
 * Steps until the first signal. shift(i) is the residual's mean shift at monitored hour i (1-based)
 * [residual spreads]; returns the hour of the first signal (or MAX_HOURS).
 */
function runLength(rng: Rng, phi: number, whiten: boolean, shift: (i: number) => number): number {
  const next = ar1Source(rng, phi);
  const model = reference(next, whiten);
  let state = cusumInit();
  let prev: number | null = null;
  for (let i = 1; i <= MAX_HOURS; i++) {
    const r = next() + shift(i);
    const x = ar1Innovation(r, prev === null ? null : { r: prev, hoursBack: 1 }, model);
    prev = r;
    const out = cusumStep(state, x, options);
    state = out.state;
    if (out.point.signals.length) return i;
  }
  return MAX_HOURS;
}

function meanSe(xs: number[]): { mean: number; se: number } {
  const m = xs.reduce((a, b) => a + b, 0) / xs.length;
  const v = xs.reduce((a, b) => a + (b - m) ** 2, 0) / (xs.length - 1);
  return { mean: m, se: Math.sqrt(v / xs.length) };
}

function print(name: string, value: number, digits = 1) {
  console.log(`${name} ${value.toFixed(digits)}`);
}

const t0 = Date.now();
const rng = createRng(20261202);
print('settings_k', options.k!, 2);
print('settings_h', options.h!, 2);
print('settings_sustained_hours', options.minRunLength!, 0);
print('reference_hours', REFERENCE_HOURS, 0);
print('markov_arl0_two_sided', cusumArlTwoSided(options.k!, options.h!, 0));

const inControl: [string, number, boolean, number][] = [
  ['independent', 0, true, RUNS],
  [`ar1_phi${DEMO_PHI.typical}`, DEMO_PHI.typical, true, RUNS],
  [`ar1_phi${DEMO_PHI.highest_below_clamp}`, DEMO_PHI.highest_below_clamp, true, RUNS],
  [`ar1_phi${DEMO_PHI.DA1}`, DEMO_PHI.DA1, true, Math.max(50, Math.round(RUNS / 4))],
  [`ar1_phi${DEMO_PHI.highest_below_clamp}_unwhitened`, DEMO_PHI.highest_below_clamp, false, Math.max(50, Math.round(RUNS / 4))],
];
for (const [name, phi, whiten, runs] of inControl) {
  const rl: number[] = [];
  for (let i = 0; i < runs; i++) rl.push(runLength(rng, phi, whiten, () => 0));
  const { mean, se } = meanSe(rl);
  print(`arl0_${name}_hours`, mean);
  print(`arl0_${name}_se_hours`, se);
}

const shifts: [string, (i: number) => number][] = [
  ['step1', (i) => (i > WARMUP ? 1 : 0)],
  ['step2', (i) => (i > WARMUP ? 2 : 0)],
  ['step3', (i) => (i > WARMUP ? 3 : 0)],
  ['ramp_1_per_24h', (i) => (i > WARMUP ? (i - WARMUP) / 24 : 0)],
];
for (const [label, phi] of [['independent', 0], [`ar1_phi${DEMO_PHI.highest_below_clamp}`, DEMO_PHI.highest_below_clamp]] as const) {
  for (const [name, shift] of shifts) {
    const d: number[] = [];
    while (d.length < DELAY_RUNS) {
      const at = runLength(rng, phi, true, shift);
      if (at > WARMUP) d.push(at - WARMUP);
    }
    print(`delay_${name}_${label}_hours`, meanSe(d).mean);
  }
}
print('elapsed_s', (Date.now() - t0) / 1000);
