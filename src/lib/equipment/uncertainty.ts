/**
 * First-order uncertainty of a unit's balance (GUM, k = 2) by central differences of the compiled
 * balance (./model.ts), the perturbed balances lean (F, P, L, D and efficiency only).
 * @see JCGM 100:2008 (GUM) 5.1.2 eq. 10, 5.1.3, 6.2-6.3
 */
import type { BalanceKind as UnitKind } from '../kinds';
import type { UnitBalance } from './balance';
import { BalanceInputError } from './errors';
import { compiledUnit, type CompiledUnit, type UnitModel } from './model';
import { compileKernel, type SweepKernel } from './sweep-kernel';

/** Value with its standard (u) and expanded (U = k u) uncertainty, SI. */
export interface Uncertain {
  value: number;
  u: number;
  U: number;
}

/** A balance with the propagated uncertainty of its headline figures. */
export interface UnitHourUncertainty {
  balance: UnitBalance;
  /** coverage factor [-] (2) */
  k: number;
  fuel_W: Uncertain;
  product_W: Uncertain | null;
  loss_W: Uncertain;
  destruction_W: Uncertain;
  efficiency: Uncertain | null;
  /** input names and sensitivities d(output)/d(input) [SI/SI]; 0 for inputs with u = 0 */
  names: readonly string[];
  sensitivity: { efficiency: Float64Array; destruction_W: Float64Array };
  /** inputs whose sensitivity could not be formed (both neighbours failed): uncertainty is NaN */
  unavailable: string[];
}

export interface UncertaintyOptions {
  /** coverage factor, default 2 (JCGM 100:2008 6.2-6.3) */
  k?: number;
  /** central-difference step relative to max(|x_i|, u_i), default 1e-6 (as analytics' propagate) */
  relStep?: number;
  /** move the full (lean) balance for every input instead of the sweep kernel (the check of the kernel) */
  fullSweep?: boolean;
  /** false: the balance at the point without its isentropic companions (h(p, s) calls; see UnitModel's evaluate) */
  isentropic?: boolean;
  /**
   * true: the sensitivities in arrays this module keeps and overwrites on its next call, for a caller
   * that reads only the uncertainties (no two typed arrays per call)
   */
  scratchSensitivity?: boolean;
}

const N_OUT = 5; // fuel, product, loss, destruction, efficiency

function headline(b: UnitBalance, out: Float64Array, o: number): void {
  out[o] = b.fuel_W;
  out[o + 1] = b.product_W ?? NaN;
  out[o + 2] = b.loss_W;
  out[o + 3] = b.destruction_W;
  out[o + 4] = b.efficiency ?? NaN;
}

const Y0 = new Float64Array(N_OUT);
const YS = new Float64Array(2 * N_OUT);
const VAR = new Float64Array(N_OUT);
/** the moved vector by its length (the full balance checks the length) */
const XS: Float64Array[] = [];
/** the sensitivities by the vector's length, for scratchSensitivity */
const S_EFF: Float64Array[] = [];
const S_D: Float64Array[] = [];

/** Output j at the point with its standard and expanded uncertainty (a function, not a closure per call). */
function uncertain(y0: Float64Array, variance: Float64Array, j: number, k: number): Uncertain {
  const s = Math.sqrt(variance[j]);
  return { value: y0[j], u: s, U: k * s };
}

const kernels = new WeakMap<CompiledUnit, SweepKernel | null>();
/** The sweep kernel of a compiled unit (./sweep-kernel.ts), kept with it; null when not covered. */
function kernelOf(c: CompiledUnit): SweepKernel | null {
  let k = kernels.get(c);
  if (k === undefined) kernels.set(c, (k = compileKernel(c.kind, c.model, c.names, c.fluids)));
  return k;
}

/** The moved balance's headline figures into ys at o: the kernel's, or the lean full balance's. */
function moved(c: CompiledUnit, kernel: SweepKernel | null, i: number, xs: Float64Array, ys: Float64Array, o: number): boolean {
  try {
    if (kernel && i >= 2) {
      kernel.evaluate(xs, ys, o);
    } else headline(c.evaluate(xs, true), ys, o);
    return true;
  } catch {
    return false;
  }
}

/**
 * The balance at x with the first-order uncertainty of F, P, L, D and efficiency propagated through
 * the whole calculation: sensitivities c_i by central differences of evaluateUnitHour with step
 * h_i = relStep max(|x_i|, u_i), u_c^2 = sum (c_i u_i)^2 for uncorrelated inputs, U = k u_c with k = 2.
 * Inputs with u_i = 0 are skipped (they contribute nothing, and a fixed x = 0 or 1 must not be
 * stepped outside its range). Where one neighbour is outside a property range, the one-sided difference
 * of the other is used; where both fail the input is listed in `unavailable` and the uncertainty is NaN.
 * Same method as src/lib/analytics/uncertainty.ts `propagate` (eq. 10), written here to skip zero
 * uncertainties, fall back to one-sided differences and allocate nothing per evaluation.
 * @param x input vector (SI, order of inputNames)
 * @param u standard uncertainties of the inputs (SI, same order), >= 0
 * @throws BalanceInputError for a bad vector; whatever evaluateUnitHour throws at x itself
 * @see JCGM 100:2008 (GUM) 5.1.2 eq. 10, 5.1.3, 6.2-6.3; ASME PTC 19.1-2018
 */
export function unitHourWithUncertainty(
  kind: UnitKind,
  model: UnitModel,
  x: ArrayLike<number>,
  u: ArrayLike<number>,
  options: UncertaintyOptions = {},
): UnitHourUncertainty {
  const c = compiledUnit(kind, model);
  const n = c.names.length;
  if (u.length !== n) throw new BalanceInputError('INVALID_MODEL', 'u', `needs ${n} uncertainties (one per input), got ${u.length}`);
  for (let i = 0; i < n; i++) {
    if (!(u[i] >= 0 && Number.isFinite(u[i]))) throw new BalanceInputError('IMPOSSIBLE_INPUT', `u(${c.names[i]})`, `a standard uncertainty must be a finite number >= 0, got ${u[i]}`);
  }
  const k = options.k ?? 2;
  const relStep = options.relStep ?? 1e-6;
  const balance = c.evaluate(x, false, options.isentropic ?? true);
  let kernel = options.fullSweep ? null : kernelOf(c);
  if (kernel && !kernel.setPoint(x, balance)) kernel = null;
  // Scratch kept between calls (nothing here calls back into this function): the moved vector and outputs.
  const y0 = Y0;
  headline(balance, y0, 0);
  const xs = (XS[n] ??= new Float64Array(n));
  for (let i = 0; i < n; i++) xs[i] = x[i]!;
  const ys = YS;
  const variance = VAR.fill(0);
  const sEff = options.scratchSensitivity ? (S_EFF[n] ??= new Float64Array(n)).fill(0) : new Float64Array(n);
  const sD = options.scratchSensitivity ? (S_D[n] ??= new Float64Array(n)).fill(0) : new Float64Array(n);
  const unavailable: string[] = [];
  for (let i = 0; i < n; i++) {
    const ui = u[i];
    if (ui === 0) continue;
    const xi = xs[i];
    const h = relStep * Math.max(Math.abs(xi), ui);
    xs[i] = xi + h;
    const okP = moved(c, kernel, i, xs, ys, 0);
    xs[i] = xi - h;
    const okM = moved(c, kernel, i, xs, ys, N_OUT);
    xs[i] = xi;
    if (!okP && !okM) {
      unavailable.push(c.names[i]);
      for (let j = 0; j < N_OUT; j++) variance[j] = NaN;
      sEff[i] = NaN;
      sD[i] = NaN;
      continue;
    }
    for (let j = 0; j < N_OUT; j++) {
      const cj = okP && okM ? (ys[j] - ys[N_OUT + j]) / (2 * h) : okP ? (ys[j] - y0[j]) / h : (y0[j] - ys[N_OUT + j]) / h;
      variance[j] += (cj * ui) ** 2;
      if (j === 3) sD[i] = cj;
      if (j === 4) sEff[i] = cj;
    }
  }
  return {
    balance,
    k,
    fuel_W: uncertain(y0, variance, 0, k),
    product_W: balance.product_W === null ? null : uncertain(y0, variance, 1, k),
    loss_W: uncertain(y0, variance, 2, k),
    destruction_W: uncertain(y0, variance, 3, k),
    efficiency: balance.efficiency === null ? null : uncertain(y0, variance, 4, k),
    names: c.names,
    sensitivity: { efficiency: sEff, destruction_W: sD },
    unavailable,
  };
}
