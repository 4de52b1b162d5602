/**
 * The steps of a unit hour between the mapping and the audit trail: the balance (with its GUM
 * uncertainty), the checks of the balance (first-law closure, mass closure, entropy generation against
 * destruction, the balance's flags) and the hour state with its reasons (src/lib/analytics classifyHour).
 * See compute.ts for the order of the states and the entropy-generation check.
 */
import { BalanceInputError, evaluateUnitHour, inputNames, unitHourWithUncertainty, type UnitBalance } from '../equipment';
import { classifyHour, type BalanceClosure, type TagHourStats } from '../analytics';
import { ENERGY_CLOSURE_TOLERANCE, ENTROPY_CHECK_TOLERANCE, LOAD_KEY, num } from './constants';
import type { LinkSet } from './linkset';
import { sharedModel } from './linkset';
import type { InputEntry, MappedUnit } from './map';
import type { EngineHourState, EngineReason, EngineUnit } from './types';
import { STATE_SEVERITY } from '../hour-states';
import { fixed } from '../format';

/** The dead state of the hour and where it came from. */
export interface DeadState {
  T0_K: number;
  p0_Pa: number;
  source: string;
  tag?: string;
}

/** The balance of the hour, or why there is none. */
export interface BalanceRun {
  balance: UnitBalance | null;
  unc: ReturnType<typeof unitHourWithUncertainty> | null;
  entries: InputEntry[];
  balanceError: { code: string; input: string; message: string } | null;
  /** reasons found by computing (balance failed, checks failed); notes only in an idle hour */
  computed: EngineReason[];
}

const MISSING_SOURCE = { kind: 'site', what: 'missing' } as const;

/** The input entries of the balance in the order of the equipment model's vector (dead state set). */
function entriesOf(mapped: MappedUnit, names: readonly string[], dead: DeadState): InputEntry[] {
  const fromTag = dead.tag && dead.source === 'ambient tag';
  mapped.entries.set('T0_K', { name: 'T0_K', value: dead.T0_K, u: 0, source: fromTag ? { kind: 'site', what: `dead state from the ambient tag ${dead.tag}` } : { kind: 'site', what: 'dead state' } });
  mapped.entries.set('p0_Pa', { name: 'p0_Pa', value: dead.p0_Pa, u: 0, source: { kind: 'site', what: 'dead state' } });
  const out: InputEntry[] = new Array(names.length);
  for (let i = 0; i < names.length; i++) out[i] = mapped.entries.get(names[i]!) ?? { name: names[i]!, value: NaN, u: 0, source: MISSING_SOURCE };
  return out;
}

/**
 * The balance of a mapped unit hour at the dead state, with its uncertainty when asked.
 * Nothing is computed when the mapping found problems (they are the hour's reasons).
 */
export function runBalance(unit: EngineUnit, mapped: MappedUnit | null, problems: readonly EngineReason[], dead: DeadState, withU: boolean): BalanceRun {
  const run: BalanceRun = { balance: null, unc: null, entries: [], balanceError: null, computed: [] };
  if (!mapped || problems.length) return run;
  const model = sharedModel(unit, mapped.balanceKind, mapped.model);
  try {
    const entries = (run.entries = entriesOf(mapped, inputNames(mapped.balanceKind, model), dead));
    const missing = entries.filter((e) => !Number.isFinite(e.value));
    if (missing.length) {
      run.balanceError = { code: 'MISSING_INPUT', input: missing[0]!.name, message: `no value this hour for ${missing.map((m) => m.name).join(', ')}` };
      return run;
    }
    const x = new Float64Array(entries.length);
    const u = new Float64Array(entries.length);
    for (let i = 0; i < entries.length; i++) {
      x[i] = entries[i]!.value;
      u[i] = entries[i]!.u;
    }
    balanceAt(run, mapped.balanceKind, model, x, u, withU);
  } catch (err) {
    failed(run, err);
  }
  return run;
}

function failed(run: BalanceRun, err: unknown): void {
  const e = err as Error & { code?: string; input?: string };
  run.balanceError = { code: err instanceof BalanceInputError ? e.code! : e.name, input: e.input ?? '', message: e.message };
  run.computed.push({ code: 'BALANCE_FAILED', message: `the balance cannot be formed: ${e.message}` });
}

/**
 * A planned hour reads only its row's figures and checks from the balance (its audit trail is rebuilt
 * through the full mapping when read): no isentropic companions (h(p, s) calls, audit trail only), and
 * the sensitivities in the sweep's scratch arrays, valid until its next call.
 */
const FIGURES_ONLY = { isentropic: false, scratchSensitivity: true } as const;

/**
 * The balance at the input vector x (finite, in the model's order) with its uncertainty when asked,
 * into run; a balance that cannot be formed is recorded as run.balanceError and a BALANCE_FAILED reason.
 * figuresOnly: the caller reads only the row's figures and checks, never the audit trail's (FIGURES_ONLY).
 */
export function balanceAt(
  run: BalanceRun,
  kind: MappedUnit['balanceKind'],
  model: MappedUnit['model'],
  x: Float64Array,
  u: Float64Array,
  withU: boolean,
  figuresOnly = false,
): BalanceRun {
  try {
    if (withU) {
      run.unc = figuresOnly ? unitHourWithUncertainty(kind, model, x, u, FIGURES_ONLY) : unitHourWithUncertainty(kind, model, x, u);
      run.balance = run.unc.balance;
    } else run.balance = evaluateUnitHour(kind, model, x, figuresOnly ? FIGURES_ONLY : {});
  } catch (err) {
    failed(run, err);
  }
  return run;
}

/** Group of an equipment port as the balances default it (for the mass check's denominator). */
function groupOf(kind: string, s: { role?: string; group?: string }): string {
  if (s.group) return s.group;
  if (kind === 'heat-exchanger' || kind === 'condenser' || kind === 'cooler') return s.role ?? 'main';
  if (kind === 'boiler') return s.role === 'water' || s.role === 'blowdown' ? 'water' : 'gas';
  return 'main';
}

/** What the checks of a balance found. */
export interface BalanceChecks {
  closures: BalanceClosure[];
  entropy: { residual_W: number; share: number } | null;
  massShare: number | null;
}

/** Mass closure as a share of the inflow of the checked groups. */
function massShareOf(mapped: MappedUnit, balance: UnitBalance): number | null {
  if (!mapped.massCheck) return null;
  let inFlow = 0;
  for (const s of mapped.model.ports ?? []) {
    if (s.direction === 'in' && mapped.massCheck.groups.includes(groupOf(mapped.balanceKind, s))) inFlow += balance.ports[s.name]?.mDot_kg_per_s ?? 0;
  }
  return inFlow > 0 ? balance.massResidual_kg_per_s / inFlow : balance.massResidual_kg_per_s === 0 ? 0 : Infinity;
}

/** Gouy-Stodola: D against T0 Sgen, allowed to differ by the tolerance of D or D's expanded uncertainty. */
function entropyCheck(run: BalanceRun, balance: UnitBalance, notes: string[]): BalanceChecks['entropy'] {
  const D = balance.destruction_W;
  const gs = balance.gouyStodolaResidual_W;
  if (!Number.isFinite(gs)) {
    notes.push('entropy-generation check not available (a condensed fuel has no absolute entropy in the property core)');
    return null;
  }
  const scale = Math.max(Math.abs(D), 0.01 * Math.abs(balance.fuel_W), 1e-9);
  const U_D = run.unc && Number.isFinite(run.unc.destruction_W.U) ? run.unc.destruction_W.U : 0;
  const allowed = Math.max(ENTROPY_CHECK_TOLERANCE * scale, U_D);
  if (Math.abs(gs) > allowed) {
    run.computed.push({
      code: 'ENTROPY_CHECK_FAILED',
      message:
        `destruction ${fixed(D / 1e3, 1)} kW and T0 Sgen ${fixed((D - gs) / 1e3, 1)} kW differ by ${fixed(Math.abs(gs) / 1e3, 1)} kW, ` +
        `more than ${fixed(100 * ENTROPY_CHECK_TOLERANCE, 0)} % of D and more than its uncertainty (U = ${fixed(U_D / 1e3, 1)} kW): the data do not close the first law`,
    });
  }
  return { residual_W: gs, share: gs / scale };
}

/** The balance's flags as reasons (suspect) or notes. */
function flagReasons(run: BalanceRun, balance: UnitBalance, notes: string[]): void {
  for (const f of balance.flags) {
    const [flag, port] = f.split(':');
    if (flag === 'near-saturation' && port) {
      if (balance.ports[port]?.state.phase === 'vapour') {
        run.computed.push({ code: 'NEAR_SATURATION', message: `${port}: p and T are within the saturation tolerance on the vapour side; the steam may be wet and its state unknown` });
      } else notes.push(`${port}: liquid within the saturation tolerance (taken as liquid)`);
    } else if (flag === 'below-dead-state-definitions') {
      run.computed.push({ code: 'BELOW_DEAD_STATE', message: 'a stream is below T0: hot-side decrease and cold-side increase are not the fuel and product there' });
    } else if (flag === 'negative-destruction') {
      run.computed.push({ code: 'NEGATIVE_DESTRUCTION', message: 'the balance gives negative destruction, which no real process does: the data are inconsistent' });
    } else if (flag === 'efficiency-above-one') {
      run.computed.push({ code: 'EFFICIENCY_ABOVE_ONE', message: 'power out exceeds power in: a meter is off' });
    } else if (flag === 'loss-not-separated') {
      notes.push('no coolant flow: the heat is taken as rejected at T0, so loss and destruction are not split (L = 0)');
    } else if (flag === 'below-dead-state' && port) {
      notes.push(`${port}: below T0`);
    }
  }
}

/** The checks of the hour's balance; failed checks are added to run.computed, remarks to notes. */
export function checkBalance(run: BalanceRun, mapped: MappedUnit | null, params: Record<string, unknown>, notes: string[]): BalanceChecks {
  const out: BalanceChecks = { closures: [], entropy: null, massShare: null };
  const balance = run.balance;
  if (!balance || !mapped) return out;
  out.closures.push({ name: 'first-law (energy)', residual: balance.energyClosure_pct / 100, tolerance: ENERGY_CLOSURE_TOLERANCE });
  out.massShare = massShareOf(mapped, balance);
  if (out.massShare !== null) out.closures.push({ name: 'mass', residual: out.massShare, tolerance: num(params.massBalanceTolerance, 0.03) });
  out.entropy = entropyCheck(run, balance, notes);
  flagReasons(run, balance, notes);
  return out;
}

/** The hour's load as the steady-state test sees it (one exact figure, never spread or missing samples). */
export function loadStats(load: number): TagHourStats {
  return { mean: Number.isFinite(load) ? load : null, stdDev: null, sampleCount: 1e9, coveredFraction: 1, flatline: false, outOfRangeCount: 0, nonNumericCount: 0 };
}

/** What the hour state needs besides the tags' statistics. */
export interface StateInputs {
  set: LinkSet;
  tags: Record<string, TagHourStats | null>;
  closures: BalanceClosure[];
  mapped: MappedUnit | null;
  load: number;
  minLoad: number;
  problems: readonly EngineReason[];
  computed: readonly EngineReason[];
  params: Record<string, unknown>;
  notes: string[];
}

/**
 * The hour state with its reasons, most severe first. A unit at no load is idle even when its minimum
 * load is 0; an idle hour's balance problems are notes, not reasons (a stopped unit's flows do not balance).
 */
export function hourState(s: StateInputs): { state: EngineHourState; reasons: EngineReason[] } {
  const effMin = s.minLoad > 0 ? s.minLoad : Number.MIN_VALUE;
  const idleCandidate = Number.isFinite(s.load) && s.load < effMin;
  const classified = classifyHour(
    { tags: s.tags, balances: idleCandidate ? [] : s.closures },
    { loadTag: LOAD_KEY, minLoad: effMin, keyTags: s.set.keyTags, spread: s.set.spread, defaultMaxRelSpread: s.set.relLimit, minCoveredFraction: num(s.params.minCoverage, 0.75) },
  );
  const reasons: (EngineReason & { state: EngineHourState })[] = [];
  for (const r of classified.reasons) {
    if (r.tag === LOAD_KEY && r.code !== 'BELOW_MIN_LOAD') continue; // the load's own tags carry the reason
    let message = r.message;
    if (r.code === 'BELOW_MIN_LOAD' && s.mapped) {
      const u = s.mapped.load.unit === 'W' ? { f: 1e-3, s: 'kW' } : { f: 3.6, s: 't/h' };
      message = `${s.mapped.load.label} ${fixed(s.load * u.f, 1)} ${u.s} is below the minimum load ${fixed(s.minLoad * u.f, 1)} ${u.s}${s.minLoad > 0 ? '' : ' (the unit is not running)'}`;
    }
    reasons.push({ code: r.code, message, ...(r.tag && r.tag !== LOAD_KEY ? { tag: r.tag } : {}), state: r.state });
  }
  for (const p of s.problems) reasons.push({ ...p, state: 'suspect' });
  for (const c of s.computed) {
    if (idleCandidate) s.notes.push(`${c.code}: ${c.message}`);
    else reasons.push({ ...c, state: 'suspect' });
  }
  reasons.sort((a, b) => STATE_SEVERITY[b.state] - STATE_SEVERITY[a.state]);
  const state: EngineHourState = reasons.length ? reasons[0]!.state : 'steady';
  return { state, reasons: reasons.map(({ state: _s, ...r }) => r) };
}
