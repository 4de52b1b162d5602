/**
 * One unit hour, start to finish, pure: dead state of the hour, the unit mapped to the equipment
 * library (./map.ts), the balance with first-order uncertainty (GUM, k = 2), the checks (first-law
 * closure, mass closure, entropy generation against destruction), the hour state with its reasons
 * (src/lib/analytics/steady.ts classifyHour), the cost of destruction, the audit trail and the hashes.
 *
 * Hour state, in order:
 * - suspect: a key tag missing, frozen, out of range (the tag's own range or the link's), poorly
 *   covered or full of status words; a required link missing; the balance cannot be formed; the mass
 *   or first-law balance misses its tolerance; the entropy-generation check fails; negative
 *   destruction; a vapour port within the saturation tolerance (phase unknown);
 * - idle: the load is below the unit's minimum load (or not above zero). Balance problems of an idle
 *   hour are kept as notes, not reasons: a stopped unit's flows do not balance;
 * - unsettled: a key tag's spread within the hour, (max - min) / |mean| in SI (absolute pressure,
 *   kelvin, kg/s, W), is above the unit's spreadLimit (docs/plant-model.md); O2 and vapour fraction use
 *   an absolute limit instead (SPREAD_O2_ABS, SPREAD_X_ABS); no limit is below what the link's
 *   instrument resolves, U = 2 u from its uncertainty and range (src/lib/analytics/steady.ts resolvableSpread);
 * - steady: none of these.
 *
 * The entropy-generation check: the balance gives D from the exergy balance and, independently,
 * Sgen from the entropy balance; Gouy-Stodola says D = T0 Sgen when mass and energy close. Data that
 * do not close the first law make the two differ: when |D - T0 Sgen| exceeds both ENTROPY_CHECK_TOLERANCE
 * of D and the expanded uncertainty of D (k = 2, when propagated), the destruction is not confirmed by
 * the measurements and the hour is suspect.
 *
 * @see docs/domain.md s.2 (Gouy-Stodola), s.6 (steady state, common practice), s.7 (GUM, cost)
 */
import type { TagHourStats } from '../analytics';
import { destructionCost_per_hour } from '../analytics';
import { balanceAt, checkBalance, hourState, loadStats, runBalance, type BalanceRun, type DeadState } from './checks';
import { LOAD_KEY, T0_RANGE_K, finiteOrNull } from './constants';
import { detailOf } from './detail';
import { keepPlan, planHour, type HourPlan } from './hour-plan';
import { hashesOf, linkSetOf, type ComputeOptions, type LinkSet } from './linkset';
import { cachedConverter, mapUnitHour, unitParameters, type MappedUnit } from './map';
import { linkConverter } from './map-port';
import { clearlySteady } from './steady-fast';
import type { EngineHourState, EngineLink, EngineReason, TagHour, UnitHourInput, UnitHourResult } from './types';
import { upTo } from '../format';

export { ENGINE_VERSION, ENERGY_CLOSURE_TOLERANCE, ENTROPY_CHECK_TOLERANCE, SPREAD_O2_ABS, SPREAD_X_ABS } from './constants';
export { unitHourHashes, type ComputeOptions } from './linkset';

/** The dead state of the hour: the ambient tag's mean when it has one, else the site's fixed T0. */
export function deadStateOf(input: Pick<UnitHourInput, 'site' | 'tagHours'>): DeadState {
  const { site } = input;
  if (site.t0Tag) {
    const th = input.tagHours.get(site.t0Tag.name);
    if (th && th.mean !== null && Number.isFinite(th.mean) && th.samples > 0 && !th.flatline) {
      try {
        const T = cachedConverter(site.t0Tag.engUnit, 'temperature', site.p_atm_Pa).toSI(th.mean);
        if (T >= T0_RANGE_K[0] && T <= T0_RANGE_K[1]) return { T0_K: T, p0_Pa: site.p0_Pa, source: 'ambient tag', tag: site.t0Tag.name };
      } catch {
        /* falls back below */
      }
    }
    return { T0_K: site.T0_K, p0_Pa: site.p0_Pa, source: `fallback: the ambient tag ${site.t0Tag.name} has no usable value this hour`, tag: site.t0Tag.name };
  }
  return { T0_K: site.T0_K, p0_Pa: site.p0_Pa, source: 'fixed' };
}

const IDENTITY = (v: number) => v;

/** The hour's statistics of a link's tag in SI, for the steady-state test (spread as max - min). */
function statsSI(link: EngineLink, th: TagHour | undefined, p_atm_Pa: number): TagHourStats | null {
  if (!th) return null;
  let factor = 1;
  let toSI = IDENTITY;
  try {
    const c = linkConverter(link, p_atm_Pa);
    factor = Math.abs(c.factor);
    toSI = c.toSI;
  } catch {
    /* the mapping reports the conversion problem */
  }
  const linkRange =
    (link.validMin !== null && th.min !== null && th.min < link.validMin) || (link.validMax !== null && th.max !== null && th.max > link.validMax) ? 1 : 0;
  const spread = th.min !== null && th.max !== null ? (th.max - th.min) * factor : th.std !== null ? th.std * factor : null;
  return {
    mean: th.mean === null ? null : toSI(th.mean),
    stdDev: spread,
    min: th.min === null ? null : toSI(th.min),
    max: th.max === null ? null : toSI(th.max),
    sampleCount: th.samples,
    coveredFraction: th.coveredFraction,
    flatline: th.flatline,
    outOfRangeCount: th.outOfRange + linkRange,
    nonNumericCount: th.nonNumeric,
  };
}

/** The key tags of the steady-state test in SI, with the unit's load. */
function keyTagStats(input: UnitHourInput, set: LinkSet, load: number): Record<string, TagHourStats | null> {
  const tags: Record<string, TagHourStats | null> = {};
  for (const l of set.linksUsed) tags[l.tagName] = statsSI(l, input.tagHours.get(l.tagName), input.site.p_atm_Pa);
  tags[LOAD_KEY] = loadStats(load);
  return tags;
}

/** The unit mapped to the equipment library, or the reason it cannot be (a model problem). */
function mapHour(input: UnitHourInput, notes: string[]): { mapped: MappedUnit | null; problems: EngineReason[] } {
  try {
    const mapped = mapUnitHour(input.unit, input.links, input.tagHours, input.site.p_atm_Pa, input.flueGasSources ?? {});
    notes.push(...mapped.notes);
    return { mapped, problems: [...mapped.problems] };
  } catch (err) {
    return { mapped: null, problems: [{ code: 'MODEL_INCOMPLETE', message: (err as Error).message }] };
  }
}

/**
 * Computes one unit hour. The audit trail (`detail`) is built when first read: the job stores the
 * lean row and never reads it. An hour of a link set whose mapping is planned (./hour-plan.ts) only
 * fills the balance's input vector from its tag hours; the full mapping runs for the first hour of a
 * link set, for an hour the plan cannot take (a missing reading, a balance that fails) and for the
 * audit trail, and gives the same figures.
 * @param input the unit, its links holding in the hour, the hour's tag statistics, site, cost basis
 * @returns the row to store, with state, reasons, figures, uncertainty, cost, detail and hashes
 */
export function computeUnitHour(input: UnitHourInput, options: ComputeOptions = {}): UnitHourResult {
  const withU = options.uncertainty ?? true;
  const dead = deadStateOf(input);
  const planned = planHour(input, dead.T0_K, dead.p0_Pa);
  return (planned && plannedHour(input, options, withU, dead, planned.plan, planned.load)) || fullHour(input, options, withU, dead);
}

/** An hour through its plan; null when the balance fails (the full mapping words why). */
function plannedHour(input: UnitHourInput, options: ComputeOptions, withU: boolean, dead: DeadState, plan: HourPlan, load: number): UnitHourResult | null {
  const run: BalanceRun = { balance: null, unc: null, entries: [], balanceError: null, computed: [] };
  balanceAt(run, plan.kind, plan.model, plan.x, plan.u, withU, true);
  if (!run.balance) return null;
  const params = unitParameters(input.unit);
  const notes: string[] = [];
  const set = linkSetOf(input);
  const mapped = plan.mapped;
  const checks = checkBalance(run, mapped, params, notes);
  // Most hours are steady: the quick test says so without the statistics objects and words of the full one.
  if (run.computed.length === 0 && clearlySteady(set, input.tagHours, input.site.p_atm_Pa, checks.closures, load, mapped.minLoad, params)) {
    return new UnitHourRow(input, set, options, dead, load, mapped.load.unit, run, 'steady', [], () => fullHour(input, options, withU, dead).detail);
  }
  const tags = keyTagStats(input, set, load);
  const { state, reasons } = hourState({ set, tags, closures: checks.closures, mapped, load, minLoad: mapped.minLoad, problems: [], computed: run.computed, params, notes });
  return new UnitHourRow(input, set, options, dead, load, mapped.load.unit, run, state, reasons, () => fullHour(input, options, withU, dead).detail);
}

/** An hour through the full mapping, which also keeps the plan of its link set and choices. */
function fullHour(input: UnitHourInput, options: ComputeOptions, withU: boolean, dead: DeadState): UnitHourResult {
  const params = unitParameters(input.unit);
  const notes: string[] = [];
  if (dead.source.startsWith('fallback')) notes.push(`dead state: ${dead.source}; T0 = ${upTo(dead.T0_K, 3)} K (the site's setting)`);
  const { mapped, problems } = mapHour(input, notes);
  const set = linkSetOf(input);
  const load = mapped?.load.value ?? NaN;
  const minLoad = mapped?.minLoad ?? 0;
  const tags = keyTagStats(input, set, load);
  const run = runBalance(input.unit, mapped, problems, dead, withU);
  keepPlan(input, mapped, run.entries.length ? run.entries.map((e) => e.name) : null);
  const checks = checkBalance(run, mapped, params, notes);
  const { state, reasons } = hourState({ set, tags, closures: checks.closures, mapped, load, minLoad, problems, computed: run.computed, params, notes });
  return new UnitHourRow(input, set, options, dead, load, mapped?.load.unit ?? null, run, state, reasons, () => detailOf({ input, set, dead, mapped, minLoad, run, checks, notes }));
}

/**
 * The row of an hour: its figures as own fields, its audit trail (`detail`) a getter of the class
 * that builds it when first read. A class rather than an object literal with a getter: a literal's
 * getter is a new accessor on every row, which cost about as much as the rest of the row.
 * Its fields are the one declaration of a unit hour's figures: UnitHourResult (types.ts) is derived
 * from them. They stay declared class fields (not merged in from an interface): V8 then gives every
 * row its full shape at once, which measured faster than fields that appear as they are assigned.
 */
export class UnitHourRow {
  state: EngineHourState;
  reasons: EngineReason[];
  load: number | null;
  loadUnit: 'W' | 'kg/s' | null;
  T0_K: number;
  p0_Pa: number;
  fuel_W: number | null;
  product_W: number | null;
  loss_W: number | null;
  destruction_W: number | null;
  efficiency: number | null;
  efficiency_U: number | null;
  destruction_U_W: number | null;
  closure_pct: number | null;
  entropyGeneration_W_per_K: number | null;
  destructionCost_per_h: number | null;
  modelVersion: string;
  inputsHash: string;
  #detail: Record<string, unknown> | undefined;
  #detailFn: (() => Record<string, unknown>) | null;

  constructor(
    input: UnitHourInput,
    set: LinkSet,
    options: ComputeOptions,
    dead: DeadState,
    load: number,
    loadUnit: 'W' | 'kg/s' | null,
    run: BalanceRun,
    state: EngineHourState,
    reasons: EngineReason[],
    detailFn: () => Record<string, unknown>,
  ) {
    const { balance, unc } = run;
    const D = balance ? balance.destruction_W : NaN;
    const cost = input.cost && Number.isFinite(D) ? destructionCost_per_hour(input.cost.cF_per_J, D) : null;
    const { modelVersion, inputsHash } = options.hashes ?? hashesOf(set, input, options);
    this.state = state;
    this.reasons = reasons;
    this.load = finiteOrNull(load);
    this.loadUnit = loadUnit;
    this.T0_K = dead.T0_K;
    this.p0_Pa = dead.p0_Pa;
    this.fuel_W = balance ? finiteOrNull(balance.fuel_W) : null;
    this.product_W = balance ? finiteOrNull(balance.product_W) : null;
    this.loss_W = balance ? finiteOrNull(balance.loss_W) : null;
    this.destruction_W = balance ? finiteOrNull(balance.destruction_W) : null;
    this.efficiency = balance ? finiteOrNull(balance.efficiency) : null;
    this.efficiency_U = unc?.efficiency ? finiteOrNull(unc.efficiency.U) : null;
    this.destruction_U_W = unc ? finiteOrNull(unc.destruction_W.U) : null;
    this.closure_pct = balance ? finiteOrNull(balance.energyClosure_pct) : null;
    this.entropyGeneration_W_per_K = balance ? finiteOrNull(balance.entropyGeneration_W_per_K) : null;
    this.destructionCost_per_h = finiteOrNull(cost);
    this.modelVersion = modelVersion;
    this.inputsHash = inputsHash;
    this.#detail = undefined;
    this.#detailFn = detailFn;
  }

  get detail(): Record<string, unknown> {
    if (this.#detailFn) {
      this.#detail = this.#detailFn();
      this.#detailFn = null;
    }
    return this.#detail!;
  }
}
